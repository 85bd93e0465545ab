import { httpResource } from '@angular/common/http';
import { Injectable } from '@angular/core';
import type { Health } from '@counterpoise/api';

/** The health of the server and its database, as `GET /api/health` reports it. */
@Injectable({ providedIn: 'root' })
export class ServerStatus {
  /** The latest answer; `error()` is set when the server cannot be reached. */
  readonly health = httpResource<Health>(() => '/api/health');

  /** Asks the server again. */
  refresh(): void {
    this.health.reload();
  }
}
