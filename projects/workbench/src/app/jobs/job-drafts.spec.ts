import { TestBed } from '@angular/core/testing';
import { FormArray, FormControl, FormGroup } from '@angular/forms';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { JobDrafts } from './job-drafts';

describe('JobDrafts', () => {
  let drafts: JobDrafts;

  beforeEach(() => {
    localStorage.clear();
    drafts = TestBed.inject(JobDrafts);
  });

  afterEach(() => localStorage.clear());

  it('keeps a value per job and per form, and forgets it when told', () => {
    drafts.write(8, 'setup', { operatingSpeedRpm: 2150 });
    drafts.write(9, 'setup', { operatingSpeedRpm: 980 });
    expect(drafts.read(8, 'setup')).toEqual({ operatingSpeedRpm: 2150 });
    expect(drafts.read(9, 'setup')).toEqual({ operatingSpeedRpm: 980 });
    expect(drafts.read(8, 'run-trial')).toBeNull();
    drafts.clear(8, 'setup');
    expect(drafts.read(8, 'setup')).toBeNull();
    expect(drafts.read(9, 'setup')).toEqual({ operatingSpeedRpm: 980 });
  });

  it('reads a damaged draft as none', () => {
    localStorage.setItem('counterpoise.job-draft.8.setup', '{"operatingSpeedRpm":');
    expect(drafts.read(8, 'setup')).toBeNull();
  });

  it('writes every change of a form at once, and fills the form from it when the step opens again', () => {
    const form = () =>
      new FormGroup({
        tachometer: new FormControl(''),
        repeats: new FormArray([new FormControl<number | null>(null), new FormControl<number | null>(null)]),
      });
    const first = form();
    TestBed.runInInjectionContext(() => expect(drafts.keep(first, 8, 'run-initial')).toBe(false));
    first.controls.tachometer.setValue('tape at the drive-end pulley');
    first.controls.repeats.at(0).setValue(0.52);
    expect(drafts.read(8, 'run-initial')).toEqual({
      tachometer: 'tape at the drive-end pulley',
      repeats: [0.52, null],
    });

    // The page is reloaded: a new form for the same job and step.
    const second = form();
    TestBed.runInInjectionContext(() => expect(drafts.keep(second, 8, 'run-initial')).toBe(true));
    expect(second.getRawValue()).toEqual({
      tachometer: 'tape at the drive-end pulley',
      repeats: [0.52, null],
    });
    expect(second.dirty).toBe(true);
  });
});
