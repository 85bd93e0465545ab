import * as z from 'zod';
import { CORRECTION_METHODS, InstalledWeightSchema, JOB_STATUSES } from './jobs';
import {
  AcceptanceLevelSchema,
  AmplitudeUnitSchema,
  MACHINE_SIDES,
  MachineSchema,
  StoredSensitivitySchema,
} from './records';

/*
 * A machine's history (every job on it, before and after per side, the weights now on the rotor, the
 * family's stored sensitivity) and the export of the shop's jobs as CSV for a date range. The routes and
 * the CSV's columns: docs/machine-history.md.
 */

const IdSchema = z.number().int().positive();
const SideSchema = z.enum(MACHINE_SIDES);

/** One side's reading of a run as the history shows it: the run's average, and its speed. */
const HistoryReadingSchema = z.object({
  /** The run it was read in. */
  runId: IdSchema,
  /** In the job's unit. */
  amplitude: z.number(),
  /** As the instrument counted it; null for a run read without phase. */
  phaseDeg: z.number().nullable(),
  speedRpm: z.number(),
});

/** One side of a job: the first reading, the last one after the weights, and the acceptance limit. */
export const MachineHistorySideSchema = z
  .object({
    sensorSide: SideSchema,
    /** The initial run's reading; null when the job has none yet. */
    before: HistoryReadingSchema.nullable(),
    /** The reading the job ended on (its last run without a trial weight); null before such a run. */
    after: HistoryReadingSchema.nullable(),
    /** The acceptance limit in the job's unit; null when the level cannot be read as an amplitude. */
    limit: z.number().nullable(),
    /** Whether `after` is within `limit`; null without an after reading or a limit. */
    accepted: z.boolean().nullable(),
    /**
     * `before`, `after` and `limit` in the history's unit (`MachineHistory.unit`): the same figures for a
     * job read in that unit, converted with the engine's `convertVibration` for a job read in the other
     * (in/s peak and mm/s RMS of one sinusoid at 1x).
     */
    inHistoryUnit: z.object({
      before: z.number().nullable(),
      after: z.number().nullable(),
      limit: z.number().nullable(),
    }),
  })
  .meta({ id: 'MachineHistorySide' });
export type MachineHistorySide = z.infer<typeof MachineHistorySideSchema>;

/** One job on the machine as the history lists it. */
export const MachineHistoryJobSchema = z
  .object({
    /** The job's number (its id). */
    id: IdSchema,
    scheduledFor: z.iso.date(),
    completedAt: z.iso.datetime().nullable(),
    status: z.enum(JOB_STATUSES),
    technician: z.object({ id: IdSchema, name: z.string() }),
    /** The methods of the job's corrections, each once, in the order first used. */
    methods: z.array(z.enum(CORRECTION_METHODS)),
    /** The unit the job was read in; null before its set-up. */
    unit: AmplitudeUnitSchema.nullable(),
    operatingSpeedRpm: z.number().nullable(),
    /** How the job counted weight angles from the reference mark; null before its set-up. */
    weightAngles: z.enum(['againstRotation', 'withRotation']).nullable(),
    /** The acceptance level the job was judged against (the machine's, else its family's). */
    acceptance: AcceptanceLevelSchema.nullable(),
    /** Whether the job ended within the acceptance level; null while it has no after reading. */
    accepted: z.boolean().nullable(),
    sides: z.array(MachineHistorySideSchema),
    /** Every weight fitted in this job, as fitted. */
    weightsFitted: z.array(InstalledWeightSchema),
  })
  .meta({ id: 'MachineHistoryJob' });
export type MachineHistoryJob = z.infer<typeof MachineHistoryJobSchema>;

/** A weight on the rotor now, with the job that fitted it. */
export const WeightOnRotorSchema = InstalledWeightSchema.extend({
  jobId: IdSchema,
  /** The day of the job that fitted it. */
  fittedOn: z.iso.date().nullable(),
}).meta({ id: 'WeightOnRotor' });
export type WeightOnRotor = z.infer<typeof WeightOnRotorSchema>;

/** A machine's history. */
export const MachineHistorySchema = z
  .object({
    machine: MachineSchema,
    /**
     * The unit the history's figures are compared in (`inHistoryUnit`): the unit of the latest job that
     * has a set-up; null when no job has one.
     */
    unit: AmplitudeUnitSchema.nullable(),
    /** Every job on the machine, oldest first (by date, then number). */
    jobs: z.array(MachineHistoryJobSchema),
    /** The weights now on the rotor, as the latest completed job left them; null before any. */
    weightsOnRotor: z
      .object({
        /** The completed job whose list it is. */
        jobId: IdSchema,
        completedAt: z.iso.datetime(),
        weights: z.array(WeightOnRotorSchema),
      })
      .nullable(),
    /** The machine's family with its stored sensitivities (refined by completed jobs); null without one. */
    family: z
      .object({
        id: IdSchema,
        name: z.string(),
        sensitivities: z.array(StoredSensitivitySchema),
      })
      .nullable(),
  })
  .meta({ id: 'MachineHistory' });
export type MachineHistory = z.infer<typeof MachineHistorySchema>;

// The export of the shop's jobs

/** The longest range one export covers, in years (a product default: enough for a warranty file). */
export const JOBS_EXPORT_MAX_YEARS = 3;

const ExportDateSchema = (name: 'from' | 'to') =>
  z.iso.date({ error: `Write ${name} as a day of the calendar, YYYY-MM-DD.` });

/** The last day a range that starts on `from` may end on. */
export function jobsExportLastDay(from: string): string {
  const [year, month, day] = from.split('-').map(Number) as [number, number, number];
  const last = new Date(Date.UTC(year + JOBS_EXPORT_MAX_YEARS, month - 1, day) - 86_400_000);
  return last.toISOString().slice(0, 10);
}

/** The range of an export: jobs scheduled or completed from the first day to the last, both included. */
export const JobsExportQuerySchema = z
  .object({
    from: ExportDateSchema('from').meta({
      description: 'The first day (YYYY-MM-DD), included.',
      example: '2026-01-01',
    }),
    to: ExportDateSchema('to').meta({
      description: 'The last day (YYYY-MM-DD), included.',
      example: '2026-03-31',
    }),
  })
  .superRefine((range, context) => {
    // The order and the length are judged between two days of the calendar only.
    const day = z.iso.date();
    if (!day.safeParse(range.from).success || !day.safeParse(range.to).success) return;
    if (range.to < range.from) {
      context.addIssue({
        code: 'custom',
        path: ['to'],
        message: 'The last day (to) is before the first (from).',
      });
    } else if (range.to > jobsExportLastDay(range.from)) {
      context.addIssue({
        code: 'custom',
        path: ['to'],
        message: `One export covers at most ${JOBS_EXPORT_MAX_YEARS} years: end on ${jobsExportLastDay(range.from)} or earlier.`,
      });
    }
  })
  .meta({ id: 'JobsExportQuery' });
export type JobsExportQuery = z.input<typeof JobsExportQuerySchema>;
