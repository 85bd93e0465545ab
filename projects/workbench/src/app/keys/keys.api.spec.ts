import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ApplicationRef } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { ApiKeySummary } from '@counterpoise/api';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { CreatedApiKey } from '../auth/api-types';
import { KeysApi } from './keys.api';

const LOGGER: ApiKeySummary = {
  id: 3,
  name: 'Test bench logger',
  prefix: 'cpk_bG9nZ2Vy',
  limitPerMinute: 60,
  createdAt: '2026-05-01T08:00:00.000Z',
  lastUsedAt: null,
  revokedAt: null,
  allowedOrigins: [],
};
const WHOLE_KEY = `cpk_${'A'.repeat(43)}`;

describe('KeysApi', () => {
  let api: KeysApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(KeysApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('reads the keys into a resource, and again on reload', async () => {
    const keys = TestBed.runInInjectionContext(() => api.listResource());
    TestBed.tick();
    const request = http.expectOne('/api/v1/keys');
    expect(request.request.method).toBe('GET');
    request.flush({ keys: [LOGGER] });
    await TestBed.inject(ApplicationRef).whenStable();
    expect(keys.value()?.keys).toEqual([LOGGER]);

    keys.reload();
    TestBed.tick();
    http.expectOne({ method: 'GET', url: '/api/v1/keys' }).flush({ keys: [] });
    await TestBed.inject(ApplicationRef).whenStable();
    expect(keys.value()?.keys).toEqual([]);
  });

  it('creates a key with a POST of its name and limit, and answers the whole key', async () => {
    const answer = firstValueFrom(api.create({ name: 'Field tablet', limitPerMinute: 120 }));
    const request = http.expectOne('/api/v1/keys');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ name: 'Field tablet', limitPerMinute: 120 });
    const created: CreatedApiKey = { key: WHOLE_KEY, summary: { ...LOGGER, name: 'Field tablet' } };
    request.flush(created, { status: 201, statusText: 'Created' });
    expect((await answer).key).toBe(WHOLE_KEY);
  });

  it('revokes a key with a DELETE of its address', async () => {
    const done = firstValueFrom(api.revoke(3), { defaultValue: 'no answer' });
    const request = http.expectOne('/api/v1/keys/3');
    expect(request.request.method).toBe('DELETE');
    expect(request.request.body).toBeNull();
    request.flush(null, { status: 204, statusText: 'No Content' });
    expect(await done).toBeNull();
  });
});
