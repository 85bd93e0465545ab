import { ChangeDetectionStrategy, Component } from '@angular/core';

/** The shop's jobs (being built). */
@Component({
  selector: 'app-jobs-page',
  template: `<h1>Jobs</h1>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobsPage {}
