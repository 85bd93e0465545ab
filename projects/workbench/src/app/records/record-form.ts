import { afterNextRender, ElementRef, inject, Injector, signal } from '@angular/core';
import type { AbstractControl } from '@angular/forms';
import type { MatFormFieldDefaultOptions } from '@angular/material/form-field';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { formErrorOf, httpErrorMessage } from '../shell/server-errors';
import { changedFields, type FieldDescriptions } from './record-fields';
import type { RecordsApi, StoredRecord, Versioned } from './records-api';
import { updateMindingOthers } from './update-minding-others';

/**
 * How the records' forms draw their fields: outlined, and with hints and messages taking the lines they need
 * (the fields are spaced by the form's styles), so that a two-line message never covers the next label.
 */
export const FORM_FIELD_OPTIONS: MatFormFieldDefaultOptions = {
  appearance: 'outline',
  subscriptSizing: 'dynamic',
};

/** What a record's form page tells the helper about its record and its form. */
export interface RecordFormOptions<T extends StoredRecord, C extends object, U> {
  /** The feature's data service. */
  readonly api: RecordsApi<T, unknown, object, C, U>;
  /** The kind of record, as a sentence names it: "customer". */
  readonly noun: string;
  /** How the record's fields read, for the "changed meanwhile" comparison. */
  readonly fields: FieldDescriptions;
  /** The form. */
  readonly form: AbstractControl;
  /** The form's value as the API takes it on create (and, field by field, on change). */
  readonly request: () => C;
  /** A stored record's fields shaped as `request()` shapes them, to find what the person changed. */
  readonly fieldsOf: (record: T) => C;
  /** Fills the form from a stored record. */
  readonly fill: (record: T) => void;
  /** The record's own page, where a save leads. */
  readonly pageOf: (record: T) => string;
}

/**
 * The life of a record's form page: it loads the record to edit (with its ETag), saves a new one or only the
 * changed fields of an existing one, shows the server's refusals on their fields with nothing typed lost,
 * and on a change made meanwhile by someone else asks which version to keep. Create it in the page's
 * field initialisers (it injects what it needs).
 */
export class RecordForm<T extends StoredRecord, C extends object, U> {
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly host = inject(ElementRef<HTMLElement>);
  private readonly injector = inject(Injector);
  private saved = false;

  /** The version being edited, with its ETag; null for a new record (or while it loads). */
  readonly base = signal<Versioned<T> | null>(null);
  /** True while the record to edit is fetched. */
  readonly loading = signal(false);
  /** Why the record to edit could not be fetched, or null. */
  readonly loadError = signal<string | null>(null);
  /** True while a save is on its way. */
  readonly busy = signal(false);
  /** A refusal that names no field, shown above the form; null otherwise. */
  readonly formError = signal<string | null>(null);

  constructor(private readonly options: RecordFormOptions<T, C, U>) {}

  /** Fetches the record to edit and fills the form with it. */
  load(id: number): void {
    this.loading.set(true);
    this.loadError.set(null);
    this.options.api.get(id).subscribe({
      next: (versioned) => {
        this.base.set(versioned);
        this.options.fill(versioned.record);
        this.options.form.markAsPristine();
        this.loading.set(false);
      },
      error: (error: unknown) => {
        this.loadError.set(httpErrorMessage(error));
        this.loading.set(false);
      },
    });
  }

  /** Whether leaving would lose typed input. */
  hasUnsavedInput(): boolean {
    return !this.saved && this.options.form.dirty;
  }

  /**
   * Checks the form, then creates the record or sends the fields changed since it was loaded. On success it
   * opens the record's page; on a refusal the form stays as typed, with the reasons on their fields.
   */
  save(): void {
    if (this.busy()) return;
    const { form } = this.options;
    form.markAllAsTouched();
    if (form.invalid) {
      this.focusFirstProblem();
      return;
    }
    this.busy.set(true);
    this.formError.set(null);
    const base = this.base();
    if (base === null) {
      this.options.api.create(this.options.request()).subscribe({
        next: ({ record }) => this.leave(record, `Saved the new ${this.options.noun}.`, true),
        error: (error: unknown) => this.refused(error),
      });
      return;
    }
    const change = changedFields(this.options.fieldsOf(base.record), this.options.request());
    if (Object.keys(change).length === 0) {
      this.leave(base.record, 'Nothing was changed, so nothing was saved.', false);
      return;
    }
    updateMindingOthers<T, U>({
      api: this.options.api,
      dialog: this.dialog,
      noun: this.options.noun,
      fields: this.options.fields,
      base,
      change: change as U,
      fieldsOf: this.options.fieldsOf,
    }).subscribe({
      next: (outcome) => {
        if (outcome.kind === 'saved') {
          this.leave(outcome.versioned.record, 'Saved.', false);
        } else if (outcome.kind === 'took-theirs') {
          this.base.set(outcome.versioned);
          this.options.fill(outcome.versioned.record);
          form.markAsPristine();
          this.busy.set(false);
          this.snackBar.open('The form now shows their version. Change it again if needed.', 'Close', {
            duration: 8_000,
          });
        } else {
          this.busy.set(false);
        }
      },
      error: (error: unknown) => this.refused(error),
    });
  }

  private leave(record: T, message: string, replaceUrl: boolean): void {
    this.saved = true;
    this.busy.set(false);
    this.snackBar.open(message, 'Close', { duration: 5_000 });
    void this.router.navigateByUrl(this.options.pageOf(record), { replaceUrl });
  }

  private refused(error: unknown): void {
    this.formError.set(formErrorOf(this.options.form, error));
    this.busy.set(false);
    this.focusFirstProblem();
  }

  /** Puts the focus where the fix is: the first field at fault, or the message above the form. */
  private focusFirstProblem(): void {
    afterNextRender(
      () => {
        const element = this.host.nativeElement as HTMLElement;
        const target =
          element.querySelector<HTMLElement>(
            'input.ng-invalid, textarea.ng-invalid, mat-select.ng-invalid, .form-error',
          ) ?? null;
        target?.focus();
      },
      { injector: this.injector },
    );
  }
}
