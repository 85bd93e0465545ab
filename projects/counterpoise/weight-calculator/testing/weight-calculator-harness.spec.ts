import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { describe, expect, it } from 'vitest';
import { provideCounterpoise } from '@counterpoise/ng/solver';
import { CpWeightCalculator } from '@counterpoise/ng/weight-calculator';
import { CpWeightCalculatorHarness } from './weight-calculator-harness';

@Component({
  imports: [CpWeightCalculator],
  template: `
    <cp-weight-calculator method="four-run" />
    <cp-weight-calculator method="one-run" [methods]="['one-run']" />
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class TwoCalculators {}

async function loader() {
  TestBed.configureTestingModule({ providers: [provideCounterpoise({ solver: 'local' })] });
  return TestbedHarnessEnvironment.loader(TestBed.createComponent(TwoCalculators));
}

describe('CpWeightCalculatorHarness', { timeout: 60_000 }, () => {
  it('finds a calculator by the method it shows', async () => {
    const found = await loader();
    expect(await found.getAllHarnesses(CpWeightCalculatorHarness)).toHaveLength(2);
    const oneRun = await found.getHarness(CpWeightCalculatorHarness.with({ method: 'one-run' }));
    expect(await oneRun.getMethodLabels()).toEqual([]);
    expect(await found.getAllHarnesses(CpWeightCalculatorHarness.with({ method: 'multi-plane' }))).toEqual(
      [],
    );
  });

  it('reads what was typed back, and names a field it cannot find', async () => {
    const calculator = await (
      await loader()
    ).getHarness(CpWeightCalculatorHarness.with({ method: 'four-run' }));
    await calculator.fill({ trialMass: 50, 'trialRuns.1.angleDeg': 130 });
    expect(await calculator.getFieldValue('trialMass')).toBe('50');
    expect(await calculator.getFieldValue('trialRuns.1.angleDeg')).toBe('130');
    await expect(calculator.setField('initial.amplitude', 1)).rejects.toThrow(
      'The weight calculator shows no field "initial.amplitude".',
    );
    await expect(calculator.useLocalEngine()).rejects.toThrow(/does not offer/);
    expect(await calculator.getResult()).toBeNull();
    expect(await calculator.getFailure()).toBeNull();
  });
});
