import { Injectable, inject } from '@angular/core';
import { HealthApi } from './health.api';

/**
 * The health of the server and its database, held for the whole app: the home page shows the last answer
 * at once when it is opened again, instead of asking anew each time.
 */
@Injectable({ providedIn: 'root' })
export class ServerStatus {
  /** The latest answer; `error()` is set when the server cannot be reached. */
  readonly health = inject(HealthApi).healthResource();

  /** Asks the server again. */
  refresh(): void {
    this.health.reload();
  }
}
