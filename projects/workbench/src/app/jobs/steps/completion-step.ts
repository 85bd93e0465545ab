import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import type { Machine } from '../../machines/machines.api';
import type { Job } from '../jobs.api';

/** The completion step of a job (being built). */
@Component({
  selector: 'app-job-completion-step',
  template: `<h2>completion</h2>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobCompletionStep {
  readonly job = input.required<Job>();
  readonly machine = input<Machine>();
  readonly family = input<MachineFamily>();
  readonly editable = input(false);
}
