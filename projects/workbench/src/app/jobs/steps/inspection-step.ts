import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import type { Job } from '../jobs.api';

/** The inspection step of a job (being built). */
@Component({
  selector: 'app-job-inspection-step',
  template: `<h2>inspection</h2>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobInspectionStep {
  readonly job = input.required<Job>();
  readonly family = input<MachineFamily>();
  readonly editable = input(false);
}
