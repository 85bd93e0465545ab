import { DatePipe } from '@angular/common';
import { HttpErrorResponse, httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { Router, RouterLink } from '@angular/router';
import { PasswordSchema, PersonNameSchema } from '@counterpoise/api';
import { httpErrorMessage } from '../shell/server-errors';
import { errorMessage, requiredWith, schemaValidator } from '../shell/validators';
import type { InvitationPreview } from './api-types';
import { AuthSession } from './auth-session';
import { NewPasswordField } from './new-password-field';
import { ROLE_LABELS, ROLE_SUMMARIES } from './roles';
import { ErrorBanner } from '../forms/error-banner';
import { BusyButton } from '../forms/busy-button';
import { FormRequest } from '../forms/form-request';

/**
 * Joining an organisation from the link of an invitation (`/accept-invitation?token=…`): the person sees
 * who invited them to what, gives their name and a password, and is signed in.
 */
@Component({
  selector: 'app-accept-invitation-page',
  imports: [
    BusyButton,
    ErrorBanner,
    DatePipe,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressSpinnerModule,
    NewPasswordField,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './accept-invitation-page.html',
  styleUrl: './auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AcceptInvitationPage {
  /** The one-time token of the invitation's link. */
  readonly token = input<string>();

  protected readonly session = inject(AuthSession);
  private readonly router = inject(Router);

  protected readonly invitation = httpResource<InvitationPreview>(() => {
    const token = this.token();
    return token ? `/api/v1/invitations/${encodeURIComponent(token)}` : undefined;
  });
  /** Why the invitation cannot be used, in words for the invited person. */
  protected readonly invitationError = computed(() => {
    const error = this.invitation.error();
    if (!error) return null;
    const status = error instanceof HttpErrorResponse ? error.status : 0;
    return status === 404 || status === 410
      ? 'This invitation can no longer be used: it has expired, it was accepted already, or it was withdrawn. Ask the person who invited you to send a new one.'
      : httpErrorMessage(error);
  });

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [requiredWith('Enter your name.'), schemaValidator(PersonNameSchema)]],
    password: ['', [requiredWith('Choose a password.'), schemaValidator(PasswordSchema)]],
  });
  protected readonly request = new FormRequest();
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly roleSummaries = ROLE_SUMMARIES;
  protected readonly errorMessage = errorMessage;

  protected submit(): void {
    const token = this.token();
    if (!token) return;
    const { name, password } = this.form.getRawValue();
    this.request.send(
      this.form,
      () => this.session.acceptInvitation(token, { name: name.trim(), password }),
      { sent: () => void this.router.navigateByUrl('/'), leaves: true },
    );
  }
}
