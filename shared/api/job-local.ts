import { normalizeAngleDeg } from '@counterpoise/engine';
import type * as z from 'zod';
import { invalidRequestProblem } from './calc-routes';
import { computeCorrection, JobChangeRefusal, runIsAmplitudeOnly } from './job-calculations';
import {
  inspectionLimitsOf,
  judgeInspection,
  type JobFacts,
  nextStepOf,
  planeRadiiOf,
  planInstalled,
  planRun,
  requireSafety,
  requireSetupChangeable,
  requireStatus,
  requireWorking,
  verificationOf,
  WORKING_OR_ON_HOLD_STATUSES,
  WORKING_STATUSES,
} from './job-rules';
import {
  AcknowledgeSafetySchema,
  type AddRun,
  AddRunSchema,
  ComputeCorrectionSchema,
  type Job,
  type JobCorrection,
  type JobRun,
  type RecordInspection,
  RecordInspectionSchema,
  type RecordInstalled,
  RecordInstalledSchema,
  type RecordSetup,
  RecordSetupSchema,
} from './jobs';
import type { Machine, MachineFamily } from './records';

/*
 * A job's change made with no connection, applied on the device as the server will apply it: the same
 * schemas check the body, the same rules (job-rules.ts) decide and the same calculations (job-calculations.ts)
 * average the readings and compute the correction. When the change is sent, the server recomputes it from
 * what it stores, and `compareCorrections` tells whether the two corrections agree.
 */

/** The body of an acknowledgement of the safety cautions. */
export type AcknowledgeSafety = z.input<typeof AcknowledgeSafetySchema>;
/** The body of a request to compute a correction. */
export type ComputeCorrection = z.input<typeof ComputeCorrectionSchema>;
/** A person as a job names them. */
export type PersonRef = Job['technician'];

/**
 * What the device needs besides the job to apply a change as the server would: the job's machine as
 * GET /api/v1/machines/{id} returns it (planes and their radii, rotor mass, its own acceptance level), and
 * its family as GET /api/v1/machine-families/{id} returns it (inspection limits, acceptance level, stored
 * sensitivities), null only for a machine without a family.
 */
export interface LocalJobContext {
  readonly machine: Machine;
  readonly family: MachineFamily | null;
}

/** A change of a job that can be made with no connection, as the device queues it. */
export type OfflineJobChange =
  | { readonly kind: 'acknowledge-safety'; readonly body: AcknowledgeSafety }
  | { readonly kind: 'record-inspection'; readonly body: RecordInspection }
  | { readonly kind: 'record-setup'; readonly body: RecordSetup }
  | { readonly kind: 'add-run'; readonly body: AddRun }
  | { readonly kind: 'compute-correction'; readonly body: ComputeCorrection }
  /** The correction by its sequence number (a correction computed offline has no id yet). */
  | {
      readonly kind: 'record-installed';
      readonly correctionSequence: number;
      readonly body: RecordInstalled;
    };

/** The body checked by its route's schema, as the server's validation does (400 with every field at fault). */
function parsed<T extends z.ZodType>(schema: T, body: unknown): z.output<T> {
  const result = schema.safeParse(body);
  if (result.success) return result.data;
  const problem = invalidRequestProblem(result.error);
  throw new JobChangeRefusal(
    problem.status,
    problem.title,
    problem.detail ?? problem.title,
    problem.errors,
    problem.code,
  );
}

/** The id a new run or correction gets on the device: below every id the job has, and negative. */
function localId(records: readonly { readonly id: number }[]): number {
  return Math.min(0, ...records.map((record) => record.id)) - 1;
}

/**
 * The job as the server would store it after `change`, computed on the device with the same schemas,
 * rules and engine as the server. New runs and corrections get negative ids until the server gives its
 * own; the version goes up by one and `updatedAt` is `by.at`, as the server's would if nothing else changed
 * meanwhile. Throws `JobChangeRefusal` (status, code, detail, field errors as the server's problem) where
 * the server would refuse the change. Who may change the job (the server's 403) is left to the server.
 */
