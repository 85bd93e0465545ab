import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession } from '../auth/testing';
import { Connection, HEALTH_PROBE } from './connection';
import { isKeptRead, OFFLINE_STORAGE, offlineRecordsInterceptor, OfflineRecords } from './offline-records';
import { MemoryOfflineStorage } from './offline-storage';

/** Lets the promise chain behind an answer move on. */
const tick = () => new Promise((resolve) => setTimeout(resolve));

describe('offlineRecordsInterceptor', () => {
  let http: HttpTestingController;
  let client: HttpClient;
  let storage: MemoryOfflineStorage;
  let session: AuthSession;

  beforeEach(() => {
    storage = new MemoryOfflineStorage();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(withInterceptors([offlineRecordsInterceptor])),
        provideHttpClientTesting(),
        { provide: OFFLINE_STORAGE, useValue: storage },
        { provide: HEALTH_PROBE, useValue: async () => false },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    client = TestBed.inject(HttpClient);
    session = TestBed.inject(AuthSession);
    session.start(aSession('technician'));
  });

  afterEach(() => http.verify());

  /** Reads the job through the interceptor and answers it with `answer`. */
  async function readJob(answer: (request: ReturnType<HttpTestingController['expectOne']>) => void) {
    const reading = firstValueFrom(client.get('/api/v1/jobs/31', { observe: 'response' }));
    answer(http.expectOne('/api/v1/jobs/31'));
    return reading;
  }

  it('keeps what the server answered and gives it back, with its ETag, when there is no answer', async () => {
    await readJob((request) => request.flush({ id: 31, version: 4 }, { headers: { ETag: '"4"' } }));
    await tick();
    expect(TestBed.inject(Connection).online()).toBe(true);

    const offline = await readJob((request) => request.error(new ProgressEvent('error'), { status: 0 }));
    expect(offline.body).toEqual({ id: 31, version: 4 });
    expect(offline.headers.get('ETag')).toBe('"4"');
    expect(TestBed.inject(Connection).online()).toBe(false);
  });

  it('keeps each person’s apart, and forgets them at sign-out', async () => {
    await readJob((request) => request.flush({ id: 31, version: 4 }, { headers: { ETag: '"4"' } }));
    await tick();
    expect(await storage.readRecord(3, '/api/v1/jobs/31')).not.toBeNull();

    session.start(aSession('manager'));
    await expect(
      readJob((request) => request.error(new ProgressEvent('error'), { status: 0 })),
    ).rejects.toMatchObject({ status: 0 });

    await TestBed.inject(OfflineRecords).clear(3);
    expect(await storage.readRecord(3, '/api/v1/jobs/31')).toBeNull();
  });

  it('passes a refusal through as it is', async () => {
    await readJob((request) => request.flush({ id: 31, version: 4 }));
    await tick();
    await expect(
      readJob((request) =>
        request.flush({ title: 'Not found', status: 404 }, { status: 404, statusText: 'Not Found' }),
      ),
    ).rejects.toMatchObject({ status: 404 });
  });

  it('keeps only the technician’s day, jobs, machines and families', () => {
    expect(isKeptRead('/api/v1/jobs/home')).toBe(true);
    expect(isKeptRead('/api/v1/jobs/31')).toBe(true);
    expect(isKeptRead('/api/v1/machines/12')).toBe(true);
    expect(isKeptRead('/api/v1/machine-families/4')).toBe(true);
    expect(isKeptRead('/api/v1/jobs/31/report')).toBe(false);
    expect(isKeptRead('/api/v1/people')).toBe(false);
    expect(isKeptRead('/api/v1/auth/refresh')).toBe(false);
  });
});
