import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { CpSafetyNotice } from '@counterpoise/ng/core';
import { AuthSession } from '../auth/auth-session';
import { BusyButton } from '../forms/busy-button';
import { ErrorBanner } from '../forms/error-banner';
import { jobDate } from '../jobs/job-dates';
import { JOB_STATUS_LABELS, machineTitle } from '../jobs/job-labels';
import { JobsApi, type JobSummary } from '../jobs/jobs.api';
import { JobStarter } from '../jobs/start-job-dialog';
import { API_REFERENCE_URL } from '../status/health.api';
import { ServerStatus } from '../status/server-status';
import { JOB_STEPS } from './job-steps';

/**
 * The start page. For someone signed in who reads jobs, their day comes first: their open jobs, the jobs
 * waiting for a manager, and the machines due a balance, each with the way on. Then, as for every visitor,
 * what Counterpoise does, the stages of a job, the safety cautions and whether the server is working.
 */
@Component({
  selector: 'app-home-page',
  imports: [
    BusyButton,
    CpSafetyNotice,
    ErrorBanner,
    MatButtonModule,
    MatCardModule,
    MatIconModule,
    MatProgressSpinnerModule,
    RouterLink,
  ],
  templateUrl: './home-page.html',
  styleUrl: './home-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HomePage {
  protected readonly steps = JOB_STEPS;
  protected readonly status = inject(ServerStatus);
  protected readonly session = inject(AuthSession);
  protected readonly starter = inject(JobStarter);
  protected readonly uptimeLabel = uptimeLabel;
  protected readonly apiReferenceUrl = API_REFERENCE_URL;
  protected readonly statusLabels = JOB_STATUS_LABELS;
  protected readonly machineTitle = machineTitle;
  protected readonly jobDate = jobDate;

  private readonly api = inject(JobsApi);
  /** Whether the page shows the person's day: signed in, in a role that reads jobs. */
  protected readonly showsDay = computed(() => this.session.signedIn() && this.session.can('jobs:read'));
  protected readonly isManager = computed(() => this.session.can('jobs:write-any'));
  protected readonly day = rxResource({
    params: () => (this.showsDay() ? this.session.user()?.id : undefined),
    stream: () => this.api.home(),
  });
  protected readonly firstName = computed(() => this.session.user()?.name.split(' ')[0] ?? '');

  /** The failed start of a job on one of the machines due, if the last start failed there. */
  protected failedDue(due: readonly { machine: { id: number } }[]) {
    const failure = this.starter.failure();
    return failure && due.some((item) => item.machine.id === failure.machineId) ? failure : null;
  }

  /** The way on from a job: a job never touched begins, an open one carries on, one on hold is looked at. */
  protected openLabel(job: JobSummary): string {
    if (job.status === 'on-hold') return 'Open the job';
    return job.version === 1 ? 'Begin' : 'Carry on';
  }
}

/** How long the server has been up, in the largest unit that reads naturally. */
export function uptimeLabel(seconds: number): string {
  if (seconds < 60) return 'Under a minute';
  const minutes = Math.floor(seconds / 60);
  if (minutes < 120) return `${minutes} min`;
  const hours = Math.floor(minutes / 60);
  if (hours < 48) return `${hours} h ${minutes % 60} min`;
  return `${Math.floor(hours / 24)} days`;
}
