import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatIconModule } from '@angular/material/icon';
import { Router, RouterLink } from '@angular/router';
import type { ACCOUNTS_PROBLEM_CODES } from '@counterpoise/api';
import { problemOf } from '../shell/server-errors';
import { requiredWith } from '../shell/validators';
import { safeReturnUrl } from './auth.guards';
import { AuthSession } from './auth-session';
import { PasswordField } from '../forms/password-field';
import { ErrorBanner } from '../forms/error-banner';
import { BusyButton } from '../forms/busy-button';
import { EmailField } from '../forms/email-field';
import { FormRequest } from '../forms/form-request';

/** Signing in with an e-mail address and a password, then back to the page the person asked for. */
@Component({
  selector: 'app-sign-in-page',
  imports: [
    EmailField,
    BusyButton,
    ErrorBanner,
    MatIconModule,
    PasswordField,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './sign-in-page.html',
  styleUrl: './auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignInPage {
  /** Where to go once signed in (set by the guards and the interceptor). */
  readonly returnUrl = input<string>();
  /** Present when the interceptor brought the person here because their session ended. */
  readonly ended = input<string>();
  /** Present after signing out. */
  readonly signedOut = input<string>();

  private readonly session = inject(AuthSession);
  private readonly router = inject(Router);

  protected readonly form = inject(NonNullableFormBuilder).group({
    // Only presence is checked here: the schemas would bring zod to the first page of the day, and the
    // server answers a malformed address with the contract's own message, shown on the field.
    email: ['', requiredWith('Enter your e-mail address.')],
    password: ['', requiredWith('Enter your password.')],
  });
  protected readonly request = new FormRequest();

  protected submit(): void {
    const { email, password } = this.form.getRawValue();
    this.request.send(this.form, () => this.session.signIn(email.trim(), password), {
      sent: () => void this.router.navigateByUrl(safeReturnUrl(this.returnUrl())),
      refused: signInRefusal,
      leaves: true,
    });
  }
}

/** The stable `code` of an accounts problem. */
type AccountsCode = (typeof ACCOUNTS_PROBLEM_CODES)[keyof typeof ACCOUNTS_PROBLEM_CODES];

/** "Wait 12 seconds", "Wait 3 minutes", or "Wait a few minutes" without a `Retry-After`. */
function waitFor(error: HttpErrorResponse): string {
  const seconds = Number(error.headers.get('Retry-After'));
  if (!(seconds > 0)) return 'Wait a few minutes';
  if (seconds < 120) return `Wait ${seconds} ${seconds === 1 ? 'second' : 'seconds'}`;
  return `Wait ${Math.ceil(seconds / 60)} minutes`;
}

/** Our words for the refusals particular to signing in, told apart by their `code`; null for the others. */
function signInRefusal(error: unknown): string | null {
  if (!(error instanceof HttpErrorResponse)) return null;
  const code = problemOf(error)?.code as AccountsCode | undefined;
  switch (error.status) {
    case 401:
      return 'This e-mail address and password do not match an account. Check both, or set a new password.';
    case 403:
      return code === 'CROSS_SITE_REQUEST'
        ? 'This sign-in was sent from another site’s page and was refused. Open the workbench at its own address and sign in there.'
        : 'This account is deactivated. An owner or a manager of your shop can reactivate it.';
    case 429:
      if (code === 'PASSWORD_CHECKS_BUSY') {
        return 'The server is checking many sign-ins just now. Try again in a moment.';
      }
      if (code === 'CLIENT_THROTTLED') {
        return `Too many failed sign-ins from this network. ${waitFor(error)}, then try again.`;
      }
      return `Too many attempts with this address. ${waitFor(error)}, then try again.`;
    default:
      return null;
  }
}
