import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { CpPhaseDial } from '@counterpoise/ng/phase-dial';
import { describe, expect, it } from 'vitest';
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
});
