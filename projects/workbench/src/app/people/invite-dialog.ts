import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { EmailSchema, PersonNameSchema, type Role } from '@counterpoise/api';
import type { InviteRequest } from '../auth/api-types';
import { ROLE_LABELS, ROLE_SUMMARIES } from '../auth/roles';
import { httpErrorMessage, problemOf } from '../shell/server-errors';
import { errorMessage, requiredWith, schemaValidator } from '../shell/validators';
import { PeopleApi } from './people.api';
import { ErrorBanner } from '../forms/error-banner';
import { BusyButton } from '../forms/busy-button';
import { EmailField } from '../forms/email-field';
import { FormRequest } from '../forms/form-request';

/** What the invitation dialog needs to know. */
export interface InviteDialogData {
  /** The roles the signed-in person may give. */
  readonly roles: readonly Role[];
}

/** How an invitation ended: sent, or saved on the server without its e-mail. */
export interface InviteOutcome {
  /** The address invited. */
  readonly email: string;
  /** Why the e-mail was not sent, when the server saved the invitation all the same; otherwise null. */
  readonly mailProblem: string | null;
}

/**
 * Inviting someone by e-mail. The request is sent from inside the dialog, so that a refusal (an address
 * already in the organisation, a role out of reach) is shown on its field with everything typed kept;
 * the dialog closes once the server has saved the invitation.
 */
@Component({
  selector: 'app-invite-dialog',
  imports: [
    EmailField,
    BusyButton,
    ErrorBanner,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  template: `
    <h2 mat-dialog-title>Invite someone</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content>
        <p class="lead">
          They receive an e-mail with a link. Opening it, they choose their password and join with the role
          you give here.
        </p>
        @if (request.formError(); as message) {
          <app-error-banner class="form-error" [message]="message" />
        }
        <app-email-field [control]="form.controls.email" autocomplete="off" subscriptSizing="dynamic" />
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Role</mat-label>
          <mat-select formControlName="role">
            @for (role of data.roles; track role) {
              <mat-option [value]="role">{{ roleLabels[role] }}</mat-option>
            }
          </mat-select>
          <mat-hint>{{ roleSummary() }}</mat-hint>
          <mat-error>{{ errorMessage(form.controls.role) }}</mat-error>
        </mat-form-field>
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Name (optional)</mat-label>
          <input matInput formControlName="name" autocomplete="off" />
          <mat-hint>For the e-mail's greeting; they can correct it when they join.</mat-hint>
          <mat-error>{{ errorMessage(form.controls.name) }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button matButton type="button" mat-dialog-close>Cancel</button>
        <app-busy-button
          type="submit"
          [busy]="request.busy()"
          label="Send the invitation"
          busyLabel="Sending…"
        />
      </mat-dialog-actions>
    </form>
  `,
  styleUrl: './dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InviteDialog {
  protected readonly data = inject<InviteDialogData>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<InviteDialog, InviteOutcome>>(MatDialogRef);
  private readonly api = inject(PeopleApi);

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [requiredWith('Enter their e-mail address.'), schemaValidator(EmailSchema)]],
    role: [this.defaultRole(), requiredWith('Choose a role.')],
    name: ['', schemaValidator(PersonNameSchema, { optional: true })],
  });
  private readonly role = toSignal(this.form.controls.role.valueChanges, {
    initialValue: this.form.controls.role.value,
  });
  protected readonly roleSummary = computed(() => ROLE_SUMMARIES[this.role()]);
  protected readonly request = new FormRequest();
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly errorMessage = errorMessage;

  protected submit(): void {
    const { email, role, name } = this.form.getRawValue();
    const request: InviteRequest = {
      email: email.trim(),
      role,
      ...(name.trim() ? { name: name.trim() } : {}),
    };
    this.request.send(this.form, () => this.api.invite(request), {
      sent: (invitation) => this.dialogRef.close({ email: invitation.email, mailProblem: null }),
      refused: (error) => {
        // The invitation exists; sending it again would replace it, so the dialog's work is done.
        if (problemOf(error)?.code !== 'MAIL_NOT_SENT') return null;
        this.dialogRef.close({ email: request.email, mailProblem: httpErrorMessage(error) });
        return 'handled';
      },
      leaves: true,
    });
  }

  /** Most invitations are for technicians; otherwise the least powerful role on offer. */
  private defaultRole(): Role {
    const roles = this.data.roles;
    return roles.includes('technician') ? 'technician' : (roles.at(-1) ?? 'viewer');
  }
}
