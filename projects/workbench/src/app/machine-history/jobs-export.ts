import { DOCUMENT } from '@angular/common';
import { ChangeDetectionStrategy, Component, effect, inject, input, signal, untracked } from '@angular/core';
import {
  type AbstractControl,
  FormControl,
  FormGroup,
  ReactiveFormsModule,
  type ValidationErrors,
} from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { BusyButton } from '../forms/busy-button';
import { todayIso } from '../jobs/job-dates';
import { formErrorOf } from '../shell/server-errors';
import { errorMessage } from '../shell/validators';
import { MachineHistoryApi } from './machine-history.api';

/** The longest range one export covers, in years: the server's rule (`JOBS_EXPORT_MAX_YEARS`). */
export const EXPORT_MAX_YEARS = 3;

/** The last day a range starting on `from` may end on (the day before the same date three years on). */
export function lastDayOf(from: string): string {
  const [year, month, day] = from.split('-').map(Number) as [number, number, number];
  return new Date(Date.UTC(year + EXPORT_MAX_YEARS, month - 1, day) - 86_400_000).toISOString().slice(0, 10);
}

/** A day typed in a date field: there, and a real day. */
function day(missing: string) {
  return (control: AbstractControl<string>): ValidationErrors | null => {
    const value = control.value;
    if (!value) return { required: missing };
    return /^\d{4}-\d{2}-\d{2}$/.test(value) ? null : { date: 'Enter a real date.' };
  };
}

/** The last day is not before the first, and at most three years after it. */
function rangeRule(group: AbstractControl): ValidationErrors | null {
  const from = group.get('from')?.value as string;
  const to = group.get('to');
  if (!to) return null;
  const errors = { ...(to.errors ?? {}) } as ValidationErrors;
  delete errors['order'];
  delete errors['length'];
  if (from && to.value && to.value < from) errors['order'] = 'The last day is before the first.';
  else if (from && to.value && to.value > lastDayOf(from)) {
    errors['length'] =
      `One file covers at most ${EXPORT_MAX_YEARS} years: end on ${lastDayOf(from)} or earlier.`;
  }
  to.setErrors(Object.keys(errors).length > 0 ? errors : null);
  return null;
}

/** Hands a file to the browser to save, under its name. */
export function saveFile(document: Document, blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.style.display = 'none';
  document.body.append(link);
  link.click();
  link.remove();
  // The click has started the download; the address is not needed after it.
  setTimeout(() => URL.revokeObjectURL(url), 0);
}

/**
 * The shop's jobs of a date range as a CSV file for a spreadsheet: the first and last day (the list's
 * date filters when set, else the year so far), and Download CSV, which fetches the file with the
 * session's credentials and saves it. A refused range shows the server's words on its field.
 */
@Component({
  selector: 'app-jobs-export',
  imports: [BusyButton, MatFormFieldModule, MatIconModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './jobs-export.html',
  styleUrl: './jobs-export.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobsExport {
  /** The list's first day filter, if any: the export starts from it. */
  readonly from = input('');
  /** The list's last day filter, if any. */
  readonly to = input('');

  private readonly api = inject(MachineHistoryApi);
  private readonly document = inject(DOCUMENT);

  protected readonly form = new FormGroup(
    {
      from: new FormControl(`${todayIso().slice(0, 4)}-01-01`, {
        nonNullable: true,
        validators: day('Enter the first day.'),
      }),
      to: new FormControl(todayIso(), { nonNullable: true, validators: day('Enter the last day.') }),
    },
    { validators: rangeRule },
  );
  protected readonly busy = signal(false);
  /** What the last download did, for the polite status line. */
  protected readonly status = signal<string | null>(null);
  protected readonly problem = signal<string | null>(null);
  protected readonly errorMessage = errorMessage;

  constructor() {
    // The list's date filters, when set, are the range to export.
    effect(() => {
      const from = this.from();
      const to = this.to();
      untracked(() => {
        if (from) this.form.controls.from.setValue(from);
        if (to) this.form.controls.to.setValue(to);
      });
    });
  }

  protected download(): void {
    if (this.busy()) return;
    this.status.set(null);
    this.problem.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const range = this.form.getRawValue();
    this.busy.set(true);
    this.api.exportJobs(range).subscribe({
      next: (file) => {
        this.busy.set(false);
        saveFile(this.document, file.blob, file.fileName);
        this.status.set(`Saved ${file.fileName}.`);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.form.markAllAsTouched();
        this.problem.set(formErrorOf(this.form, error));
      },
    });
  }
}
