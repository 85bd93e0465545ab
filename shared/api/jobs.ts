import * as z from 'zod';
import { HIDDEN_CHARACTERS } from './display-name';
import { ProblemSchema } from './problem';
import {
  AcceptanceLevelSchema,
  AmplitudeUnitSchema,
  InspectionLimitsSchema,
  MACHINE_SIDES,
  StoredSensitivitySchema,
} from './records';

/*
 * The balancing job: a machine, a technician and a date, and what the job holds step by step (safety,
 * inspection, set-up, runs with their readings, corrections with what was installed, verification,
 * completion). One source for the server's validation, the OpenAPI document and the workbench's types.
 * The routes, states, what the server recomputes and the concurrency rules: docs/jobs.md.
 */

// Common pieces

const IdSchema = z.number().int().positive();
const SideSchema = z.enum(MACHINE_SIDES, { error: 'The side is left or right.' });
const DateSchema = z.iso.date({ error: 'Write the date as YYYY-MM-DD.' });

/** A reason or a note a person writes: trimmed, 3 to `maxLength` characters, no invisible characters. */
function reasonText(field: string, maxLength: number) {
  return z
    .string({ error: `Write ${field}.` })
    .trim()
    .min(3, { error: `Write ${field} in a few words.` })
    .max(maxLength, { error: `Keep ${field} to ${maxLength} characters.` })
    .refine((text) => !HIDDEN_CHARACTERS.test(text.replace(/[\n\r\t]/g, '')), {
      error: `${field[0]!.toUpperCase()}${field.slice(1)} holds an invisible control or text-direction character.`,
    });
}

const AmplitudeSchema = z
  .number({ error: 'Enter the amplitude.' })
  .nonnegative({ error: 'The amplitude is 0 or more.' })
  .max(1000, { error: 'The amplitude is at most 1000.' });
const AngleSchema = (what: string) =>
  z
    .number({ error: `Enter the ${what} in degrees.` })
    .min(0, { error: `The ${what} is from 0 to 359.9 degrees.` })
    .lt(360, { error: `The ${what} is from 0 to 359.9 degrees.` });
const SpeedSchema = z
  .number({ error: 'Enter the speed in rpm.' })
  .positive({ error: 'The speed is above 0 rpm.' })
  .max(30_000, { error: 'The speed is at most 30000 rpm.' });
const MassGramsSchema = z
  .number({ error: 'Enter the mass in grams.' })
  .positive({ error: 'The mass is above 0 g.' })
  .max(50_000, { error: 'The mass is at most 50000 g.' });
const RadiusMmSchema = z
  .number({ error: 'Enter the radius in mm.' })
  .positive({ error: 'The radius is above 0 mm.' })
  .max(5_000, { error: 'The radius is at most 5000 mm.' });
const PlaneIndexSchema = z
  .number({ error: 'Name the plane: 0 (the only or left plane) or 1 (the right plane).' })
  .int()
  .min(0, { error: 'The plane is 0 or 1.' })
  .max(1, { error: 'The plane is 0 or 1.' });

/** A reading or a weight as the answers show them (the engine's shapes). */
/** A reading that may have been taken without phase: `phaseDeg` is null for an amplitude-only run. */
const AmplitudeReadingOutSchema = z.object({
  amplitude: z.number(),
  phaseDeg: z.number().nullable().meta({ description: 'Null when the run was read without phase.' }),
});
const PlaneWeightOutSchema = z.object({
  planeIndex: z.number().int(),
  massGrams: z.number(),
  angleDeg: z.number(),
});

// The job's states

/**
 * Where a job stands: `open` (being worked), `on-hold` (an inspection limit failed: a re-measure within
 * the limit or a manager's override lets it go on), `completed`, `abandoned` (a manager may reopen it).
 */
