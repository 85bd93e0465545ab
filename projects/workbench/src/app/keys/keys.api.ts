import { HttpClient, type HttpResourceRef, httpResource } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { CreateApiKeySchema } from '@counterpoise/api';
import type { Observable } from 'rxjs';
import type * as z from 'zod';
import type { ApiKeyList, CreatedApiKey } from '../auth/api-types';

/** `POST /api/v1/keys`: what the person asks for; a limit left out takes the server's default. */
export type CreateApiKeyRequest = z.input<typeof CreateApiKeySchema>;

/** The API keys routes, named once: the service sends to them, and page specs expect them by name. */
export const KEYS_URLS = {
  list: '/api/v1/keys',
  key: (id: number) => `/api/v1/keys/${encodeURIComponent(id)}`,
} as const;

/**
 * The organisation's API keys on the server, so that the keys page and its dialog hold no addresses and
 * every request and answer has the contract's type.
 */
@Injectable({ providedIn: 'root' })
export class KeysApi {
  private readonly http = inject(HttpClient);

  /**
   * The keys, revoked ones included, as a resource of the caller's injection context (a page's field
   * initializer): it lives and dies with the page, which reloads it after each change.
   */
  listResource(): HttpResourceRef<ApiKeyList | undefined> {
    return httpResource<ApiKeyList>(() => KEYS_URLS.list);
  }

  /** Creates a key; the answer holds the whole key, the one time the server ever sends it. */
  create(request: CreateApiKeyRequest): Observable<CreatedApiKey> {
    return this.http.post<CreatedApiKey>(KEYS_URLS.list, request);
  }

  /** Revokes a key for good; software that uses it is refused from its next request. */
  revoke(id: number): Observable<void> {
    return this.http.delete<void>(KEYS_URLS.key(id));
  }
}
