import { COMMON_PRACTICE_INSPECTION_LIMITS_IN, evaluateInspection } from '@counterpoise/engine';
import {
  averageRun,
  baseRun,
  type CorrectionFacts,
  installedSoFar,
  JobChangeRefusal,
  type JobSetup,
  type PlaneWeight,
  predictInstalled,
  type RunFacts,
  runSpeedRpm,
  type SensorReading,
  verdictOf,
} from './job-calculations';
import {
  type AddRun,
  type InstalledWeight,
  type Job,
  JOBS_PROBLEM_CODES,
  type JobStatus,
  type JobStep,
  type RecordInspection,
} from './jobs';
import type { AcceptanceLevel, StoredSensitivity } from './records';

/*
 * The rules of a job's steps: which status a step may be written in, which step must come first, how an
 * inspection is judged, what a run or an installed correction stores, and where the stepper opens. The
 * server's JobsService decides with these functions, and the device applies a change made offline with
 * the same ones (`applyJobChange`), so that the two cannot drift apart. Each refusal is a
 * `JobChangeRefusal` carrying the problem the server answers.
 */

/** The statuses a step of the balancing itself (set-up, runs, corrections, completion) is written in. */
export const WORKING_STATUSES: readonly JobStatus[] = ['open'];
/** The statuses the safety and inspection steps (and assigning, abandoning) are written in. */
export const WORKING_OR_ON_HOLD_STATUSES: readonly JobStatus[] = ['open', 'on-hold'];

const MM_PER_IN = 25.4;

/** A 409: a step that must come first is missing (or the code given). */
export function conflictRefusal(
  detail: string,
  code: string = JOBS_PROBLEM_CODES.stepMissing,
): JobChangeRefusal {
  return new JobChangeRefusal(409, 'Conflict', detail, undefined, code);
}

/** A 400 on one field that names something the job does not have. */
export function badFieldRefusal(path: string, message: string): JobChangeRefusal {
  return new JobChangeRefusal(
    400,
    'Bad Request',
    `${path}: ${message}`,
    [{ path, message }],
    JOBS_PROBLEM_CODES.unknownReference,
  );
}

/** The job's status allows the step (409 `JOB_NOT_OPEN` otherwise). */
export function requireStatus(status: JobStatus, allowed: readonly JobStatus[]): void {
  if (!allowed.includes(status)) {
    throw conflictRefusal(
      `The job is ${status}: this step needs it ${allowed.join(' or ')}.`,
      JOBS_PROBLEM_CODES.jobNotOpen,
    );
  }
}

/** The safety cautions were acknowledged. */
export function requireSafety(job: { readonly safety: object | null }): void {
  if (job.safety === null) throw conflictRefusal('Acknowledge the safety cautions first.');
}

/** The safety cautions were acknowledged and the inspection recorded. */
export function requireInspected(job: {
  readonly safety: object | null;
  readonly inspection: object | null;
}): void {
  requireSafety(job);
  if (job.inspection === null) throw conflictRefusal('Record the inspection first.');
}

/** What the rules read of the machine: the planes' radii, the rotor's mass and its own acceptance level. */
export interface MachineFacts {
  readonly planes: readonly { readonly correctionRadiusMm: number }[];
  readonly rotorMassKg: number | null;
  readonly acceptance: AcceptanceLevel | null;
}

/** What the rules read of the machine's family. */
export interface FamilyFacts {
  readonly inspectionLimits: { readonly bearingEndPlayMm: number; readonly shaftRunoutMm: number };
  readonly acceptance: AcceptanceLevel;
  readonly sensitivities: readonly StoredSensitivity[];
}

/** The correction radius of each plane, in mm. */
export function planeRadiiOf(machine: MachineFacts): number[] {
  return machine.planes.map((plane) => plane.correctionRadiusMm);
}

/** The level a job is judged against: the machine's own, else its family's, else none. */
export function acceptanceOf(
  machine: MachineFacts,
  family: FamilyFacts | null | undefined,
): AcceptanceLevel | null {
  return machine.acceptance ?? family?.acceptance ?? null;
}

/**
 * The inspection limits of a machine: its family's, or for a machine without a family the common practice
 * defaults of the engine (in inches) converted to mm.
 */
