import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { AuthSession } from '../auth/auth-session';
import { OfflineJobs } from './offline-jobs';

/** "1 conflict", "2 conflicts". */
function count(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

/**
 * The shell's word on the connection, always in view: online or offline, what waits on the device to be sent,
 * what is being sent, and what needs a person (a conflict, a refused change, a correction to check). For the
 * signed-in it links to the page of changes kept on this device. Changes are read out politely.
 */
@Component({
  selector: 'app-connection-status',
  imports: [MatIconModule, RouterLink],
  template: `
    @if (session.signedIn()) {
      <a
        class="connection"
        [class.connection--offline]="!offline.online()"
        [class.connection--attention]="needsAttention()"
        routerLink="/offline"
        [attr.aria-label]="'Connection: ' + summary() + '. Changes kept on this device'"
      >
        <mat-icon aria-hidden="true" [svgIcon]="icon()" />
        <span class="connection__text">{{ summary() }}</span>
        <span class="connection__short" aria-hidden="true">{{ shortSummary() }}</span>
        @if (count() > 0) {
          <span class="connection__count" aria-hidden="true">{{ count() }}</span>
        }
      </a>
    } @else {
      <span class="connection" [class.connection--offline]="!offline.online()">
        <mat-icon aria-hidden="true" [svgIcon]="icon()" />
        <span class="connection__text">{{ summary() }}</span>
      </span>
    }
    <span class="cdk-visually-hidden" role="status">{{ summary() }}</span>
  `,
  styles: `
    :host {
      display: flex;
      align-items: center;
    }
    .connection {
      display: inline-flex;
      align-items: center;
      gap: 6px;
      min-height: 48px;
      padding: 0 12px;
      border-radius: 24px;
      font: var(--mat-sys-label-large);
      color: inherit;
      text-decoration: none;
      white-space: nowrap;
    }
    a.connection:hover {
      box-shadow: inset 0 0 0 2px currentColor;
    }
    a.connection:focus-visible {
      outline: 3px solid var(--mat-sys-primary);
      outline-offset: 2px;
    }
    .connection--offline {
      background: var(--mat-sys-surface-container-highest);
      color: var(--mat-sys-on-surface);
    }
    .connection--attention {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .connection__count,
    .connection__short {
      display: none;
    }
    /* On a tablet the toolbar is shared with the tagline and the menus: the short words. */
    @media (max-width: 959px) {
      .connection__text {
        position: absolute;
        width: 1px;
        height: 1px;
        overflow: hidden;
        clip-path: inset(50%);
        white-space: nowrap;
      }
      .connection__short {
        display: inline;
      }
    }
    /* On a phone the toolbar has no room for words: the icon and the number of changes waiting. */
    @media (max-width: 599px) {
      .connection {
        padding: 0 8px;
      }
      .connection__text {
        position: absolute;
        width: 1px;
        height: 1px;
        overflow: hidden;
        clip-path: inset(50%);
        white-space: nowrap;
      }
      .connection__short {
        display: none;
      }
      .connection__count {
        display: inline;
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ConnectionStatus {
  protected readonly offline = inject(OfflineJobs);
  protected readonly session = inject(AuthSession);

  protected readonly needsAttention = computed(
    () =>
      this.offline.conflicts().length > 0 ||
      this.offline.refused().length > 0 ||
      this.offline.disagreements().length > 0,
  );

  protected readonly icon = computed(() => {
    if (this.needsAttention()) return 'sync_problem';
    if (!this.offline.online()) return 'cloud_off';
    if (this.offline.activity().kind === 'sending') return 'send';
    return this.offline.queue().length > 0 ? 'pending' : 'cloud_done';
  });

  /** What waits or needs a person, for the phone's short form. */
  protected readonly count = computed(
    () => this.offline.queue().length + this.offline.conflicts().length + this.offline.disagreements().length,
  );

  /** The summary in a few words, what needs a person first: "1 conflict", "Offline · 3", "Sending 2…". */
  protected readonly shortSummary = computed(() => {
    const conflicts = this.offline.conflicts().length;
    if (conflicts > 0) return count(conflicts, 'conflict', 'conflicts');
    const refused = this.offline.refused().length;
    if (refused > 0) return `${refused} refused`;
    const disagreements = this.offline.disagreements().length;
    if (disagreements > 0) return count(disagreements, 'to check', 'to check');
    const activity = this.offline.activity();
    if (activity.kind === 'sending') return `Sending ${activity.left}…`;
    const waiting = this.offline.queue().length;
    if (!this.offline.online()) return waiting > 0 ? `Offline · ${waiting}` : 'Offline';
    return waiting > 0 ? `${waiting} waiting` : 'Online';
  });

  /** "Online", "Offline · 3 waiting", "Sending 2…", "1 conflict"… */
  protected readonly summary = computed(() => {
    const activity = this.offline.activity();
    const parts: string[] = [];
    if (activity.kind === 'sending') parts.push(`Sending ${activity.left}…`);
    else parts.push(this.offline.online() ? 'Online' : 'Offline');
    const waiting = this.offline.queue().length;
    if (waiting > 0 && activity.kind !== 'sending') parts.push(`${waiting} waiting`);
    const conflicts = this.offline.conflicts().length;
    if (conflicts > 0) parts.push(count(conflicts, 'conflict', 'conflicts'));
    const refused = this.offline.refused().length;
    if (refused > 0) parts.push(`${refused} refused`);
    const disagreements = this.offline.disagreements().length;
    if (disagreements > 0) parts.push(count(disagreements, 'correction to check', 'corrections to check'));
    return parts.join(' · ');
  });
}
