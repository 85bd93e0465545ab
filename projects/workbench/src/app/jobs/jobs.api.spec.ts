import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom, type Observable } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { type CorrectRunReadings, type Job, JobsApi, type VersionedJob } from './jobs.api';

/** A job at `version` as the server answers it, with nothing done yet. */
function aJob(version: number): Job {
  return {
    id: 118,
    version,
    status: 'open',
    nextStep: 'safety',
    scheduledFor: '2026-04-14',
    machine: {
      id: 31,
      serialNumber: 'BF220-18734',
      make: 'Brackenfold',
      model: 'BF-220',
      customerId: 12,
      customerName: 'Alder Creek Land Clearing',
      familyId: 4,
      familyName: 'Fixed-tooth mulcher drum, 2.0 m',
    },
    technician: { id: 7, name: 'Rowan Tally' },
    createdAt: '2026-04-14T07:02:11.000Z',
    updatedAt: '2026-04-14T07:02:11.000Z',
    safety: null,
    inspection: null,
    setup: null,
    runs: [],
    corrections: [],
    verification: null,
    completion: null,
    abandonment: null,
  };
}

const RETYPED: CorrectRunReadings = {
  readings: [
    {
      sensorSide: 'left',
      repeats: [
        { amplitude: 0.46, phaseDeg: 212, speedRpm: 2150 },
        { amplitude: 0.47, phaseDeg: 214, speedRpm: 2152 },
      ],
    },
  ],
};

