import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, type MatDialog, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { map, type Observable } from 'rxjs';

/** What a decision that must give its reason asks. */
export interface ReasonRequest {
  /** The question, as the dialog's heading. */
  readonly title: string;
  /** What will happen, and what the reason is kept for. */
  readonly message: string;
  /** The label of the reason's field. */
  readonly label: string;
  /** The label of the button that goes ahead. */
  readonly confirm: string;
}

/** The longest reason the server keeps (abandoning a job, letting an inspection go). */
const REASON_MAX = 1000;

/**
 * A decision kept with its reason (abandoning a job, letting a failed inspection go on): the reason is
 * required, and Cancel holds the first focus so that an Enter pressed by habit decides nothing.
 */
@Component({
  selector: 'app-reason-dialog',
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <mat-dialog-content>
      <p>{{ data.message }}</p>
      <mat-form-field class="reason">
        <mat-label>{{ data.label }}</mat-label>
        <textarea matInput [formControl]="reason" rows="3" [maxlength]="max"></textarea>
        <mat-hint align="end">{{ reason.value.length }} / {{ max }}</mat-hint>
        @if (reason.hasError('required')) {
          <mat-error>Give the reason: it is kept with the job.</mat-error>
        }
      </mat-form-field>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button matButton type="button" mat-dialog-close>Cancel</button>
      <button matButton="filled" type="button" (click)="decide()">{{ data.confirm }}</button>
    </mat-dialog-actions>
  `,
  styles: `
    p {
      margin: 0 0 16px;
    }
    .reason {
      width: 100%;
    }
    mat-dialog-actions {
      gap: 8px;
      --mat-button-filled-container-height: 48px;
      --mat-button-text-container-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReasonDialog {
  protected readonly data = inject<ReasonRequest>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<ReasonDialog, string>>(MatDialogRef);
  protected readonly max = REASON_MAX;
  protected readonly reason = new FormControl('', {
    nonNullable: true,
    validators: [Validators.required, Validators.pattern(/\S/)],
  });

  protected decide(): void {
    if (this.reason.invalid) {
      this.reason.setErrors({ required: true });
      this.reason.markAsTouched();
      return;
    }
    this.ref.close(this.reason.value.trim());
  }
}

/** Asks for a decision and its reason; emits the reason once, or null when the person cancels. */
export function askForReason(dialog: MatDialog, request: ReasonRequest): Observable<string | null> {
  return dialog
    .open<ReasonDialog, ReasonRequest, string>(ReasonDialog, {
      data: request,
      maxWidth: '34rem',
      width: '100%',
      autoFocus: 'first-tabbable',
    })
    .afterClosed()
    .pipe(map((reason) => reason ?? null));
}
