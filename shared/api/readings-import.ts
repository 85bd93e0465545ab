import * as z from 'zod';
import { FieldErrorSchema } from './problem';
import { AddRunSchema, JobRunSchema } from './jobs';
import { AmplitudeUnitSchema } from './records';

/*
 * A job's run readings imported from a CSV file of Counterpoise's own format: one row per repeat reading,
 * a header row naming the columns, the rows of one run grouped by its number. Each row is checked with the
 * rules of the run schemas (AddRunSchema and its parts), so that a file is accepted exactly when typing the
 * same readings would be. The format and the routes: docs/readings-csv.md.
 */

/** The columns of a readings file, in the order the sample writes them. */
export const READINGS_CSV_COLUMNS = [
  'run',
  'kind',
  'sensorSide',
  'amplitude',
  'phaseDeg',
  'speedRpm',
  'amplitudeUnit',
  'trialPlaneIndex',
  'trialMassGrams',
  'trialAngleDeg',
] as const;
export type ReadingsCsvColumn = (typeof READINGS_CSV_COLUMNS)[number];

/** The columns every file has (a cell of `phaseDeg` may be empty: a reading without phase). */
export const READINGS_CSV_REQUIRED_COLUMNS: readonly ReadingsCsvColumn[] = [
  'run',
  'kind',
  'sensorSide',
  'amplitude',
  'phaseDeg',
  'speedRpm',
  'amplitudeUnit',
];

/** The columns of a trial run's trial weight: needed in a file with a trial run. */
export const READINGS_CSV_TRIAL_COLUMNS: readonly ReadingsCsvColumn[] = [
  'trialPlaneIndex',
  'trialMassGrams',
  'trialAngleDeg',
];

/** How a column is named in a sentence ("Row 12, phase: …"). */
export const READINGS_CSV_COLUMN_LABELS: Readonly<Record<ReadingsCsvColumn, string>> = {
  run: 'run',
  kind: 'kind',
  sensorSide: 'sensor side',
  amplitude: 'amplitude',
  phaseDeg: 'phase',
  speedRpm: 'speed',
  amplitudeUnit: 'unit',
  trialPlaneIndex: 'trial plane',
  trialMassGrams: 'trial mass',
  trialAngleDeg: 'trial angle',
};

/** The largest file taken, in bytes (256 kB: some thousand rows). */
export const READINGS_CSV_MAX_BYTES = 256 * 1024;
/** The most data rows a file may hold: 20 repeats of two sensors for 25 runs. */
export const READINGS_CSV_MAX_ROWS = 1000;
/** The media type of the upload. */
export const READINGS_CSV_MEDIA_TYPE = 'text/csv';

// The parts of a run as typed, reused so that a row obeys the same rules as a typed repeat.
const RunShape = AddRunSchema.shape;
const SensorShape = RunShape.readings.element.shape;
const RepeatShape = SensorShape.repeats.element.shape;
const TrialShape = RunShape.trialWeight.unwrap().shape;

/**
 * One data row of a readings file, its cells read as numbers where the column holds one (an empty cell
 * left out). The values' rules are those of AddRun: the same amplitude, phase, speed and trial-weight
 * limits and messages as a run typed in the workbench.
 */
export const ReadingsCsvRowSchema = z.strictObject({
  run: z
    .number({ error: 'Number the run: rows of one run share its number.' })
    .int({ error: 'The run number is a whole number.' })
    .min(1, { error: 'The run number is 1 or more.' })
    .max(999, { error: 'The run number is at most 999.' }),
  kind: RunShape.kind,
  sensorSide: SensorShape.sensorSide,
  amplitude: RepeatShape.amplitude,
  phaseDeg: RepeatShape.phaseDeg,
  speedRpm: RepeatShape.speedRpm,
  amplitudeUnit: AmplitudeUnitSchema,
  trialPlaneIndex: TrialShape.planeIndex.optional(),
  trialMassGrams: TrialShape.massGrams.optional(),
  trialAngleDeg: TrialShape.angleDeg.optional(),
});
export type ReadingsCsvRow = z.output<typeof ReadingsCsvRowSchema>;

/**
 * One thing wrong with a file: the row (its line in the file, every line counted: notes, the header and empty
 * lines too, as a text editor numbers them) and column at fault
 * with the value found, or the file as a whole (`row` null). `path` names it as the API's errors do
 * (`rows[12].phaseDeg`, `columns`, `file`), so the same list is a preview's `errors` and a refused import's
 * problem `errors`.
 */
export const ReadingsImportErrorSchema = FieldErrorSchema.extend({
  row: z.number().int().positive().nullable().meta({
    description: 'The line of the file at fault, as a text editor numbers it; null for the file as a whole.',
  }),
  column: z.enum(READINGS_CSV_COLUMNS).nullable().meta({ description: 'The column at fault, if one is.' }),
  value: z.string().nullable().meta({ description: 'The cell as found in the file (cut to 40 characters).' }),
}).meta({ id: 'ReadingsImportError' });
export type ReadingsImportError = z.infer<typeof ReadingsImportErrorSchema>;

/**
 * One run the file would add, as the server would store it: its sequence in the job, kind, trial weight,
 * each sensor's repeats averaged (vectors, or amplitudes alone for a run read without phase) with their
 * spread, and the warnings, exactly as for a run typed in.
 */
export const ImportedRunSchema = JobRunSchema.pick({
  sequence: true,
  kind: true,
  amplitudeOnly: true,
  trialWeight: true,
  weightsOnRotor: true,
  readings: true,
  warnings: true,
})
  .extend({
    /** The run's number in the file. */
    fileRun: z.number().int().positive(),
    /** The lines of the file its rows are on. */
    rows: z.array(z.number().int().positive()),
  })
  .meta({ id: 'ImportedRun' });
export type ImportedRun = z.infer<typeof ImportedRunSchema>;

/**
 * What importing a file would do to the job as it stands, with nothing saved: the runs it would add and
 * every bad row. The file can be imported when `errors` is empty, on the job's version `jobVersion` (sent
 * back as `If-Match: "<jobVersion>"`).
 */
export const ReadingsImportPreviewSchema = z
  .object({
    jobId: z.number().int().positive(),
    /** The version of the job the preview was made on: the import sends it back in `If-Match`. */
    jobVersion: z.number().int().positive(),
    /** The job's set-up unit, which every row's `amplitudeUnit` must name. */
    amplitudeUnit: AmplitudeUnitSchema.nullable(),
    /** The data rows read (empty lines and `#` comments not counted). */
    rowCount: z.number().int().nonnegative(),
    runs: z.array(ImportedRunSchema),
    errors: z.array(ReadingsImportErrorSchema),
  })
  .meta({ id: 'ReadingsImportPreview' });
export type ReadingsImportPreview = z.infer<typeof ReadingsImportPreviewSchema>;
