import { BreakpointObserver } from '@angular/cdk/layout';
import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { rxResource, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatStepperModule, type StepperOrientation } from '@angular/material/stepper';
import { RouterLink } from '@angular/router';
import { map } from 'rxjs';
import { AuthSession } from '../auth/auth-session';
import { ErrorBanner } from '../forms/error-banner';
import { MachineFamiliesApi } from '../machine-families/machine-families.api';
import { MachinesApi } from '../machines/machines.api';
import { JobOfflinePanel } from '../offline/job-offline-panel';
import { idFromRoute } from '../records/record-page';
import { askForReason } from './reason-dialog';
import { JOB_STATUS_LABELS, JOB_STEP_LABELS, JOB_STEP_ORDER, machineTitle, stepDone } from './job-labels';
import { JobSaveStatus } from './job-save-status';
import { JobSession } from './job-session';
import type { JobStep } from './jobs.api';
import { JobCompletionStep } from './steps/completion-step';
import { JobCorrectionStep } from './steps/correction-step';
import { JobInspectionStep } from './steps/inspection-step';
import { JobRunsStep } from './steps/runs-step';
import { JobSafetyStep } from './steps/safety-step';
import { JobSetupStep } from './steps/setup-step';
import { JobVerificationStep } from './steps/verification-step';

/** From this width the stepper's steps stand in a row above the step; below it, one under the other. */
const ROW_OF_STEPS = '(min-width: 760px)';

/**
 * One balancing job, from the safety check to the balanced rotor: the machine and who does it, where the last
 * change stands (stored, being sent, waiting to be sent again), and a stepper that opens at the step to do
 * next and moves on as each is stored. Each step stores itself through the page's `JobSession`; what is typed
 * and not yet stored stays on the device (`JobDrafts`).
 */
@Component({
  selector: 'app-job-page',
  imports: [
    DatePipe,
    ErrorBanner,
    JobCompletionStep,
    JobCorrectionStep,
    JobInspectionStep,
    JobOfflinePanel,
    JobRunsStep,
    JobSafetyStep,
    JobSaveStatus,
    JobSetupStep,
    JobVerificationStep,
    MatButtonModule,
    MatIconModule,
    MatProgressSpinnerModule,
    MatStepperModule,
    RouterLink,
  ],
  providers: [JobSession],
  templateUrl: './job-page.html',
  styleUrl: './job-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobPage {
  /** The job's id, from the address. */
  readonly id = input<string>();

  protected readonly session = inject(JobSession);
  protected readonly auth = inject(AuthSession);
  private readonly dialog = inject(MatDialog);
  private readonly machines = inject(MachinesApi);
  private readonly families = inject(MachineFamiliesApi);

  protected readonly job = this.session.job;
  protected readonly steps = JOB_STEP_ORDER;
  protected readonly stepLabels = JOB_STEP_LABELS;
  protected readonly statusLabels = JOB_STATUS_LABELS;
  protected readonly machineTitle = machineTitle;
  protected readonly stepDone = stepDone;

  /** The job's machine record: its planes, allowed positions, stock weights and acceptance level. */
  private readonly machineResource = rxResource({
    params: () => this.job()?.machine.id,
    stream: ({ params }) => this.machines.get(params).pipe(map((versioned) => versioned.record)),
  });
  protected readonly machine = computed(() =>
    this.machineResource.hasValue() ? this.machineResource.value() : undefined,
  );
  /** The machine's family, with its inspection limits and stored sensitivities; undefined without one. */
  private readonly familyResource = rxResource({
    params: () => this.job()?.machine.familyId ?? undefined,
    stream: ({ params }) => this.families.get(params).pipe(map((versioned) => versioned.record)),
  });
  protected readonly family = computed(() =>
    this.familyResource.hasValue() ? this.familyResource.value() : undefined,
  );

  protected readonly orientation = toSignal(
    inject(BreakpointObserver)
      .observe(ROW_OF_STEPS)
      .pipe(map((state): StepperOrientation => (state.matches ? 'horizontal' : 'vertical'))),
    { initialValue: 'horizontal' as StepperOrientation },
  );

  /** The step shown: the job's next step, followed as each change is stored; the person may go back. */
  protected readonly selectedIndex = signal(0);
  protected readonly canManage = computed(() => this.auth.can('jobs:write-any'));
  /** Whether the signed-in person may work on this job: their own, or any for a manager. */
  protected readonly mayWork = computed(() => {
    const job = this.job();
    const me = this.auth.user();
    if (!job || !me) return false;
    return this.auth.can('jobs:write-any') || (this.auth.can('jobs:write') && job.technician.id === me.id);
  });

  constructor() {
    effect(() => {
      const id = idFromRoute(this.id());
      if (id !== null) untracked(() => void this.session.load(id));
    });
    // Opens at the step to do next, and moves on when a stored change makes another step the next.
    effect(() => {
      const next = this.job()?.nextStep;
      if (next === undefined) return;
      const index = next === 'done' ? JOB_STEP_ORDER.length - 1 : JOB_STEP_ORDER.indexOf(next);
      untracked(() => this.selectedIndex.set(index));
    });
  }

  /** A step can be opened once the steps before it are done (or it is the next one). */
  protected reachable(step: JobStep): boolean {
    const job = this.job();
    if (!job) return false;
    if (job.nextStep === 'done') return true;
    return JOB_STEP_ORDER.indexOf(step) <= JOB_STEP_ORDER.indexOf(job.nextStep);
  }

  protected abandon(): void {
    const job = this.job();
    if (!job) return;
    askForReason(this.dialog, {
      title: `Abandon the job on ${machineTitle(job.machine)}?`,
      message:
        'The job stops here and keeps everything entered so far. A manager can reopen it. Say why, for the record.',
      label: 'Why the job is abandoned',
      confirm: 'Abandon the job',
    }).subscribe((reason) => {
      if (reason)
        void this.session.save('Abandoning the job', (api, id, etag) => api.abandon(id, reason, etag));
    });
  }

  protected reopen(): void {
    void this.session.save('Reopening the job', (api, id, etag) => api.reopen(id, etag));
  }
}
