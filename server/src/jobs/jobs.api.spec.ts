/*
 * The balancing job through the real app: who may call each route, what another organisation sees,
 * the steps in order, versions (428, 412, writes sent at once), and that every stored correction is the
 * calculator API's answer for the stored readings.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '@counterpoise/api';
import { as, type RecordsTestApp, rowCount, startRecordsTestApp } from '../records/records.test-app';
import {
  type JobBody,
  jobsAs,
  machineOfFamily,
  modelReadings,
  type ModelRotor,
  passingInspection,
  readyForRuns,
  runReadings,
  secondTechnician,
  setupBody,
} from './jobs.test-app';

let test: RecordsTestApp;
let machineId: number;
let otherMachineId: number;
beforeAll(async () => {
  test = await startRecordsTestApp();
  machineId = (await machineOfFamily(test, test.tokens.owner)).machineId;
  otherMachineId = (await machineOfFamily(test, test.otherOwner)).machineId;
});
afterAll(async () => test.close());

const jobPath = (id: number) => `/api/v1/jobs/${id}`;

/** A new job on the own machine, by `token` (the technician's by default). */
async function newJob(token = test.tokens.technician, body: object = {}): Promise<JobBody> {
  const response = await jobsAs(test, token).create({ machineId, scheduledFor: '2026-04-14', ...body });
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return response.body as JobBody;
}

/** One plane, one sensor: initial 0.5 in/s at 60°, 0.004 in/s per gram at 30°. */
const SINGLE: ModelRotor = {
  initial: [{ amplitude: 0.5, phaseDeg: 60 }],
  coefficients: [[{ amplitudePerMass: 0.004, phaseDeg: 30 }]],
};