export const JOB_STATUSES = ['open', 'on-hold', 'completed', 'abandoned'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

/** The steps of the job, in the stepper's order. */
export const JOB_STEPS = [
  'safety',
  'inspection',
  'setup',
  'runs',
  'correction',
  'verification',
  'completion',
] as const;
export type JobStep = (typeof JOB_STEPS)[number];

/**
 * The ids of the safety topics a technician acknowledges, the same ids as the cautions the workbench
 * shows (`SAFETY_TOPICS` of @counterpoise/ng/core): lockout, running rotor, hot work, weights, protection.
 */
export const JOB_SAFETY_TOPICS = ['lockout', 'running', 'hot-work', 'weights', 'protection'] as const;
export type JobSafetyTopic = (typeof JOB_SAFETY_TOPICS)[number];

/** Stable `code`s of the jobs' problems (besides the records' CHANGED_MEANWHILE and VERSION_REQUIRED). */
export const JOBS_PROBLEM_CODES = {
  /** The job is not in a state that allows the change (abandoned, completed, on hold…): 409. */
  jobNotOpen: 'JOB_NOT_OPEN',
  /** A step that must come first is not done (safety before inspection…): 409. */
  stepMissing: 'STEP_MISSING',
  /** The machine, technician or run named is not the organisation's, or does not fit (400 on the field). */
  unknownReference: 'UNKNOWN_REFERENCE',
  /** The stored runs do not allow the method asked for (a trial run missing…): 409. */
  methodNotPossible: 'METHOD_NOT_POSSIBLE',
  /** Only the job's technician or a manager may change it: 403. */
  notYourJob: 'NOT_YOUR_JOB',
  /**
   * The run's readings can no longer be typed again: a later run or a correction computed from it rests
   * on them (409). Take a new run instead.
   */
  runInUse: 'RUN_IN_USE',
} as const;

// Requests

/** A new job: a machine, a date and (for a manager) the technician; a technician's job is their own. */
export const CreateJobSchema = z
  .strictObject({
    machineId: IdSchema,
    /** The technician who does the job; the caller when left out. Only a manager names another. */
    technicianId: IdSchema.optional(),
    scheduledFor: DateSchema,
  })
  .meta({ id: 'CreateJob' });
export type CreateJob = z.input<typeof CreateJobSchema>;

export const AssignJobSchema = z.strictObject({ technicianId: IdSchema }).meta({ id: 'AssignJob' });
export const AbandonJobSchema = z
  .strictObject({ reason: reasonText('why the job is abandoned', 1000) })
  .meta({ id: 'AbandonJob' });
export const OverrideInspectionSchema = z
  .strictObject({ reason: reasonText('why the job may go on', 1000) })
  .meta({ id: 'OverrideInspection' });

/** The safety topics the technician has read and acknowledges: all of them. */
export const AcknowledgeSafetySchema = z
  .strictObject({
    topicIds: z
      .array(z.enum(JOB_SAFETY_TOPICS, { error: `A topic is one of ${JOB_SAFETY_TOPICS.join(', ')}.` }))
      .refine((ids) => JOB_SAFETY_TOPICS.every((topic) => ids.includes(topic)), {
        error: `Acknowledge every topic: ${JOB_SAFETY_TOPICS.join(', ')}.`,
      }),
  })
  .meta({ id: 'AcknowledgeSafety' });

/** A visual check of the inspection: fine as found, fixed before balancing, or a fault left. */
const CheckSchema = z.enum(['ok', 'fixed', 'fault'], { error: 'A check is ok, fixed or fault.' });

/** The pre-balance inspection as measured; the server judges it against the family's limits. */
export const RecordInspectionSchema = z
  .strictObject({
    bearingEndPlayMm: z
      .number({ error: 'Enter the bearing end play in mm.' })
      .nonnegative({ error: 'The end play is 0 mm or more.' })
      .max(50, { error: 'The end play is at most 50 mm.' }),
    shaftRunoutMm: z
      .number({ error: 'Enter the shaft runout in mm.' })
      .nonnegative({ error: 'The runout is 0 mm or more.' })
      .max(10, { error: 'The runout is at most 10 mm.' }),
    checks: z.strictObject({
      teethOrKnives: CheckSchema,
      buildUpCleaned: CheckSchema,
      welds: CheckSchema,
      beltsAndPulleys: CheckSchema,
    }),
    notes: z.string().trim().max(2000, { error: 'Keep the notes to 2000 characters.' }).optional(),
  })
  .meta({ id: 'RecordInspection' });
export type RecordInspection = z.input<typeof RecordInspectionSchema>;

/** The instrument and where it sits. */
export const RecordSetupSchema = z
  .strictObject({
    sensors: z
      .array(
        z.strictObject({
          side: SideSchema,
          /** Where the sensor sits, in the technician's words ("left bearing housing, horizontal"). */
          position: z.string().trim().max(200, { error: 'Keep the position to 200 characters.' }),
        }),
      )
      .min(1, { error: 'Place at least one sensor.' })
      .max(2, { error: 'At most one sensor a side.' })
      .refine((sensors) => new Set(sensors.map((sensor) => sensor.side)).size === sensors.length, {
        error: 'Name each side once.',
      }),
    tachometer: z.string().trim().max(200, { error: 'Keep the tachometer note to 200 characters.' }),
    referenceMark: z.string().trim().max(200, { error: 'Keep the reference mark to 200 characters.' }),
    /** How the rotor turns seen from the left end (seen from the right it turns the other way). */
    rotationSeenFromLeft: z.enum(['clockwise', 'counterClockwise'], {
      error: 'The rotation is clockwise or counterClockwise.',
    }),
    operatingSpeedRpm: SpeedSchema,
    amplitudeUnit: AmplitudeUnitSchema,
    /** How the instrument's phase counts: a lag (the usual) or a lead of the reference mark. */
    phaseSense: z.enum(['lag', 'lead'], { error: 'The phase is a lag or a lead.' }),
    /** How weight angles are counted from the reference mark on this rotor. */
    weightAngles: z.enum(['againstRotation', 'withRotation'], {
      error: 'Weight angles are counted againstRotation or withRotation.',
    }),
  })
  .meta({ id: 'RecordSetup' });
export type RecordSetup = z.input<typeof RecordSetupSchema>;

/**
 * One repeat of one sensor's reading. `phaseDeg` is left out when the phase cannot be read (an
 * amplitude-only run); a run is either read with phase throughout or without it throughout.
 */
const RepeatSchema = z.strictObject({
  amplitude: AmplitudeSchema,
  phaseDeg: AngleSchema('phase').optional(),
  speedRpm: SpeedSchema,
});

/** The kinds of run: without weights, with a trial weight in one plane, after a correction was fitted. */
export const RUN_KINDS = ['initial', 'trial', 'verification'] as const;
export type RunKind = (typeof RUN_KINDS)[number];

/** The trial weight of a trial run, as typed. */
const TrialWeightSchema = z.strictObject({
  planeIndex: PlaneIndexSchema,
  massGrams: MassGramsSchema,
  angleDeg: AngleSchema('angle'),
});

/** Each sensor's repeats of a run, as typed: one to two sensors, each named once. */
const RunReadingsSchema = z
  .array(
    z.strictObject({
      sensorSide: SideSchema,
      repeats: z
        .array(RepeatSchema)
        .min(1, { error: 'Enter at least one reading.' })
        .max(20, { error: 'At most 20 repeats a sensor.' }),
    }),
  )
  .min(1, { error: 'Enter the readings of at least one sensor.' })
  .max(2)
  .refine((readings) => new Set(readings.map((reading) => reading.sensorSide)).size === readings.length, {
    error: 'Give each sensor once.',
  })
  .superRefine((readings, context) => {
    // A run is read with phase or without it: one rule for every repeat of every sensor.
    const repeats = readings.flatMap((sensor, sensorIndex) =>
      sensor.repeats.map((repeat, repeatIndex) => ({ repeat, sensorIndex, repeatIndex })),
    );
    const withPhase = repeats.filter(({ repeat }) => repeat.phaseDeg !== undefined).length;
    if (withPhase === 0 || withPhase === repeats.length) return;
    for (const { repeat, sensorIndex, repeatIndex } of repeats) {
      if (repeat.phaseDeg !== undefined) continue;
      context.addIssue({
        code: 'custom',
        path: [sensorIndex, 'repeats', repeatIndex, 'phaseDeg'],
        message:
          'Other readings of this run have a phase: enter this one’s too, or leave out every phase ' +
          'for an amplitude-only run.',
      });
    }
  });

/** Whether a run's readings were typed without phase (an amplitude-only run). */
export function isAmplitudeOnly(readings: readonly { repeats: readonly { phaseDeg?: number }[] }[]): boolean {
  return readings.every((sensor) => sensor.repeats.every((repeat) => repeat.phaseDeg === undefined));
}

/** A run as typed: its kind, the trial weight of a trial run, and the repeats of each sensor. */
export const AddRunSchema = z
  .strictObject({
    kind: z.enum(RUN_KINDS, { error: `The run is one of ${RUN_KINDS.join(', ')}.` }),
    trialWeight: TrialWeightSchema.optional(),
    readings: RunReadingsSchema,
  })
  .superRefine((run, context) => {
    if (run.kind === 'trial' && run.trialWeight === undefined) {
      context.addIssue({
        code: 'custom',
        path: ['trialWeight'],
        message: 'A trial run names its trial weight.',
      });
    }
    if (run.kind !== 'trial' && run.trialWeight !== undefined) {
      context.addIssue({
        code: 'custom',
        path: ['trialWeight'],
        message: 'Only a trial run has a trial weight.',
      });
    }
  })
  .meta({ id: 'AddRun' });
export type AddRun = z.input<typeof AddRunSchema>;

/**
 * The readings of the job's latest run typed again, when they were mistyped (a phase of 212 typed as
 * 21, the other sensor's amplitude): every sensor's repeats as in AddRun, replacing the run's, and for a
 * trial run its trial weight if that was mistyped too (left out, the stored one stays). The run's kind
 * does not change. The server averages and checks them again and keeps what was typed before.
 */
export const CorrectRunReadingsSchema = z
  .strictObject({
    readings: RunReadingsSchema,
    trialWeight: TrialWeightSchema.optional().meta({
      description: 'A trial run’s trial weight typed again; only a trial run has one.',
    }),
  })
  .meta({ id: 'CorrectRunReadings' });
export type CorrectRunReadings = z.input<typeof CorrectRunReadingsSchema>;

/**
 * The methods of correction, simplest first: a stored sensitivity, a trial weight in one plane, trial
 * weights in two planes, and amplitude only (`four-run`: the trial weight at three positions, for runs
 * read without phase).
 */
export const CORRECTION_METHODS = ['one-run', 'single-plane', 'multi-plane', 'four-run'] as const;
export type CorrectionMethod = (typeof CORRECTION_METHODS)[number];

export const ComputeCorrectionSchema = z
  .strictObject({
    method: z.enum(CORRECTION_METHODS, { error: `The method is one of ${CORRECTION_METHODS.join(', ')}.` }),
  })
  .meta({ id: 'ComputeCorrection' });

/** One weight as fitted: it often differs from the plan. */
export const InstalledWeightSchema = z
  .strictObject({
    planeIndex: PlaneIndexSchema,
    massGrams: MassGramsSchema,
    angleDeg: AngleSchema('angle'),
    radiusMm: RadiusMmSchema,
    fixing: z.enum(['welded', 'bolted'], { error: 'A weight is welded or bolted.' }),
  })
  .meta({ id: 'InstalledWeight' });
export type InstalledWeight = z.infer<typeof InstalledWeightSchema>;

export const RecordInstalledSchema = z
  .strictObject({
    weights: z
      .array(InstalledWeightSchema)
      .min(1, { error: 'List at least one weight fitted.' })
      .max(12, { error: 'At most 12 weights a correction.' }),
  })
  .meta({ id: 'RecordInstalled' });
export type RecordInstalled = z.input<typeof RecordInstalledSchema>;

/** The list of jobs: filters and paging on the server. */
export const JobListQuerySchema = z
  .object({
    status: z.enum(JOB_STATUSES, { error: `status is one of ${JOB_STATUSES.join(', ')}.` }).optional(),
    technicianId: z.coerce.number({ error: 'technicianId is a whole number.' }).int().positive().optional(),
    customerId: z.coerce.number({ error: 'customerId is a whole number.' }).int().positive().optional(),
    machineId: z.coerce.number({ error: 'machineId is a whole number.' }).int().positive().optional(),
    from: DateSchema.optional().meta({ description: 'Scheduled on or after this date.' }),
    to: DateSchema.optional().meta({ description: 'Scheduled on or before this date.' }),
    page: z.coerce.number({ error: 'page is a whole number.' }).int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number({ error: 'pageSize is a whole number.' }).int().min(1).max(100).default(25),
  })
  .meta({ id: 'JobListQuery' });
export type JobListQuery = z.input<typeof JobListQuerySchema>;

// Answers

const PersonRefSchema = z.object({ id: IdSchema, name: z.string() });

/** A repeat as stored: without `phaseDeg` in an amplitude-only run. */
const RepeatOutSchema = z.object({
  amplitude: z.number(),
  phaseDeg: z.number().optional(),
  speedRpm: z.number(),
});

/** The average of one sensor's repeats in a run, with their spread and the check of the engine. */
export const SensorReadingSchema = z
  .object({
    sensorSide: SideSchema,
    repeats: z.array(RepeatOutSchema),
    /**
     * The vector average of the repeats, as typed (phase as the instrument counts it); for an
     * amplitude-only run the plain mean of the amplitudes, with `phaseDeg` null.
     */
    average: AmplitudeReadingOutSchema,
    /**
     * RMS vector distance of the repeats from their average, in amplitude units (for an amplitude-only
     * run the RMS distance of the amplitudes from their mean).
     */
    spread: z.number(),
    spreadRatio: z.number().nullable(),
    trusted: z.boolean(),
    speedRpm: z.number(),
  })
  .meta({ id: 'SensorReading' });

/** One retyping of a run's readings: when, who, and what was typed before it. */
export const RunRetypeSchema = z
  .object({
    at: z.iso.datetime(),
    by: PersonRefSchema,
    /** Each sensor's repeats as they were before this retyping. */
    previousReadings: z.array(
      z.object({
        sensorSide: SideSchema,
        repeats: z.array(RepeatOutSchema),
      }),
    ),
    /** The trial weight before this retyping (null for a run without one). */
    previousTrialWeight: PlaneWeightOutSchema.nullable(),
  })
  .meta({ id: 'RunRetype' });
export type RunRetype = z.infer<typeof RunRetypeSchema>;

export const JobRunSchema = z
  .object({
    id: IdSchema,
    sequence: z.number().int().positive(),
    kind: z.enum(RUN_KINDS),
    /**
     * Read without phase: every repeat is an amplitude alone (the `four-run` method's runs). The server
     * always sends it; optional for a job a client kept from before it existed (read as false).
     */
    amplitudeOnly: z.boolean().optional(),
    trialWeight: PlaneWeightOutSchema.nullable(),
    /** Every weight of this job on the rotor during the run (equivalent masses at the plane's radius). */
    weightsOnRotor: z.array(PlaneWeightOutSchema),
    readings: z.array(SensorReadingSchema),
    /** Repeats that disagree, a speed that drifted from the initial run. */
    warnings: z.array(z.string()),
    createdAt: z.iso.datetime(),
    by: PersonRefSchema,
    /**
     * Each time the readings were typed again, oldest first: when, who, and the readings (and trial
     * weight) as they stood before, so the first entry holds the run as first typed. The server always
     * sends it (empty when never retyped); optional for a job a client kept from before it existed.
     */
    retyped: z.array(RunRetypeSchema).optional(),
  })
  .meta({ id: 'JobRun' });
export type JobRun = z.infer<typeof JobRunSchema>;

export const JobCorrectionSchema = z
  .object({
    id: IdSchema,
    sequence: z.number().int().positive(),
    method: z.enum(CORRECTION_METHODS),
    /** `trial` from trial runs; `trim` when earlier corrections and their verification runs refined it. */
    basis: z.enum(['sensitivity', 'trial', 'trim']),
    /** The runs it was computed from. */
    runIds: z.array(IdSchema),
    /** The calculator route and request it was computed with: the calculator answers the same. */
    calc: z.object({
      route: z.enum(['one-run', 'single-plane', 'multi-plane', 'four-run']),
      request: z.unknown(),
      /** The sensors whose readings it used, in the order of the request's readings. */
      sensorSides: z.array(SideSchema),
    }),
    /** The calculator's answer to `calc.request`, as computed by the server. */
    result: z.record(z.string(), z.unknown()),
    /** The weights to add now, per plane, in grams at the plane's correction radius. */
    plan: z.array(PlaneWeightOutSchema),
    installed: z.array(InstalledWeightSchema).nullable(),
    /**
     * The reading each sensor should show with the installed weights, as the model predicts it (an
     * amplitude alone, `phaseDeg` null, for a `four-run` correction).
     */
    predicted: z.array(z.object({ sensorSide: SideSchema, reading: AmplitudeReadingOutSchema })).nullable(),
    installedAt: z.iso.datetime().nullable(),
    warnings: z.array(z.string()),
    createdAt: z.iso.datetime(),
    by: PersonRefSchema,
  })
  .meta({ id: 'JobCorrection' });
export type JobCorrection = z.infer<typeof JobCorrectionSchema>;

/** One side of the latest run against the acceptance level. */
const SideVerdictSchema = z.object({
  sensorSide: SideSchema,
  amplitude: z.number(),
  /** The acceptance limit in the job's unit; null when the level cannot be read as an amplitude. */
  limit: z.number().nullable(),
  accepted: z.boolean(),
});

export const JobVerificationSchema = z
  .object({
    runId: IdSchema,
    acceptance: AcceptanceLevelSchema,
    sides: z.array(SideVerdictSchema),
    accepted: z.boolean(),
    /** The side to work next (the worse one first), or null when both are accepted. */
    nextSide: SideSchema.nullable(),
    why: z.string(),
  })
  .meta({ id: 'JobVerification' });

export const JobCompletionSchema = z
  .object({
    completedAt: z.iso.datetime(),
    by: PersonRefSchema,
    accepted: z.boolean(),
    beforeAfter: z.array(
      z.object({
        sensorSide: SideSchema,
        before: AmplitudeReadingOutSchema,
        after: AmplitudeReadingOutSchema,
      }),
    ),
    /** The weights now on the rotor: this job's and those earlier jobs left. */
    weightsOnRotor: z.array(InstalledWeightSchema.extend({ jobId: IdSchema })),
    /** The influence coefficients this job measured, per sensor and plane, in the job's unit per gram. */
    coefficients: z.array(
      z.object({
        sensorSide: SideSchema,
        planeIndex: z.number().int(),
        amplitudePerGram: z.number(),
        phaseDeg: z.number(),
        unit: AmplitudeUnitSchema,
      }),
    ),
    /** The family's stored sensitivities as refined with this job (null for a machine without family). */
    familySensitivities: z.array(StoredSensitivitySchema).nullable(),
  })
  .meta({ id: 'JobCompletion' });

export const JobSchema = z
  .object({
    id: IdSchema,
    version: z.number().int().positive(),
    status: z.enum(JOB_STATUSES),
    /** The step the stepper opens at: the first one not done. */
    nextStep: z.enum([...JOB_STEPS, 'done']),
    scheduledFor: DateSchema,
    machine: z.object({
      id: IdSchema,
      serialNumber: z.string().nullable(),
      make: z.string().nullable(),
      model: z.string().nullable(),
      customerId: IdSchema,
      customerName: z.string(),
      familyId: IdSchema.nullable(),
      familyName: z.string().nullable(),
    }),
    technician: PersonRefSchema,
    createdAt: z.iso.datetime(),
    updatedAt: z.iso.datetime(),
    safety: z
      .object({
        topicIds: z.array(z.enum(JOB_SAFETY_TOPICS)),
        acknowledgedAt: z.iso.datetime(),
        by: PersonRefSchema,
      })
      .nullable(),
    inspection: z
      .object({
        bearingEndPlayMm: z.number(),
        shaftRunoutMm: z.number(),
        checks: RecordInspectionSchema.shape.checks,
        notes: z.string().nullable(),
        limits: InspectionLimitsSchema,
        passed: z.boolean(),
        reasons: z.array(z.string()),
        measuredAt: z.iso.datetime(),
        by: PersonRefSchema,
        override: z.object({ reason: z.string(), at: z.iso.datetime(), by: PersonRefSchema }).nullable(),
      })
      .nullable(),
    setup: RecordSetupSchema.extend({ recordedAt: z.iso.datetime() }).nullable(),
    runs: z.array(JobRunSchema),
    corrections: z.array(JobCorrectionSchema),
    verification: JobVerificationSchema.nullable(),
    completion: JobCompletionSchema.nullable(),
    abandonment: z
      .object({
        reason: z.string(),
        at: z.iso.datetime(),
        by: PersonRefSchema,
        reopenedAt: z.iso.datetime().nullable(),
        reopenedBy: PersonRefSchema.nullable(),
      })
      .nullable(),
  })
  .meta({ id: 'Job' });
export type Job = z.infer<typeof JobSchema>;

/** A job in a list: who, what, when, where it stands. */
export const JobSummarySchema = z
  .object({
    id: IdSchema,
    version: z.number().int().positive(),
    status: z.enum(JOB_STATUSES),
    scheduledFor: DateSchema,
    machine: JobSchema.shape.machine,
    technician: PersonRefSchema,
    updatedAt: z.iso.datetime(),
  })
  .meta({ id: 'JobSummary' });
export type JobSummary = z.infer<typeof JobSummarySchema>;

export const JobPageSchema = z
  .object({
    items: z.array(JobSummarySchema),
    total: z.number().int().nonnegative(),
    page: z.number().int().positive(),
    pageSize: z.number().int().positive(),
  })
  .meta({ id: 'JobPage' });
export type JobPage = z.infer<typeof JobPageSchema>;

/** The home page's summary of the caller's day. */
export const JobsHomeSchema = z
  .object({
    /** The caller's jobs open or on hold, by date. */
    myOpenJobs: z.array(JobSummarySchema),
    /** Jobs on hold for a manager's decision (all of the organisation's for a manager, the caller's otherwise). */
    waitingForManager: z.array(JobSummarySchema),
    /** Machines whose last job is old or did not end accepted. */
    machinesDue: z.array(
      z.object({
        machine: JobSchema.shape.machine,
        lastJob: z.object({ id: IdSchema, scheduledFor: DateSchema, status: z.enum(JOB_STATUSES) }),
        reason: z.string(),
      }),
    ),
    /** How many days make a last job old (a product default). */
    dueAfterDays: z.number().int().positive(),
  })
  .meta({ id: 'JobsHome' });
export type JobsHome = z.infer<typeof JobsHomeSchema>;

/** The 412 of a job: the problem and the job as stored. */
export const JobChangedMeanwhileSchema = ProblemSchema.extend({ current: JobSchema }).meta({
  id: 'JobChangedMeanwhile',
});
