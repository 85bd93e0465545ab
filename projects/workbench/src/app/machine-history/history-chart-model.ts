import type { AmplitudeUnit, MachineSide } from '@counterpoise/api';
import { jobDate } from '../jobs/job-dates';
import { AMPLITUDE_UNIT_LABELS, formatNumber, SIDE_LABELS } from '../records/record-labels';
import type { MachineHistory, MachineHistoryJob } from './machine-history.api';

/*
 * What the history's chart draws, worked out without chart.js: one series per side and stage (before,
 * after) of the amplitudes in the history's unit over the jobs' dates, and the acceptance limit (one line
 * when both sides share it, one per side otherwise), with a sentence that says the same for a screen
 * reader.
 */

/** What a series shows. */
export type SeriesStage = 'before' | 'after' | 'limit';

/** One point: the job's day (ms since the epoch, UTC midnight), the amplitude, and the job. */
export interface HistoryPoint {
  readonly x: number;
  readonly y: number;
  readonly jobId: number;
}

/** One line of the chart. */
export interface HistorySeries {
  readonly key: string;
  readonly label: string;
  /** The side, or null for a limit both sides share. */
  readonly side: MachineSide | null;
  readonly stage: SeriesStage;
  readonly points: readonly HistoryPoint[];
}

/** The day of a job as the chart's x value. */
export function dayValue(iso: string): number {
  return Date.parse(`${iso}T00:00:00Z`);
}

function pointsOf(
  jobs: readonly MachineHistoryJob[],
  side: MachineSide,
  pick: (figures: MachineHistoryJob['sides'][number]['inHistoryUnit']) => number | null,
): HistoryPoint[] {
  return jobs.flatMap((job) => {
    const figure = job.sides.find((candidate) => candidate.sensorSide === side);
    const y = figure === undefined ? null : pick(figure.inHistoryUnit);
    return y === null ? [] : [{ x: dayValue(job.scheduledFor), y, jobId: job.id }];
  });
}

function samePoints(a: readonly HistoryPoint[], b: readonly HistoryPoint[]): boolean {
  return (
    a.length === b.length &&
    a.every((point, index) => point.jobId === b[index]!.jobId && Math.abs(point.y - b[index]!.y) < 1e-9)
  );
}

/** The chart's series, in the order of the legend: left before and after, right before and after, limits. */
export function historySeries(history: MachineHistory): HistorySeries[] {
  const sides = (['left', 'right'] as const).filter((side) =>
    history.jobs.some((job) => job.sides.some((figure) => figure.sensorSide === side)),
  );
  const series: HistorySeries[] = [];
  for (const side of sides) {
    for (const stage of ['before', 'after'] as const) {
      const points = pointsOf(history.jobs, side, (figures) => figures[stage]);
      if (points.length > 0) {
        series.push({ key: `${side}-${stage}`, label: `${SIDE_LABELS[side]} ${stage}`, side, stage, points });
      }
    }
  }
  const limits = sides.map((side) => ({ side, points: pointsOf(history.jobs, side, (f) => f.limit) }));
  const shared = limits.length > 0 && limits.every((limit) => samePoints(limit.points, limits[0]!.points));
  if (shared && limits[0]!.points.length > 0) {
    series.push({
      key: 'limit',
      label: 'Acceptance limit',
      side: null,
      stage: 'limit',
      points: limits[0]!.points,
    });
  } else if (!shared) {
    for (const { side, points } of limits) {
      if (points.length === 0) continue;
      series.push({
        key: `${side}-limit`,
        label: `${SIDE_LABELS[side]} acceptance limit`,
        side,
        stage: 'limit',
        points,
      });
    }
  }
  return series;
}

/** An amplitude as the chart and its summary write it: three significant digits at most. */
export function formatAmplitude(value: number): string {
  return formatNumber(Number(value.toPrecision(3)), 4);
}

/** The unit in words ("in/s peak"). */
export function unitLabel(unit: AmplitudeUnit | null): string {
  return unit === null ? '' : AMPLITUDE_UNIT_LABELS[unit];
}

/** The jobs read in another unit than the history's, whose figures the chart draws converted. */
export function convertedJobs(history: MachineHistory): MachineHistoryJob[] {
  return history.jobs.filter((job) => job.unit !== null && job.unit !== history.unit && job.sides.length > 0);
}

/** The chart in one paragraph, for its accessible name: what it covers and the latest job's figures. */
export function historySummary(history: MachineHistory): string {
  const drawn = history.jobs.filter((job) => job.sides.some((side) => side.before !== null));
  if (drawn.length === 0 || history.unit === null) return 'No readings yet: the chart is empty.';
  const unit = unitLabel(history.unit);
  const first = jobDate(drawn[0]!.scheduledFor);
  const latest = drawn.at(-1)!;
  const span =
    drawn.length === 1
      ? `one job, on ${first}`
      : `${drawn.length} jobs, from ${first} to ${jobDate(latest.scheduledFor)}`;
  const sides = latest.sides
    .map((side) => {
      const before = side.inHistoryUnit.before;
      const after = side.inHistoryUnit.after;
      const read =
        before === null
          ? 'not read'
          : after === null
            ? `${formatAmplitude(before)} before, no reading after yet`
            : `${formatAmplitude(before)} before, ${formatAmplitude(after)} after`;
      return `${SIDE_LABELS[side.sensorSide].toLowerCase()} side ${read}`;
    })
    .join('; ');
  const limit = latest.sides.find((side) => side.inHistoryUnit.limit !== null)?.inHistoryUnit.limit ?? null;
  return (
    `Amplitude before and after balancing, in ${unit}, for ${span}. ` +
    `Latest job (no. ${latest.id}, ${jobDate(latest.scheduledFor)}): ${sides}` +
    (limit === null ? '.' : `; acceptance limit ${formatAmplitude(limit)}.`) +
    ' The table below gives every figure.'
  );
}
