import { DatePipe, NgTemplateOutlet } from '@angular/common';
import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { BusyButton } from '../../forms/busy-button';
import { ErrorBanner } from '../../forms/error-banner';
import { ReportPanel } from '../../reports/report-panel';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import type { Machine } from '../../machines/machines.api';
import {
  AMPLITUDE_UNIT_LABELS,
  describeAcceptance,
  formatDeg,
  formatNumber,
  planeName,
  SIDE_LABELS,
} from '../../records/record-labels';
import { httpErrorMessage } from '../../shell/server-errors';
import { machineTitle, planeCountOf } from '../job-labels';
import { JobSession } from '../job-session';
import type { Job } from '../jobs.api';
import { baseRunOf, fittedCount, unitLabel } from './correction-view';

/**
 * Step 7 of a job: what completing it records (before and after per side, whether it ends within its
 * acceptance level, the weights fitted, the family's sensitivity refined), "Complete the job" once the
 * server allows it, and afterwards the record as the server stored it: before and after, the weights now
 * on the rotor, the influence coefficients measured, and the family's stored sensitivity as refined; and the
 * service report (`ReportPanel`): the customer's signature, the revisions and the e-mail to the customer.
 */
@Component({
  selector: 'app-job-completion-step',
  imports: [
    BusyButton,
    DatePipe,
    ErrorBanner,
    MatButtonModule,
    MatIconModule,
    NgTemplateOutlet,
    ReportPanel,
    RouterLink,
  ],
  templateUrl: './completion-step.html',
  styleUrl: './completion-step.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobCompletionStep {
  readonly job = input.required<Job>();
  readonly machine = input<Machine>();
  readonly family = input<MachineFamily>();
  readonly editable = input(false);

  protected readonly session = inject(JobSession);

  protected readonly formatNumber = formatNumber;
  protected readonly formatDeg = formatDeg;
  protected readonly sideLabels = SIDE_LABELS;
  protected readonly unitLabels = AMPLITUDE_UNIT_LABELS;
  protected readonly machineTitle = machineTitle;

  protected readonly unit = computed(() => unitLabel(this.job()));
  /** Whether the job's corrections were worked out from runs read without phase (amplitude only). */
  protected readonly amplitudeOnly = computed(() =>
    this.job().corrections.some((correction) => correction.method === 'four-run'),
  );
  protected readonly planeCount = computed(() => planeCountOf(this.job(), this.machine(), this.family()));
  protected readonly error = signal<string | null>(null);

  /** Before and after per side, as completion will take them: the initial run against the last run. */
  protected readonly summary = computed(() => {
    const job = this.job();
    const initial = job.runs.find((run) => run.kind === 'initial');
    const last = baseRunOf(job);
    if (!initial || !last) return null;
    return {
      initialSequence: initial.sequence,
      lastSequence: last.sequence,
      sides: initial.readings.flatMap((reading) => {
        const after = last.readings.find((one) => one.sensorSide === reading.sensorSide);
        return after ? [{ side: reading.sensorSide, before: reading.average, after: after.average }] : [];
      }),
      fitted: job.corrections.flatMap((correction) => correction.installed ?? []),
    };
  });

  /** Why the job cannot be completed now, or null when the server allows it. */
  protected readonly missing = computed(() => {
    const job = this.job();
    if (job.status !== 'open') {
      return job.status === 'on-hold'
        ? 'The job is on hold: its inspection must be resolved first.'
        : `The job is ${job.status}.`;
    }
    if (job.nextStep === 'completion' || job.nextStep === 'correction') {
      return baseRunOf(job) ? null : 'Take the initial run first.';
    }
    if (job.nextStep === 'verification') {
      return `Weights were fitted after the last run (${fittedCount(job)} in all): take a verification run with them on first.`;
    }
    return 'The steps before it are not done yet: safety, inspection, set-up and an initial run.';
  });

  protected readonly acceptance = computed(() => {
    const verification = this.job().verification;
    return verification ? describeAcceptance(verification.acceptance) : null;
  });

  protected planeLabel(index: number): string {
    return planeName(index, this.planeCount());
  }

  /** A change from before to after, as a percentage of before: "−93 %". */
  protected change(before: number, after: number): string {
    if (before === 0) return '';
    const percent = ((after - before) / before) * 100;
    return `${percent <= 0 ? '−' : '+'}${formatNumber(Math.abs(percent), 0)} %`;
  }

  /** An influence coefficient per 100 g, a figure a technician can read: "0.165 in/s peak per 100 g". */
  protected per100g(amplitudePerGram: number): string {
    return formatNumber(amplitudePerGram * 100, 3);
  }

  protected async complete(): Promise<void> {
    this.error.set(null);
    const outcome = await this.session.save('Completing the job', (api, id, etag) => api.complete(id, etag));
    if (outcome.ok) return;
    if (outcome.error instanceof HttpErrorResponse && outcome.error.status === 412) return;
    this.error.set(httpErrorMessage(outcome.error));
  }
}
