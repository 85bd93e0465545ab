import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  inject,
  Injector,
  input,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import type { MachineSide } from '@counterpoise/api';
import type { RotationCounting, RotationDirection } from '@counterpoise/ng/core';
import { CpPolarPlot, type PolarSeries } from '@counterpoise/ng/polar-plot';
import type { Machine } from '../../machines/machines.api';
import {
  AMPLITUDE_UNIT_LABELS,
  formatDeg,
  formatNumber,
  opposite,
  planeName,
  SIDE_LABELS,
} from '../../records/record-labels';
import type { AddRun, Job, JobRun } from '../jobs.api';
import type { JobChange } from '../job-session';
import { RUN_KIND_LABELS, RunEntry } from '../run-entry';
import { planeCountOf } from '../job-labels';
import { openReadingsImport } from '../readings-import/readings-import-dialog';

/** A weight in words: "120 g at 0° in the left plane". */
export function describeWeight(
  weight: { readonly planeIndex: number; readonly massGrams: number; readonly angleDeg: number },
  planeCount: number,
): string {
  const plane = planeName(weight.planeIndex, planeCount);
  const where = planeCount <= 1 ? 'in the plane' : `in the ${plane.toLowerCase()}`;
  return `${formatNumber(weight.massGrams, 0)} g at ${formatDeg(weight.angleDeg)} ${where}`;
}

/** How the rotor turns and how its angles count as seen from one sensor's end, for a polar plot. */
export function plotConvention(
  job: Job,
  side: MachineSide,
): { rotation: RotationDirection; counting: RotationCounting } {
  const fromLeft = job.setup?.rotationSeenFromLeft ?? 'clockwise';
  // A phase lag counts against the rotation, a lead with it.
  return {
    rotation: side === 'left' ? fromLeft : opposite(fromLeft),
    counting: job.setup?.phaseSense === 'lead' ? 'withRotation' : 'againstRotation',
  };
}

/** Every run's average at one sensor, as the points of one series of the polar plot. */
export function runSeries(job: Job, side: MachineSide): PolarSeries {
  const unit = job.setup ? AMPLITUDE_UNIT_LABELS[job.setup.amplitudeUnit] : '';
  return {
    id: `runs-${side}`,
    label: `${SIDE_LABELS[side]} sensor`,
    kind: 'run',
    unit,
    // A run read without phase has no point on a polar plot: its amplitude shows in the run's card.
    points: job.runs.flatMap((run) => {
      const reading = run.readings.find((candidate) => candidate.sensorSide === side);
      return reading && reading.average.phaseDeg !== null
        ? [
            {
              amplitude: reading.average.amplitude,
              angleDeg: reading.average.phaseDeg,
              label: `Run ${run.sequence}`,
            },
          ]
        : [];
    }),
  };
}

/**
 * The runs step of a job: every run in order with what it was (the trial weight, the weights on the rotor),
 * each sensor's average, speed, repeats and spread, whether it is trusted and what the server warned of; a
 * polar plot per sensor of every run; the entry of the initial run while there is none, then a trial run for
 * the technician who wants one here.
 */
@Component({
  selector: 'app-job-runs-step',
  imports: [CpPolarPlot, DatePipe, MatButtonModule, MatIconModule, RunEntry],
  templateUrl: './runs-step.html',
  styleUrl: './runs-step.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobRunsStep {
  /** The job as stored. */
  readonly job = input.required<Job>();
  /** The job's machine, for its planes; undefined while it is fetched. */
  readonly machine = input<Machine>();
  /** Whether the signed-in person may change this job now. */
  readonly editable = input(false);

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly dialog = inject(MatDialog);
  private readonly injector = inject(Injector);

  protected readonly kindLabels = RUN_KIND_LABELS;
  protected readonly sideLabels = SIDE_LABELS;
  protected readonly formatNumber = formatNumber;
  protected readonly formatDeg = formatDeg;

  /** Whether the trial run's form is open. */
  protected readonly addingTrial = signal(false);

  protected readonly unit = computed(() => {
    const setup = this.job().setup;
    return setup ? AMPLITUDE_UNIT_LABELS[setup.amplitudeUnit] : '';
  });
  protected readonly planeCount = computed(() => planeCountOf(this.job(), this.machine()));
  protected readonly runs = computed(() => [...this.job().runs].sort((a, b) => a.sequence - b.sequence));
  protected readonly hasInitial = computed(() => this.job().runs.some((run) => run.kind === 'initial'));
  /** One polar plot per sensor of the set-up, with every run's average at that sensor. */
  protected readonly plots = computed(() => {
    const job = this.job();
    return (job.setup?.sensors ?? []).map((sensor) => ({
      side: sensor.side,
      caption: `${SIDE_LABELS[sensor.side]} sensor: every run`,
      series: [runSeries(job, sensor.side)],
      ...plotConvention(job, sensor.side),
    }));
  });

  /** The run whose readings are being typed again; null when none is. */
  protected readonly correcting = signal<number | null>(null);
  /**
   * The run whose readings may be typed again: the latest one, while no correction was computed from it
   * (the server refuses it otherwise, 409 RUN_IN_USE).
   */
  protected readonly correctable = computed(() => {
    const latest = this.runs().at(-1);
    if (!latest || !this.editable()) return null;
    const used = this.job().corrections.some((correction) => correction.runIds.includes(latest.id));
    return used ? null : latest.id;
  });

  /** How the retyped readings of the run being corrected are stored: in its place, with what was typed before. */
  protected readonly retype = computed(() => {
    const runId = this.correcting();
    if (runId === null) return undefined;
    return (typed: AddRun): JobChange =>
      (api, id, etag) =>
        api.correctRunReadings(
          id,
          runId,
          typed.trialWeight
            ? { readings: typed.readings, trialWeight: typed.trialWeight }
            : { readings: typed.readings },
          etag,
        );
  });

  protected weightText(weight: JobRun['weightsOnRotor'][number]): string {
    return describeWeight(weight, this.planeCount());
  }

  /** Opens or closes the trial run's form, taking the keyboard's focus to it or back to its button. */
  protected showTrial(open: boolean): void {
    this.addingTrial.set(open);
    this.focusLater(open ? '#trial-run-heading' : '.runs-step__add-trial');
  }

  /**
   * Opens the import of a readings file; the dialog reaches the page's JobSession through this step's
   * injector, and the job shows as stored once it is imported.
   */
  protected importReadings(): void {
    openReadingsImport(this.dialog, this.injector, { planeCount: this.planeCount() });
  }

  /** Opens or closes the correction of a run's readings, with the focus likewise. */
  protected showCorrection(runId: number | null): void {
    const closing = this.correcting();
    this.correcting.set(runId);
    this.focusLater(
      runId !== null
        ? `#correct-run-heading-${runId}`
        : `.run[data-run-id="${closing}"] .run__correct-button`,
    );
  }

  private focusLater(selector: string): void {
    // After the next render, once the form (or the button) is there again.
    setTimeout(() => this.host.nativeElement.querySelector<HTMLElement>(selector)?.focus());
  }
}
