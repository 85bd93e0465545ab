/*
 * Typing a run's readings again through the real app (PUT /jobs/{id}/runs/{runId}/readings): the run
 * averaged and checked again, what was typed before kept, who may do it, which runs it may touch, and
 * versions as a client in a hurry or an attacker would send them (the same retyping many times at once,
 * a retyping racing a new run or a correction).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type RecordsTestApp, startRecordsTestApp } from '../records/records.test-app';
import {
  type JobBody,
  jobsAs,
  machineOfFamily,
  modelReadings,
  type ModelRotor,
  readyForRuns,
  runReadings,
  secondTechnician,
} from './jobs.test-app';

let test: RecordsTestApp;
let machineId: number;
beforeAll(async () => {
  test = await startRecordsTestApp();
  machineId = (await machineOfFamily(test, test.tokens.owner)).machineId;
});
afterAll(async () => test.close());

const jobPath = (id: number) => `/api/v1/jobs/${id}`;
const readingsPath = (jobId: number, runId: number) => `${jobPath(jobId)}/runs/${runId}/readings`;

/** One plane, one sensor: initial 0.5 in/s at 60°, 0.004 in/s per gram at 30°. */
const SINGLE: ModelRotor = {
  initial: [{ amplitude: 0.5, phaseDeg: 60 }],
  coefficients: [[{ amplitudePerMass: 0.004, phaseDeg: 30 }]],
};
const TRIAL_WEIGHT = { planeIndex: 0, massGrams: 50, angleDeg: 0 };

/** A run as the specs read it, with its retypings. */
interface RetypedRun {
  id: number;
  kind: string;
  trialWeight: { planeIndex: number; massGrams: number; angleDeg: number } | null;
  readings: {
    sensorSide: string;
    repeats: { amplitude: number; phaseDeg: number; speedRpm: number }[];
    average: { amplitude: number; phaseDeg: number };
  }[];
  warnings: string[];
  retyped: {
    at: string;
    by: { id: number; name: string };
    previousReadings: {
      sensorSide: string;
      repeats: { amplitude: number; phaseDeg: number; speedRpm: number }[];
    }[];
    previousTrialWeight: { planeIndex: number; massGrams: number; angleDeg: number } | null;
  }[];
}

/** A job of `token`'s (the technician's by default) ready for runs, with its initial run taken. */
async function jobWithInitialRun(
  owner = test.tokens.technician,
  initial: object[] = runReadings(['left'], SINGLE.initial),
): Promise<JobBody> {
  const created = await jobsAs(test, owner).create({
    machineId,
    scheduledFor: '2026-04-20',
    ...(owner === test.tokens.manager ? { technicianId: test.own.people.technician.id } : {}),
  });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const ready = await readyForRuns(test, owner, created.body.id, created.body.version);
  const run = await jobsAs(test, owner).post(
    `${jobPath(ready.id)}/runs`,
    { kind: 'initial', readings: initial },
    ready.version,
  );
  expect(run.status, JSON.stringify(run.body)).toBe(201);
  return run.body as JobBody;
}

/** The same job with a trial run after its initial one. */
async function jobWithTrialRun(): Promise<JobBody> {
  const job = await jobWithInitialRun();
  const trial = await jobsAs(test, test.tokens.technician).post(
    `${jobPath(job.id)}/runs`,
    {
      kind: 'trial',
      trialWeight: TRIAL_WEIGHT,
      readings: runReadings(['left'], modelReadings(SINGLE, [TRIAL_WEIGHT])),
    },
    job.version,
  );
  expect(trial.status, JSON.stringify(trial.body)).toBe(201);
  return trial.body as JobBody;
}

const runOf = (job: JobBody, runId: number) =>
  (job.runs as unknown as RetypedRun[]).find((run) => run.id === runId)!;