describe('JobsApi', () => {
  let api: JobsApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(JobsApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('lists with the filters given, leaving out the empty ones, and reads the day', async () => {
    const page = firstValueFrom(api.list({ status: 'open', technicianId: 7, from: '', page: 2 }));
    const list = http.expectOne((r) => r.url === '/api/v1/jobs');
    expect(list.request.method).toBe('GET');
    expect(list.request.urlWithParams).toBe('/api/v1/jobs?status=open&technicianId=7&page=2');
    list.flush({ items: [], total: 0, page: 2, pageSize: 25 });
    expect((await page).page).toBe(2);

    const home = firstValueFrom(api.home());
    http
      .expectOne({ method: 'GET', url: '/api/v1/jobs/home' })
      .flush({ myOpenJobs: [], waitingForManager: [], machinesDue: [], dueAfterDays: 365 });
    expect((await home).dueAfterDays).toBe(365);
  });

  it('reads and creates a job with its ETag, or the version’s when a proxy dropped the header', async () => {
    const read = firstValueFrom(api.get(118));
    http.expectOne({ method: 'GET', url: '/api/v1/jobs/118' }).flush(aJob(5), { headers: { ETag: '"5"' } });
    expect(await read).toEqual({ record: aJob(5), etag: '"5"' });

    const created = firstValueFrom(api.create({ machineId: 31, scheduledFor: '2026-04-14' }));
    const create = http.expectOne({ method: 'POST', url: '/api/v1/jobs' });
    expect(create.request.body).toEqual({ machineId: 31, scheduledFor: '2026-04-14' });
    expect(create.request.headers.has('If-Match')).toBe(false);
    create.flush(aJob(1), { status: 201, statusText: 'Created' });
    expect((await created).etag).toBe('"1"');
  });

  it('sends every change to its address with its body and the ETag in If-Match', async () => {
    const setup = {
      sensors: [{ side: 'left' as const, position: 'Left bearing housing' }],
      tachometer: 'On the skid',
      referenceMark: 'Tape on the end plate',
      rotationSeenFromLeft: 'counterClockwise' as const,
      operatingSpeedRpm: 2150,
      amplitudeUnit: 'in/s-pk' as const,
      phaseSense: 'lag' as const,
      weightAngles: 'againstRotation' as const,
    };
    const inspection = {
      bearingEndPlayMm: 0.1,
      shaftRunoutMm: 0.05,
      checks: {
        teethOrKnives: 'ok' as const,
        buildUpCleaned: 'ok' as const,
        welds: 'ok' as const,
        beltsAndPulleys: 'ok' as const,
      },
    };
    const run = { kind: 'initial' as const, readings: RETYPED.readings };
    const installed = {
      weights: [{ planeIndex: 0, massGrams: 100, angleDeg: 225, radiusMm: 210, fixing: 'welded' as const }],
    };
    const changes: [Observable<VersionedJob>, string, string, unknown][] = [
      [api.assign(118, 9, '"2"'), 'POST', 'assign', { technicianId: 9 }],
      [api.abandon(118, 'Machine sold.', '"2"'), 'POST', 'abandon', { reason: 'Machine sold.' }],
      [api.reopen(118, '"2"'), 'POST', 'reopen', null],
      [
        api.acknowledgeSafety(118, ['lockout', 'running'], '"2"'),
        'PUT',
        'safety',
        { topicIds: ['lockout', 'running'] },
      ],
      [api.recordInspection(118, inspection, '"2"'), 'PUT', 'inspection', inspection],
      [
        api.overrideInspection(118, 'Bearings ordered.', '"2"'),
        'POST',
        'inspection/override',
        { reason: 'Bearings ordered.' },
      ],
      [api.recordSetup(118, setup, '"2"'), 'PUT', 'setup', setup],
      [api.addRun(118, run, '"2"'), 'POST', 'runs', run],
      [api.correctRunReadings(118, 402, RETYPED, '"2"'), 'PUT', 'runs/402/readings', RETYPED],
      [api.computeCorrection(118, 'single-plane', '"2"'), 'POST', 'corrections', { method: 'single-plane' }],
      [api.recordInstalled(118, 12, installed, '"2"'), 'PUT', 'corrections/12/installed', installed],
      [api.complete(118, '"2"'), 'POST', 'complete', null],
    ];
    for (const [call, method, path, body] of changes) {
      const answer = firstValueFrom(call);
      const request = http.expectOne({ method, url: `/api/v1/jobs/118/${path}` });
      expect(request.request.headers.get('If-Match'), path).toBe('"2"');
      expect(request.request.body, path).toEqual(body);
      request.flush(aJob(3), { headers: { ETag: '"3"' } });
      expect(await answer, path).toEqual({ record: aJob(3), etag: '"3"' });
    }
  });

  it('types a run’s readings again with a trial weight, and gives the job as stored on a 412', async () => {
    const body: CorrectRunReadings = {
      ...RETYPED,
      trialWeight: { planeIndex: 0, massGrams: 65, angleDeg: 0 },
    };
    const refused = firstValueFrom(api.correctRunReadings(118, 403, body, '"4"')).catch(
      (error: unknown) => error,
    );
    const request = http.expectOne({ method: 'PUT', url: '/api/v1/jobs/118/runs/403/readings' });
    expect(request.request.body).toEqual(body);
    expect(request.request.headers.get('If-Match')).toBe('"4"');
    request.flush(
      {
        type: 'about:blank',
        title: 'Precondition Failed',
        status: 412,
        detail: 'The job changed meanwhile.',
        code: 'CHANGED_MEANWHILE',
        current: aJob(6),
      },
      {
        status: 412,
        statusText: 'Precondition Failed',
        headers: { 'Content-Type': 'application/problem+json', ETag: '"6"' },
      },
    );
    expect(api.changedMeanwhile(await refused)).toEqual({
      record: aJob(6),
      etag: '"6"',
      detail: 'The job changed meanwhile.',
    });
  });

  it('answers null for a refusal other than a 412', async () => {
    const refused = firstValueFrom(api.correctRunReadings(118, 402, RETYPED, '"4"')).catch(
      (error: unknown) => error,
    );
    http.expectOne({ method: 'PUT', url: '/api/v1/jobs/118/runs/402/readings' }).flush(
      {
        type: 'about:blank',
        title: 'Conflict',
        status: 409,
        detail:
          'Correction 1 was computed from run 2: its readings can no longer change. Take a new run instead.',
        code: 'RUN_IN_USE',
      },
      { status: 409, statusText: 'Conflict', headers: { 'Content-Type': 'application/problem+json' } },
    );
    expect(api.changedMeanwhile(await refused)).toBeNull();
  });
});
