import { ChangeDetectionStrategy, Component } from '@angular/core';
import { AppShell } from './shell/app-shell';

/** The root of the workbench: the shell with the toolbar, the navigation and the routed page. */
@Component({
  selector: 'app-root',
  imports: [AppShell],
  template: '<app-shell />',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {}