describe('typing a run’s readings again', () => {
  it('stores the readings typed again, averages them again, and keeps the ones first typed', async () => {
    const typed = [
      {
        sensorSide: 'left',
        repeats: [
          { amplitude: 0.5, phaseDeg: 212, speedRpm: 2150 },
          { amplitude: 0.5, phaseDeg: 21, speedRpm: 2150 },
        ],
      },
    ];
    const job = await jobWithInitialRun(test.tokens.technician, typed);
    const run = job.runs[0]!;
    expect((run as unknown as RetypedRun).retyped).toEqual([]);
    expect(run.warnings.join(' ')).toMatch(/Left sensor: The readings spread/);
    const jobs = jobsAs(test, test.tokens.technician);
    const retyped = [
      {
        sensorSide: 'left',
        repeats: [
          { amplitude: 0.5, phaseDeg: 212, speedRpm: 2150 },
          { amplitude: 0.5, phaseDeg: 214, speedRpm: 2150 },
        ],
      },
    ];
    const answer = await jobs.put(readingsPath(job.id, run.id), { readings: retyped }, job.version);
    expect(answer.status, JSON.stringify(answer.body)).toBe(200);
    expect(answer.headers['etag']).toBe(`"${job.version + 1}"`);
    expect(answer.body.version).toBe(job.version + 1);
    const stored = runOf(answer.body as JobBody, run.id);
    expect(stored.readings[0]!.repeats.map((repeat) => repeat.phaseDeg)).toEqual([212, 214]);
    expect(stored.readings[0]!.average.phaseDeg).toBeCloseTo(213, 9);
    expect(stored.readings[0]!.average.amplitude).toBeCloseTo(0.5 * Math.cos(Math.PI / 180), 9);
    expect(stored.warnings).toEqual([]);
    expect(stored.retyped).toEqual([
      {
        at: expect.any(String),
        by: { id: test.own.people.technician.id, name: expect.any(String) },
        previousReadings: typed,
        previousTrialWeight: null,
      },
    ]);
    // The verdict is read from the run as it stands now.
    expect(answer.body.verification.sides[0].amplitude).toBeCloseTo(stored.readings[0]!.average.amplitude, 9);
    const read = await jobs.get(jobPath(job.id));
    expect(runOf(read.body as JobBody, run.id)).toEqual(stored);
  });
});

