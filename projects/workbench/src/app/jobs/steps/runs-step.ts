import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { Machine } from '../../machines/machines.api';
import type { Job } from '../jobs.api';

/** The runs step of a job (being built). */
@Component({
  selector: 'app-job-runs-step',
  template: `<h2>runs</h2>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobRunsStep {
  readonly job = input.required<Job>();
  readonly machine = input<Machine>();
  readonly editable = input(false);
}