export function applyJobChange(
  job: Job,
  change: OfflineJobChange,
  context: LocalJobContext,
  by: { readonly actor: PersonRef; readonly at: Date },
): Job {
  const { machine, family } = context;
  if (machine.id !== job.machine.id) throw new Error('The context names another machine than the job’s.');
  if ((machine.familyId ?? null) !== (family?.id ?? null)) {
    throw new Error(
      'The context needs the family of the job’s machine (null only for a machine without one).',
    );
  }
  const at = by.at.toISOString();
  const person = { id: by.actor.id, name: by.actor.name };
  const facts: JobFacts = {
    safety: job.safety,
    inspection: job.inspection,
    setup: job.setup,
    planeRadiiMm: planeRadiiOf(machine),
    runs: job.runs,
    corrections: job.corrections,
  };
  let next: Job;
  switch (change.kind) {
    case 'acknowledge-safety': {
      const body = parsed(AcknowledgeSafetySchema, change.body);
      requireStatus(job.status, WORKING_OR_ON_HOLD_STATUSES);
      next = { ...job, safety: { topicIds: [...new Set(body.topicIds)], acknowledgedAt: at, by: person } };
      break;
    }
    case 'record-inspection': {
      const body = parsed(RecordInspectionSchema, change.body);
      requireStatus(job.status, WORKING_OR_ON_HOLD_STATUSES);
      requireSafety(job);
      const judged = judgeInspection(body, inspectionLimitsOf(family));
      next = {
        ...job,
        status: judged.status,
        inspection: { ...judged.inspection, measuredAt: at, by: person, override: null },
      };
      break;
    }
    case 'record-setup': {
      const body = parsed(RecordSetupSchema, change.body);
      requireStatus(job.status, WORKING_STATUSES);
      requireSetupChangeable(job, job.runs.length);
      next = { ...job, setup: { ...body, recordedAt: at } };
      break;
    }
    case 'add-run': {
      const body = parsed(AddRunSchema, change.body);
      requireStatus(job.status, WORKING_STATUSES);
      const planned = planRun(facts, body);
      const run: JobRun = {
        id: localId(job.runs),
        ...planned,
        amplitudeOnly: runIsAmplitudeOnly(planned),
        createdAt: at,
        by: person,
        retyped: [],
      };
      next = { ...job, runs: [...job.runs, run] };
      break;
    }
    case 'compute-correction': {
      const body = parsed(ComputeCorrectionSchema, change.body);
      requireStatus(job.status, WORKING_STATUSES);
      const working = requireWorking(facts);
      const computed = computeCorrection({
        method: body.method,
        setup: working.setup,
        planeRadiiMm: working.planeRadiiMm,
        runs: working.runs,
        corrections: working.corrections,
        familySensitivities: family?.sensitivities ?? [],
      });
      const correction: JobCorrection = {
        id: localId(job.corrections),
        sequence: job.corrections.length + 1,
        ...computed,
        installed: null,
        predicted: null,
        installedAt: null,
        createdAt: at,
        by: person,
      };
      next = { ...job, corrections: [...job.corrections, correction] };
      break;
    }
    case 'record-installed': {
      const body = parsed(RecordInstalledSchema, change.body);
      requireStatus(job.status, WORKING_STATUSES);
      const working = requireWorking(facts);
      const correction = job.corrections.find(
        (candidate) => candidate.sequence === change.correctionSequence,
      );
      if (correction === undefined) {
        throw new JobChangeRefusal(404, 'Not Found', 'The job has no correction with this id.');
      }
      const predicted = planInstalled(working, correction, body.weights);
      next = {
        ...job,
        corrections: job.corrections.map((candidate) =>
          candidate === correction
            ? { ...candidate, installed: [...body.weights], predicted, installedAt: at }
            : candidate,
        ),
      };
      break;
    }
  }
  const after = {
    setup: next.setup,
    planeRadiiMm: facts.planeRadiiMm,
    runs: next.runs,
    corrections: next.corrections,
  };
  const verification = verificationOf(after, machine, family);
  return {
    ...next,
    version: job.version + 1,
    updatedAt: at,
    verification,
    nextStep: nextStepOf(next, after, verification?.accepted ?? false),
  };
}