export function inspectionLimitsOf(family: FamilyFacts | null | undefined): {
  bearingEndPlayMm: number;
  shaftRunoutMm: number;
} {
  return family
    ? { ...family.inspectionLimits }
    : {
        bearingEndPlayMm: COMMON_PRACTICE_INSPECTION_LIMITS_IN.bearingEndPlay * MM_PER_IN,
        shaftRunoutMm: COMMON_PRACTICE_INSPECTION_LIMITS_IN.stubShaftRunout * MM_PER_IN,
      };
}

const CHECK_NAMES = {
  teethOrKnives: 'Teeth or knives',
  buildUpCleaned: 'Build-up',
  welds: 'Welds',
  beltsAndPulleys: 'Belts and pulleys',
} as const;

/**
 * The inspection as measured, judged against the limits: a limit over, or a visual check with a fault
 * left, fails it, and the job goes on hold until a re-measure within the limits or a manager's override.
 */
export function judgeInspection(
  body: RecordInspection,
  limits: { bearingEndPlayMm: number; shaftRunoutMm: number },
): {
  inspection: Omit<NonNullable<Job['inspection']>, 'measuredAt' | 'by' | 'override'>;
  status: JobStatus;
} {
  const judged = evaluateInspection({
    items: [
      {
        name: 'Bearing end play',
        measured: body.bearingEndPlayMm,
        limit: limits.bearingEndPlayMm,
        unit: 'mm',
      },
      { name: 'Shaft runout', measured: body.shaftRunoutMm, limit: limits.shaftRunoutMm, unit: 'mm' },
    ],
  });
  const faults = (Object.keys(CHECK_NAMES) as (keyof typeof CHECK_NAMES)[])
    .filter((key) => body.checks[key] === 'fault')
    .map((key) => `${CHECK_NAMES[key]}: a fault is left; fix it before balancing.`);
  const passed = judged.pass && faults.length === 0;
  return {
    inspection: {
      bearingEndPlayMm: body.bearingEndPlayMm,
      shaftRunoutMm: body.shaftRunoutMm,
      checks: body.checks,
      notes: body.notes === undefined || body.notes === '' ? null : body.notes,
      limits,
      passed,
      reasons: [...judged.reasons, ...faults],
    },
    status: passed ? 'open' : 'on-hold',
  };
}

/** The set-up may be recorded only before the first run. */
export function requireSetupChangeable(
  job: { readonly safety: object | null; readonly inspection: object | null },
  runCount: number,
): void {
  requireInspected(job);
  if (runCount > 0) {
    throw conflictRefusal(
      'The runs are read with this set-up: it can no longer change. Start a new job for another set-up.',
    );
  }
}

/** Each sensor of a run's readings is one of the set-up's (400 on the side named otherwise). */
export function checkSensors(setup: JobSetup, readings: AddRun['readings']): void {
  readings.forEach((reading, index) => {
    if (!setup.sensors.some((sensor) => sensor.side === reading.sensorSide)) {
      throw badFieldRefusal(
        `readings[${index}].sensorSide`,
        `The set-up has no sensor on the ${reading.sensorSide} side.`,
      );
    }
  });
}

/** What a job's runs and corrections are read with. */
export interface JobFacts {
  readonly safety: object | null;
  readonly inspection: object | null;
  readonly setup: JobSetup | null;
  readonly planeRadiiMm: readonly number[];
  readonly runs: readonly RunFacts[];
  readonly corrections: readonly CorrectionFacts[];
}

/** A job past its set-up and initial run: what the correction steps read. */
export type WorkingFacts = JobFacts & { readonly setup: JobSetup };

/** The job is inspected, set up and has its initial run: the correction steps may go on. */
export function requireWorking(facts: JobFacts): WorkingFacts {
  requireInspected(facts);
  if (facts.setup === null) throw conflictRefusal('Record the set-up first.');
  if (!facts.runs.some((run) => run.kind === 'initial')) throw conflictRefusal('Take the initial run first.');
  return facts as WorkingFacts;
}

/** A run as the job stores it, before it has an id. */
export interface NewRun {
  readonly sequence: number;
  readonly kind: AddRun['kind'];
  readonly trialWeight: PlaneWeight | null;
  readonly weightsOnRotor: PlaneWeight[];
  readonly readings: SensorReading[];
  readonly warnings: string[];
}

/**
 * A run checked against the job (sensors of the set-up, the initial run first and once, a trial weight
 * in a plane the machine has, weights installed before a verification run) and averaged, with every
 * weight of the job on the rotor while it was read.
 */
