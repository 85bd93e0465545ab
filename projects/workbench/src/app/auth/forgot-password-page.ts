import { ChangeDetectionStrategy, Component, inject, input, type OnInit, signal } from '@angular/core';
import { HttpClient } from '@angular/common/http';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { requiredWith } from '../shell/validators';
import { AUTH_URLS } from './auth-session';
import { ErrorBanner } from '../forms/error-banner';
import { BusyButton } from '../forms/busy-button';
import { EmailField } from '../forms/email-field';
import { FormRequest } from '../forms/form-request';

/**
 * Asking for a link to set a new password. The answer is the same whether or not the address belongs to
 * an account, so that the page cannot be used to find out who has one.
 */
@Component({
  selector: 'app-forgot-password-page',
  imports: [EmailField, BusyButton, ErrorBanner, MatIconModule, ReactiveFormsModule, RouterLink],
  template: `
    <h1>Set a new password</h1>
    @if (sentTo(); as address) {
      <div class="notice" role="status">
        <mat-icon aria-hidden="true" svgIcon="mark_email_read" />
        <p>
          If an account uses <strong>{{ address }}</strong>, an e-mail with a link to set a new password is on
          its way. The link works once; open it on this device or any other.
        </p>
      </div>
      <div class="links">
        <a routerLink="/sign-in">Back to sign in</a>
        <a href="" (click)="$event.preventDefault(); sentTo.set(null)">Use another address</a>
      </div>
    } @else {
      <p class="lead">
        Enter the e-mail address you sign in with. We send a link to it that lets you choose a new password.
      </p>
      <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
        @if (request.formError(); as message) {
          <app-error-banner class="form-error" [message]="message" />
        }
        <app-email-field [control]="form.controls.email" autocomplete="username" subscriptSizing="dynamic" />
        <app-busy-button
          class="submit"
          type="submit"
          [busy]="request.busy()"
          label="Send the link"
          busyLabel="Sending…"
        />
      </form>
      <div class="links">
        <a routerLink="/sign-in">Back to sign in</a>
      </div>
    }
  `,
  styleUrl: './auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ForgotPasswordPage implements OnInit {
  /** The address typed on the sign-in page, if any. */
  readonly email = input<string>();

  private readonly http = inject(HttpClient);
  protected readonly form = inject(NonNullableFormBuilder).group({
    // Only presence is checked here: the schemas would bring zod to the first page of the day, and the
    // server answers a malformed address with the contract's own message, shown on the field.
    email: ['', requiredWith('Enter your e-mail address.')],
  });
  protected readonly request = new FormRequest();
  /** The address the link went to, once the server has taken the request. */
  protected readonly sentTo = signal<string | null>(null);

  ngOnInit(): void {
    const email = this.email();
    if (email) this.form.controls.email.setValue(email);
  }

  protected submit(): void {
    const email = this.form.controls.email.value.trim();
    this.request.send(this.form, () => this.http.post(AUTH_URLS.passwordReset, { email }), {
      sent: () => this.sentTo.set(email),
    });
  }
}
