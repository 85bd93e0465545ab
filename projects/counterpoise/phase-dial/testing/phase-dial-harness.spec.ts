import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { CpPhaseDial } from '@counterpoise/ng/phase-dial';
import { describe, expect, it, vi } from 'vitest';
import { INITIAL_RUN_PHASE_MESSAGE, SIX_HOLDERS } from '../phase-dial.fixtures';
import { CpPhaseDialHarness } from './phase-dial-harness';

@Component({
  imports: [CpPhaseDial],
  template: `
    <cp-phase-dial label="Reading, sensor A" [value]="212" readonly />
    <cp-phase-dial label="Reading, sensor B" [value]="37.5" step="0.5" />
    <cp-phase-dial label="Correction" required zeroAtDeg="90" />
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {}

@Component({
  imports: [CpPhaseDial, ReactiveFormsModule],
  template: `
    <cp-phase-dial label="Phase, run 1" compact [formControl]="phase" [errorText]="message" />
    <cp-phase-dial label="Holder" [formControl]="holder" [positions]="holders" />
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class FormHost {
  readonly phase = new FormControl<number | null>(null, Validators.required);
  readonly holder = new FormControl<number | null>(100);
  readonly holders = SIX_HOLDERS;
  readonly message = INITIAL_RUN_PHASE_MESSAGE;
}

async function setUp() {
  const fixture = TestBed.createComponent(Host);
  return TestbedHarnessEnvironment.loader(fixture);
}

describe('CpPhaseDialHarness', () => {
  it('finds dials by accessible name, pattern or angle', async () => {
    const loader = await setUp();
    expect(await loader.getAllHarnesses(CpPhaseDialHarness)).toHaveLength(3);
    expect(await loader.getAllHarnesses(CpPhaseDialHarness.with({ label: /^Reading/ }))).toHaveLength(2);
    const byValue = await loader.getHarness(CpPhaseDialHarness.with({ value: 37.5 }));
    expect(await byValue.getLabel()).toBe('Reading, sensor B');
    const empty = await loader.getHarness(CpPhaseDialHarness.with({ value: null }));
    expect(await empty.getLabel()).toBe('Correction');
  });

  it('reaches half degrees with Page keys and arrows on a dial with a fine step', async () => {
    const loader = await setUp();
    const dial = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Reading, sensor B' }));
    await dial.setValue(123.5);
    expect(await dial.getValue()).toBe(123.5);
    expect(await dial.getMax()).toBe(359.5);
  });

  it('drags an empty dial from the target itself', async () => {
    const loader = await setUp();
    const dial = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Correction' }));
    await dial.dragTo(-45);
    expect(await dial.getValue()).toBe(315);
  });

  it('takes its flags and numbers as plain attributes', async () => {
    const loader = await setUp();
    const correction = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Correction' }));
    const reading = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Reading, sensor A' }));
    expect(await correction.isRequired()).toBe(true);
    expect(await correction.getDescription()).toContain('The reference mark is on the right.');
    expect(await reading.isReadonly()).toBe(true);
  });

  it('refuses to set a read-only dial and to type without a numeric field', async () => {
    const loader = await setUp();
    const dial = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Reading, sensor A' }));
    await expect(dial.setValue(10)).rejects.toThrow(/read-only/);
    await expect(dial.typeInField('10')).rejects.toThrow(/not compact/);
    await expect(dial.getFieldText()).rejects.toThrow(/not compact/);
    expect(await dial.getMarkers()).toEqual([]);
  });

  it('reads the error a dial shows, and whether it is in error state', async () => {
    const fixture = TestBed.createComponent(FormHost);
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const phase = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Phase, run 1' }));
    const holder = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Holder' }));
    expect(await phase.isInvalid()).toBe(false);
    expect(await phase.getErrorText()).toBeNull();

    await phase.typeInField('');
    expect(await phase.isInvalid()).toBe(true);
    expect(await phase.getErrorText()).toBe(INITIAL_RUN_PHASE_MESSAGE);
    const formField = (await phase.getFormField())!;
    expect(await formField.getTextErrors()).toEqual([INITIAL_RUN_PHASE_MESSAGE]);

    fixture.componentInstance.holder.markAsTouched();
    expect(await holder.getErrorText()).toBe(
      'Choose one of the allowed positions: 0°, 60°, 120°, 180°, 240°, 300°.',
    );
    expect(await holder.getFormField()).toBeNull();
  });

  it('measures the dial as laid out', async () => {
    const fixture = TestBed.createComponent(Host);
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const dial = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Correction' }));
    const slider: HTMLElement = fixture.nativeElement.querySelectorAll('[role="slider"]')[2];
    // The test DOM lays nothing out: give the dial the box a browser would.
    vi.spyOn(slider, 'getBoundingClientRect').mockReturnValue(new DOMRect(10, 20, 168, 168));
    expect(await dial.getSizePx()).toBe(168);
  });
});
