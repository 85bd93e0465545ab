import {
  formatPath,
  type ImportedRun,
  type Job,
  type ReadingsCsvColumn,
  type ReadingsImportError,
  type ReadingsImportPreview,
} from '@counterpoise/api';
import type { Orm } from '../db/database';
import { HttpProblem } from '../http/problem';
import type { JobActor, JobsService } from '../jobs/jobs.service';
import { type FileRun, readReadingsCsv } from './readings-csv';

/** The `code` of an import refused for its file's rows. */
export const READINGS_FILE_REFUSED = 'READINGS_FILE_REFUSED';

/** Thrown inside the transaction to undo a preview, carrying what it found. */
class Undo {
  constructor(readonly outcome: Outcome) {}
}

interface Outcome {
  readonly job: Job;
  readonly preview: ReadingsImportPreview;
}

/**
 * Run readings imported from a file of our own CSV format (docs/readings-csv.md). The preview and the import
 * are one piece of work: the file is read, and its runs are added through the jobs service (`addRuns`, the
 * rules and averaging of a typed run) in one write transaction. The preview always undoes it and answers what
 * it saw, every bad row named; the import keeps it only when the file has no bad row, so what the preview
 * showed is what is stored.
 */
export class ReadingsImportService {
  constructor(
    private readonly orm: Orm,
    private readonly jobs: JobsService,
  ) {}

  /** What importing the file would add to the job as it stands, and every bad row; nothing is saved. */
  preview(actor: JobActor, jobId: number, bytes: Uint8Array): ReadingsImportPreview {
    return this.attempt(actor, jobId, undefined, bytes, false).preview;
  }

  /**
   * Adds the file's runs to the job, on the version the caller previewed (412 otherwise): all of them, or
   * none with a 400 naming every bad row.
   */
  import(actor: JobActor, jobId: number, versions: readonly number[], bytes: Uint8Array): Job {
    return this.attempt(actor, jobId, versions, bytes, true).job;
  }

  private attempt(
    actor: JobActor,
    jobId: number,
    versions: readonly number[] | undefined,
    bytes: Uint8Array,
    keep: boolean,
  ): Outcome {
    try {
      return this.orm.transaction(
        () => {
          const before = this.jobs.get(actor, jobId);
          const file = readReadingsCsv(bytes, before.setup?.amplitudeUnit ?? null);
          const errors = [...file.errors];
          const refused = new Set<number>();
          const after = this.jobs.addRuns(
            actor,
            jobId,
            versions ?? [before.version],
            file.runs.map((run) => run.body),
            (index, problem) => {
              refused.add(index);
              errors.push(refusal(file.runs[index]!, problem));
            },
          );
          const kept = file.runs.filter((_run, index) => !refused.has(index));
          const added = after.runs.filter((run) => run.sequence > before.runs.length);
          const preview: ReadingsImportPreview = {
            jobId,
            jobVersion: before.version,
            amplitudeUnit: before.setup?.amplitudeUnit ?? null,
            rowCount: file.rowCount,
            runs: added.map((run, index) => importedRun(run, kept[index]!)),
            errors: errors.sort((a, b) => (a.row ?? 0) - (b.row ?? 0)),
          };
          if (keep && errors.length > 0) throw refusedFile(errors);
          if (!keep) throw new Undo({ job: before, preview });
          return { job: after, preview };
        },
        { behavior: 'immediate' },
      );
    } catch (error) {
      if (error instanceof Undo) return error.outcome;
      throw error;
    }
  }
}

function importedRun(run: Job['runs'][number], fileRun: FileRun): ImportedRun {
  return {
    fileRun: fileRun.fileRun,
    rows: [...fileRun.rows],
    sequence: run.sequence,
    kind: run.kind,
    amplitudeOnly: run.amplitudeOnly ?? false,
    trialWeight: run.trialWeight,
    weightsOnRotor: run.weightsOnRotor,
    readings: run.readings,
    warnings: run.warnings,
  };
}

/**
 * A run of the file that the job refuses (an initial run when it has one, a plane the machine lacks, a
 * sensor the set-up lacks), put on the row and column it comes from.
 */
function refusal(run: FileRun, problem: HttpProblem): ReadingsImportError {
  const field = problem.errors?.[0];
  let line = run.rows[0]!;
  let column: ReadingsCsvColumn = 'kind';
  const sensor = /^readings\[(\d+)\]\.sensorSide$/.exec(field?.path ?? '');
  if (sensor) {
    line = run.lines[Number(sensor[1])]?.[0] ?? line;
    column = 'sensorSide';
  } else if (field?.path === 'trialWeight.planeIndex') {
    column = 'trialPlaneIndex';
  }
  const reason = field?.message ?? problem.detail ?? problem.title;
  const value =
    column === 'sensorSide'
      ? (run.body.readings[Number(sensor![1])]?.sensorSide ?? null)
      : column === 'trialPlaneIndex'
        ? String(run.body.trialWeight?.planeIndex ?? '')
        : run.body.kind;
  return {
    path: formatPath(['rows', line, column]),
    message: `The job cannot take run ${run.fileRun} of the file: ${reason}`,
    row: line,
    column,
    value,
  };
}

function refusedFile(errors: readonly ReadingsImportError[]): HttpProblem {
  const rows = new Set(errors.map((error) => error.row).filter((row) => row !== null)).size;
  const whole = errors.some((error) => error.row === null);
  const what = whole
    ? 'The file cannot be read as readings'
    : `The file has ${rows} bad row${rows === 1 ? '' : 's'}`;
  return new HttpProblem(
    400,
    'Bad Request',
    `${what}: nothing was imported. Each error names its row (the line in the file) and column; preview the file to see them all.`,
    errors,
    'about:blank',
    READINGS_FILE_REFUSED,
  );
}
