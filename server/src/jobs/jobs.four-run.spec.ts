/*
 * Amplitude-only balancing as a method of the job (`four-run`): runs typed without phase, the initial
 * amplitude and the same trial weight at three positions, a correction equal to the calculator API's
 * answer that brings the modelled rotor down, and the refusals that name the field or the runs missing.
 */
import { balanceTolerance } from '@counterpoise/engine';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { as, type RecordsTestApp, startRecordsTestApp } from '../records/records.test-app';
import {
  amplitudeReadings,
  type JobBody,
  jobsAs,
  machineOfFamily,
  modelReadings,
  type ModelRotor,
  readyForRuns,
  runReadings,
} from './jobs.test-app';

let test: RecordsTestApp;
let machineId: number;
beforeAll(async () => {
  test = await startRecordsTestApp();
  machineId = (await machineOfFamily(test, test.tokens.owner)).machineId;
});
afterAll(async () => test.close());

const jobPath = (id: number) => `/api/v1/jobs/${id}`;

/**
 * One plane, one sensor: initial 0.5 in/s at 60°, 0.004 in/s per gram at 30°. The weight that cancels it
 * is |r0| / |H| = 0.5 / 0.004 = 125 g; the technician's meter reads only the amplitudes of this model.
 */
const ROTOR: ModelRotor = {
  initial: [{ amplitude: 0.5, phaseDeg: 60 }],
  coefficients: [[{ amplitudePerMass: 0.004, phaseDeg: 30 }]],
};
const TRIAL_GRAMS = 50;
const trialAt = (angleDeg: number) => ({ planeIndex: 0, massGrams: TRIAL_GRAMS, angleDeg });

/** A job ready for runs on the one-plane machine, and the technician's requests. */
async function readyJob() {
  const jobs = jobsAs(test, test.tokens.technician);
  const created = await jobs.create({ machineId, scheduledFor: '2026-04-20' });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const ready = await readyForRuns(test, test.tokens.technician, created.body.id, created.body.version);
  return { jobs, path: jobPath(ready.id), version: ready.version };
}

/** Adds a run and returns the job after it (201 expected). */
async function addRun(
  jobs: ReturnType<typeof jobsAs>,
  path: string,
  version: number,
  body: object,
): Promise<JobBody> {
  const answer = await jobs.post(`${path}/runs`, body, version);
  expect(answer.status, JSON.stringify(answer.body)).toBe(201);
  return answer.body as JobBody;
}

/** The initial run and trial runs at `angles`, all amplitude only, read off the modelled rotor. */
async function amplitudeOnlyRuns(angles: readonly number[]) {
  const { jobs, path, version } = await readyJob();
  let job = await addRun(jobs, path, version, {
    kind: 'initial',
    readings: amplitudeReadings(['left'], ROTOR.initial),
  });
  for (const angleDeg of angles) {
    job = await addRun(jobs, path, job.version, {
      kind: 'trial',
      trialWeight: trialAt(angleDeg),
      readings: amplitudeReadings(['left'], modelReadings(ROTOR, [trialAt(angleDeg)])),
    });
  }
  return { jobs, path, job };
}

