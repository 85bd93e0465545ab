import { HttpClient, httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject, signal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { Me } from '@counterpoise/api';
import { httpErrorMessage } from '../shell/server-errors';
import { AUTH_URLS, AuthSession } from './auth-session';
import { PERMISSION_LABELS, ROLE_LABELS, ROLE_SUMMARIES } from './roles';
import { ErrorBanner } from '../forms/error-banner';
import { BusyButton } from '../forms/busy-button';

/**
 * The signed-in person's own account: who they are to the organisation, what their role lets them do, and
 * a way to change their password by the same e-mailed link as a forgotten one.
 */
@Component({
  selector: 'app-account-page',
  imports: [BusyButton, ErrorBanner, MatIconModule],
  templateUrl: './account-page.html',
  styleUrl: './account-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AccountPage {
  private readonly session = inject(AuthSession);
  private readonly http = inject(HttpClient);

  /** Asked afresh, since an owner may have changed the role since this session began. */
  protected readonly me = httpResource<Me>(() => AUTH_URLS.me);
  // value() throws while the resource is in error; hasValue() first, then the session's own copy.
  protected readonly user = computed(() => (this.me.hasValue() ? this.me.value().user : this.session.user()));
  protected readonly allowed = computed(() =>
    (this.me.hasValue() ? this.me.value().permissions : this.session.permissions()).map(
      (p) => PERMISSION_LABELS[p],
    ),
  );
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly roleSummaries = ROLE_SUMMARIES;

  protected readonly sending = signal(false);
  protected readonly linkSent = signal(false);
  protected readonly linkError = signal<string | null>(null);

  constructor() {
    effect(() => {
      if (!this.me.hasValue()) return;
      const { user, permissions } = this.me.value();
      this.session.update(user, permissions);
    });
  }

  protected sendPasswordLink(email: string): void {
    if (this.sending()) return;
    this.sending.set(true);
    this.linkError.set(null);
    this.http.post(AUTH_URLS.passwordReset, { email }).subscribe({
      next: () => {
        this.linkSent.set(true);
        this.sending.set(false);
      },
      error: (error: unknown) => {
        this.linkError.set(httpErrorMessage(error));
        this.sending.set(false);
      },
    });
  }
}
