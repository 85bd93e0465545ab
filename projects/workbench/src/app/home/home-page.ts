import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { CpSafetyNotice } from '@counterpoise/ng/core';
import { ServerStatus } from '../status/server-status';
import { JOB_STEPS } from './job-steps';

/** The start page: what Counterpoise does, the stages of a job, and whether the server is working. */
@Component({
  selector: 'app-home-page',
  imports: [
    CpSafetyNotice,
    DecimalPipe,
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
}