describe('what may be typed again', () => {
  it('keeps every earlier typing, the first one first, and types a trial weight again', async () => {
    const job = await jobWithTrialRun();
    const jobs = jobsAs(test, test.tokens.technician);
    const trial = job.runs[1]!;
    const asFirstTyped = (runOf(job, trial.id) as RetypedRun).readings.map(({ sensorSide, repeats }) => ({
      sensorSide,
      repeats,
    }));
    const heavier = { ...TRIAL_WEIGHT, massGrams: 65 };
    const once = await jobs.put(
      readingsPath(job.id, trial.id),
      { readings: runReadings(['left'], [{ amplitude: 0.31, phaseDeg: 75 }]), trialWeight: heavier },
      job.version,
    );
    expect(once.status, JSON.stringify(once.body)).toBe(200);
    expect(runOf(once.body as JobBody, trial.id).trialWeight).toEqual(heavier);
    const twice = await jobs.put(
      readingsPath(job.id, trial.id),
      { readings: runReadings(['left'], [{ amplitude: 0.32, phaseDeg: 76 }]) },
      once.body.version,
    );
    expect(twice.status, JSON.stringify(twice.body)).toBe(200);
    const stored = runOf(twice.body as JobBody, trial.id);
    // Left out, the trial weight stays as last typed.
    expect(stored.trialWeight).toEqual(heavier);
    expect(stored.kind).toBe('trial');
    expect(stored.readings[0]!.average.amplitude).toBeCloseTo(0.32, 9);
    expect(stored.retyped.map((entry) => entry.previousTrialWeight)).toEqual([TRIAL_WEIGHT, heavier]);
    expect(stored.retyped[0]!.previousReadings).toEqual(asFirstTyped);
    expect(stored.retyped[1]!.previousReadings[0]!.repeats[0]).toEqual({
      amplitude: 0.31,
      phaseDeg: 75,
      speedRpm: 2150,
    });
    // The initial run is untouched.
    expect(runOf(twice.body as JobBody, job.runs[0]!.id).retyped).toEqual([]);
  });

  it('checks the speed again against the initial run’s', async () => {
    const job = await jobWithTrialRun();
    const trial = job.runs[1]!;
    const drifted = await jobsAs(test, test.tokens.technician).put(
      readingsPath(job.id, trial.id),
      { readings: runReadings(['left'], [{ amplitude: 0.3, phaseDeg: 70 }], { speedRpm: 2250 }) },
      job.version,
    );
    expect(drifted.status, JSON.stringify(drifted.body)).toBe(200);
    expect(runOf(drifted.body as JobBody, trial.id).warnings.join(' ')).toMatch(/speed drifted by 4.7 %/);
  });

  it('refuses bad input with the field at fault, and changes nothing', async () => {
    const job = await jobWithTrialRun();
    const jobs = jobsAs(test, test.tokens.technician);
    const trial = job.runs[1]!;
    const good = runReadings(['left'], [{ amplitude: 0.3, phaseDeg: 70 }]);
    const cases: { body: object; path: string }[] = [
      {
        body: {
          readings: [
            {
              sensorSide: 'left',
              repeats: [
                { amplitude: 0.3, phaseDeg: 70, speedRpm: 2150 },
                { amplitude: 0.3, phaseDeg: 360, speedRpm: 2150 },
              ],
            },
          ],
        },
        path: 'readings[0].repeats[1].phaseDeg',
      },
      { body: { readings: [] }, path: 'readings' },
      { body: {}, path: 'readings' },
      { body: { readings: [...good, ...good] }, path: 'readings' },
      { body: { readings: good, kind: 'initial' }, path: 'kind' },
      {
        body: { readings: runReadings(['right'], [{ amplitude: 0.3, phaseDeg: 70 }]) },
        path: 'readings[0].sensorSide',
      },
      {
        body: { readings: good, trialWeight: { ...TRIAL_WEIGHT, planeIndex: 1 } },
        path: 'trialWeight.planeIndex',
      },
      {
        body: { readings: good, trialWeight: { ...TRIAL_WEIGHT, massGrams: -5 } },
        path: 'trialWeight.massGrams',
      },
    ];
    for (const { body, path } of cases) {
      const answer = await jobs.put(readingsPath(job.id, trial.id), body, job.version);
      expect(answer.status, `${path}: ${JSON.stringify(answer.body)}`).toBe(400);
      expect(answer.headers['content-type']).toMatch(/application\/problem\+json/);
      expect(answer.body.errors.map((error: { path: string }) => error.path)).toContain(path);
    }
    const stored = await jobs.get(jobPath(job.id));
    expect(stored.body.version).toBe(job.version);
    expect(stored.body.runs).toEqual(job.runs);
  });

  it('refuses a trial weight for a run that has none, naming the field', async () => {
    const job = await jobWithInitialRun();
    const jobs = jobsAs(test, test.tokens.technician);
    const answer = await jobs.put(
      readingsPath(job.id, job.runs[0]!.id),
      { readings: runReadings(['left'], SINGLE.initial), trialWeight: TRIAL_WEIGHT },
      job.version,
    );
    expect(answer.status).toBe(400);
    expect(answer.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(answer.body.errors).toEqual([
      { path: 'trialWeight', message: 'Only a trial run has a trial weight.' },
    ]);
    expect((await jobs.get(jobPath(job.id))).body.version).toBe(job.version);
  });

  it('answers 409 RUN_IN_USE for a run that is not the latest, and tells to take a new run', async () => {
    const job = await jobWithTrialRun();
    const answer = await jobsAs(test, test.tokens.technician).put(
      readingsPath(job.id, job.runs[0]!.id),
      { readings: runReadings(['left'], SINGLE.initial) },
      job.version,
    );
    expect(answer.status).toBe(409);
    expect(answer.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(answer.body.code).toBe('RUN_IN_USE');
    expect(answer.body.detail).toMatch(/not the job’s latest run.*Take a new run/);
  });

  it('answers 409 RUN_IN_USE for a run a correction was computed from', async () => {
    const job = await jobWithTrialRun();
    const jobs = jobsAs(test, test.tokens.technician);
    const computed = await jobs.post(
      `${jobPath(job.id)}/corrections`,
      { method: 'single-plane' },
      job.version,
    );
    expect(computed.status, JSON.stringify(computed.body)).toBe(201);
    const trial = job.runs[1]!;
    const answer = await jobs.put(
      readingsPath(job.id, trial.id),
      { readings: runReadings(['left'], [{ amplitude: 0.3, phaseDeg: 70 }]) },
      computed.body.version,
    );
    expect(answer.status).toBe(409);
    expect(answer.body.code).toBe('RUN_IN_USE');
    expect(answer.body.detail).toMatch(/Correction 1 was computed from run 2.*Take a new run/);
    const stored = await jobs.get(jobPath(job.id));
    expect(stored.body.version).toBe(computed.body.version);
    expect(runOf(stored.body as JobBody, trial.id)).toEqual(runOf(computed.body as JobBody, trial.id));
  });

  it('answers 409 JOB_NOT_OPEN on a completed or an abandoned job', async () => {
    const jobs = jobsAs(test, test.tokens.technician);
    const toComplete = await jobWithInitialRun();
    const completed = await jobs.post(`${jobPath(toComplete.id)}/complete`, undefined, toComplete.version);
    expect(completed.status, JSON.stringify(completed.body)).toBe(200);
    const toAbandon = await jobWithInitialRun();
    const abandoned = await jobs.post(
      `${jobPath(toAbandon.id)}/abandon`,
      { reason: 'The customer called the visit off.' },
      toAbandon.version,
    );
    expect(abandoned.status).toBe(200);
    for (const job of [completed.body as JobBody, abandoned.body as JobBody]) {
      const answer = await jobs.put(
        readingsPath(job.id, job.runs[0]!.id),
        { readings: runReadings(['left'], [{ amplitude: 0.45, phaseDeg: 61 }]) },
        job.version,
      );
      expect(answer.status, job.status).toBe(409);
      expect(answer.body.code).toBe('JOB_NOT_OPEN');
      expect((await jobs.get(jobPath(job.id))).body.runs).toEqual(job.runs);
    }
  });

  it('answers 404 for a run that is not the job’s', async () => {
    const job = await jobWithInitialRun();
    const other = await jobWithInitialRun();
    const jobs = jobsAs(test, test.tokens.technician);
    const body = { readings: runReadings(['left'], SINGLE.initial) };
    const foreignRun = await jobs.put(readingsPath(job.id, other.runs[0]!.id), body, job.version);
    expect(foreignRun.status).toBe(404);
    const noRun = await jobs.put(readingsPath(job.id, 999_999), body, job.version);
    expect(noRun.status).toBe(404);
    const badId = await jobs.put(`${jobPath(job.id)}/runs/first/readings`, body, job.version);
    expect(badId.status).toBe(400);
    expect(badId.body.errors[0].path).toBe('runId');
    expect((await jobs.get(jobPath(other.id))).body.runs).toEqual(other.runs);
  });
});

describe('who may type a run again', () => {
  it('refuses another technician’s job (NOT_YOUR_JOB), viewers and developers; a manager may', async () => {
    const second = await secondTechnician(test);
    const job = await jobWithInitialRun();
    const run = job.runs[0]!;
    const body = { readings: runReadings(['left'], [{ amplitude: 0.48, phaseDeg: 62 }]) };
    const foreign = await jobsAs(test, second.token).put(readingsPath(job.id, run.id), body, job.version);
    expect(foreign.status).toBe(403);
    expect(foreign.body.code).toBe('NOT_YOUR_JOB');
    for (const role of ['viewer', 'developer'] as const) {
      const refused = await jobsAs(test, test.tokens[role]).put(
        readingsPath(job.id, run.id),
        body,
        job.version,
      );
      expect(refused.status, role).toBe(403);
    }
    const other = await jobsAs(test, test.otherOwner).put(readingsPath(job.id, run.id), body, job.version);
    expect(other.status).toBe(404);
    const unchanged = await jobsAs(test, test.tokens.technician).get(jobPath(job.id));
    expect(unchanged.body.version).toBe(job.version);
    expect(unchanged.body.runs).toEqual(job.runs);
    const byManager = await jobsAs(test, test.tokens.manager).put(
      readingsPath(job.id, run.id),
      body,
      job.version,
    );
    expect(byManager.status, JSON.stringify(byManager.body)).toBe(200);
    const stored = runOf(byManager.body as JobBody, run.id);
    expect(stored.retyped[0]!.by.id).toBe(test.own.people.manager.id);
    // The run stays the technician's, who read it.
    expect((stored as unknown as { by: { id: number } }).by.id).toBe(test.own.people.technician.id);
  });
});

describe('versions', () => {
  it('needs If-Match (428) and refuses a stale one with the job as stored (412)', async () => {
    const job = await jobWithInitialRun();
    const jobs = jobsAs(test, test.tokens.technician);
    const path = readingsPath(job.id, job.runs[0]!.id);
    const body = { readings: runReadings(['left'], [{ amplitude: 0.49, phaseDeg: 59 }]) };
    const without = await jobs.put(path, body);
    expect(without.status).toBe(428);
    expect(without.body.code).toBe('VERSION_REQUIRED');
    const first = await jobs.put(path, body, job.version);
    expect(first.status).toBe(200);
    const stale = await jobs.put(path, body, job.version);
    expect(stale.status).toBe(412);
    expect(stale.body.code).toBe('CHANGED_MEANWHILE');
    expect(stale.body.current.version).toBe(first.body.version);
    expect(stale.headers['etag']).toBe(`"${first.body.version}"`);
    expect(runOf(stale.body.current as JobBody, job.runs[0]!.id).retyped).toHaveLength(1);
  });

  it('lands exactly one of the same retyping sent many times at once on one version', async () => {
    const job = await jobWithInitialRun();
    const jobs = jobsAs(test, test.tokens.technician);
    const path = readingsPath(job.id, job.runs[0]!.id);
    const body = { readings: runReadings(['left'], [{ amplitude: 0.51, phaseDeg: 58 }]) };
    const answers = await Promise.all(Array.from({ length: 12 }, () => jobs.put(path, body, job.version)));
    const statuses = answers.map((answer) => answer.status).sort();
    expect(statuses).toEqual([200, ...Array.from({ length: 11 }, () => 412)]);
    const stored = await jobs.get(jobPath(job.id));
    expect(stored.body.version).toBe(job.version + 1);
    const run = runOf(stored.body as JobBody, job.runs[0]!.id);
    expect(run.retyped).toHaveLength(1);
    expect(run.retyped[0]!.previousReadings[0]!.repeats[0]).toMatchObject({ amplitude: 0.5, phaseDeg: 60 });
    expect(run.readings[0]!.average.amplitude).toBeCloseTo(0.51, 9);
  });

  it('lands one of a retyping and a new run sent at once on one version', async () => {
    const job = await jobWithInitialRun();
    const jobs = jobsAs(test, test.tokens.technician);
    const initial = job.runs[0]!;
    const [retype, trial] = await Promise.all([
      jobs.put(
        readingsPath(job.id, initial.id),
        { readings: runReadings(['left'], [{ amplitude: 0.52, phaseDeg: 57 }]) },
        job.version,
      ),
      jobs.post(
        `${jobPath(job.id)}/runs`,
        {
          kind: 'trial',
          trialWeight: TRIAL_WEIGHT,
          readings: runReadings(['left'], modelReadings(SINGLE, [TRIAL_WEIGHT])),
        },
        job.version,
      ),
    ]);
    expect(
      (retype.status === 200 && trial.status === 412) || (retype.status === 412 && trial.status === 201),
    ).toBe(true);
    const stored = (await jobs.get(jobPath(job.id))).body as JobBody;
    expect(stored.version).toBe(job.version + 1);
    const storedInitial = runOf(stored, initial.id);
    if (retype.status === 200) {
      expect(stored.runs).toHaveLength(1);
      expect(storedInitial.retyped).toHaveLength(1);
      expect(storedInitial.readings[0]!.average.amplitude).toBeCloseTo(0.52, 9);
    } else {
      expect(stored.runs).toHaveLength(2);
      expect(storedInitial).toEqual(runOf(job, initial.id));
    }
  });

  it('lands one of a retyping and a correction from that run sent at once, and the correction reads the stored run', async () => {
    const job = await jobWithTrialRun();
    const jobs = jobsAs(test, test.tokens.technician);
    const trial = job.runs[1]!;
    const retypedReading = { amplitude: 0.35, phaseDeg: 40 };
    const [retype, correction] = await Promise.all([
      jobs.put(
        readingsPath(job.id, trial.id),
        { readings: runReadings(['left'], [retypedReading]) },
        job.version,
      ),
      jobs.post(`${jobPath(job.id)}/corrections`, { method: 'single-plane' }, job.version),
    ]);
    expect(
      (retype.status === 200 && correction.status === 412) ||
        (retype.status === 412 && correction.status === 201),
    ).toBe(true);
    let stored = (await jobs.get(jobPath(job.id))).body as JobBody;
    expect(stored.version).toBe(job.version + 1);
    if (retype.status === 200) {
      expect(stored.corrections).toHaveLength(0);
      const computed = await jobs.post(
        `${jobPath(job.id)}/corrections`,
        { method: 'single-plane' },
        stored.version,
      );
      expect(computed.status, JSON.stringify(computed.body)).toBe(201);
      stored = computed.body as JobBody;
    } else {
      expect(runOf(stored, trial.id)).toEqual(runOf(job, trial.id));
      const late = await jobs.put(
        readingsPath(job.id, trial.id),
        { readings: runReadings(['left'], [retypedReading]) },
        stored.version,
      );
      expect(late.body.code).toBe('RUN_IN_USE');
    }
    // Whichever landed, the stored correction is computed from the trial run as stored.
    const used = runOf(stored, trial.id).readings[0]!.average;
    const request = stored.corrections[0]!.calc.request as {
      withTrial: { amplitude: number; phaseDeg: number };
    };
    expect(request.withTrial.amplitude).toBeCloseTo(used.amplitude, 9);
    expect(request.withTrial.phaseDeg).toBeCloseTo(used.phaseDeg, 9);
  });
});
