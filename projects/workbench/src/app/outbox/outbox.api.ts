import { type HttpResourceRef, httpResource } from '@angular/common/http';
import { Injectable } from '@angular/core';
import type { Outbox } from '../auth/api-types';

/** The Outbox's route, named once: the service reads it, and page specs expect it by name. */
export const OUTBOX_URL = '/api/v1/outbox';

/** The e-mail the server has sent for the organisation, so that the Outbox page holds no address. */
@Injectable({ providedIn: 'root' })
export class OutboxApi {
  /**
   * The captured messages, as a resource of the caller's injection context (a page's field initializer):
   * it lives and dies with the page.
   */
  listResource(): HttpResourceRef<Outbox | undefined> {
    return httpResource<Outbox>(() => OUTBOX_URL);
  }
}
