import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { Router, RouterLink } from '@angular/router';
import { formErrorOf } from '../shell/server-errors';
import { errorMessage, requiredWith } from '../shell/validators';
import { safeReturnUrl } from './auth.guards';
import { AuthSession } from './auth-session';
import { PasswordToggle } from './password-toggle';

/** Signing in with an e-mail address and a password, then back to the page the person asked for. */
@Component({
  selector: 'app-sign-in-page',
  imports: [
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressSpinnerModule,
    PasswordToggle,
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
  protected readonly busy = signal(false);
  protected readonly formError = signal<string | null>(null);
  protected readonly errorMessage = errorMessage;

  protected submit(): void {
    if (this.busy()) return;
    this.form.markAllAsTouched();
    if (this.form.invalid) return;
    this.busy.set(true);
    this.formError.set(null);
    const { email, password } = this.form.getRawValue();
    this.session.signIn(email.trim(), password).subscribe({
      next: () => void this.router.navigateByUrl(safeReturnUrl(this.returnUrl())),
      error: (error: unknown) => {
        // The typed values stay in the form whatever went wrong.
        this.formError.set(signInRefusal(error) ?? formErrorOf(this.form, error));
        this.busy.set(false);
      },
    });
  }
}

/** Our words for the refusals particular to signing in; null for the others. */
function signInRefusal(error: unknown): string | null {
  if (!(error instanceof HttpErrorResponse)) return null;
  switch (error.status) {
    case 401:
      return 'This e-mail address and password do not match an account. Check both, or set a new password.';
    case 403:
      return 'This account is deactivated. An owner or a manager of your shop can reactivate it.';
    case 429: {
      const seconds = Number(error.headers.get('Retry-After'));
      return seconds > 0
        ? `Too many attempts with this address. Wait ${seconds} ${seconds === 1 ? 'second' : 'seconds'}, then try again.`
        : 'Too many attempts with this address. Wait a few minutes, then try again.';
    }
    default:
      return null;
  }
}