describe('who may call the job routes', () => {
  it('lets every role that holds jobs:read list and read jobs, and no one else', async () => {
    const job = await newJob();
    for (const role of ROLES) {
      const expected = role === 'developer' ? 403 : 200;
      const list = await as(test.app, test.tokens[role]).get('/api/v1/jobs');
      expect(list.status, role).toBe(expected);
      const one = await as(test.app, test.tokens[role]).get(jobPath(job.id));
      expect(one.status, role).toBe(expected);
      const home = await as(test.app, test.tokens[role]).get('/api/v1/jobs/home');
      expect(home.status, role).toBe(expected);
    }
    const anonymous = await jobsAs(test, 'not-a-token').get('/api/v1/jobs');
    expect(anonymous.status).toBe(401);
  });

  it('lets owners, managers and technicians start jobs; not viewers or developers', async () => {
    const allowed: Record<Role, number> = {
      owner: 201,
      manager: 201,
      technician: 201,
      developer: 403,
      viewer: 403,
    };
    for (const role of ROLES) {
      const response = await jobsAs(test, test.tokens[role]).create({
        machineId,
        scheduledFor: '2026-04-15',
      });
      expect(response.status, role).toBe(allowed[role]);
      if (response.status === 201) {
        expect(response.headers['location']).toBe(jobPath(response.body.id));
        expect(response.headers['etag']).toBe('"1"');
        expect(response.body.technician.id).toBe(test.own.people[role].id);
      }
    }
  });

  it('answers 404 for another organisation’s job, to reads and writes alike', async () => {
    const job = await newJob();
    const other = jobsAs(test, test.otherOwner);
    expect((await other.get(jobPath(job.id))).status).toBe(404);
    expect(
      (
        await other.put(
          `${jobPath(job.id)}/safety`,
          { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
          1,
        )
      ).status,
    ).toBe(404);
    expect((await other.post(`${jobPath(job.id)}/abandon`, { reason: 'Not ours at all.' }, 1)).status).toBe(
      404,
    );
    const list = await other.get('/api/v1/jobs');
    expect(list.body.items.map((item: { id: number }) => item.id)).not.toContain(job.id);
  });

  it('answers 404 to another organisation on every change route, and changes nothing', async () => {
    const job = await newJob();
    const other = jobsAs(test, test.otherOwner);
    const path = jobPath(job.id);
    const topics = { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] };
    const installed = {
      weights: [{ planeIndex: 0, massGrams: 10, angleDeg: 0, radiusMm: 210, fixing: 'bolted' }],
    };
    const calls = [
      other.post(`${path}/assign`, { technicianId: test.other.people.technician.id }, job.version),
      other.post(`${path}/abandon`, { reason: 'Not ours at all.' }, job.version),
      other.post(`${path}/reopen`, undefined, job.version),
      other.put(`${path}/safety`, topics, job.version),
      other.put(`${path}/inspection`, passingInspection(), job.version),
      other.post(`${path}/inspection/override`, { reason: 'Not ours at all.' }, job.version),
      other.put(`${path}/setup`, setupBody(['left']), job.version),
      other.post(
        `${path}/runs`,
        { kind: 'initial', readings: runReadings(['left'], SINGLE.initial) },
        job.version,
      ),
      other.put(`${path}/runs/1/readings`, { readings: runReadings(['left'], SINGLE.initial) }, job.version),
      other.post(`${path}/corrections`, { method: 'single-plane' }, job.version),
      other.put(`${path}/corrections/1/installed`, installed, job.version),
      other.post(`${path}/complete`, undefined, job.version),
    ];
    const statuses = (await Promise.all(calls)).map((answer) => answer.status);
    expect(statuses).toEqual(calls.map(() => 404));
    const stored = await jobsAs(test, test.tokens.technician).get(path);
    expect(stored.body.version).toBe(job.version);
  });

  it('refuses a machine of another organisation, naming the field, and stores nothing', async () => {
    const before = rowCount(test, 'jobs');
    const response = await jobsAs(test, test.tokens.technician).create({
      machineId: otherMachineId,
      scheduledFor: '2026-04-14',
    });
    expect(response.status).toBe(400);
    expect(response.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(response.body.errors).toEqual([expect.objectContaining({ path: 'machineId' })]);
    const missing = await jobsAs(test, test.tokens.technician).create({ scheduledFor: '14/04/2026' });
    expect(missing.status).toBe(400);
    expect(missing.body.errors.map((error: { path: string }) => error.path).sort()).toEqual([
      'machineId',
      'scheduledFor',
    ]);
    expect(rowCount(test, 'jobs')).toBe(before);
  });

  it('keeps a technician to their own jobs; a manager assigns and changes any', async () => {
    const second = await secondTechnician(test);
    const given = await jobsAs(test, test.tokens.technician).create({
      machineId,
      scheduledFor: '2026-04-14',
      technicianId: second.id,
    });
    expect(given.status).toBe(403);
    expect(given.body.code).toBe('NOT_YOUR_JOB');
    const job = await newJob(test.tokens.manager, { technicianId: second.id });
    expect(job['technician']).toEqual({ id: second.id, name: 'Second technician' });
    const foreign = await jobsAs(test, test.tokens.technician).put(
      `${jobPath(job.id)}/safety`,
      { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
      job.version,
    );
    expect(foreign.status).toBe(403);
    const byTechnician = await jobsAs(test, test.tokens.technician).post(
      `${jobPath(job.id)}/assign`,
      { technicianId: test.own.people.technician.id },
      job.version,
    );
    expect(byTechnician.status).toBe(403);
    const toViewer = await jobsAs(test, test.tokens.manager).post(
      `${jobPath(job.id)}/assign`,
      { technicianId: test.own.people.viewer.id },
      job.version,
    );
    expect(toViewer.status).toBe(400);
    expect(toViewer.body.errors[0].path).toBe('technicianId');
    const assigned = await jobsAs(test, test.tokens.manager).post(
      `${jobPath(job.id)}/assign`,
      { technicianId: test.own.people.technician.id },
      job.version,
    );
    expect(assigned.status, JSON.stringify(assigned.body)).toBe(200);
    expect(assigned.body.technician.id).toBe(test.own.people.technician.id);
    expect(assigned.body.version).toBe(job.version + 1);
  });
});

describe('who may change a job', () => {
  it('refuses the steps to viewers and developers, and lets a manager work a technician’s job', async () => {
    const job = await newJob();
    const topics = { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] };
    for (const role of ['viewer', 'developer'] as const) {
      const refused = await jobsAs(test, test.tokens[role]).put(
        `${jobPath(job.id)}/safety`,
        topics,
        job.version,
      );
      expect(refused.status, role).toBe(403);
      const abandon = await jobsAs(test, test.tokens[role]).post(
        `${jobPath(job.id)}/abandon`,
        { reason: 'Not mine to stop.' },
        job.version,
      );
      expect(abandon.status, role).toBe(403);
    }
    const byManager = await jobsAs(test, test.tokens.manager).put(
      `${jobPath(job.id)}/safety`,
      topics,
      job.version,
    );
    expect(byManager.status).toBe(200);
    expect(byManager.body.safety.by.id).toBe(test.own.people.manager.id);
    expect(byManager.body.technician.id).toBe(test.own.people.technician.id);
  });
});

describe('versions', () => {
  it('needs If-Match (428) and refuses a stale one with the job as stored (412)', async () => {
    const job = await newJob();
    const jobs = jobsAs(test, test.tokens.technician);
    const topics = { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] };
    const without = await jobs.put(`${jobPath(job.id)}/safety`, topics);
    expect(without.status).toBe(428);
    expect(without.body.code).toBe('VERSION_REQUIRED');
    const first = await jobs.put(`${jobPath(job.id)}/safety`, topics, job.version);
    expect(first.status).toBe(200);
    const stale = await jobs.put(`${jobPath(job.id)}/safety`, topics, job.version);
    expect(stale.status).toBe(412);
    expect(stale.body.code).toBe('CHANGED_MEANWHILE');
    expect(stale.body.current.version).toBe(first.body.version);
    expect(stale.headers['etag']).toBe(`"${first.body.version}"`);
  });

  it('stores one of two runs sent at once on one version, and never doubles one', async () => {
    const job = await newJob();
    const ready = await readyForRuns(test, test.tokens.technician, job.id, job.version);
    const jobs = jobsAs(test, test.tokens.technician);
    const body = { kind: 'initial', readings: runReadings(['left'], SINGLE.initial) };
    const answers = await Promise.all(
      Array.from({ length: 5 }, () => jobs.post(`${jobPath(job.id)}/runs`, body, ready.version)),
    );
    const statuses = answers.map((answer) => answer.status).sort();
    expect(statuses).toEqual([201, 412, 412, 412, 412]);
    const stored = await jobs.get(jobPath(job.id));
    expect(stored.body.runs).toHaveLength(1);
    expect(stored.body.version).toBe(ready.version + 1);
  });

  it('lets a completion and a change sent at once not both land', async () => {
    const job = await newJob();
    const ready = await readyForRuns(test, test.tokens.technician, job.id, job.version);
    const jobs = jobsAs(test, test.tokens.technician);
    const initial = await jobs.post(
      `${jobPath(job.id)}/runs`,
      { kind: 'initial', readings: runReadings(['left'], SINGLE.initial) },
      ready.version,
    );
    const version = initial.body.version as number;
    const [complete, trial] = await Promise.all([
      jobs.post(`${jobPath(job.id)}/complete`, undefined, version),
      jobs.post(
        `${jobPath(job.id)}/runs`,
        {
          kind: 'trial',
          trialWeight: { planeIndex: 0, massGrams: 50, angleDeg: 0 },
          readings: runReadings(['left'], SINGLE.initial),
        },
        version,
      ),
    ]);
    // Exactly one lands: the completion (200) or the run (201); the other is refused as stale.
    expect(
      (complete.status === 200 && trial.status === 412) || (complete.status === 412 && trial.status === 201),
    ).toBe(true);
    const stored = (await jobs.get(jobPath(job.id))).body as JobBody;
    if (complete.status === 200) {
      expect(stored.status).toBe('completed');
      expect(stored.runs).toHaveLength(1);
    } else {
      expect(stored.status).toBe('open');
      expect(stored.runs).toHaveLength(2);
    }
  });
});