/** Whether two corrections of a job agree, and if not, how they differ in words. */
export interface CorrectionAgreement {
  readonly agrees: boolean;
  readonly differences: readonly string[];
}

/**
 * How far apart the device's and the server's masses may be and still agree: 0.5 % of the larger mass or
 * 0.1 g, whichever is larger (a product default: a tenth of a gram is below what a technician weighs, and
 * half a percent is far above the floating-point noise of the same engine on two machines).
 */
export const CORRECTION_MASS_TOLERANCE = { fraction: 0.005, grams: 0.1 } as const;
/** How far apart the angles may be and still agree, in degrees (a product default; typed angles have 0.1°). */
export const CORRECTION_ANGLE_TOLERANCE_DEG = 0.5;

function gramsText(grams: number): string {
  return `${grams.toFixed(1)} g`;
}

function degText(angleDeg: number): string {
  return `${normalizeAngleDeg(angleDeg).toFixed(1)}°`;
}

function planeWords(planeIndex: number, planeCount: number): string {
  if (planeCount <= 1) return 'The plane';
  return planeIndex === 0 ? 'Left plane' : 'Right plane';
}

/**
 * Whether the server's correction agrees with the one computed on the device: the same method, weights in
 * the same planes, each mass within `CORRECTION_MASS_TOLERANCE` and each angle within
 * `CORRECTION_ANGLE_TOLERANCE_DEG` (an angle is not compared where both masses are within the mass
 * tolerance of nothing: a weight that small has no meaningful angle). `planeCount` names the planes in
 * words (the machine's; by default two when a plan names plane 1, else one).
 */
export function compareCorrections(
  device: Pick<JobCorrection, 'method' | 'plan'>,
  server: Pick<JobCorrection, 'method' | 'plan'>,
  planeCount?: number,
): CorrectionAgreement {
  const planes =
    planeCount ?? ([...device.plan, ...server.plan].some((weight) => weight.planeIndex > 0) ? 2 : 1);
  const differences: string[] = [];
  if (device.method !== server.method) {
    differences.push(`The server used the method ${server.method}; this device used ${device.method}.`);
  }
  const indices = [...new Set([...device.plan, ...server.plan].map((weight) => weight.planeIndex))].sort();
  for (const planeIndex of indices) {
    const name = planeWords(planeIndex, planes);
    const mine = device.plan.find((weight) => weight.planeIndex === planeIndex);
    const theirs = server.plan.find((weight) => weight.planeIndex === planeIndex);
    if (theirs === undefined) {
      differences.push(
        `${name}: this device computed ${gramsText(mine!.massGrams)}; the server computed no weight there.`,
      );
      continue;
    }
    if (mine === undefined) {
      differences.push(
        `${name}: the server computed ${gramsText(theirs.massGrams)}; this device computed no weight there.`,
      );
      continue;
    }
    const allowedGrams = Math.max(
      CORRECTION_MASS_TOLERANCE.grams,
      CORRECTION_MASS_TOLERANCE.fraction * Math.max(Math.abs(mine.massGrams), Math.abs(theirs.massGrams)),
    );
    const apartGrams = Math.abs(mine.massGrams - theirs.massGrams);
    if (apartGrams > allowedGrams) {
      differences.push(
        `${name}: the server computed ${gramsText(theirs.massGrams)}, this device ${gramsText(mine.massGrams)} ` +
          `(${gramsText(apartGrams)} apart; up to ${gramsText(allowedGrams)} agrees).`,
      );
    }
    const negligible = Math.max(mine.massGrams, theirs.massGrams) <= allowedGrams;
    const apartDeg = Math.abs(normalizeAngleDeg(mine.angleDeg - theirs.angleDeg));
    const angleApart = Math.min(apartDeg, 360 - apartDeg);
    if (!negligible && angleApart > CORRECTION_ANGLE_TOLERANCE_DEG) {
      differences.push(
        `${name}: the server computed the angle ${degText(theirs.angleDeg)}, this device ${degText(mine.angleDeg)} ` +
          `(${angleApart.toFixed(1)}° apart; up to ${CORRECTION_ANGLE_TOLERANCE_DEG}° agrees).`,
      );
    }
  }
  return { agrees: differences.length === 0, differences };
}
