import { ChangeDetectionStrategy, Component, computed, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatCardModule } from '@angular/material/card';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import type { OverlayPoint } from '@counterpoise/ng/correction-overlay';
import { CpCorrectionOverlay } from '@counterpoise/ng/correction-overlay';
import { CpPhaseDial } from '@counterpoise/ng/phase-dial';
import { CpPolarPlot, type PolarSeries } from '@counterpoise/ng/polar-plot';
import { CpWeightCalculator } from '@counterpoise/ng/weight-calculator';
import { DEMO_ROTOR } from './demo-rotor';

/**
 * The four widgets of `@counterpoise/ng` at work on one rotor of the demo scenario, as a dealer would
 * embed them: the phase dial in a reactive form, the correction overlay, the polar plot of the runs and
 * the weight calculator.
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
