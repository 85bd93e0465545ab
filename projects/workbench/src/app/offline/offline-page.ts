import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { JobOfflinePanel } from './job-offline-panel';
import { OfflineJobs } from './offline-jobs';

/**
 * The changes kept on this device, job by job: what waits to be sent, what needs a person (a conflict, a
 * refusal), corrections the server computed differently, and what was discarded. The shell's status links
 * here.
 */
@Component({
  selector: 'app-offline-page',
  imports: [DatePipe, JobOfflinePanel, MatButtonModule, MatIconModule, RouterLink],
  template: `
    <h1>Changes kept on this device</h1>
    <p class="lead">
      @if (offline.online()) {
        Online: changes kept here are sent by themselves, in the order they were made.
      } @else {
        Offline: changes of jobs are kept on this device and sent when the connection returns.
      }
    </p>
    @if (jobIds().length === 0) {
      <p class="empty">Nothing waits on this device: everything is stored on the server.</p>
    }
    @for (jobId of jobIds(); track jobId) {
      <section class="job" [attr.aria-labelledby]="'job-' + jobId">
        <h2 [id]="'job-' + jobId" class="job__title">
          <a [routerLink]="['/jobs', jobId]">Job no. {{ jobId }}</a>
        </h2>
        <app-job-offline-panel [jobId]="jobId" />
        @let waiting = offline.pendingFor(jobId)();
        @if (waiting.length > 0) {
          <p>Waiting to be sent ({{ waiting.length }}):</p>
          <ol>
            @for (change of waiting; track change.key) {
              <li>{{ change.what }}, {{ change.queuedAt | date: 'd MMM, HH:mm' }}</li>
            }
          </ol>
        }
        @for (d of offline.disagreementsFor(jobId)(); track d.correctionSequence) {
          <div class="disagreement" role="note">
            <p>
              <strong>Correction {{ d.correctionSequence }}: the server's differs from this device's.</strong>
              The server's is stored; check it on the job before fitting weights.
            </p>
            <ul>
              @for (difference of d.differences; track $index) {
                <li>{{ difference }}</li>
              }
            </ul>
            <button matButton="outlined" type="button" (click)="offline.dismissDisagreement(d)">
              I have checked it
            </button>
          </div>
        }
      </section>
    }
  `,
  styles: `
    :host {
      display: block;
      max-width: 56rem;
    }
    h1 {
      font: var(--mat-sys-headline-small);
      margin: 0 0 8px;
    }
    .lead,
    .empty {
      font: var(--mat-sys-body-large);
    }
    .job {
      margin: 16px 0;
      padding: 12px 0;
      border-top: 1px solid var(--mat-sys-outline-variant);
    }
    .job__title {
      font: var(--mat-sys-title-large);
      margin: 0 0 8px;
    }
    .job__title a {
      display: inline-flex;
      align-items: center;
      min-height: 48px;
      color: var(--mat-sys-primary);
    }
    .disagreement {
      margin-top: 12px;
      padding: 12px 16px;
      border-radius: 12px;
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
      --mat-button-outlined-container-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class OfflinePage {
  protected readonly offline = inject(OfflineJobs);

  /** Every job with something kept on this device, in the order its first change was made. */
  protected readonly jobIds = computed(() => [
    ...new Set([
      ...this.offline.queue().map((c) => c.jobId),
      ...this.offline.conflicts().map((c) => c.jobId),
      ...this.offline.disagreements().map((d) => d.jobId),
      ...this.offline.discarded().map((d) => d.jobId),
    ]),
  ]);
}
