import { HttpErrorResponse, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession } from '../auth/testing';
import { Connection, HEALTH_PROBE } from '../offline/connection';
import { OfflineJobs } from '../offline/offline-jobs';
import { OFFLINE_STORAGE } from '../offline/offline-records';
import { MemoryOfflineStorage } from '../offline/offline-storage';
import { problemOf } from '../shell/server-errors';
import { isTransient, JobSession, NEEDS_CONNECTION, retryDelayMs } from './job-session';
import type { Job } from './jobs.api';
import { aJob as aFullJob, aJobMachine } from './jobs-testing';

/** The fields of a job the session reads (id, version, status); the rest is the steps' business. */
function aJob(version: number, status: Job['status'] = 'open'): Job {
  return { id: 8, version, status, nextStep: 'runs' } as Job;
}

/** Lets the promise chain behind a request or an answer move on. */
const tick = () => new Promise((resolve) => setTimeout(resolve));

describe('JobSession', () => {
  let session: JobSession;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), JobSession],
    });
    session = TestBed.inject(JobSession);
    http = TestBed.inject(HttpTestingController);
    const loading = session.load(8);
    http.expectOne('/api/v1/jobs/8').flush(aJob(4), { headers: { ETag: '"4"' } });
    await loading;
  });

  afterEach(() => http.verify());

  it('opens the job with its ETag', () => {
    expect(session.job()?.version).toBe(4);
    expect(session.versioned()?.etag).toBe('"4"');
    expect(session.changeable()).toBe(true);
    expect(session.saveState()).toEqual({ kind: 'idle' });
  });

  it('sends a change on the stored ETag and then shows the job as the server answered it', async () => {
    const saving = session.save('Set-up', (api, id, etag) => api.complete(id, etag));
    expect(session.saveState()).toEqual({ kind: 'saving', what: 'Set-up' });
    expect(session.busy()).toBe(true);
    const request = http.expectOne('/api/v1/jobs/8/complete');
    expect(request.request.headers.get('If-Match')).toBe('"4"');
    request.flush(aJob(5, 'completed'), { headers: { ETag: '"5"' } });
    const outcome = await saving;
    expect(outcome.ok).toBe(true);
    expect(session.versioned()?.etag).toBe('"5"');
    expect(session.changeable()).toBe(false);
    expect(session.saveState().kind).toBe('saved');
  });

  it('sends the same change again, on the same ETag, while there is no connection, and says so', async () => {
    const saving = session.save('Readings of run 3', (api, id, etag) => api.reopen(id, etag));
    http
      .expectOne('/api/v1/jobs/8/reopen')
      .error(new ProgressEvent('error'), { status: 0, statusText: 'Unknown Error' });
    await tick();
    expect(session.saveState()).toMatchObject({
      kind: 'retrying',
      what: 'Readings of run 3',
      attempt: 1,
      delayMs: 1000,
    });
    expect(session.busy()).toBe(true);

    session.retryNow();
    const second = http.expectOne('/api/v1/jobs/8/reopen');
    expect(second.request.headers.get('If-Match')).toBe('"4"');
    second.flush({ title: 'Service unavailable', status: 503 }, { status: 503, statusText: 'Unavailable' });
    await tick();
    expect(session.saveState()).toMatchObject({ kind: 'retrying', attempt: 2, delayMs: 2000 });

    session.retryNow();
    http.expectOne('/api/v1/jobs/8/reopen').flush(aJob(5), { headers: { ETag: '"5"' } });
    expect((await saving).ok).toBe(true);
    expect(session.saveState().kind).toBe('saved');
  });

  it('shows the job as stored when it changed meanwhile, and keeps the typed values for another try', async () => {
    const saving = session.save('Inspection', (api, id, etag) => api.reopen(id, etag));
    http
      .expectOne('/api/v1/jobs/8/reopen')
      .flush(
        { title: 'Changed meanwhile', status: 412, code: 'CHANGED_MEANWHILE', current: aJob(6) },
        { status: 412, statusText: 'Precondition Failed', headers: { ETag: '"6"' } },
      );
    const outcome = await saving;
    expect(outcome.ok).toBe(false);
    expect(session.job()?.version).toBe(6);
    expect(session.versioned()?.etag).toBe('"6"');
    expect(session.saveState()).toMatchObject({ kind: 'changed-meanwhile', what: 'Inspection' });
    expect((session.saveState() as { message: string }).message).toContain('still in the form');
  });

  it('after a lost answer, a 412 says the change may already be stored and shows the job as stored', async () => {
    const saving = session.save('Readings of run 2', (api, id, etag) => api.reopen(id, etag));
    http
      .expectOne('/api/v1/jobs/8/reopen')
      .error(new ProgressEvent('error'), { status: 0, statusText: 'Unknown Error' });
    await tick();
    session.retryNow();
    http
      .expectOne('/api/v1/jobs/8/reopen')
      .flush(
        { title: 'Changed meanwhile', status: 412, current: aJob(5) },
        { status: 412, statusText: 'Precondition Failed', headers: { ETag: '"5"' } },
      );
    expect((await saving).ok).toBe(false);
    expect(session.job()?.version).toBe(5);
    expect((session.saveState() as { message: string }).message).toContain('check that your change is in it');
  });

  it('hands a refusal to the step at once, without sending it again', async () => {
    const saving = session.save('Set-up', (api, id, etag) => api.reopen(id, etag));
    http.expectOne('/api/v1/jobs/8/reopen').flush(
      {
        title: 'Invalid request',
        status: 400,
        detail: 'Check the highlighted fields.',
        errors: [{ path: 'operatingSpeedRpm', message: 'Enter the speed in rpm.' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    const outcome = await saving;
    expect(outcome.ok).toBe(false);
    expect(!outcome.ok && outcome.error instanceof HttpErrorResponse && outcome.error.status).toBe(400);
    expect(session.saveState()).toEqual({
      kind: 'refused',
      what: 'Set-up',
      message: 'Check the highlighted fields.',
    });
    expect(session.job()?.version).toBe(4);
  });

  it('refuses a second change while the first is on its way, sending nothing', async () => {
    const first = session.save('Safety', (api, id, etag) => api.reopen(id, etag));
    const second = await session.save('Safety again', (api, id, etag) => api.reopen(id, etag));
    expect(second.ok).toBe(false);
    http.expectOne('/api/v1/jobs/8/reopen').flush(aJob(5));
    expect((await first).ok).toBe(true);
  });

  it('says why a job cannot be opened', async () => {
    const loading = session.load(99);
    http
      .expectOne('/api/v1/jobs/99')
      .flush({ title: 'Not found', status: 404 }, { status: 404, statusText: 'Not Found' });
    await loading;
    expect(session.loadError()).toBe('This is no longer here. It may have been removed.');
  });
});

describe('retryDelayMs', () => {
  it('waits 1, 2, 4, 8 then 15 s, then every 30 s', () => {
    expect([1, 2, 3, 4, 5, 6, 7, 20].map(retryDelayMs)).toEqual([
      1000, 2000, 4000, 8000, 15_000, 30_000, 30_000, 30_000,
    ]);
  });
});

describe('isTransient', () => {
  it('sends again on no answer, a server or gateway failure and too many requests; not on a refusal', () => {
    const failure = (status: number) => new HttpErrorResponse({ status });
    expect([0, 429, 500, 502, 503, 504].map((status) => isTransient(failure(status)))).toEqual([
      true,
      true,
      true,
      true,
      true,
      true,
    ]);
    expect([400, 401, 403, 404, 409, 412, 428].map((status) => isTransient(failure(status)))).toEqual(
      Array(7).fill(false),
    );
    expect(isTransient(new Error('not HTTP'))).toBe(false);
  });
});

describe('JobSession with no connection', () => {
  /** Suvi's open job on a machine without family, newly started. */
  const job = aStartedJob();
  let session: JobSession;
  let http: HttpTestingController;
  let storage: MemoryOfflineStorage;

  function aStartedJob(): Job {
    return aFullJob({ id: 31, version: 4, machine: aJobMachine({ familyId: null, familyName: null }) });
  }

  beforeEach(async () => {
    storage = new MemoryOfflineStorage();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        JobSession,
        { provide: OFFLINE_STORAGE, useValue: storage },
        { provide: HEALTH_PROBE, useValue: async () => false },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    TestBed.inject(AuthSession).start(aSession('technician'));
    // What the device kept while online: the job's machine (one plane), as its GET answers it.
    await storage.writeRecord({
      userId: 3,
      url: '/api/v1/machines/12',
      body: { id: 12, familyId: null, planes: [{ correctionRadiusMm: 210 }] },
      etag: '"1"',
      storedAt: '2026-12-04T08:00:00.000Z',
    });
    session = TestBed.inject(JobSession);
    const loading = session.load(31);
    http.expectOne('/api/v1/jobs/31').flush(job, { headers: { ETag: '"4"' } });
    await loading;
  });

  afterEach(() => {
    // The day kept while online and the queue's own reads are another spec's business: no answer here.
    for (const request of http.match(() => true)) request.error(new ProgressEvent('error'), { status: 0 });
    http.verify();
  });

  it('keeps a change that meets no connection on the device and shows the job as it will be', async () => {
    const saving = session.save('Safety acknowledgement', (api, id, etag) =>
      api.acknowledgeSafety(id, ['lockout', 'running', 'hot-work', 'weights', 'protection'], etag),
    );
    http.expectOne('/api/v1/jobs/31/safety').error(new ProgressEvent('error'), { status: 0 });
    const outcome = await saving;

    expect(outcome.ok).toBe(true);
    expect(session.saveState()).toMatchObject({ kind: 'queued', what: 'Safety acknowledgement' });
    expect(session.job()?.safety?.by.name).toBe('Suvi Achterberg');
    expect(session.pending().map((change) => change.what)).toEqual(['Safety acknowledgement']);
    const [kept] = await storage.changes(3);
    expect(kept).toMatchObject({ jobId: 31, baseVersion: 4, change: { kind: 'acknowledge-safety' } });
  });

  it('queues without sending while offline, and then queues the next change behind it', async () => {
    TestBed.inject(Connection).reportNoAnswer();
    await session.save('Safety acknowledgement', (api, id, etag) =>
      api.acknowledgeSafety(id, ['lockout', 'running', 'hot-work', 'weights', 'protection'], etag),
    );
    TestBed.inject(Connection).reportAnswer();
    // Online again, but a change of this job still waits: the next one waits behind it, in order.
    const queued = await storage.changes(3);
    expect(queued).toHaveLength(1);
    expect(TestBed.inject(OfflineJobs).mustQueue(31)).toBe(true);
  });

  it('says that a change needing the server needs a connection, and sends nothing', async () => {
    TestBed.inject(Connection).reportNoAnswer();
    const outcome = await session.save('Completing the job', (api, id, etag) => api.complete(id, etag));
    expect(outcome.ok).toBe(false);
    expect(session.saveState()).toEqual({
      kind: 'refused',
      what: 'Completing the job',
      message: NEEDS_CONNECTION,
    });
    expect(await storage.changes(3)).toEqual([]);
  });

  it('refuses offline what the server would refuse, as the server words it, and queues nothing', async () => {
    TestBed.inject(Connection).reportNoAnswer();
    const outcome = await session.save('Set-up', (api, id, etag) =>
      api.recordSetup(id, { sensors: [], speedRpm: 2150 } as never, etag),
    );
    expect(outcome.ok).toBe(false);
    expect(session.saveState().kind).toBe('refused');
    expect(outcome.ok ? null : problemOf(outcome.error)?.status).toBeGreaterThanOrEqual(400);
    expect(await storage.changes(3)).toEqual([]);
  });
});
