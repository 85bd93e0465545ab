import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ApplicationRef } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { Health } from '@counterpoise/api';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { HealthApi } from './health.api';

const HEALTH: Health = {
  status: 'ok',
  version: '0.1.0',
  uptimeSeconds: 42.5,
  database: { status: 'ok', migrations: 1 },
};

describe('HealthApi', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('reads the health report into a resource, and again on reload', async () => {
    const health = TestBed.runInInjectionContext(() => TestBed.inject(HealthApi).healthResource());
    TestBed.tick();
    const request = http.expectOne('/api/health');
    expect(request.request.method).toBe('GET');
    request.flush(HEALTH);
    await TestBed.inject(ApplicationRef).whenStable();
    expect(health.value()).toEqual(HEALTH);

    health.reload();
    TestBed.tick();
    http.expectOne({ method: 'GET', url: '/api/health' }).error(new ProgressEvent('error'));
    await TestBed.inject(ApplicationRef).whenStable();
    expect(health.error()).toBeTruthy();
  });
});
