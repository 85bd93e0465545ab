import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { Machine } from '../../machines/machines.api';
import {
  AMPLITUDE_UNIT_LABELS,
  describeAcceptance,
  formatDeg,
  formatNumber,
  SIDE_LABELS,
} from '../../records/record-labels';
import type { Job } from '../jobs.api';
import { RunEntry } from '../run-entry';
import { planeCountOf } from '../job-labels';
import { describeWeight } from './runs-step';

/** Why a side without a limit is not judged: the level cannot be read as an amplitude there. */
export function notJudgedReason(job: Job): string {
  const level = job.verification?.acceptance;
  if (level?.kind === 'balance-grade') {
    return (
      'A balance grade is a permissible unbalance, read as an amplitude through the influence coefficient ' +
      'of the side: that needs the rotor’s mass on the machine and a coefficient this job measured with a ' +
      'trial weight in the side’s plane.'
    );
  }
  return 'The acceptance level cannot be read as an amplitude in the job’s unit for this side.';
}

/**
 * The verification step of a job: once the weights are fitted, the verification run's readings with what the
 * model predicts for the fitted weights beside them; then the server's verdict of the latest run, side by side
 * against the acceptance level, and the side to work next when it is not yet within it. The page moves on to
 * the step the server names (the completion, or the correction again).
 */
@Component({
  selector: 'app-job-verification-step',
  imports: [MatIconModule, RunEntry],
  templateUrl: './verification-step.html',
  styleUrl: './verification-step.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobVerificationStep {
  /** The job as stored. */
  readonly job = input.required<Job>();
  /** The job's machine, for its planes; undefined while it is fetched. */
  readonly machine = input<Machine>();
  /** Whether the signed-in person may change this job now. */
  readonly editable = input(false);

  protected readonly sideLabels = SIDE_LABELS;
  protected readonly formatNumber = formatNumber;
  protected readonly formatDeg = formatDeg;

  protected readonly unit = computed(() => {
    const setup = this.job().setup;
    return setup ? AMPLITUDE_UNIT_LABELS[setup.amplitudeUnit] : '';
  });
  /** The latest correction, whose fitted weights the verification run checks. */
  protected readonly correction = computed(() => this.job().corrections.at(-1) ?? null);
  /** Whether the weights are fitted and wait for their run. */
  protected readonly awaitingRun = computed(() => this.job().nextStep === 'verification');
  protected readonly fittedWeights = computed(() => {
    const count = planeCountOf(this.job(), this.machine());
    return (this.correction()?.installed ?? []).map(
      (weight) =>
        `${describeWeight(weight, count)}, ${weight.fixing} at ${formatNumber(weight.radiusMm, 0)} mm`,
    );
  });
  /** The server's verdict, when it judges a verification run (not the initial run before any weight). */
  protected readonly verdict = computed(() => {
    const job = this.job();
    const verification = job.verification;
    if (!verification || this.awaitingRun()) return null;
    const run = job.runs.find((candidate) => candidate.id === verification.runId);
    if (!run || run.kind !== 'verification') return null;
    return {
      ...verification,
      runSequence: run.sequence,
      acceptanceText: describeAcceptance(verification.acceptance),
      notJudged: notJudgedReason(job),
    };
  });
}
