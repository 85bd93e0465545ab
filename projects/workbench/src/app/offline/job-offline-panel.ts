import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { firstValueFrom } from 'rxjs';
import { askToConfirm } from '../shell/confirm-dialog';
import { OfflineJobs } from './offline-jobs';

/**
 * What needs a person about one job's changes kept on this device: a conflict (the job changed on the server
 * meanwhile: what is stored now, who changed it and when, the device's waiting changes in words, and the
 * choice of sending them on top or discarding them), a change the server refused, and changes discarded here
 * (kept to read until dismissed). Shows nothing when all is well.
 */
@Component({
  selector: 'app-job-offline-panel',
  imports: [DatePipe, MatButtonModule, MatIconModule],
  template: `
    @let conflict = offline.conflictFor(jobId());
    @let refusal = refused();
    @if (conflict) {
      <section class="panel panel--alert" [attr.aria-labelledby]="'conflict-' + jobId()" role="region">
        <h2 class="panel__title" [id]="'conflict-' + jobId()">
          <mat-icon aria-hidden="true" svgIcon="sync_problem" />
          Job no. {{ jobId() }} changed on the server while this device was offline
        </h2>
        <p>
          Stored on the server now: version {{ conflict.current.version }}, last changed
          {{ conflict.current.updatedAt | date: 'd MMM y, HH:mm' }}.
          @if (serverRuns().length > 0) {
            Its runs:
          }
        </p>
        @if (serverRuns().length > 0) {
          <ul class="list">
            @for (run of serverRuns(); track run.sequence) {
              <li>
                Run {{ run.sequence }} ({{ run.kind }}) by {{ run.by.name }},
                {{ run.createdAt | date: 'd MMM, HH:mm' }}
              </li>
            }
          </ul>
        }
        <p>Waiting on this device ({{ pending().length }}), in the order they were made:</p>
        <ol class="list">
          @for (change of pending(); track change.key) {
            <li>{{ change.what }}, {{ change.queuedAt | date: 'd MMM, HH:mm' }}</li>
          }
        </ol>
        <div class="actions">
          <button matButton="filled" type="button" [disabled]="working()" (click)="sendMine()">
            <mat-icon aria-hidden="true" svgIcon="send" />
            Send mine on top of theirs
          </button>
          <button matButton="outlined" type="button" [disabled]="working()" (click)="discardMine()">
            <mat-icon aria-hidden="true" svgIcon="delete" />
            Discard mine
          </button>
        </div>
      </section>
    } @else if (refusal) {
      <section class="panel panel--alert" [attr.aria-labelledby]="'refused-' + jobId()" role="region">
        <h2 class="panel__title" [id]="'refused-' + jobId()">
          <mat-icon aria-hidden="true" svgIcon="error" />
          The server refused a change kept on this device (job no. {{ jobId() }})
        </h2>
        <p>
          <strong>{{ refusal.what }}</strong> ({{ refusal.queuedAt | date: 'd MMM, HH:mm' }}):
          {{ refusal.refusal?.message }}
        </p>
        @if (refusal.refusal?.fields?.length) {
          <ul class="list">
            @for (field of refusal.refusal?.fields; track $index) {
              <li>{{ field }}</li>
            }
          </ul>
        }
        <p>It and the {{ pending().length - 1 }} change(s) after it wait on this device.</p>
        <div class="actions">
          <button matButton="filled" type="button" [disabled]="working()" (click)="tryAgain()">
            <mat-icon aria-hidden="true" svgIcon="replay" />
            Send again
          </button>
          <button matButton="outlined" type="button" [disabled]="working()" (click)="discardMine()">
            <mat-icon aria-hidden="true" svgIcon="delete" />
            Discard mine
          </button>
        </div>
      </section>
    }
    @for (discarded of discardedHere(); track discarded.key) {
      <section class="panel" [attr.aria-labelledby]="'discarded-' + discarded.key" role="region">
        <h2 class="panel__title" [id]="'discarded-' + discarded.key">
          <mat-icon aria-hidden="true" svgIcon="delete" />
          Discarded from this device on {{ discarded.discardedAt | date: 'd MMM, HH:mm' }} (job no.
          {{ jobId() }})
        </h2>
        <p>These changes were not sent; enter them again if they are still needed:</p>
        <ol class="list">
          @for (change of discarded.changes; track $index) {
            <li>{{ change.what }}, made {{ change.queuedAt | date: 'd MMM, HH:mm' }}</li>
          }
        </ol>
        <div class="actions">
          <button matButton="outlined" type="button" (click)="offline.dismissDiscarded(discarded.key)">
            Dismiss
          </button>
        </div>
      </section>
    }
  `,
  styles: `
    :host {
      display: grid;
      gap: 12px;
    }
    :host:empty {
      display: none;
    }
    .panel {
      padding: 12px 16px;
      border-radius: 12px;
      background: var(--mat-sys-surface-container);
      color: var(--mat-sys-on-surface);
    }
    .panel--alert {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .panel__title {
      display: flex;
      align-items: center;
      gap: 8px;
      margin: 0 0 8px;
      font: var(--mat-sys-title-medium);
    }
    p {
      margin: 8px 0;
    }
    .list {
      margin: 4px 0 8px;
      padding-left: 1.5rem;
    }
    .actions {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      --mat-button-filled-container-height: 48px;
      --mat-button-outlined-container-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobOfflinePanel {
  /** The job's id. */
  readonly jobId = input.required<number>();

  protected readonly offline = inject(OfflineJobs);
  private readonly dialog = inject(MatDialog);
  protected readonly working = signal(false);

  protected readonly pending = computed(() => this.offline.pendingFor(this.jobId())());
  protected readonly refused = computed(() => this.pending().find((c) => c.refusal !== null) ?? null);
  protected readonly serverRuns = computed(() => this.offline.conflictFor(this.jobId())?.current.runs ?? []);
  protected readonly discardedHere = computed(() =>
    this.offline.discarded().filter((d) => d.jobId === this.jobId()),
  );

  protected async sendMine(): Promise<void> {
    await this.run(() => this.offline.sendMineOnTop(this.jobId()));
  }

  protected async tryAgain(): Promise<void> {
    await this.run(() => this.offline.tryAgain(this.jobId()));
  }

  protected async discardMine(): Promise<void> {
    const lost = this.pending().map((c) => c.what);
    const confirmed = await firstValueFrom(
      askToConfirm(this.dialog, {
        title: `Discard ${lost.length} change${lost.length === 1 ? '' : 's'} kept on this device?`,
        message: `These will not reach the server: ${lost.join('; ')}. The job stays as stored on the server. A list of what was discarded stays here until you dismiss it.`,
        confirm: 'Discard mine',
        destructive: true,
      }),
    );
    if (confirmed) await this.run(() => this.offline.discardMine(this.jobId()));
  }

  private async run(action: () => Promise<void>): Promise<void> {
    this.working.set(true);
    try {
      await action();
    } finally {
      this.working.set(false);
    }
  }
}
