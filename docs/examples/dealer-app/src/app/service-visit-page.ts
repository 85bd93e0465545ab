import { ChangeDetectionStrategy, Component, computed, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { CpSafetyNotice } from '@counterpoise/ng/core';
import {
  CpCorrectionOverlay,
  type OverlayPoint,
  type OverlayWeight,
} from '@counterpoise/ng/correction-overlay';
import { CpPhaseDial } from '@counterpoise/ng/phase-dial';
import { CpPolarPlot, type PolarSeries, type PolarValue } from '@counterpoise/ng/polar-plot';
import {
  CpWeightCalculator,
  type WeightCalculation,
  type WeightCalculatorValue,
} from '@counterpoise/ng/weight-calculator';

/** A correction weight as the visit record keeps it. */
export interface VisitWeight {
  /** The correction plane, from 1. */
  readonly plane: number;
  /** The mass, in the calculation's mass unit. */
  readonly mass: number;
  /** The angle from the reference mark, in degrees. */
  readonly angleDeg: number;
}

/** What the page saves for a service visit. */
export interface ServiceVisit {
  /** The customer's machine, as the technician names it. */
  readonly machine: string;
  /** Where the reference mark sits on the rotor, read from the dial, in degrees. */
  readonly referenceMarkDeg: number;
  /** The correction weights of the calculation. */
  readonly weights: readonly VisitWeight[];
  /** The unit of the masses. */
  readonly massUnit: string;
  /** Where the calculation ran: on the device or on the server. */
  readonly computed: string;
  /** Where the technician marked that the weight really went, when they did. */
  readonly installedAtDeg: number | null;
}

/** The correction weights of a calculation, one per plane. */
export function weightsOf(calculation: WeightCalculation): VisitWeight[] {
  const result = calculation.result;
  if ('corrections' in result) {
    return result.corrections.map(({ plane, mass, angleDeg }) => ({ plane, mass, angleDeg }));
  }
  return [{ plane: 1, mass: result.correction.mass, angleDeg: result.correction.angleDeg }];
}

/** A reading (amplitude and phase) as a vector of the polar plot. */
function vector(reading: { readonly amplitude: number; readonly phaseDeg: number }): PolarValue {
  return { amplitude: reading.amplitude, angleDeg: reading.phaseDeg };
}

/**
 * The readings of a calculation as the polar plot draws them: the runs as read and, for the trial-weight
 * method, the trial weight's effect, drawn from the first run so that it ends on the second.
 */
export function runsOf(calculation: WeightCalculation): PolarSeries[] {
  const unit = calculation.amplitudeUnit;
  if (calculation.method === 'single-plane') {
    const { initial, withTrial } = calculation.request;
    return [
      {
        id: 'runs',
        label: 'Runs',
        kind: 'run',
        unit,
        points: [
          { label: 'Run 1', ...vector(initial) },
          { label: 'Run 2', ...vector(withTrial) },
        ],
      },
      {
        id: 'trial-effect',
        label: 'Trial effect',
        kind: 'trialEffect',
        unit,
        points: [{ ...vector(calculation.result.trialEffect), from: vector(initial) }],
      },
    ];
  }
  if (calculation.method === 'one-run') {
    const reading = vector(calculation.request.reading);
    return [{ id: 'runs', label: 'Runs', kind: 'run', unit, points: [{ label: 'Run 1', ...reading }] }];
  }
  return [];
}

/** A dealer's page for one balancing visit: the machine, the reference mark, and the correction weight. */
@Component({
  selector: 'kb-root',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    CpSafetyNotice,
    CpPhaseDial,
    CpWeightCalculator,
    CpCorrectionOverlay,
    CpPolarPlot,
  ],
  templateUrl: './service-visit-page.html',
  styleUrl: './service-visit-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ServiceVisitPage {
  protected readonly form = new FormGroup({
    machine: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    referenceMarkDeg: new FormControl<number | null>(null, Validators.required),
    correction: new FormControl<WeightCalculatorValue | null>(null, Validators.required),
    installedAt: new FormControl<OverlayPoint | null>(null),
  });

  private readonly correctionValue = toSignal(this.form.controls.correction.valueChanges, {
    initialValue: null,
  });

  /** The calculation of the values typed, once there is one. */
  protected readonly calculation = computed(() => this.correctionValue()?.calculation ?? null);

  /** The correction weights, as the overlay shows them on the rotor. */
  protected readonly overlayWeights = computed<OverlayWeight[]>(() => {
    const calculation = this.calculation();
    if (!calculation) return [];
    return weightsOf(calculation).map(({ mass, angleDeg }) => ({
      mass,
      angleDeg,
      unit: calculation.massUnit,
    }));
  });

  /** The runs, as the polar plot shows them. */
  protected readonly runs = computed(() => {
    const calculation = this.calculation();
    return calculation ? runsOf(calculation) : [];
  });

  /** The last visit saved, shown under the form. */
  protected readonly saved = signal<ServiceVisit | null>(null);

  protected save(): void {
    const { machine, referenceMarkDeg, correction, installedAt } = this.form.getRawValue();
    const calculation = correction?.calculation;
    if (this.form.invalid || referenceMarkDeg === null || !calculation) {
      this.form.markAllAsTouched();
      return;
    }
    this.saved.set({
      machine,
      referenceMarkDeg,
      weights: weightsOf(calculation),
      massUnit: calculation.massUnit,
      computed: calculation.solver === 'local' ? 'on this device' : 'on the Counterpoise server',
      installedAtDeg: installedAt?.angleDeg ?? null,
    });
  }
}
