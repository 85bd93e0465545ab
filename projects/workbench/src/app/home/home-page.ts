import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { CpSafetyNotice } from '@counterpoise/ng/core';
import { API_REFERENCE_URL } from '../status/health.api';
import { ServerStatus } from '../status/server-status';
import { JOB_STEPS } from './job-steps';

/** The start page: what Counterpoise does, the stages of a job, and whether the server is working. */
@Component({
  selector: 'app-home-page',
  imports: [
    CpSafetyNotice,
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
  protected readonly uptimeLabel = uptimeLabel;
  protected readonly apiReferenceUrl = API_REFERENCE_URL;
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
