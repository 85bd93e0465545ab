import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

/** What an address that leads nowhere shows, with the way back. */
@Component({
  selector: 'app-not-found-page',
  imports: [MatButtonModule, RouterLink],
  template: `
    <h1>There is no page at this address</h1>
    <p>The link may be old, or the address mistyped.</p>
    <a matButton="filled" routerLink="/">Back to the start</a>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotFoundPage {}
