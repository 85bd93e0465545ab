import { HttpErrorResponse } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  type ElementRef,
  inject,
  type Injector,
  signal,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import {
  MAT_DIALOG_DATA,
  type MatDialog,
  MatDialogModule,
  type MatDialogRef,
  MatDialogRef as DialogRef,
} from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { READINGS_CSV_COLUMN_LABELS } from '@counterpoise/api';
import { firstValueFrom } from 'rxjs';
import { BusyButton } from '../../forms/busy-button';
import { ErrorBanner } from '../../forms/error-banner';
import { etagOfVersion } from '../../records/records-api';
import { AMPLITUDE_UNIT_LABELS, formatDeg, formatNumber, SIDE_LABELS } from '../../records/record-labels';
import { JobSession } from '../job-session';
import {
  type ImportedRun,
  type Job,
  JobsApi,
  type ReadingsImportError,
  type ReadingsImportPreview,
} from '../jobs.api';
import { RUN_KIND_LABELS } from '../run-entry';
import { describeWeight } from '../steps/runs-step';
import SAMPLE_CSV from '../../../../../../docs/samples/readings.csv' with { loader: 'text' };

/** The columns of a readings file, for the summary in the dialog (docs/readings-csv.md has the rest). */
export const FORMAT_SUMMARY: readonly { readonly column: string; readonly holds: string }[] = [
  { column: 'run', holds: 'The run’s number: the same on every row of one run.' },
  { column: 'kind', holds: 'initial, trial or verification.' },
  { column: 'sensorSide', holds: 'left or right: a sensor of the set-up.' },
  { column: 'amplitude', holds: 'The amplitude at running speed, with a decimal point.' },
  { column: 'phaseDeg', holds: 'The phase in degrees; empty on every row of a run read without phase.' },
  { column: 'speedRpm', holds: 'The speed during the reading, in rpm.' },
  { column: 'amplitudeUnit', holds: 'in/s-pk or mm/s-rms: the unit of the job’s set-up.' },
  {
    column: 'trialPlaneIndex, trialMassGrams, trialAngleDeg',
    holds: 'A trial run’s weight on each of its rows: plane 0 or 1, grams, degrees.',
  },
];

/** One bad row (or the file as a whole) in a sentence: "Row 12, phase: The phase is from 0 to 359.9 degrees. Found “412”." */
export function describeImportError(error: ReadingsImportError): string {
  const where =
    error.row === null
      ? error.path === 'columns'
        ? 'Header'
        : 'File'
      : `Row ${error.row}${error.column === null ? '' : `, ${READINGS_CSV_COLUMN_LABELS[error.column]}`}`;
  const found = error.value === null || error.value === '' ? '' : ` Found “${error.value}”.`;
  return `${where}: ${error.message}${found}`;
}

/** The lines a run's rows are on, in words: "line 4", "lines 4–9", "lines 4–6, 9". */
export function describeLines(rows: readonly number[]): string {
  const spans: string[] = [];
  let start = rows[0];
  for (let index = 0; index < rows.length; index++) {
    const line = rows[index]!;
    const next = rows[index + 1];
    if (next === line + 1) continue;
    spans.push(start === line ? `${line}` : `${start}–${line}`);
    start = next;
  }
  return `${rows.length === 1 ? 'line' : 'lines'} ${spans.join(', ')}`;
}

/** What the dialog is told: the machine's planes, to name a trial weight's plane. */
export interface ReadingsImportData {
  readonly planeCount: number;
}

/**
 * Readings imported from a CSV file into the job of the session: the file chosen with a button, previewed by
 * the server at once (the runs it would add, as the server averages them, and every bad row), and imported
 * only when no row is bad, through the job's session on the version the preview was made on, so the job
 * shows as stored with its new ETag. Nothing is saved before Import.
 */
