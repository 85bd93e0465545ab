import { type HttpResourceRef, httpResource } from '@angular/common/http';
import { Injectable } from '@angular/core';
import type { Health } from '@counterpoise/api';

/** The server's health route, named once: the service reads it, and specs expect it by name. */
export const HEALTH_URL = '/api/health';

/** Where the server serves its API reference (Swagger UI), for the pages that link to it. */
export const API_REFERENCE_URL = '/api/docs';

/** The server's own health report, so that no page or state holder names its address. */
@Injectable({ providedIn: 'root' })
export class HealthApi {
  /**
   * The server's and database's health, as a resource of the caller's injection context: `error()` is
   * set when the server cannot be reached, and `reload()` asks again.
   */
  healthResource(): HttpResourceRef<Health | undefined> {
    return httpResource<Health>(() => HEALTH_URL);
  }
}