describe('amplitude-only runs', () => {
  it('stores repeats without phase as a plain mean of the amplitudes with their spread', async () => {
    const { jobs, path, version } = await readyJob();
    const job = await addRun(jobs, path, version, {
      kind: 'initial',
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            { amplitude: 0.48, speedRpm: 2150 },
            { amplitude: 0.52, speedRpm: 2150 },
          ],
        },
      ],
    });
    const run = job.runs[0]!;
    expect(run.amplitudeOnly).toBe(true);
    // Mean (0.48 + 0.52) / 2 = 0.5; RMS distance from it sqrt((0.02² + 0.02²) / 2) = 0.02.
    expect(run.readings[0]!.average).toEqual({ amplitude: expect.closeTo(0.5, 12), phaseDeg: null });
    expect((run.readings[0] as unknown as { spread: number }).spread).toBeCloseTo(0.02, 12);
    expect((run.readings[0] as unknown as { repeats: object[] }).repeats[0]).toEqual({
      amplitude: 0.48,
      speedRpm: 2150,
    });
  });

  it('refuses a run that mixes repeats with and without phase, naming the repeat, and stores nothing', async () => {
    const { jobs, path, version } = await readyJob();
    const mixed = await jobs.post(
      `${path}/runs`,
      {
        kind: 'initial',
        readings: [
          {
            sensorSide: 'left',
            repeats: [
              { amplitude: 0.5, phaseDeg: 60, speedRpm: 2150 },
              { amplitude: 0.5, speedRpm: 2150 },
            ],
          },
        ],
      },
      version,
    );
    expect(mixed.status).toBe(400);
    expect(mixed.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(mixed.body.errors).toEqual([
      {
        path: 'readings[0].repeats[1].phaseDeg',
        message: expect.stringMatching(/leave out every phase for an amplitude-only run/),
      },
    ]);
    const stored = await jobs.get(path);
    expect(stored.body.runs).toHaveLength(0);
    expect(stored.body.version).toBe(version);
  });
});

