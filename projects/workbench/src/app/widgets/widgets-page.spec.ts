import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { CALC_ROUTES, calculate } from '@counterpoise/api';
import { CpWeightCalculatorHarness } from '@counterpoise/ng/weight-calculator/testing';
import { describe, expect, it } from 'vitest';
import { DEMO_ROTOR } from './demo-rotor';
import { WidgetsPage, correctionText, describeCorrectionControl } from './widgets-page';

// Rendering the four widgets in jsdom takes a few seconds on a busy machine; the limit only stops a hung test.
const SLOW = { timeout: 60_000 };

async function render() {
  const fixture = TestBed.createComponent(WidgetsPage);
  const calculator = await TestbedHarnessEnvironment.loader(fixture).getHarness(CpWeightCalculatorHarness);
  const text = (id: string) =>
    (fixture.nativeElement as HTMLElement).querySelector(`[data-testid="${id}"]`)?.textContent?.trim();
  return { fixture, calculator, text };
}

describe('WidgetsPage', SLOW, () => {
  it("shows the calculator's form value: nothing, then the values typed, then the correction", async () => {
    const { calculator, text } = await render();
    expect(text('correction-method')).toBe('nothing typed yet');
    expect(text('correction-value')).toBe('not computed');

    await calculator.selectMethod('single-plane');
    // The demo rotor's trial weight sits on a holder, as the calculator asks when holders are given.
    await calculator.fill({
      'initial.amplitude': DEMO_ROTOR.initial.amplitude,
      'initial.phaseDeg': DEMO_ROTOR.initial.phaseDeg,
      'trialWeight.mass': DEMO_ROTOR.trialWeight.mass,
    });
    expect(text('correction-method')).toBe('Trial weight');
    expect(text('correction-status')).toBe('3 values to enter or correct');

    await calculator.fill({
      'trialWeight.angleDeg': DEMO_ROTOR.holders.firstDeg,
      'withTrial.amplitude': DEMO_ROTOR.withTrial.amplitude,
      'withTrial.phaseDeg': DEMO_ROTOR.withTrial.phaseDeg,
    });
    expect(text('correction-status')).toBe('compute the correction for these values');
    await calculator.submit();
    const result = await calculator.getResult();
    expect(text('correction-value')).toBe(
      `${result?.corrections[0]?.mass} at ${result?.corrections[0]?.angle}`,
    );
    expect(text('correction-status')).toBe('ready to save with the job');
  });

  it('counts what is missing, and names the planes of a two-plane correction', () => {
    expect(
      describeCorrectionControl(null, {
        calculatorFields: { count: 1, fields: [] },
        calculatorNotComputed: true,
      }),
    ).toEqual({
      method: 'nothing typed yet',
      correction: 'not computed',
      status: '1 value to enter or correct',
    });

    const request = CALC_ROUTES['multi-plane'].example;
    const outcome = calculate('multi-plane', request);
    if (outcome.status !== 200) throw new Error('The API example must compute.');
    const [one, two] = outcome.result.corrections;
    const calculation = {
      method: 'multi-plane',
      request,
      result: outcome.result,
      placements: [],
      solver: 'local',
      massUnit: 'oz',
      amplitudeUnit: 'mm/s',
    } as const;
    const at = (weight: typeof one) =>
      `${weight!.mass.toFixed(1)} oz at ${Math.round(weight!.angleDeg) % 360}°`;
    expect(correctionText(calculation)).toBe(`Plane 1: ${at(one)}, plane 2: ${at(two)}`);
  });
});
