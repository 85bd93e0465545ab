import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { Machine } from '../../machines/machines.api';
import type { Job } from '../jobs.api';

/** The setup step of a job (being built). */
@Component({
  selector: 'app-job-setup-step',
  template: `<h2>setup</h2>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobSetupStep {
  readonly job = input.required<Job>();
  readonly machine = input<Machine>();
  readonly editable = input(false);
}