describe('the four-run correction', () => {
  it('brings the modelled rotor down, equals the calculator’s answer, predicts the fitted weight and verifies', async () => {
    const { jobs, path, job } = await amplitudeOnlyRuns([0, 120, 240]);
    const computed = await jobs.post(`${path}/corrections`, { method: 'four-run' }, job.version);
    expect(computed.status, JSON.stringify(computed.body)).toBe(201);
    const correction = (computed.body as JobBody).corrections[0]!;
    expect(correction).toMatchObject({ method: 'four-run', basis: 'trial' });
    expect(correction.calc.route).toBe('four-run');
    expect(correction.calc.sensorSides).toEqual(['left']);
    // The request is the stored amplitudes: the initial one and the trial at each position.
    const request = correction.calc.request as {
      initialAmplitude: number;
      trialMass: number;
      trialRuns: { angleDeg: number; amplitude: number }[];
    };
    expect(request.initialAmplitude).toBeCloseTo(0.5, 12);
    expect(request.trialMass).toBe(TRIAL_GRAMS);
    expect(request.trialRuns.map((run) => run.angleDeg)).toEqual([0, 120, 240]);
    request.trialRuns.forEach((run) =>
      expect(run.amplitude).toBeCloseTo(modelReadings(ROTOR, [trialAt(run.angleDeg)])[0]!.amplitude, 12),
    );
    const calculator = await as(test.app, test.tokens.technician).post(
      '/api/v1/calc/four-run',
      correction.calc.request,
    );
    expect(calculator.status).toBe(200);
    expect(correction.result).toEqual(calculator.body);

    // The working, against the model: the weight that cancels r0 = 0.5∠60 with H = 0.004∠30 is
    // |r0| / |H| = 125 g; the trial's effect alone is |H| x 50 g = 0.2 in/s. Fitted as planned, the
    // modelled rotor reads (next to) nothing, down from 0.5 in/s.
    const plan = correction.plan[0]!;
    expect(plan.planeIndex).toBe(0);
    expect(plan.massGrams).toBeCloseTo(125, 6);
    expect((correction.result['trialEffect'] as { amplitude: number }).amplitude).toBeCloseTo(0.2, 9);
    expect(modelReadings(ROTOR, [plan])[0]!.amplitude).toBeLessThan(1e-6);

    // Fitted 5 % light and 4 degrees off: the prediction is the model's amplitude for what was fitted.
    const fitted = { planeIndex: 0, massGrams: plan.massGrams * 0.95, angleDeg: (plan.angleDeg + 4) % 360 };
    const installed = await jobs.put(
      `${path}/corrections/${correction.id}/installed`,
      { weights: [{ ...fitted, radiusMm: 210, fixing: 'welded' }] },
      computed.body.version,
    );
    expect(installed.status, JSON.stringify(installed.body)).toBe(200);
    const after = modelReadings(ROTOR, [fitted])[0]!;
    // |1 - 0.95 e^(i4°)| x 0.5 ≈ 0.042 in/s: far below the initial 0.5 in/s.
    expect(after.amplitude).toBeLessThan(0.05);
    const predicted = (installed.body as JobBody).corrections[0]!.predicted![0]!.reading;
    expect(predicted.phaseDeg).toBeNull();
    expect(predicted.amplitude).toBeCloseTo(after.amplitude, 9);

    // Verification reads amplitudes only too: judged against the family's 0.15 in/s shop target.
    const verified = await addRun(jobs, path, installed.body.version, {
      kind: 'verification',
      readings: amplitudeReadings(['left'], [after]),
    });
    expect(verified.runs.at(-1)!.amplitudeOnly).toBe(true);
    expect(verified.verification).toMatchObject({ accepted: true, nextSide: null });
    const completed = await jobs.post(`${path}/complete`, undefined, verified.version);
    expect(completed.status, JSON.stringify(completed.body)).toBe(200);
    const completion = completed.body.completion as {
      accepted: boolean;
      beforeAfter: { before: { amplitude: number; phaseDeg: null }; after: { amplitude: number } }[];
      coefficients: unknown[];
    };
    expect(completion.accepted).toBe(true);
    expect(completion.beforeAfter[0]!.before).toEqual({ amplitude: expect.closeTo(0.5, 12), phaseDeg: null });
    expect(completion.beforeAfter[0]!.after.amplitude).toBeCloseTo(after.amplitude, 12);
    // Amplitudes measure no phase: no influence coefficient to refine the family with.
    expect(completion.coefficients).toEqual([]);
  });

  it('judges a balance grade with the trial effect it measured: |H| = T / m_trial, no phase needed', async () => {
    const graded = await machineOfFamily(test, test.tokens.owner, {
      acceptance: { kind: 'balance-grade', grade: 'G6.3' },
    });
    const jobs = jobsAs(test, test.tokens.technician);
    const created = await jobs.create({ machineId: graded.machineId, scheduledFor: '2026-04-21' });
    const ready = await readyForRuns(test, test.tokens.technician, created.body.id, created.body.version);
    const path = jobPath(ready.id);
    let job = await addRun(jobs, path, ready.version, {
      kind: 'initial',
      readings: amplitudeReadings(['left'], ROTOR.initial),
    });
    // Before any correction the grade cannot be read as an amplitude: nothing measured the response.
    expect(job.verification).toMatchObject({ accepted: false, nextSide: 'left' });
    for (const angleDeg of [0, 120, 240]) {
      job = await addRun(jobs, path, job.version, {
        kind: 'trial',
        trialWeight: trialAt(angleDeg),
        readings: amplitudeReadings(['left'], modelReadings(ROTOR, [trialAt(angleDeg)])),
      });
    }
    const computed = await jobs.post(`${path}/corrections`, { method: 'four-run' }, job.version);
    const plan = (computed.body as JobBody).corrections[0]!.plan[0]!;
    const fitted = { planeIndex: 0, massGrams: plan.massGrams * 0.95, angleDeg: (plan.angleDeg + 4) % 360 };
    const installed = await jobs.put(
      `${path}/corrections/${(computed.body as JobBody).corrections[0]!.id}/installed`,
      { weights: [{ ...fitted, radiusMm: 210, fixing: 'welded' }] },
      computed.body.version,
    );
    const verified = await addRun(jobs, path, installed.body.version, {
      kind: 'verification',
      readings: amplitudeReadings(['left'], modelReadings(ROTOR, [fitted])),
    });
    // G6.3 on the 300 kg rotor at 2150 rpm: U_per / r x |H|, with |H| = 0.2 in/s / 50 g = 0.004 in/s per g.
    const tolerance = balanceTolerance({ grade: 'G6.3', rotorMassKg: 300, speedRpm: 2150 });
    const limit = (tolerance.permissibleUnbalanceGmm / 210) * 0.004;
    const verdict = verified.verification as unknown as {
      accepted: boolean;
      sides: { amplitude: number; limit: number }[];
    };
    expect(verdict.sides[0]!.limit).toBeCloseTo(limit, 9);
    expect(verdict.sides[0]!.amplitude).toBeLessThan(limit);
    expect(verdict.accepted).toBe(true);
  });

  it('says which trial runs are missing: one position short', async () => {
    const { jobs, path, job } = await amplitudeOnlyRuns([0, 120]);
    const answer = await jobs.post(`${path}/corrections`, { method: 'four-run' }, job.version);
    expect(answer.status).toBe(409);
    expect(answer.body.code).toBe('METHOD_NOT_POSSIBLE');
    expect(answer.body.detail).toBe(
      'Amplitude only needs the initial run (run 1) and the same trial weight at three positions in plane 0 ' +
        '(the left sensor’s), each read without phase: this job has trial runs with 50 g at 0° (run 2) and ' +
        '120° (run 3). Take one more trial run with 50 g at another position (e.g. 0°, 120°, 240°).',
    );
    const stored = await jobs.get(path);
    expect(stored.body.corrections).toHaveLength(0);
  });

  it('counts two trials at the same angle as one position, and says so', async () => {
    const { jobs, path, job } = await amplitudeOnlyRuns([0, 120, 120]);
    const answer = await jobs.post(`${path}/corrections`, { method: 'four-run' }, job.version);
    expect(answer.status).toBe(409);
    expect(answer.body.code).toBe('METHOD_NOT_POSSIBLE');
    expect(answer.body.detail).toMatch(/120° \(run 4\)/);
    expect(answer.body.detail).toMatch(
      /Run 3 had the trial weight at an angle already taken, so the later run at that angle counts\./,
    );
  });

  it('says what is missing with no trial run at all', async () => {
    const { jobs, path, job } = await amplitudeOnlyRuns([]);
    const answer = await jobs.post(`${path}/corrections`, { method: 'four-run' }, job.version);
    expect(answer.status).toBe(409);
    expect(answer.body.detail).toMatch(
      /this job has no amplitude-only trial run after it\. Take 3 more trial runs/,
    );
  });

  it('lets the methods with phase refuse amplitude-only runs, and four-run refuse runs with phase', async () => {
    const { jobs, path, job } = await amplitudeOnlyRuns([0]);
    const singlePlane = await jobs.post(`${path}/corrections`, { method: 'single-plane' }, job.version);
    expect(singlePlane.status).toBe(409);
    expect(singlePlane.body.code).toBe('METHOD_NOT_POSSIBLE');
    expect(singlePlane.body.detail).toMatch(/^Run 2 was read without phase: .*Use four-run/);
    const oneRun = await jobs.post(`${path}/corrections`, { method: 'one-run' }, job.version);
    expect(oneRun.status).toBe(409);

    const withPhase = await readyJob();
    const initial = await addRun(withPhase.jobs, withPhase.path, withPhase.version, {
      kind: 'initial',
      readings: runReadings(['left'], ROTOR.initial),
    });
    const fourRun = await withPhase.jobs.post(
      `${withPhase.path}/corrections`,
      { method: 'four-run' },
      initial.version,
    );
    expect(fourRun.status).toBe(409);
    expect(fourRun.body.detail).toMatch(/read without phase; it was read with phase/);
  });

  it('lets one of several corrections sent at once on one version land, the rest 412', async () => {
    const { jobs, path, job } = await amplitudeOnlyRuns([0, 120, 240]);
    const answers = await Promise.all(
      Array.from({ length: 5 }, () => jobs.post(`${path}/corrections`, { method: 'four-run' }, job.version)),
    );
    expect(answers.map((answer) => answer.status).sort()).toEqual([201, 412, 412, 412, 412]);
    const stored = await jobs.get(path);
    expect(stored.body.corrections).toHaveLength(1);
    expect(stored.body.version).toBe(job.version + 1);
  });
});