@Component({
  selector: 'app-readings-import-dialog',
  imports: [
    BusyButton,
    ErrorBanner,
    MatButtonModule,
    MatDialogModule,
    MatIconModule,
    MatProgressSpinnerModule,
  ],
  templateUrl: './readings-import-dialog.html',
  styleUrl: './readings-import-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReadingsImportDialog {
  private readonly api = inject(JobsApi);
  private readonly session = inject(JobSession);
  private readonly ref = inject<MatDialogRef<ReadingsImportDialog, Job>>(DialogRef);
  private readonly data = inject<ReadingsImportData>(MAT_DIALOG_DATA);
  private readonly picker = viewChild.required<ElementRef<HTMLInputElement>>('picker');

  protected readonly formatSummary = FORMAT_SUMMARY;
  protected readonly sampleHref = `data:text/csv;charset=utf-8,${encodeURIComponent(SAMPLE_CSV)}`;
  protected readonly sideLabels = SIDE_LABELS;
  protected readonly kindLabels = RUN_KIND_LABELS;
  protected readonly formatNumber = formatNumber;
  protected readonly formatDeg = formatDeg;
  protected readonly describeError = describeImportError;
  protected readonly describeLines = describeLines;

  /** The file chosen; null before one is. */
  protected readonly file = signal<File | null>(null);
  /** The server's preview of the file chosen; null before it answers. */
  protected readonly preview = signal<ReadingsImportPreview | null>(null);
  protected readonly previewing = signal(false);
  protected readonly importing = signal(false);
  /** Why the preview or the import failed (no connection, the job not open…); null otherwise. */
  protected readonly failure = signal<unknown>(null);
  /** A word on what happened meanwhile (the job changed since the preview). */
  protected readonly note = signal<string | null>(null);

  protected readonly unit = computed(() => {
    const unit = this.session.job()?.setup?.amplitudeUnit;
    return unit ? AMPLITUDE_UNIT_LABELS[unit] : '';
  });
  protected readonly errors = computed(() => this.preview()?.errors ?? []);
  protected readonly runs = computed(() => this.preview()?.runs ?? []);
  /** The file can be imported: previewed, with runs and no bad row, on a job that takes changes. */
  protected readonly ready = computed(
    () =>
      this.runs().length > 0 &&
      this.errors().length === 0 &&
      !this.previewing() &&
      this.session.changeable() &&
      !this.session.busy(),
  );
  protected readonly importLabel = computed(() => {
    const count = this.runs().length;
    return count === 0 || this.errors().length > 0
      ? 'Import'
      : `Import ${count} run${count === 1 ? '' : 's'}`;
  });
  /** What the preview found, in one sentence for the status line. */
  protected readonly summary = computed(() => {
    const preview = this.preview();
    if (preview === null) return '';
    const problems = preview.errors.length;
    if (problems > 0) {
      return `${problems} problem${problems === 1 ? '' : 's'} in the file: nothing can be imported until ${
        problems === 1 ? 'it is' : 'they are'
      } fixed.`;
    }
    const runs = preview.runs.length;
    return `${runs} run${runs === 1 ? '' : 's'} to add from ${preview.rowCount} row${
      preview.rowCount === 1 ? '' : 's'
    }. Nothing is saved until you import.`;
  });

  /** Opens the system's file chooser. */
  protected choose(): void {
    this.picker().nativeElement.click();
  }

  /** Takes the file chosen and asks the server for its preview. */
  protected async chosen(): Promise<void> {
    const input = this.picker().nativeElement;
    const file = input.files?.[0] ?? null;
    // The same file chosen again (fixed and saved) must still be read again.
    input.value = '';
    if (file === null) return;
    this.file.set(file);
    this.note.set(null);
    await this.runPreview(file);
  }

  /** Imports the previewed file, through the job's session, on the version the preview was made on. */
  protected async importFile(): Promise<void> {
    const file = this.file();
    const preview = this.preview();
    if (file === null || preview === null || !this.ready()) return;
    this.importing.set(true);
    this.failure.set(null);
    const outcome = await this.session.save(`Readings from ${file.name}`, (api, id) =>
      api.importReadings(id, file, etagOfVersion(preview.jobVersion)),
    );
    this.importing.set(false);
    if (outcome.ok) {
      this.ref.close(outcome.job);
      return;
    }
    const status = outcome.error instanceof HttpErrorResponse ? outcome.error.status : -1;
    if (status === 412 || status === 400) {
      // The job changed since the preview (the session shows it as stored): judge the file again against it.
      this.note.set(
        status === 412
          ? 'The job was changed meanwhile, so nothing was imported. The file is previewed again against the job as it is now.'
          : null,
      );
      await this.runPreview(file);
      return;
    }
    this.failure.set(outcome.error);
  }

  protected trialText(run: ImportedRun): string {
    return run.trialWeight ? describeWeight(run.trialWeight, this.data.planeCount) : '';
  }

  private async runPreview(file: File): Promise<void> {
    const job = this.session.job();
    if (job === null) return;
    this.previewing.set(true);
    this.preview.set(null);
    this.failure.set(null);
    try {
      this.preview.set(await firstValueFrom(this.api.previewReadingsImport(job.id, file)));
    } catch (error) {
      this.failure.set(error);
    } finally {
      this.previewing.set(false);
    }
  }
}

/**
 * Opens the import of a readings file for the job of the session `injector` reaches (the job page's), and
 * returns the dialog; it closes with the job as stored after an import, or nothing.
 */
export function openReadingsImport(
  dialog: MatDialog,
  injector: Injector,
  data: ReadingsImportData,
): MatDialogRef<ReadingsImportDialog, Job> {
  return dialog.open<ReadingsImportDialog, ReadingsImportData, Job>(ReadingsImportDialog, {
    injector,
    data,
    maxWidth: '46rem',
    width: '100%',
    autoFocus: 'first-tabbable',
    ariaLabelledBy: 'readings-import-title',
  });
}
