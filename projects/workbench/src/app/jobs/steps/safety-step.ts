import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { Job } from '../jobs.api';

/** The safety step of a job (being built). */
@Component({
  selector: 'app-job-safety-step',
  template: `<h2>safety</h2>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobSafetyStep {
  readonly job = input.required<Job>();
  readonly editable = input(false);
}