describe('the steps before the runs', () => {
  it('takes them in order: safety, inspection, set-up', async () => {
    const job = await newJob();
    const jobs = jobsAs(test, test.tokens.technician);
    const early = await jobs.put(`${jobPath(job.id)}/inspection`, passingInspection(), job.version);
    expect(early.status).toBe(409);
    expect(early.body.code).toBe('STEP_MISSING');
    const partial = await jobs.put(`${jobPath(job.id)}/safety`, { topicIds: ['lockout'] }, job.version);
    expect(partial.status).toBe(400);
    expect(partial.body.errors[0].path).toBe('topicIds');
    const safety = await jobs.put(
      `${jobPath(job.id)}/safety`,
      { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
      job.version,
    );
    expect(safety.body.safety.by.id).toBe(test.own.people.technician.id);
    expect(safety.body.nextStep).toBe('inspection');
    const setup = await jobs.put(`${jobPath(job.id)}/setup`, setupBody(['left']), safety.body.version);
    expect(setup.status).toBe(409);
  });

  it('holds a job whose inspection fails until a re-measure within the limits', async () => {
    const job = await newJob();
    const jobs = jobsAs(test, test.tokens.technician);
    const safety = await jobs.put(
      `${jobPath(job.id)}/safety`,
      { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
      job.version,
    );
    const failed = await jobs.put(
      `${jobPath(job.id)}/inspection`,
      {
        ...passingInspection(),
        bearingEndPlayMm: 0.9,
        checks: { teethOrKnives: 'ok', buildUpCleaned: 'ok', welds: 'fault', beltsAndPulleys: 'ok' },
      },
      safety.body.version,
    );
    expect(failed.status).toBe(200);
    expect(failed.body.status).toBe('on-hold');
    expect(failed.body.inspection.limits).toEqual({ bearingEndPlayMm: 0.3, shaftRunoutMm: 0.2 });
    expect(failed.body.inspection.reasons.join(' ')).toMatch(
      /Bearing end play is 0.9 mm, over the limit of 0.3 mm/,
    );
    expect(failed.body.inspection.reasons.join(' ')).toMatch(/Welds/);
    const setup = await jobs.put(`${jobPath(job.id)}/setup`, setupBody(['left']), failed.body.version);
    expect(setup.status).toBe(409);
    expect(setup.body.code).toBe('JOB_NOT_OPEN');
    const home = await as(test.app, test.tokens.manager).get('/api/v1/jobs/home');
    expect(home.body.waitingForManager.map((item: { id: number }) => item.id)).toContain(job.id);
    const remeasured = await jobs.put(
      `${jobPath(job.id)}/inspection`,
      passingInspection(),
      failed.body.version,
    );
    expect(remeasured.body.status).toBe('open');
    expect(remeasured.body.inspection.passed).toBe(true);
  });

  it('lets only a manager override a failed inspection, and keeps the reason', async () => {
    const job = await newJob();
    const jobs = jobsAs(test, test.tokens.technician);
    const safety = await jobs.put(
      `${jobPath(job.id)}/safety`,
      { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
      job.version,
    );
    const failed = await jobs.put(
      `${jobPath(job.id)}/inspection`,
      { ...passingInspection(), shaftRunoutMm: 0.5 },
      safety.body.version,
    );
    const reason = { reason: 'Runout is in the stub shaft; the customer accepts it until the rebuild.' };
    const byTechnician = await jobs.post(
      `${jobPath(job.id)}/inspection/override`,
      reason,
      failed.body.version,
    );
    expect(byTechnician.status).toBe(403);
    const noReason = await jobsAs(test, test.tokens.manager).post(
      `${jobPath(job.id)}/inspection/override`,
      { reason: ' ' },
      failed.body.version,
    );
    expect(noReason.status).toBe(400);
    expect(noReason.body.errors[0].path).toBe('reason');
    const overridden = await jobsAs(test, test.tokens.manager).post(
      `${jobPath(job.id)}/inspection/override`,
      reason,
      failed.body.version,
    );
    expect(overridden.status).toBe(200);
    expect(overridden.body.status).toBe('open');
    expect(overridden.body.inspection.passed).toBe(false);
    expect(overridden.body.inspection.override).toMatchObject({
      reason: reason.reason,
      by: { id: test.own.people.manager.id },
    });
    expect(overridden.body.nextStep).toBe('setup');
  });

  it('abandons with a reason; only a manager reopens', async () => {
    const job = await newJob();
    const jobs = jobsAs(test, test.tokens.technician);
    const abandoned = await jobs.post(
      `${jobPath(job.id)}/abandon`,
      { reason: 'Carrier broke down on the way to site.' },
      job.version,
    );
    expect(abandoned.body.status).toBe('abandoned');
    expect(abandoned.body.nextStep).toBe('done');
    const write = await jobs.put(
      `${jobPath(job.id)}/safety`,
      { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
      abandoned.body.version,
    );
    expect(write.status).toBe(409);
    expect((await jobs.post(`${jobPath(job.id)}/reopen`, undefined, abandoned.body.version)).status).toBe(
      403,
    );
    const reopened = await jobsAs(test, test.tokens.manager).post(
      `${jobPath(job.id)}/reopen`,
      undefined,
      abandoned.body.version,
    );
    expect(reopened.status).toBe(200);
    expect(reopened.body.status).toBe('open');
    expect(reopened.body.abandonment).toMatchObject({
      reason: 'Carrier broke down on the way to site.',
      reopenedBy: { id: test.own.people.manager.id },
    });
  });
});

describe('runs and corrections', () => {
  it('averages repeats as vectors and warns of a spread and a drifted speed', async () => {
    const job = await newJob();
    const ready = await readyForRuns(test, test.tokens.technician, job.id, job.version);
    const jobs = jobsAs(test, test.tokens.technician);
    const initial = await jobs.post(
      `${jobPath(job.id)}/runs`,
      {
        kind: 'initial',
        readings: [
          {
            sensorSide: 'left',
            repeats: [
              { amplitude: 1, phaseDeg: 350, speedRpm: 2150 },
              { amplitude: 1, phaseDeg: 10, speedRpm: 2150 },
            ],
          },
        ],
      },
      ready.version,
    );
    expect(initial.status).toBe(201);
    const average = initial.body.runs[0].readings[0].average;
    expect(average.amplitude).toBeCloseTo(Math.cos((10 * Math.PI) / 180), 9);
    expect(average.phaseDeg).toBeCloseTo(0, 9);
    const scattered = await jobs.post(
      `${jobPath(job.id)}/runs`,
      {
        kind: 'trial',
        trialWeight: { planeIndex: 0, massGrams: 50, angleDeg: 0 },
        readings: [
          {
            sensorSide: 'left',
            repeats: [
              { amplitude: 1, phaseDeg: 0, speedRpm: 2250 },
              { amplitude: 1, phaseDeg: 90, speedRpm: 2250 },
            ],
          },
        ],
      },
      initial.body.version,
    );
    const warnings = scattered.body.runs[1].warnings.join(' ');
    expect(warnings).toMatch(/Left sensor: The readings spread/);
    expect(warnings).toMatch(/speed drifted by 4.7 %/);
    const unknownSide = await jobs.post(
      `${jobPath(job.id)}/runs`,
      {
        kind: 'trial',
        trialWeight: { planeIndex: 0, massGrams: 50, angleDeg: 0 },
        readings: runReadings(['right'], SINGLE.initial),
      },
      scattered.body.version,
    );
    expect(unknownSide.status).toBe(400);
    expect(unknownSide.body.errors[0].path).toBe('readings[0].sensorSide');
  });

  it('stores a single-plane correction equal to the calculator API’s answer, then a verified trim, then completes', async () => {
    const { machineId: ownMachine, familyId } = await machineOfFamily(test, test.tokens.owner);
    const created = await jobsAs(test, test.tokens.technician).create({
      machineId: ownMachine,
      scheduledFor: '2026-04-16',
    });
    const ready = await readyForRuns(test, test.tokens.technician, created.body.id, created.body.version);
    const jobs = jobsAs(test, test.tokens.technician);
    const path = jobPath(ready.id);
    const trialWeight = { planeIndex: 0, massGrams: 50, angleDeg: 0 };
    const initial = await jobs.post(
      `${path}/runs`,
      { kind: 'initial', readings: runReadings(['left'], SINGLE.initial) },
      ready.version,
    );
    expect(initial.body.verification).toMatchObject({ accepted: false, nextSide: 'left' });
    const trial = await jobs.post(
      `${path}/runs`,
      { kind: 'trial', trialWeight, readings: runReadings(['left'], modelReadings(SINGLE, [trialWeight])) },
      initial.body.version,
    );
    const computed = await jobs.post(`${path}/corrections`, { method: 'single-plane' }, trial.body.version);
    expect(computed.status, JSON.stringify(computed.body)).toBe(201);
    const correction = (computed.body as JobBody).corrections[0]!;
    expect(correction.basis).toBe('trial');
    const calculator = await as(test.app, test.tokens.technician).post(
      '/api/v1/calc/single-plane',
      correction.calc.request,
    );
    expect(calculator.status).toBe(200);
    expect(correction.result).toEqual(calculator.body);
    // The modelled rotor: the correction cancels its unbalance.
    const plan = correction.plan[0]!;
    expect(modelReadings(SINGLE, [plan])[0]!.amplitude).toBeLessThan(1e-9);

    // What was fitted differs: 5 % light and 4 degrees off, at a larger radius.
    const fitted = {
      planeIndex: 0,
      massGrams: plan.massGrams * 0.95 * (210 / 230),
      angleDeg: (plan.angleDeg + 4) % 360,
      radiusMm: 230,
      fixing: 'welded',
    };
    const installed = await jobs.put(
      `${path}/corrections/${correction.id}/installed`,
      { weights: [fitted] },
      computed.body.version,
    );
    expect(installed.status, JSON.stringify(installed.body)).toBe(200);
    const atPlane = { planeIndex: 0, massGrams: plan.massGrams * 0.95, angleDeg: fitted.angleDeg };
    const expected = modelReadings(SINGLE, [atPlane])[0]!;
    const predicted = installed.body.corrections[0].predicted[0].reading;
    expect(predicted.amplitude).toBeCloseTo(expected.amplitude, 9);
    expect(installed.body.nextStep).toBe('verification');
    const early = await jobs.post(`${path}/complete`, undefined, installed.body.version);
    expect(early.status).toBe(409);

    const verification = await jobs.post(
      `${path}/runs`,
      { kind: 'verification', readings: runReadings(['left'], [expected]) },
      installed.body.version,
    );
    expect(verification.status).toBe(201);
    expect(verification.body.runs[2].weightsOnRotor[0].massGrams).toBeCloseTo(atPlane.massGrams, 9);
    const trim = await jobs.post(
      `${path}/corrections`,
      { method: 'single-plane' },
      verification.body.version,
    );
    const trimCorrection = (trim.body as JobBody).corrections[1]!;
    expect(trimCorrection.basis).toBe('trim');
    const trimCalculator = await as(test.app, test.tokens.technician).post(
      '/api/v1/calc/single-plane',
      trimCorrection.calc.request,
    );
    expect(trimCorrection.result).toEqual(trimCalculator.body);
    const coefficient = trimCorrection.result['influenceCoefficient'] as {
      amplitudePerMass: number;
      phaseDeg: number;
    };
    expect(coefficient.amplitudePerMass).toBeCloseTo(0.004, 9);
    expect(coefficient.phaseDeg).toBeCloseTo(30, 6);
    const trimWeight = trimCorrection.plan[0]!;
    const final = modelReadings(SINGLE, [atPlane, trimWeight])[0]!;
    expect(final.amplitude).toBeLessThan(1e-9);
    const trimAsFitted = { ...trimWeight, massGrams: trimWeight.massGrams * 0.97 };
    const trimFitted = await jobs.put(
      `${path}/corrections/${trimCorrection.id}/installed`,
      { weights: [{ ...trimAsFitted, radiusMm: 210, fixing: 'bolted' }] },
      trim.body.version,
    );
    const left = modelReadings(SINGLE, [atPlane, trimAsFitted])[0]!;
    const last = await jobs.post(
      `${path}/runs`,
      { kind: 'verification', readings: runReadings(['left'], [left]) },
      trimFitted.body.version,
    );
    expect(last.body.verification).toMatchObject({ accepted: true, nextSide: null });
    expect(last.body.nextStep).toBe('completion');
    const complete = await jobs.post(`${path}/complete`, undefined, last.body.version);
    expect(complete.status, JSON.stringify(complete.body)).toBe(200);
    const completion = complete.body.completion;
    expect(completion.accepted).toBe(true);
    expect(completion.beforeAfter[0].before.amplitude).toBeCloseTo(0.5, 9);
    expect(completion.beforeAfter[0].after.amplitude).toBeCloseTo(left.amplitude, 9);
    expect(completion.weightsOnRotor).toHaveLength(2);
    expect(completion.coefficients[0].amplitudePerGram).toBeCloseTo(0.004, 9);
    expect(completion.coefficients[0].phaseDeg).toBeCloseTo(30, 6);
    const family = await as(test.app, test.tokens.owner).get(`/api/v1/machine-families/${familyId}`);
    const figure = family.body.sensitivities.find(
      (s: { sensorSide: string; planeIndex: number }) => s.sensorSide === 'left' && s.planeIndex === 0,
    );
    expect(figure.jobCount).toBe(1);
    expect(figure.gramsPerUnit).toBeCloseTo(1 / completion.coefficients[0].amplitudePerGram, 6);
    const history = await as(test.app, test.tokens.owner).get(`/api/v1/machine-families/${familyId}/history`);
    expect(history.body.changes[0].by.id).toBe(test.own.people.technician.id);
    const after = await jobs.post(
      `${path}/runs`,
      { kind: 'verification', readings: runReadings(['left'], [expected]) },
      complete.body.version,
    );
    expect(after.status).toBe(409);
  });

  it('computes one run with the family’s sensitivity, equal to the calculator', async () => {
    const sensitivities = [
      { sensorSide: 'left', planeIndex: 0, gramsPerUnit: 250, unit: 'in/s-pk', phaseLagDeg: 30 },
    ];
    const { machineId: ownMachine } = await machineOfFamily(test, test.tokens.owner, { sensitivities });
    const created = await jobsAs(test, test.tokens.technician).create({
      machineId: ownMachine,
      scheduledFor: '2026-04-16',
    });
    const ready = await readyForRuns(test, test.tokens.technician, created.body.id, created.body.version);
    const jobs = jobsAs(test, test.tokens.technician);
    const initial = await jobs.post(
      `${jobPath(ready.id)}/runs`,
      { kind: 'initial', readings: runReadings(['left'], SINGLE.initial) },
      ready.version,
    );
    const computed = await jobs.post(
      `${jobPath(ready.id)}/corrections`,
      { method: 'one-run' },
      initial.body.version,
    );
    expect(computed.status, JSON.stringify(computed.body)).toBe(201);
    const correction = (computed.body as JobBody).corrections[0]!;
    const calculator = await as(test.app, test.tokens.technician).post(
      '/api/v1/calc/one-run',
      correction.calc.request,
    );
    expect(correction.result).toEqual(calculator.body);
    // 250 g per in/s x 0.5 in/s; the modelled rotor's own sensitivity is 1 / 0.004 = 250 g at 30 degrees.
    expect(correction.plan[0]!.massGrams).toBeCloseTo(125, 9);
    expect(modelReadings(SINGLE, [correction.plan[0]!])[0]!.amplitude).toBeLessThan(1e-9);
    const trialMissing = await jobs.post(
      `${jobPath(ready.id)}/corrections`,
      { method: 'single-plane' },
      computed.body.version,
    );
    expect(trialMissing.status).toBe(409);
    expect(trialMissing.body.code).toBe('METHOD_NOT_POSSIBLE');
  });

  it('fits two planes by least squares with the verification run, equal to the calculator', async () => {
    const { machineId: ownMachine } = await machineOfFamily(test, test.tokens.owner, { planeCount: 2 });
    const rotor: ModelRotor = {
      initial: [
        { amplitude: 0.46, phaseDeg: 38 },
        { amplitude: 0.29, phaseDeg: 301 },
      ],
      coefficients: [
        [
          { amplitudePerMass: 0.004, phaseDeg: 20 },
          { amplitudePerMass: 0.0012, phaseDeg: 80 },
        ],
        [
          { amplitudePerMass: 0.001, phaseDeg: 140 },
          { amplitudePerMass: 0.0035, phaseDeg: 40 },
        ],
      ],
    };
    const sides = ['left', 'right'] as const;
    const created = await jobsAs(test, test.tokens.technician).create({
      machineId: ownMachine,
      scheduledFor: '2026-04-17',
    });
    const ready = await readyForRuns(test, test.tokens.technician, created.body.id, created.body.version, [
      ...sides,
    ]);
    const jobs = jobsAs(test, test.tokens.technician);
    const path = jobPath(ready.id);
    let version = ready.version;
    const run = async (body: object) => {
      const response = await jobs.post(`${path}/runs`, body, version);
      expect(response.status, JSON.stringify(response.body)).toBe(201);
      version = response.body.version;
      return response.body as JobBody;
    };
    await run({ kind: 'initial', readings: runReadings(sides, rotor.initial) });
    for (const planeIndex of [0, 1]) {
      const trialWeight = { planeIndex, massGrams: 80, angleDeg: 0 };
      await run({
        kind: 'trial',
        trialWeight,
        readings: runReadings(sides, modelReadings(rotor, [trialWeight])),
      });
    }
    const first = await jobs.post(`${path}/corrections`, { method: 'multi-plane' }, version);
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    version = first.body.version;
    const plan = (first.body as JobBody).corrections[0]!.plan;
    const fitted = plan.map((weight) => ({
      ...weight,
      massGrams: weight.massGrams * 0.9,
      radiusMm: 210,
      fixing: 'welded',
    }));
    const installed = await jobs.put(
      `${path}/corrections/${first.body.corrections[0].id}/installed`,
      { weights: fitted },
      version,
    );
    version = installed.body.version;
    await run({ kind: 'verification', readings: runReadings(sides, modelReadings(rotor, fitted)) });
    const second = await jobs.post(`${path}/corrections`, { method: 'multi-plane' }, version);
    expect(second.status, JSON.stringify(second.body)).toBe(201);
    const correction = (second.body as JobBody).corrections[1]!;
    expect(correction.basis).toBe('trim');
    expect((correction.calc.request as { runs: unknown[] }).runs).toHaveLength(3);
    const calculator = await as(test.app, test.tokens.technician).post(
      '/api/v1/calc/multi-plane',
      correction.calc.request,
    );
    expect(correction.result).toEqual(calculator.body);
    const residual = modelReadings(rotor, [...fitted, ...correction.plan]);
    for (const reading of residual) expect(reading.amplitude).toBeLessThan(1e-9);
  });
});

describe('the list and the home summary', () => {
  it('filters by status, technician and dates', async () => {
    const job = await newJob(test.tokens.technician, { scheduledFor: '2025-01-09' });
    const jobs = jobsAs(test, test.tokens.manager);
    const dated = await jobs.get('/api/v1/jobs?from=2025-01-01&to=2025-01-31');
    expect(dated.body.items.map((item: { id: number }) => item.id)).toEqual([job.id]);
    const mine = await jobs.get(
      `/api/v1/jobs?technicianId=${test.own.people.technician.id}&status=open&pageSize=100`,
    );
    expect(
      mine.body.items.every(
        (item: { technician: { id: number }; status: string }) =>
          item.technician.id === test.own.people.technician.id && item.status === 'open',
      ),
    ).toBe(true);
    const customerId = (await as(test.app, test.tokens.owner).get(`/api/v1/machines/${machineId}`)).body
      .customerId as number;
    const byCustomer = await jobs.get(`/api/v1/jobs?customerId=${customerId}&pageSize=100`);
    expect(byCustomer.body.total).toBeGreaterThan(0);
    expect(
      byCustomer.body.items.every(
        (item: { machine: { customerId: number } }) => item.machine.customerId === customerId,
      ),
    ).toBe(true);
    const otherCustomer = await as(test.app, test.otherOwner).get(`/api/v1/jobs?customerId=${customerId}`);
    expect(otherCustomer.body.total).toBe(0);
    const bad = await jobs.get('/api/v1/jobs?status=finished');
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].path).toBe('status');
  });

  it('shows the technician’s open jobs and machines due after an abandoned job', async () => {
    const { machineId: dueMachine } = await machineOfFamily(test, test.tokens.owner);
    const created = await jobsAs(test, test.tokens.technician).create({
      machineId: dueMachine,
      scheduledFor: '2026-04-20',
    });
    const home = await as(test.app, test.tokens.technician).get('/api/v1/jobs/home');
    expect(home.body.myOpenJobs.map((item: { id: number }) => item.id)).toContain(created.body.id);
    await jobsAs(test, test.tokens.technician).post(
      `${jobPath(created.body.id)}/abandon`,
      { reason: 'Machine out on hire.' },
      created.body.version,
    );
    const after = await as(test.app, test.tokens.technician).get('/api/v1/jobs/home');
    expect(after.body.myOpenJobs.map((item: { id: number }) => item.id)).not.toContain(created.body.id);
    const due = after.body.machinesDue.find(
      (item: { machine: { id: number } }) => item.machine.id === dueMachine,
    );
    expect(due.reason).toMatch(/abandoned/);
    const other = await as(test.app, test.otherOwner).get('/api/v1/jobs/home');
    expect(other.body.machinesDue.map((item: { machine: { id: number } }) => item.machine.id)).not.toContain(
      dueMachine,
    );
  });
});
