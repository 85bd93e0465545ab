import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { JobSession } from './job-session';

/**
 * Where the job's last change stands, in one line under its heading: stored (and when), being sent, kept on
 * this device to be sent when the connection returns (and how many changes wait), not stored yet and being
 * sent again (with why, the attempt and a "Try now"), refused, or changed meanwhile.
 * Read out politely as it changes; a refusal or a change made meanwhile asks to be heard at once.
 */
@Component({
  selector: 'app-job-save-status',
  imports: [DatePipe, MatButtonModule, MatIconModule, MatProgressSpinnerModule],
  template: `
    @let state = session.saveState();
    <div class="save-status" [class]="'save-status save-status--' + state.kind" [attr.role]="role()">
      @switch (state.kind) {
        @case ('saving') {
          <mat-spinner diameter="20" aria-hidden="true" />
          <span>Saving: {{ state.what }}…</span>
        }
        @case ('retrying') {
          <mat-icon aria-hidden="true" svgIcon="cloud_off" />
          <span>
            <strong>Not saved yet: {{ state.what }}.</strong> {{ state.reason }} Trying again by itself
            (attempt {{ state.attempt + 1 }}, in {{ state.delayMs / 1000 }} s).
          </span>
          <button matButton="outlined" type="button" (click)="session.retryNow()">Try now</button>
        }
        @case ('saved') {
          <mat-icon aria-hidden="true" svgIcon="cloud_done" />
          <span>Saved: {{ state.what }}, at {{ state.at | date: 'HH:mm:ss' }}.{{ waitingText() }}</span>
        }
        @case ('queued') {
          <mat-icon aria-hidden="true" svgIcon="cloud_off" />
          <span>
            <strong>Saved on this device, waiting to be sent: {{ state.what }}</strong>
            ({{ state.at | date: 'HH:mm:ss' }}).{{ waitingText() }}
            {{
              session.conflict()
                ? 'Held back: the job changed on the server meanwhile; choose below what to do.'
                : session.online()
                  ? 'Sending when the server answers.'
                  : 'Offline: sent when the connection returns.'
            }}
          </span>
        }
        @case ('refused') {
          <mat-icon aria-hidden="true" svgIcon="error" />
          <span
            ><strong>Not saved: {{ state.what }}.</strong> {{ state.message }}</span
          >
          <button matButton type="button" (click)="session.dismiss()">Dismiss</button>
        }
        @case ('changed-meanwhile') {
          <mat-icon aria-hidden="true" svgIcon="sync_problem" />
          <span
            ><strong>Not saved: {{ state.what }}.</strong> {{ state.message }}</span
          >
          <button matButton type="button" (click)="session.dismiss()">Dismiss</button>
        }
        @default {
          @if (session.pending().length > 0 || !session.online()) {
            <mat-icon aria-hidden="true" svgIcon="cloud_off" />
            <span
              >{{
                session.online()
                  ? 'Online.'
                  : 'Offline: steps are saved on this device and sent when the connection returns.'
              }}{{ waitingText() }}</span
            >
          } @else {
            <mat-icon aria-hidden="true" svgIcon="cloud_done" />
            <span
              >Each step is saved on the server as you store it; what you type stays on this device until
              then.</span
            >
          }
        }
      }
    </div>
  `,
  styles: `
    .save-status {
      display: flex;
      align-items: center;
      flex-wrap: wrap;
      gap: 8px 12px;
      min-height: 48px;
      padding: 4px 12px;
      border-radius: 8px;
      font: var(--mat-sys-body-medium);
      background: var(--mat-sys-surface-container);
      color: var(--mat-sys-on-surface);
    }
    .save-status span {
      flex: 1 1 16rem;
    }
    .save-status--queued {
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    .save-status--retrying,
    .save-status--refused,
    .save-status--changed-meanwhile {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    button {
      --mat-button-outlined-container-height: 48px;
      --mat-button-text-container-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobSaveStatus {
  protected readonly session = inject(JobSession);
  /** " 3 changes of this job wait on this device to be sent." when any do. */
  protected readonly waitingText = computed(() => {
    const waiting = this.session.pending().length;
    if (waiting === 0) return '';
    return waiting === 1
      ? ' 1 change of this job waits on this device to be sent.'
      : ` ${waiting} changes of this job wait on this device to be sent.`;
  });
  protected readonly role = computed(() => {
    const kind = this.session.saveState().kind;
    return kind === 'refused' || kind === 'changed-meanwhile' ? 'alert' : 'status';
  });
}
