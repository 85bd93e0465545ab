import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import type { OverlayWeight } from '@counterpoise/ng/correction-overlay';
import { CpCorrectionOverlay } from '@counterpoise/ng/correction-overlay';
import { of } from 'rxjs';
import { ErrorBanner } from '../forms/error-banner';
import { jobDate } from '../jobs/job-dates';
import { JOB_STATUS_LABELS, machineTitle } from '../jobs/job-labels';
import {
  AMPLITUDE_UNIT_LABELS,
  describeAcceptance,
  formatDeg,
  formatNumber,
  opposite,
  planeName,
  planeSide,
  SIDE_LABELS,
} from '../records/record-labels';
import { idFromRoute } from '../records/record-page';
import { httpErrorMessage } from '../shell/server-errors';
import { convertedJobs, formatAmplitude, unitLabel } from './history-chart-model';
import { HistoryChart } from './history-chart';
import {
  type MachineHistory,
  MachineHistoryApi,
  type MachineHistoryJob,
  type MachineHistorySide,
} from './machine-history.api';

/** The methods of correction in the words the job's steps use. */
const METHOD_LABELS: Readonly<Record<MachineHistoryJob['methods'][number], string>> = {
  'one-run': 'One run (stored sensitivity)',
  'single-plane': 'Trial weight, one plane',
  'multi-plane': 'Trial weights, two planes',
  'four-run': 'Amplitude only (four runs)',
};

/** A reading in a table cell: amplitude and unit, and the phase and speed it was read at. */
export interface ReadingCell {
  readonly amplitude: string;
  readonly detail: string;
}

/**
 * A machine's history: a chart of each side's amplitude before and after every job over time with the
 * acceptance limit, the same figures in a table (the chart's accessible equivalent), the weights on the
 * rotor now drawn on each plane's end view, and the family's stored sensitivity with what it means.
 */
