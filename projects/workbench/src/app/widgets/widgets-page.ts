import { ChangeDetectionStrategy, Component, computed, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatCardModule } from '@angular/material/card';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import type { OverlayPoint } from '@counterpoise/ng/correction-overlay';
import { CpCorrectionOverlay } from '@counterpoise/ng/correction-overlay';
import { CpPhaseDial } from '@counterpoise/ng/phase-dial';
import { CpPolarPlot, type PolarSeries } from '@counterpoise/ng/polar-plot';
import {
  CpWeightCalculator,
  METHOD_INFO,
  type WeightCalculation,
  type WeightCalculatorErrors,
  type WeightCalculatorValue,
} from '@counterpoise/ng/weight-calculator';
import { DEMO_ROTOR } from './demo-rotor';

/**
 * The four widgets of `@counterpoise/ng` at work on one rotor of the demo scenario, as a dealer would
 * embed them: the phase dial in a reactive form, the correction overlay, the polar plot of the runs and
 * the weight calculator, a control of its own form whose value the page shows.
 */
@Component({
  selector: 'app-widgets-page',
  imports: [
    CpCorrectionOverlay,
    CpPhaseDial,
    CpPolarPlot,
    CpWeightCalculator,
    MatCardModule,
    MatSlideToggleModule,
    ReactiveFormsModule,
  ],
  templateUrl: './widgets-page.html',
  styleUrl: './widgets-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WidgetsPage {
  protected readonly rotor = DEMO_ROTOR;
  /** The phase of the last reading, as a technician would set it on the dial. */
  protected readonly phase = new FormControl<number | null>(DEMO_ROTOR.initial.phaseDeg, Validators.required);
  protected readonly counterClockwise = signal(false);
  protected readonly rotation = computed(() => (this.counterClockwise() ? 'counterClockwise' : 'clockwise'));
  /** Where the technician marked the weight really went, on the overlay. */
  protected readonly installedAt = signal<OverlayPoint | null>(null);

  /** The calculator's value: what was typed, and the calculation that matches it. */
  protected readonly correction = new FormControl<WeightCalculatorValue | null>(null);
  private readonly _correctionEvents = toSignal(this.correction.events, { initialValue: null });
  /** What the page reads from the calculator's control, in words. */
  protected readonly correctionState = computed(() => {
    this._correctionEvents();
    return describeCorrectionControl(this.correction.value, this.correction.errors);
  });

  protected readonly series: readonly PolarSeries[] = [
    {
      id: 'initial',
      label: 'Initial run',
      kind: 'reading',
      unit: DEMO_ROTOR.amplitudeUnit,
      points: [{ ...toPoint(DEMO_ROTOR.initial), label: 'Drive end' }],
    },
    {
      id: 'trial',
      label: 'With trial weight',
      kind: 'run',
      unit: DEMO_ROTOR.amplitudeUnit,
      points: [{ ...toPoint(DEMO_ROTOR.withTrial), label: 'Drive end' }],
    },
    {
      id: 'effect',
      label: 'Trial effect',
      kind: 'trialEffect',
      unit: DEMO_ROTOR.amplitudeUnit,
      points: [{ ...toPoint(DEMO_ROTOR.withTrial), from: toPoint(DEMO_ROTOR.initial) }],
    },
    {
      id: 'after',
      label: 'After correction',
      kind: 'residual',
      unit: DEMO_ROTOR.amplitudeUnit,
      points: [{ ...toPoint(DEMO_ROTOR.afterCorrection), label: 'Drive end' }],
    },
  ];
}

function toPoint(reading: { amplitude: number; phaseDeg: number }) {
  return { amplitude: reading.amplitude, angleDeg: reading.phaseDeg };
}

/** The calculation's weights in one line: "84.2 g at 253°", "Plane 1: 52.0 g at 12°, plane 2: ...". */
export function correctionText(calculation: WeightCalculation): string {
  const at = (mass: number, angleDeg: number) =>
    `${mass.toFixed(1)} ${calculation.massUnit} at ${Math.round(angleDeg) % 360}°`;
  if (calculation.method !== 'multi-plane') {
    return at(calculation.result.correction.mass, calculation.result.correction.angleDeg);
  }
  return calculation.result.corrections
    .map(
      (weight, index) =>
        `${index === 0 ? 'Plane' : 'plane'} ${weight.plane}: ${at(weight.mass, weight.angleDeg)}`,
    )
    .join(', ');
}

/** The calculator's form control as the page tells it: the method, the correction, or what is missing. */
export function describeCorrectionControl(
  value: WeightCalculatorValue | null,
  errors: WeightCalculatorErrors | null,
): { readonly method: string; readonly correction: string; readonly status: string } {
  const fields = errors?.calculatorFields;
  return {
    method: value === null ? 'nothing typed yet' : METHOD_INFO[value.draft.method].label,
    correction: value?.calculation ? correctionText(value.calculation) : 'not computed',
    status:
      fields !== undefined
        ? `${fields.count} ${fields.count === 1 ? 'value' : 'values'} to enter or correct`
        : errors?.calculatorNotComputed
          ? 'compute the correction for these values'
          : 'ready to save with the job',
  };
}
