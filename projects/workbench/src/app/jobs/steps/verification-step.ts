import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { Machine } from '../../machines/machines.api';
import type { Job } from '../jobs.api';

/** The verification step of a job (being built). */
@Component({
  selector: 'app-job-verification-step',
  template: `<h2>verification</h2>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobVerificationStep {
  readonly job = input.required<Job>();
  readonly machine = input<Machine>();
  readonly editable = input(false);
}