@Component({
  selector: 'app-machine-history-page',
  imports: [
    CpCorrectionOverlay,
    ErrorBanner,
    HistoryChart,
    MatButtonModule,
    MatIconModule,
    MatProgressSpinnerModule,
    RouterLink,
  ],
  templateUrl: './machine-history-page.html',
  styleUrl: './machine-history-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MachineHistoryPage {
  /** The machine's id, from the address. */
  readonly id = input<string>();

  private readonly api = inject(MachineHistoryApi);
  private readonly resource = rxResource({
    params: () => ({ id: idFromRoute(this.id()) }),
    stream: ({ params }) => (params.id === null ? of(null) : this.api.history(params.id)),
  });
  protected readonly history = computed<MachineHistory | null>(() =>
    this.resource.hasValue() ? this.resource.value() : null,
  );
  protected readonly notFound = computed(
    () => idFromRoute(this.id()) === null || (this.resource.hasValue() && this.resource.value() === null),
  );
  protected readonly error = computed(() => {
    const error = this.resource.error();
    return error === undefined ? null : httpErrorMessage(error);
  });
  protected readonly title = computed(() => {
    const history = this.history();
    return history === null ? '' : machineTitle(history.machine);
  });
  protected readonly newestFirst = computed(() => [...(this.history()?.jobs ?? [])].reverse());
  protected readonly hasReadings = computed(() =>
    (this.history()?.jobs ?? []).some((job) => job.sides.some((side) => side.before !== null)),
  );
  protected readonly converted = computed(() => {
    const history = this.history();
    return history === null ? [] : convertedJobs(history);
  });
  /** The units the converted jobs were read in, in words. */
  protected readonly convertedUnits = computed(() =>
    [...new Set(this.converted().map((job) => unitLabel(job.unit)))].join(', '),
  );

  /** The weights on the rotor, plane by plane, with the plane's end view. */
  protected readonly planes = computed(() => {
    const history = this.history();
    if (history === null || history.weightsOnRotor === null) return [];
    const { machine } = history;
    const counting =
      history.jobs.find((job) => job.id === history.weightsOnRotor!.jobId)?.weightAngles ?? 'againstRotation';
    return machine.planes.map((plane, index) => {
      const side = planeSide(index, machine.planes.length);
      const weights = history.weightsOnRotor!.weights.filter((weight) => weight.planeIndex === index);
      return {
        index,
        name: planeName(index, machine.planes.length),
        side,
        rotation: side === 'left' ? machine.rotationSeenFromLeft : opposite(machine.rotationSeenFromLeft),
        counting,
        positions: plane.positions
          ? { count: plane.positions.count, firstDeg: plane.positions.firstDeg }
          : null,
        blockedSectors: plane.blockedSectors,
        weights,
        overlay: weights.map((weight): OverlayWeight => ({
          mass: Number(weight.massGrams.toFixed(1)),
          angleDeg: weight.angleDeg,
          unit: 'g',
          label: `Job ${weight.jobId}`,
        })),
      };
    });
  });

  protected readonly statusLabels = JOB_STATUS_LABELS;
  protected readonly sideLabels = SIDE_LABELS;
  protected readonly unitLabels = AMPLITUDE_UNIT_LABELS;
  protected readonly methodLabels = METHOD_LABELS;
  protected readonly describeAcceptance = describeAcceptance;
  protected readonly formatNumber = formatNumber;
  protected readonly formatDeg = formatDeg;
  protected readonly jobDate = jobDate;
  protected readonly planeName = planeName;
  protected readonly unitLabel = unitLabel;

  protected reload(): void {
    this.resource.reload();
  }

  /** A side's reading of a job for the table: before or after. */
  protected reading(
    job: MachineHistoryJob,
    side: MachineHistorySide,
    stage: 'before' | 'after',
  ): ReadingCell | null {
    const reading = side[stage];
    if (reading === null) return null;
    const phase = reading.phaseDeg === null ? 'no phase' : formatDeg(reading.phaseDeg);
    return {
      amplitude: `${formatAmplitude(reading.amplitude)} ${unitLabel(job.unit)}`,
      detail: `${phase} · ${formatNumber(reading.speedRpm, 0)} rpm`,
    };
  }

  /** A side's limit and verdict in words. */
  protected verdict(job: MachineHistoryJob, side: MachineHistorySide): string {
    const limit =
      side.limit === null
        ? 'no limit as an amplitude'
        : `limit ${formatAmplitude(side.limit)} ${unitLabel(job.unit)}`;
    if (side.accepted === null) return `${limit[0]!.toUpperCase()}${limit.slice(1)}`;
    return `${side.accepted ? 'Within' : 'Above'} the ${limit}`;
  }

  /** The job's methods in words. */
  protected methods(job: MachineHistoryJob): string {
    return job.methods.length === 0 ? '—' : job.methods.map((method) => this.methodLabels[method]).join(', ');
  }

  /** The plane of a weight, for the family's figures and the weights' table. */
  protected planeLabel(index: number): string {
    return planeName(index, this.history()?.machine.planes.length ?? 1);
  }

  /** What a stored figure means for the next job, in one sentence. */
  protected meaning(history: MachineHistory): string | null {
    const figure = history.family?.sensitivities[0];
    if (figure === undefined) return null;
    const spread =
      figure.spread === null ? '' : `, give or take ${formatNumber(figure.spread.massPercent, 0)} %`;
    return (
      `On a machine of this family, about ${formatNumber(figure.gramsPerUnit, 0)} g at the correction radius of ` +
      `the ${planeName(figure.planeIndex, history.machine.planes.length).toLowerCase()} moves the ` +
      `${SIDE_LABELS[figure.sensorSide].toLowerCase()} reading by 1 ${AMPLITUDE_UNIT_LABELS[figure.unit]}` +
      `${spread}, so a one-run correction from these figures is a first estimate, to be verified by a run.`
    );
  }

  protected acceptanceOf(job: MachineHistoryJob): string {
    return job.acceptance === null ? 'No acceptance level' : describeAcceptance(job.acceptance);
  }

  protected verdictOfJob(job: MachineHistoryJob): string {
    if (job.accepted === null) return job.status === 'completed' ? 'Not judged' : 'Not finished';
    return job.accepted ? 'Within the level' : 'Above the level';
  }
}
