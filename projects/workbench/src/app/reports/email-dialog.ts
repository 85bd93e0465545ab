import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { firstValueFrom, type Observable } from 'rxjs';
import { BusyButton } from '../forms/busy-button';
import { formErrorOf } from '../shell/server-errors';
import type { EmailReport, ReportSending } from './reports.api';

/** What the e-mail dialog is opened with. */
export interface EmailRequest {
  readonly jobNumber: string;
  /** The revision that goes out. */
  readonly revision: number;
  /** The customer's address on record, or null. */
  readonly customerEmail: string | null;
  readonly send: (body: EmailReport) => Observable<ReportSending>;
}

/**
 * Confirms the sending of the signed report: the address it goes to (the customer's on record, which the
 * technician or manager may change for this sending) and Send. The dialog sends it itself, so that a refusal
 * shows on the address, and closes with the sending as the server recorded it.
 */
@Component({
  selector: 'app-email-dialog',
  imports: [
    BusyButton,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  template: `
    <h2 mat-dialog-title>E-mail report {{ data.jobNumber }}</h2>
    <mat-dialog-content>
      <p>
        Revision {{ data.revision }} goes out as a PDF attachment, as the customer signed it.
        @if (data.customerEmail === null) {
          The customer has no e-mail address on record: enter one.
        }
      </p>
      <form [formGroup]="form" (ngSubmit)="submit()" id="email-report-form">
        <mat-form-field class="to">
          <mat-label>Send to</mat-label>
          <input matInput type="email" formControlName="to" autocomplete="email" data-testid="email-to" />
          @if (form.controls.to.hasError('server')) {
            <mat-error>{{ form.controls.to.getError('server') }}</mat-error>
          } @else if (form.controls.to.invalid) {
            <mat-error>Enter an e-mail address such as name@example.com.</mat-error>
          }
        </mat-form-field>
      </form>
      @if (formError(); as message) {
        <p class="error" role="alert">{{ message }}</p>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button matButton type="button" mat-dialog-close [disabled]="busy()">Cancel</button>
      <app-busy-button label="Send" busyLabel="Sending…" icon="send" [busy]="busy()" (click)="submit()" />
    </mat-dialog-actions>
  `,
  styles: `
    p {
      margin: 0 0 12px;
    }
    .to {
      width: 100%;
    }
    .error {
      color: var(--mat-sys-error);
    }
    mat-dialog-actions {
      gap: 8px;
      --mat-button-text-container-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EmailDialog {
  protected readonly data = inject<EmailRequest>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<EmailDialog, ReportSending>>(MatDialogRef);
  protected readonly form = new FormGroup({
    to: new FormControl(this.data.customerEmail ?? '', {
      nonNullable: true,
      validators: [Validators.required, Validators.email],
    }),
  });
  protected readonly busy = signal(false);
  protected readonly formError = signal<string | null>(null);

  protected async submit(): Promise<void> {
    if (this.busy()) return;
    this.formError.set(null);
    this.form.markAllAsTouched();
    if (this.form.invalid) return;
    const to = this.form.controls.to.value.trim();
    this.busy.set(true);
    try {
      const sending = await firstValueFrom(
        this.data.send(
          to === this.data.customerEmail
            ? { revision: this.data.revision }
            : { to, revision: this.data.revision },
        ),
      );
      this.ref.close(sending);
    } catch (error) {
      this.formError.set(formErrorOf(this.form, error));
    } finally {
      this.busy.set(false);
    }
  }
}
