import { HttpClient, type HttpResourceRef, httpResource } from '@angular/common/http';
import { Injectable, inject, type Signal } from '@angular/core';
import type { ApiKeySummary, CreateApiKeySchema } from '@counterpoise/api';
import type { Observable } from 'rxjs';
import type * as z from 'zod';
import type { ApiKeyList, CreatedApiKey } from '../auth/api-types';
import type { UsageReport } from './usage-model';
import type { UsageQueryState } from './usage-query';

/** `POST /api/v1/keys`: what the person asks for; a limit left out takes the server's default. */
export type CreateApiKeyRequest = z.input<typeof CreateApiKeySchema>;

/** The API keys routes, named once: the service sends to them, and page specs expect them by name. */
export const KEYS_URLS = {
  list: '/api/v1/keys',
  key: (id: number) => `/api/v1/keys/${encodeURIComponent(id)}`,
  origins: (id: number) => `/api/v1/keys/${encodeURIComponent(id)}/origins`,
  usage: '/api/v1/usage',
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

  /**
   * The usage of the organisation's keys over the query's days (both included), asked again whenever
   * the query changes; nothing is asked while `query` is undefined (a span not yet valid).
   */
  usageResource(query: Signal<UsageQueryState | undefined>): HttpResourceRef<UsageReport | undefined> {
    return httpResource<UsageReport>(() => {
      const state = query();
      return state === undefined
        ? undefined
        : { url: KEYS_URLS.usage, params: { from: state.from, to: state.to, groupBy: state.groupBy } };
    });
  }

  /** Creates a key; the answer holds the whole key, the one time the server ever sends it. */
  create(request: CreateApiKeyRequest): Observable<CreatedApiKey> {
    return this.http.post<CreatedApiKey>(KEYS_URLS.list, request);
  }

  /** Replaces the web origins a key may be used from; an empty list lifts the limit. */
  changeOrigins(id: number, allowedOrigins: readonly string[]): Observable<ApiKeySummary> {
    return this.http.put<ApiKeySummary>(KEYS_URLS.origins(id), { allowedOrigins });
  }

  /** Revokes a key for good; software that uses it is refused from its next request. */
  revoke(id: number): Observable<void> {
    return this.http.delete<void>(KEYS_URLS.key(id));
  }
}
