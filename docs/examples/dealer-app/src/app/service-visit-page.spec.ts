import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { calculate } from '@counterpoise/ng/api';
import { CpCorrectionOverlayHarness } from '@counterpoise/ng/correction-overlay/testing';
import { CpPhaseDialHarness } from '@counterpoise/ng/phase-dial/testing';
import { CpPolarPlotHarness } from '@counterpoise/ng/polar-plot/testing';
import { CpWeightCalculatorHarness } from '@counterpoise/ng/weight-calculator/testing';
import { computeOnTheDevice } from './calculator-providers';
import { ServiceVisitPage } from './service-visit-page';

// The page as a visitor uses it, through the harnesses that ship with @counterpoise/ng: the same
// harnesses Counterpoise tests its widgets with, so this test keeps working when their markup changes.
async function openPage() {
  TestBed.configureTestingModule({ providers: [computeOnTheDevice()] });
  const fixture = TestBed.createComponent(ServiceVisitPage);
  const loader = TestbedHarnessEnvironment.loader(fixture);
  return { fixture, loader };
}

// Rendering the whole calculator in jsdom takes a few seconds on a busy machine.
const SLOW = { timeout: 60_000 };

describe('the balancing visit page', SLOW, () => {
  it('computes the correction on the device and saves the visit', async () => {
    const { fixture, loader } = await openPage();

    const machine = await loader.getHarness(MatInputHarness);
    await machine.setValue('Mulcher drum, carrier 7');

    const mark = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Reference mark' }));
    await mark.focus();
    await mark.pressKey('Home');
    await mark.pressKey('ArrowLeft');
    expect(await mark.getValue()).toBe(355);

    const calculator = await loader.getHarness(CpWeightCalculatorHarness);
    await calculator.selectMethod('single-plane');
    await calculator.fill({
      'initial.amplitude': 0.44,
      'initial.phaseDeg': 212,
      'trialWeight.mass': 40,
      'trialWeight.angleDeg': 0,
      'withTrial.amplitude': 0.29,
      'withTrial.phaseDeg': 265,
    });
    await calculator.submit();

    // What the engine inside the package answers for the same readings, the trial weight coming off.
    const outcome = calculate('single-plane', {
      initial: { amplitude: 0.44, phaseDeg: 212 },
      trialWeight: { mass: 40, angleDeg: 0 },
      withTrial: { amplitude: 0.29, phaseDeg: 265 },
      trialWeightRemoved: true,
    });
    if (outcome.status !== 200) throw new Error('The readings of this test must compute.');
    const { mass, angleDeg } = outcome.result.correction;
    const result = await calculator.getResult();
    expect(result?.solver).toBe('local');
    expect(result?.corrections[0]).toMatchObject({
      mass: `${mass.toFixed(1)} g`,
      angle: `${Math.round(angleDeg) % 360}°`,
    });

    // The runs on the polar plot, and the correction on the rotor, where the technician marks with the
    // keyboard where the weight really went: two degrees on from where the crosshair starts. (The
    // calculator draws an overlay of its own; the page's is found by its label.)
    const plot = await loader.getHarness(CpPolarPlotHarness.with({ caption: 'Runs of this visit' }));
    expect(await plot.getSeriesLabels()).toEqual(['Runs', 'Trial effect']);
    const rotor = await loader.getHarness(
      CpCorrectionOverlayHarness.with({ label: 'Where the correction weight goes' }),
    );
    const start = await rotor.getCrosshair();
    await rotor.moveCrosshair(2);
    await rotor.markWithKeyboard();
    const installedAtDeg = (start.angleDeg + 2) % 360;

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save the visit' }))).click();
    const saved = (fixture.nativeElement as HTMLElement).querySelector('.saved')?.textContent ?? '';
    expect(saved).toContain('Mulcher drum, carrier 7, reference mark at 355°, computed on this device.');
    expect(saved).toContain(`The weight went on at ${installedAtDeg}°.`);
    expect(saved).toContain(`Plane 1: ${mass.toFixed(1)} g at ${angleDeg.toFixed(0)}°`);
  });

  it('saves nothing until every part is filled, and says what is missing', async () => {
    const { fixture, loader } = await openPage();
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save the visit' }))).click();

    expect((fixture.nativeElement as HTMLElement).querySelector('.saved')).toBeNull();
    const mark = await loader.getHarness(CpPhaseDialHarness);
    expect(await mark.isInvalid()).toBe(true);
    expect(await mark.getErrorText()).toBe('Set where the reference mark sits.');
    const calculator = await loader.getHarness(CpWeightCalculatorHarness);
    expect(await calculator.getErrors()).toContain('Enter the initial amplitude.');
  });

  it('offers the methods the dealer chose', async () => {
    const { loader } = await openPage();
    const calculator = await loader.getHarness(CpWeightCalculatorHarness);
    expect(await calculator.getMethodLabels()).toEqual(['Trial weight', 'Stored sensitivity']);
  });
});
