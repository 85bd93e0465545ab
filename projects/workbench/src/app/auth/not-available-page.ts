import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { Permission } from '@counterpoise/api';
import { AuthSession } from './auth-session';
import { PERMISSION_LABELS, ROLE_LABELS } from './roles';

/**
 * What a signed-in person sees at an address their role does not open (the permission guard shows it
 * while the address bar keeps the address asked for): why, and who can change it.
 */
@Component({
  selector: 'app-not-available-page',
  imports: [MatButtonModule, MatIconModule, RouterLink],
  template: `
    <mat-icon class="icon" aria-hidden="true" svgIcon="lock_person" />
    <h1>Not available for your role</h1>
    @if (session.user(); as user) {
      <p>
        @if (purpose(); as purpose) {
          This page is for people who {{ purpose }}.
        }
        As {{ article(roleLabels[user.role]) }} {{ roleLabels[user.role].toLowerCase() }} at
        {{ user.organisation.name }}, your role does not include that.
      </p>
      <p>If your work needs it, ask an owner of {{ user.organisation.name }} to change your role.</p>
    } @else {
      <p>Sign in to see whether your role opens this page.</p>
    }
    <div class="actions">
      <a matButton="filled" routerLink="/">Back to the start</a>
      @if (session.signedIn()) {
        <a matButton="outlined" routerLink="/account">What your role allows</a>
      } @else {
        <a matButton="outlined" routerLink="/sign-in">Sign in</a>
      }
    </div>
  `,
  styles: `
    :host {
      display: block;
      max-width: 40rem;
    }
    .icon {
      width: 48px;
      height: 48px;
      font-size: 48px;
      color: var(--mat-sys-primary);
    }
    h1 {
      font: var(--mat-sys-headline-medium);
      margin: 8px 0 12px;
    }
    .actions {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
      margin-top: 24px;
      --mat-button-filled-container-height: 48px;
      --mat-button-outlined-container-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotAvailablePage {
  /** The permission the page asked for (set by the guard). */
  readonly need = input<string>();

  protected readonly session = inject(AuthSession);
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly purpose = computed(() => {
    const need = this.need();
    return need && need in PERMISSION_LABELS ? PERMISSION_LABELS[need as Permission] : null;
  });

  protected article(word: string): string {
    return /^[aeiou]/i.test(word) ? 'an' : 'a';
  }
}
