import {
  type AmplitudeUnit,
  type Job,
  MACHINE_SIDES,
  type MachineHistoryJob,
  type MachineHistorySide,
} from '@counterpoise/api';
import { convertVibration } from '@counterpoise/engine';

/*
 * A job as the machine's history and the CSV export show it, read from the job as the job routes answer
 * it (`JobsService.get`): before and after come from the completion where the job is completed (the
 * figures its record keeps), else from its runs by the same rule the jobs use (the initial run against
 * the latest run without a trial weight, `baseRun`); the limit and the verdict are the job's own
 * `verification`. Nothing is recomputed differently here.
 */

type JobRun = Job['runs'][number];

/** The latest run without a trial weight: the initial run, or the latest verification (the jobs' `baseRun`). */
function baseRunOf(job: Job): JobRun | undefined {
  return [...job.runs].reverse().find((run) => run.kind !== 'trial');
}

/** An amplitude of `from` in `to`, by the engine's conversion (one sinusoid at 1x); null stays null. */
export function inUnit(value: number | null, from: AmplitudeUnit | null, to: AmplitudeUnit | null) {
  if (value === null || from === null || to === null || from === to) return value;
  return convertVibration(value, from, to);
}

/** One side's reading of a run, with the run and its speed. */
function readingOf(run: JobRun | undefined, side: string) {
  const reading = run?.readings.find((candidate) => candidate.sensorSide === side);
  return run === undefined || reading === undefined
    ? null
    : {
        runId: run.id,
        amplitude: reading.average.amplitude,
        phaseDeg: reading.average.phaseDeg,
        speedRpm: reading.speedRpm,
      };
}

/**
 * A job's figures for the history: per side the initial reading, the reading it ended on (its latest
 * verification run, or whatever run a completed job ended on), the acceptance limit and the verdict, each
 * also in `historyUnit`.
 */
export function historyJobOf(job: Job, historyUnit: AmplitudeUnit | null): MachineHistoryJob {
  const unit = job.setup?.amplitudeUnit ?? null;
  const initial = job.runs.find((run) => run.kind === 'initial');
  const base = baseRunOf(job);
  // A job that is not completed has an "after" once a verification run was read.
  const ended =
    base !== undefined && (base.kind === 'verification' || job.completion !== null) ? base : undefined;
  const verdict = ended !== undefined && job.verification?.runId === ended.id ? job.verification : null;
  const read = new Set([...(initial?.readings ?? []), ...(ended?.readings ?? [])].map((r) => r.sensorSide));
  const sides = MACHINE_SIDES.filter((side) => read.has(side)).map((side): MachineHistorySide => {
    const kept = job.completion?.beforeAfter.find((figure) => figure.sensorSide === side);
    const before = readingOf(initial, side);
    const after = readingOf(ended, side);
    // A completed job's record keeps its before and after: they win over a later reading of the runs.
    if (kept !== undefined && before !== null) Object.assign(before, kept.before);
    if (kept !== undefined && after !== null) Object.assign(after, kept.after);
    const judged = job.verification?.sides.find((figure) => figure.sensorSide === side);
    const limit = judged?.limit ?? null;
    const sideVerdict = verdict?.sides.find((figure) => figure.sensorSide === side);
    return {
      sensorSide: side,
      before,
      after,
      limit,
      accepted: sideVerdict === undefined || sideVerdict.limit === null ? null : sideVerdict.accepted,
      inHistoryUnit: {
        before: inUnit(before?.amplitude ?? null, unit, historyUnit),
        after: inUnit(after?.amplitude ?? null, unit, historyUnit),
        limit: inUnit(limit, unit, historyUnit),
      },
    };
  });
  return {
    id: job.id,
    scheduledFor: job.scheduledFor,
    completedAt: job.completion?.completedAt ?? null,
    status: job.status,
    technician: job.technician,
    methods: [...new Set(job.corrections.map((correction) => correction.method))],
    unit,
    operatingSpeedRpm: job.setup?.operatingSpeedRpm ?? null,
    weightAngles: job.setup?.weightAngles ?? null,
    acceptance: job.verification?.acceptance ?? null,
    accepted: job.completion?.accepted ?? verdict?.accepted ?? null,
    sides,
    weightsFitted: job.corrections.flatMap((correction) => correction.installed ?? []),
  };
}
