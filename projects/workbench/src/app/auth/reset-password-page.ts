import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { PasswordSchema } from '@counterpoise/api';
import { problemOf } from '../shell/server-errors';
import { requiredWith, schemaValidator } from '../shell/validators';
import { AUTH_URLS } from './auth-session';
import { NewPasswordField } from './new-password-field';
import { ErrorBanner } from '../forms/error-banner';
import { BusyButton } from '../forms/busy-button';
import { FormRequest } from '../forms/form-request';

/** Choosing a new password from the link of a reset e-mail (`/reset-password?token=…`). */
@Component({
  selector: 'app-reset-password-page',
  imports: [
    BusyButton,
    ErrorBanner,
    MatButtonModule,
    MatIconModule,
    NewPasswordField,
    ReactiveFormsModule,
    RouterLink,
  ],
  template: `
    <h1>Choose a new password</h1>
    @if (!token()) {
      <app-error-banner
        class="form-error"
        icon="link_off"
        message="This link is incomplete. Open the whole link from the e-mail, or ask for a new one."
      />
      <div class="links">
        <a routerLink="/forgot-password">Ask for a new link</a>
        <a routerLink="/sign-in">Back to sign in</a>
      </div>
    } @else if (done()) {
      <div class="notice" role="status">
        <mat-icon aria-hidden="true" svgIcon="check_circle" />
        <p>
          Your password is changed. Sign in with it now; other devices signed in as you have to sign in again.
        </p>
      </div>
      <a matButton="filled" class="submit" routerLink="/sign-in">Sign in</a>
    } @else {
      <p class="lead">Your new password replaces the old one everywhere you sign in.</p>
      <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
        @if (request.formError(); as message) {
          <app-error-banner class="form-error" [message]="message">
            @if (linkSpent()) {
              <a routerLink="/forgot-password">Ask for a new link</a>.
            }
          </app-error-banner>
        }
        <app-new-password-field [control]="form.controls.password" label="New password" />
        <app-busy-button
          class="submit"
          type="submit"
          [busy]="request.busy()"
          label="Save the new password"
          busyLabel="Saving…"
        />
      </form>
    }
  `,
  styleUrl: './auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ResetPasswordPage {
  /** The one-time token of the e-mail's link. */
  readonly token = input<string>();

  private readonly http = inject(HttpClient);
  protected readonly form = inject(NonNullableFormBuilder).group({
    password: ['', [requiredWith('Enter a new password.'), schemaValidator(PasswordSchema)]],
  });
  protected readonly request = new FormRequest();
  protected readonly done = signal(false);
  /** Whether the server refused the link itself (used, expired or unknown), not the password. */
  protected readonly linkSpent = signal(false);

  protected submit(): void {
    const token = this.token();
    if (!token) return;
    const password = this.form.controls.password.value;
    this.request.send(
      this.form,
      () => {
        this.linkSpent.set(false);
        return this.http.post(AUTH_URLS.passwordResetConfirm, { token, password });
      },
      {
        sent: () => this.done.set(true),
        refused: (error) => {
          const fields = problemOf(error)?.errors ?? [];
          const aboutPassword = fields.some((field) => field.path.replace(/^\//, '') === 'password');
          const status = problemOf(error)?.status ?? 0;
          this.linkSpent.set(!aboutPassword && status >= 400 && status < 500 && status !== 429);
          return null;
        },
      },
    );
  }
}