export function planRun(facts: JobFacts, body: AddRun): NewRun {
  requireInspected(facts);
  const setup = facts.setup;
  if (setup === null) throw conflictRefusal('Record the set-up first.');
  const radii = facts.planeRadiiMm;
  checkSensors(setup, body.readings);
  const initial = facts.runs.find((run) => run.kind === 'initial');
  if (body.kind === 'initial' && initial !== undefined)
    throw conflictRefusal('The job has its initial run already.');
  if (body.kind !== 'initial' && initial === undefined) throw conflictRefusal('Take the initial run first.');
  if (body.trialWeight !== undefined && body.trialWeight.planeIndex >= radii.length) {
    throw badFieldRefusal('trialWeight.planeIndex', `The machine has ${radii.length} plane(s).`);
  }
  const onRotor = installedSoFar(facts.corrections, radii);
  if (body.kind === 'verification' && onRotor.length === 0) {
    throw conflictRefusal('Record the weights installed before a verification run.');
  }
  const averaged = averageRun(body.readings, initial === undefined ? undefined : runSpeedRpm(initial));
  return {
    sequence: facts.runs.length + 1,
    kind: body.kind,
    trialWeight: body.trialWeight ?? null,
    weightsOnRotor: onRotor,
    readings: averaged.readings,
    warnings: averaged.warnings,
  };
}

/**
 * The reading the model predicts for what was really fitted on a correction: only the latest correction,
 * only until a run is taken after it, only in planes the machine has.
 */
export function planInstalled(
  facts: WorkingFacts,
  correction: CorrectionFacts,
  weights: readonly InstalledWeight[],
): NonNullable<Job['corrections'][number]['predicted']> {
  if (correction.id !== facts.corrections.at(-1)?.id) {
    throw conflictRefusal('Only the latest correction can be fitted.', JOBS_PROBLEM_CODES.jobNotOpen);
  }
  const lastUsed = Math.max(
    ...facts.runs.filter((run) => correction.runIds.includes(run.id)).map((run) => run.sequence),
  );
  if (facts.runs.some((run) => run.sequence > lastUsed)) {
    throw conflictRefusal(
      'A run was taken after this correction: what is fitted now is read from that run; compute a new correction.',
      JOBS_PROBLEM_CODES.jobNotOpen,
    );
  }
  weights.forEach((weight, index) => {
    if (weight.planeIndex >= facts.planeRadiiMm.length)
      throw badFieldRefusal(
        `weights[${index}].planeIndex`,
        `The machine has ${facts.planeRadiiMm.length} plane(s).`,
      );
  });
  return predictInstalled(correction, weights, facts.runs, facts.setup, facts.planeRadiiMm);
}

/** The verdict on the job's latest run without a trial weight against its acceptance level, if it has one. */
export function verificationOf(
  facts: Pick<JobFacts, 'setup' | 'planeRadiiMm' | 'runs' | 'corrections'>,
  machine: MachineFacts,
  family: FamilyFacts | null | undefined,
): Job['verification'] {
  const base = baseRun(facts.runs);
  const level = acceptanceOf(machine, family);
  if (base === undefined || level === null || facts.setup === null) return null;
  return verdictOf(
    base,
    level,
    facts.setup,
    {
      rotorMassKg: machine.rotorMassKg,
      speedRpm: facts.setup.operatingSpeedRpm,
      planeRadiiMm: facts.planeRadiiMm,
    },
    facts.corrections,
  );
}

/** The step the stepper opens at: the first one not done. */
export function nextStepOf(
  job: { readonly status: JobStatus } & Pick<JobFacts, 'safety' | 'inspection' | 'setup'>,
  facts: Pick<JobFacts, 'planeRadiiMm' | 'runs' | 'corrections'>,
  accepted: boolean,
): JobStep | 'done' {
  if (job.status === 'completed' || job.status === 'abandoned') return 'done';
  if (job.safety === null) return 'safety';
  if (job.inspection === null || job.status === 'on-hold') return 'inspection';
  if (job.setup === null) return 'setup';
  const base = baseRun(facts.runs);
  if (base === undefined) return 'runs';
  if (base.weightsOnRotor.length !== installedSoFar(facts.corrections, facts.planeRadiiMm).length)
    return 'verification';
  if (accepted) return 'completion';
  return 'correction';
}
