import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import type { Machine } from '../../machines/machines.api';
import type { Job } from '../jobs.api';

/** The correction step of a job (being built). */
@Component({
  selector: 'app-job-correction-step',
  template: `<h2>correction</h2>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobCorrectionStep {
  readonly job = input.required<Job>();
  readonly machine = input<Machine>();
  readonly family = input<MachineFamily>();
  readonly editable = input(false);
}
