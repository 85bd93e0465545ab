import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { JobDrafts } from './job-drafts';
import { JobSession } from './job-session';
import type { Job, JobRun, RunKind } from './jobs.api';
import { parseTypedNumber, RunEntry } from './run-entry';
import { JOB_AFTER_LEFT_TRIAL, MULCHER_MACHINE } from './steps/testing-jobs';

/** Job 8 before its first run: the set-up's two sensors, in/s peak, phase as a lag. */
const JOB_BEFORE_RUNS: Job = {
  ...JOB_AFTER_LEFT_TRIAL,
  version: 4,
  nextStep: 'runs',
  runs: [],
  verification: null,
};

@Component({
  imports: [RunEntry],
  providers: [JobSession],
  template: `
    @if (session.job(); as job) {
      <app-run-entry [job]="job" [kind]="kind()" [machine]="machine" (saved)="saved.push($event)" />
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly session = inject(JobSession);
  readonly kind = input<RunKind>('initial');
  readonly machine = MULCHER_MACHINE;
  readonly saved: JobRun[] = [];
}

describe('RunEntry', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  async function render(kind: RunKind, job: Job = JOB_BEFORE_RUNS) {
    const fixture = TestBed.createComponent(Host);
    fixture.componentRef.setInput('kind', kind);
    const session = fixture.debugElement.injector.get(JobSession);
    const loading = session.load(job.id);
    http.expectOne(`/api/v1/jobs/${job.id}`).flush(job, { headers: { ETag: `"${job.version}"` } });
    await loading;
    fixture.detectChanges();
    await fixture.whenStable();
    return { fixture, element: fixture.nativeElement as HTMLElement, host: fixture.componentInstance };
  }

  function field(element: HTMLElement, id: string): HTMLInputElement {
    const input = element.querySelector<HTMLInputElement>(`#${id}`);
    if (!input) throw new Error(`No field #${id}`);
    return input;
  }

  async function type(fixture: ComponentFixture<Host>, id: string, text: string) {
    const input = field(fixture.nativeElement as HTMLElement, id);
    input.value = text;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
    fixture.detectChanges();
    await fixture.whenStable();
  }

  async function typeRepeat(
    fixture: ComponentFixture<Host>,
    kind: RunKind,
    sensor: number,
    repeat: number,
    values: readonly [string, string, string],
  ) {
    await type(fixture, `run-${kind}-s${sensor}-r${repeat}-amplitude`, values[0]);
    await type(fixture, `run-${kind}-s${sensor}-r${repeat}-phaseDeg`, values[1]);
    await type(fixture, `run-${kind}-s${sensor}-r${repeat}-speedRpm`, values[2]);
  }

  async function press(fixture: ComponentFixture<Host>, button: HTMLElement | null) {
    if (!button) throw new Error('No such button');
    button.click();
    fixture.detectChanges();
    await fixture.whenStable();
    await new Promise((resolve) => setTimeout(resolve));
    fixture.detectChanges();
  }

  function text(element: Element | null | undefined): string {
    return element?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  }

  function summary(element: HTMLElement, side: 'left' | 'right'): Element | null {
    return element.querySelector(`.run-entry__summary[data-side="${side}"]`);
  }

  function addRepeatButton(element: HTMLElement, sensor: number): HTMLElement | null {
    return element.querySelector<HTMLElement>(`[id$="-add-repeat-${sensor}"]`);
  }

  function saveButton(element: HTMLElement): HTMLElement | null {
    return element.querySelector<HTMLElement>('.run-entry__actions button');
  }

  it('reads numbers as typed on a keypad, with a dot or a comma', () => {
    expect(parseTypedNumber('0,42')).toBe(0.42);
    expect(parseTypedNumber(' 2 100 ')).toBe(2100);
    expect(parseTypedNumber('.5')).toBe(0.5);
    expect(parseTypedNumber('')).toBeNull();
    expect(parseTypedNumber('12a')).toBeNull();
    expect(parseTypedNumber('1.2.3')).toBeNull();
  });

  it('names each sensor of the set-up with its side and position, one repeat each, on the numeric keypad', async () => {
    const { element } = await render('initial');
    expect([...element.querySelectorAll('.run-entry__sensor legend')].map(text)).toEqual([
      'Left sensor · Left bearing housing, horizontal',
      'Right sensor · Right bearing housing, horizontal',
    ]);
    expect(element.querySelectorAll('.run-entry__repeat')).toHaveLength(2);
    const inputs = [...element.querySelectorAll<HTMLInputElement>('.run-entry__repeat input')];
    expect(inputs).toHaveLength(6);
    expect(inputs.every((input) => input.getAttribute('inputmode') === 'decimal')).toBe(true);
    expect(text(element.querySelector('.run-entry__units'))).toContain('Amplitude in in/s peak');
    // No trial weight on an initial run.
    expect(element.querySelector('.run-entry__trial')).toBeNull();
  });

  it('averages the repeats as vectors as they are typed, with their spread', async () => {
    const { fixture, element } = await render('initial');
    await typeRepeat(fixture, 'initial', 0, 0, ['0.5', '20', '2100']);
    expect(text(summary(element, 'left'))).toContain('Average of 1 repeat: 0.5 in/s peak at 20° · 2,100 rpm');
    expect(text(summary(element, 'left'))).toContain('one repeat cannot show it');

    await press(fixture, addRepeatButton(element, 0));
    expect(document.activeElement?.id).toBe('run-initial-s0-r1-amplitude');
    await typeRepeat(fixture, 'initial', 0, 1, ['0,5', '40', '2096']);
    // Two vectors of 0.5 at 20° and 40°: their mean points at 30°, 0.5·cos 10° = 0.4924 long; each lies
    // 0.5·sin 10° = 0.0868 from it, so the RMS spread is 0.0868, 0.0868 / 0.4924 = tan 10° = 17.6 % of it.
    // The speed is the mean of 2100 and 2096.
    const left = text(summary(element, 'left'));
    expect(left).toContain('Average of 2 repeats: 0.492 in/s peak at 30° · 2,098 rpm');
    expect(left).toContain('Spread 0.087 in/s peak (18 % of the average)');
    expect(summary(element, 'left')?.querySelector('.run-entry__warning')).toBeNull();
    expect(text(summary(element, 'right'))).toBe(
      'The average shows once a repeat has its amplitude and phase.',
    );
  });

  it('warns when the repeats disagree by more than 20 % of their average', async () => {
    const { fixture, element } = await render('initial');
    await typeRepeat(fixture, 'initial', 1, 0, ['1', '0', '2100']);
    await press(fixture, addRepeatButton(element, 1));
    await typeRepeat(fixture, 'initial', 1, 1, ['1', '90', '2100']);
    // 1 at 0° and 1 at 90°: the mean is (0.5, 0.5), 0.7071 at 45°; each is 0.7071 from it, so the spread
    // equals the average: 100 %, far over 20 %.
    const right = summary(element, 'right');
    expect(text(right)).toContain('0.707 in/s peak at 45°');
    expect(text(right)).toContain('(100 % of the average)');
    expect(text(right?.querySelector('.run-entry__warning'))).toContain(
      'The repeats disagree: they spread by more than 20 % of their average.',
    );
  });

  it('removes a repeat and keeps at least one', async () => {
    const { fixture, element } = await render('initial');
    await press(fixture, addRepeatButton(element, 0));
    await typeRepeat(fixture, 'initial', 0, 1, ['0.3', '90', '2100']);
    const removeFirst = element.querySelector<HTMLButtonElement>(
      'button[aria-label="Remove repeat 1 of the left sensor"]',
    );
    await press(fixture, removeFirst);
    expect(element.querySelectorAll('.run-entry__sensor:first-of-type .run-entry__repeat')).toHaveLength(1);
    expect(field(element, 'run-initial-s0-r0-amplitude').value).toBe('0.3');
    expect(
      element.querySelector<HTMLButtonElement>('button[aria-label="Remove repeat 1 of the left sensor"]')
        ?.disabled,
    ).toBe(true);
  });

  it('says what is wrong on the field and sends nothing while a field is not a number', async () => {
    const { fixture, element } = await render('initial');
    await typeRepeat(fixture, 'initial', 0, 0, ['0.5', '361', '2100']);
    await typeRepeat(fixture, 'initial', 1, 0, ['abc', '10', '2100']);
    await press(fixture, saveButton(element));
    const errors = [...element.querySelectorAll('mat-error')].map(text);
    expect(errors).toContain('The phase is from 0 to 359.9 degrees.');
    expect(errors).toContain('Type a number. Enter the amplitude.');
    http.expectNone('/api/v1/jobs/8/runs');
  });

  it('sends a trial run with its trial weight on the stored ETag, clears its draft and hands on the stored run', async () => {
    const { fixture, element, host } = await render('trial', JOB_AFTER_LEFT_TRIAL);
    expect(element.querySelector('.run-entry__trial legend')?.textContent?.trim()).toBe('Trial weight');
    const drafts = TestBed.inject(JobDrafts);

    // The plane, from the machine's two planes.
    element.querySelector<HTMLElement>('#run-trial-plane')?.click();
    fixture.detectChanges();
    await fixture.whenStable();
    const options = [...document.querySelectorAll<HTMLElement>('mat-option')];
    expect(options.map(text)).toEqual(['Left plane', 'Right plane']);
    await press(fixture, options[1]!);
    await type(fixture, 'run-trial-mass', '80');
    await type(fixture, 'run-trial-angle', '0');
    await typeRepeat(fixture, 'trial', 0, 0, ['0.41', '250', '2100']);
    await typeRepeat(fixture, 'trial', 1, 0, ['0.52', '31.5', '2099']);
    await press(fixture, addRepeatButton(element, 1));
    await typeRepeat(fixture, 'trial', 1, 1, ['0.5', '32', '2101']);
    expect(drafts.read(8, 'run-trial')).not.toBeNull();

    await press(fixture, saveButton(element));
    const request = http.expectOne('/api/v1/jobs/8/runs');
    expect(request.request.method).toBe('POST');
    expect(request.request.headers.get('If-Match')).toBe('"6"');
    expect(request.request.body).toEqual({
      kind: 'trial',
      trialWeight: { planeIndex: 1, massGrams: 80, angleDeg: 0 },
      readings: [
        { sensorSide: 'left', repeats: [{ amplitude: 0.41, phaseDeg: 250, speedRpm: 2100 }] },
        {
          sensorSide: 'right',
          repeats: [
            { amplitude: 0.52, phaseDeg: 31.5, speedRpm: 2099 },
            { amplitude: 0.5, phaseDeg: 32, speedRpm: 2101 },
          ],
        },
      ],
    });
    const storedRun: JobRun = {
      ...JOB_AFTER_LEFT_TRIAL.runs[1]!,
      id: 31,
      sequence: 3,
      trialWeight: { planeIndex: 1, massGrams: 80, angleDeg: 0 },
    };
    request.flush(
      { ...JOB_AFTER_LEFT_TRIAL, version: 7, runs: [...JOB_AFTER_LEFT_TRIAL.runs, storedRun] },
      { headers: { ETag: '"7"' } },
    );
    await fixture.whenStable();
    await new Promise((resolve) => setTimeout(resolve));
    expect(host.saved.map((run) => run.id)).toEqual([31]);
    expect(drafts.read(8, 'run-trial')).toBeNull();
  });

  it('puts the server’s word on the repeat and the trial weight it names', async () => {
    const { fixture, element } = await render('trial', JOB_AFTER_LEFT_TRIAL);
    element.querySelector<HTMLElement>('#run-trial-plane')?.click();
    fixture.detectChanges();
    await press(fixture, document.querySelectorAll<HTMLElement>('mat-option')[0]!);
    await type(fixture, 'run-trial-mass', '80');
    await type(fixture, 'run-trial-angle', '10');
    await typeRepeat(fixture, 'trial', 0, 0, ['0.41', '250', '2100']);
    await press(fixture, addRepeatButton(element, 0));
    await typeRepeat(fixture, 'trial', 0, 1, ['0.42', '251', '2100']);
    await typeRepeat(fixture, 'trial', 1, 0, ['0.52', '31', '2100']);

    await press(fixture, saveButton(element));
    http.expectOne('/api/v1/jobs/8/runs').flush(
      {
        type: 'about:blank',
        title: 'Invalid request',
        status: 400,
        errors: [
          { path: 'readings.0.repeats.1.amplitude', message: 'The amplitude is at most 1000.' },
          { path: 'trialWeight.massGrams', message: 'The mass is at most 50000 g.' },
        ],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    await new Promise((resolve) => setTimeout(resolve));
    fixture.detectChanges();

    const secondRepeat = field(element, 'run-trial-s0-r1-amplitude').closest('mat-form-field');
    expect(text(secondRepeat?.querySelector('mat-error'))).toBe('The amplitude is at most 1000.');
    const firstRepeat = field(element, 'run-trial-s0-r0-amplitude').closest('mat-form-field');
    expect(firstRepeat?.querySelector('mat-error')).toBeNull();
    const mass = field(element, 'run-trial-mass').closest('mat-form-field');
    expect(text(mass?.querySelector('mat-error'))).toBe('The mass is at most 50000 g.');
    // Every message found its field: no banner.
    expect(element.querySelector('.run-entry__error')).toBeNull();
  });

  it('types a run as amplitude only: no phase fields, a plain mean, repeats sent without phase', async () => {
    const { fixture, element } = await render('initial');
    const toggles = [...element.querySelectorAll<HTMLButtonElement>('[data-testid="phase-mode"] button')];
    expect(toggles.map(text)).toEqual(['With phase', 'Amplitude only (no phase)']);
    await press(fixture, toggles[1]!);
    expect(element.querySelector('[id$="-phaseDeg"]')).toBeNull();
    expect(text(element.querySelector('.run-entry__units'))).toContain('the phase is not read');
    expect(text(summary(element, 'left'))).toBe('The mean shows once a repeat has its amplitude.');

    await type(fixture, 'run-initial-s0-r0-amplitude', '0.48');
    await type(fixture, 'run-initial-s0-r0-speedRpm', '2100');
    await press(fixture, addRepeatButton(element, 0));
    expect(element.querySelector('#run-initial-s0-r1-phaseDeg')).toBeNull();
    await type(fixture, 'run-initial-s0-r1-amplitude', '0,52');
    await type(fixture, 'run-initial-s0-r1-speedRpm', '2100');
    await type(fixture, 'run-initial-s1-r0-amplitude', '0.3');
    await type(fixture, 'run-initial-s1-r0-speedRpm', '2100');
    // The plain mean (0.48 + 0.52) / 2 = 0.5; each lies 0.02 from it: a spread of 0.02, 4 % of the mean.
    const left = text(summary(element, 'left'));
    expect(left).toContain('Mean of 2 repeats: 0.5 in/s peak · 2,100 rpm');
    expect(left).toContain('Spread 0.02 in/s peak (4 % of the mean)');
    expect(left).not.toContain('°');

    await press(fixture, saveButton(element));
    const request = http.expectOne('/api/v1/jobs/8/runs');
    expect(request.request.body).toEqual({
      kind: 'initial',
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            { amplitude: 0.48, speedRpm: 2100 },
            { amplitude: 0.52, speedRpm: 2100 },
          ],
        },
        { sensorSide: 'right', repeats: [{ amplitude: 0.3, speedRpm: 2100 }] },
      ],
    });
    request.flush({ ...JOB_BEFORE_RUNS, version: 5 }, { headers: { ETag: '"5"' } });
    await fixture.whenStable();
    await new Promise((resolve) => setTimeout(resolve));
  });

  it('starts a new run as the job’s last run was read: without phase after an amplitude-only run', async () => {
    const [initial] = JOB_AFTER_LEFT_TRIAL.runs as [JobRun];
    const readWithoutPhase: Job = {
      ...JOB_AFTER_LEFT_TRIAL,
      runs: [{ ...initial, amplitudeOnly: true }],
    };
    const { element } = await render('trial', readWithoutPhase);
    const chosen = element.querySelector('[data-testid="phase-mode"] .mat-button-toggle-checked');
    expect(text(chosen)).toBe('Amplitude only (no phase)');
    expect(element.querySelector('[id$="-phaseDeg"]')).toBeNull();
  });

  it('warns when amplitudes read without phase disagree by more than 20 % of their mean', async () => {
    const { fixture, element } = await render('initial');
    const toggles = [...element.querySelectorAll<HTMLButtonElement>('[data-testid="phase-mode"] button')];
    await press(fixture, toggles[1]!);
    await type(fixture, 'run-initial-s1-r0-amplitude', '0.2');
    await press(fixture, addRepeatButton(element, 1));
    await type(fixture, 'run-initial-s1-r1-amplitude', '0.4');
    // Mean 0.3, each 0.1 from it: the spread is a third of the mean, over 20 %.
    const right = summary(element, 'right');
    expect(text(right)).toContain('Mean of 2 repeats: 0.3 in/s peak');
    expect(text(right)).toContain('(33 % of the mean)');
    expect(text(right?.querySelector('.run-entry__warning'))).toContain(
      'their amplitudes spread by more than 20 % of their mean',
    );
  });

  it('restores the draft with all its repeats after a reload', async () => {
    TestBed.inject(JobDrafts).write(8, 'run-initial', {
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            { amplitude: '0.5', phaseDeg: '20', speedRpm: '2100' },
            { amplitude: '0.5', phaseDeg: '40', speedRpm: '2096' },
            { amplitude: '0.5', phaseDeg: '30', speedRpm: '2' },
          ],
        },
        { sensorSide: 'right', repeats: [{ amplitude: '0.3', phaseDeg: '', speedRpm: '' }] },
      ],
    });
    const { element } = await render('initial');
    expect(
      element.querySelectorAll('.run-entry__sensor')[0]?.querySelectorAll('.run-entry__repeat'),
    ).toHaveLength(3);
    expect(field(element, 'run-initial-s0-r2-phaseDeg').value).toBe('30');
    expect(field(element, 'run-initial-s0-r2-speedRpm').value).toBe('2');
    expect(field(element, 'run-initial-s1-r0-amplitude').value).toBe('0.3');
    // 0.5 at 20°, 30° and 40°: the mean points at 30°, (0.5 + 2 · 0.5 · cos 10°) / 3 = 0.4949 long.
    expect(text(summary(element, 'left'))).toContain('Average of 3 repeats: 0.495 in/s peak at 30°');
  });
});
