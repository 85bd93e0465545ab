import { ChangeDetectionStrategy, Component, Injector, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { Router, RouterLink } from '@angular/router';
import { AuthSession } from '../auth/auth-session';
import { ROLE_LABELS } from '../auth/roles';
import { httpErrorMessage } from './server-errors';
import { showSnackBarMessage } from './snack-bar-message';

/**
 * The signed-in person in the toolbar: who they are, for which organisation and in which role, and the
 * way to sign out, which matters on a tablet the whole crew shares. Signed out, it offers to sign in.
 */
@Component({
  selector: 'app-user-menu',
  imports: [MatButtonModule, MatIconModule, MatMenuModule, RouterLink],
  template: `
    @if (session.user(); as user) {
      <button
        matButton
        class="trigger"
        type="button"
        [matMenuTriggerFor]="menu"
        [attr.aria-label]="'Your account: ' + user.name"
      >
        <mat-icon aria-hidden="true" svgIcon="account_circle" />
        <span class="trigger__name">{{ user.name }}</span>
      </button>
      <mat-menu #menu="matMenu" xPosition="before" class="user-menu">
        <div class="who">
          <span class="who__name">{{ user.name }}</span>
          <span class="who__line">{{ roleLabels[user.role] }} · {{ user.organisation.name }}</span>
          <span class="who__line">{{ user.email }}</span>
        </div>
        <a mat-menu-item routerLink="/account">
          <mat-icon aria-hidden="true" svgIcon="badge" />
          Your account
        </a>
        <button mat-menu-item type="button" [disabled]="signingOut()" (click)="signOut()">
          <mat-icon aria-hidden="true" svgIcon="logout" />
          Sign out
        </button>
      </mat-menu>
    } @else if (session.restored()) {
      <a matButton class="trigger" routerLink="/sign-in">
        <mat-icon aria-hidden="true" svgIcon="login" />
        Sign in
      </a>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .trigger {
      --mat-button-text-container-height: 48px;
      max-width: 16rem;
    }
    /* The global focus outline is the primary colour, which the toolbar is painted in. */
    .trigger:focus-visible {
      outline-color: var(--mat-sys-on-primary);
    }
    .trigger__name {
      overflow: hidden;
      text-overflow: ellipsis;
      white-space: nowrap;
    }
    @media (max-width: 599px) {
      .trigger__name {
        position: absolute;
        width: 1px;
        height: 1px;
        overflow: hidden;
        clip-path: inset(50%);
      }
    }
    .who {
      display: grid;
      gap: 2px;
      padding: 8px 16px 12px;
      margin-bottom: 4px;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
    }
    .who__name {
      font: var(--mat-sys-title-medium);
    }
    .who__line {
      font: var(--mat-sys-body-medium);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UserMenu {
  protected readonly session = inject(AuthSession);
  private readonly router = inject(Router);
  private readonly injector = inject(Injector);
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly signingOut = signal(false);

  protected signOut(): void {
    this.signingOut.set(true);
    const done = () => {
      this.signingOut.set(false);
      void this.router.navigate(['/sign-in'], { queryParams: { signedOut: 1 } });
    };
    this.session.signOut().subscribe({
      next: done,
      error: (error: unknown) => {
        // A session the server no longer knows is signed out all the same.
        if (!this.session.signedIn()) return done();
        this.signingOut.set(false);
        // Staying signed in is the honest answer: the refresh cookie would restore the session on reload.
        void showSnackBarMessage(this.injector, `Not signed out. ${httpErrorMessage(error)}`, 'Close', {
          duration: 10_000,
        });
      },
    });
  }
}
