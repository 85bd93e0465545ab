/*
 * The device's rules against the server's: every change a technician can make offline, applied on the
 * device with `applyJobChange` to the job as the server last gave it, then sent to the server through its
 * API. The two jobs must be the same but for ids, times and version, and a change the server refuses the
 * device refuses with the same problem. Walked through the demo's shapes of job: one plane with a trial
 * weight and a trim, two planes, amplitude only at four runs, a stored sensitivity, a failed inspection,
 * and a machine without a family.
 */
import {
  applyJobChange,
  compareCorrections,
  type Job,
  JobChangeRefusal,
  type LocalJobContext,
  type OfflineJobChange,
} from '@counterpoise/api';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  as,
  customerBody,
  machineBody,
  type RecordsTestApp,
  startRecordsTestApp,
} from '../records/records.test-app';
import {
  amplitudeReadings,
  jobsAs,
  machineOfFamily,
  type ModelRotor,
  modelReadings,
  passingInspection,
  runReadings,
  setupBody,
} from './jobs.test-app';

let test: RecordsTestApp;
beforeAll(async () => {
  test = await startRecordsTestApp();
});
afterAll(async () => test.close());

/** What the device stores of the server's answers: the job, its machine and the machine's family. */
async function contextOf(job: Job): Promise<LocalJobContext> {
  const owner = as(test.app, test.tokens.technician);
  const machine = await owner.get(`/api/v1/machines/${job.machine.id}`);
  expect(machine.status).toBe(200);
  if (job.machine.familyId === null) return { machine: machine.body, family: null };
  const family = await owner.get(`/api/v1/machine-families/${job.machine.familyId}`);
  expect(family.status).toBe(200);
  return { machine: machine.body, family: family.body };
}

/** The request the device sends for a queued change once it is online. */
function send(jobs: ReturnType<typeof jobsAs>, job: Job, change: OfflineJobChange) {
  const path = `/api/v1/jobs/${job.id}`;
  switch (change.kind) {
    case 'acknowledge-safety':
      return jobs.put(`${path}/safety`, change.body, job.version);
    case 'record-inspection':
      return jobs.put(`${path}/inspection`, change.body, job.version);
    case 'record-setup':
      return jobs.put(`${path}/setup`, change.body, job.version);
    case 'add-run':
      return jobs.post(`${path}/runs`, change.body, job.version);
    case 'compute-correction':
      return jobs.post(`${path}/corrections`, change.body, job.version);
    case 'record-installed': {
      const correction = job.corrections.find((c) => c.sequence === change.correctionSequence);
      return jobs.put(`${path}/corrections/${correction?.id ?? 999_999}/installed`, change.body, job.version);
    }
  }
}

/**
 * A job as both sides store it, without what only the server gives (ids, times, version): runs named by
 * their sequence wherever an id names them. Through JSON, as every answer of the server is.
 */
function comparable(job: Job): unknown {
  const sequenceOf = new Map(job.runs.map((run) => [run.id, run.sequence]));
  const { id: _id, version: _version, createdAt: _created, updatedAt: _updated, ...rest } = job;
  return JSON.parse(
    JSON.stringify({
      ...rest,
      safety: job.safety && { ...job.safety, acknowledgedAt: 'time' },
      inspection: job.inspection && { ...job.inspection, measuredAt: 'time' },
      setup: job.setup && { ...job.setup, recordedAt: 'time' },
      runs: job.runs.map(({ id: _runId, createdAt: _at, ...run }) => run),
      corrections: job.corrections.map(
        ({ id: _correctionId, createdAt: _at, installedAt, runIds, ...correction }) => ({
          ...correction,
          runs: runIds.map((runId) => sequenceOf.get(runId)),
          installedAt: installedAt === null ? null : 'time',
        }),
      ),
      verification: job.verification && {
        ...job.verification,
        runId: sequenceOf.get(job.verification.runId),
      },
    }),
  );
}

/** A job of `machineId` created online by the technician, and the technician's requests. */
async function newJob(machineId: number) {
  const jobs = jobsAs(test, test.tokens.technician);
  const created = await jobs.create({ machineId, scheduledFor: '2026-05-04' });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  let job = created.body as Job;
  const context = await contextOf(job);
  let applied = 0;
  let refused = 0;

  /**
   * Applies `change` on the device to the job as last stored, sends it, and checks that both sides agree:
   * the same job, or the same refusal. Returns the server's job (or the refusal).
   */
  async function both(change: OfflineJobChange): Promise<Job | JobChangeRefusal> {
    let local: Job | JobChangeRefusal;
    try {
      local = applyJobChange(job, change, context, { actor: job.technician, at: new Date() });
    } catch (error) {
      if (!(error instanceof JobChangeRefusal)) throw error;
      local = error;
    }
    const answer = await send(jobs, job, change);
    if (local instanceof JobChangeRefusal) {
      refused++;
      expect(
        {
          status: answer.status,
          code: answer.body.code,
          detail: answer.body.detail,
          errors: answer.body.errors,
        },
        `${change.kind} refused`,
      ).toEqual({ status: local.status, code: local.code, detail: local.detail, errors: local.errors });
      return local;
    }
    expect(answer.status, JSON.stringify(answer.body)).toBeLessThan(300);
    applied++;
    expect(comparable(local), change.kind).toEqual(comparable(answer.body as Job));
    expect(local.version).toBe(answer.body.version);
    job = answer.body as Job;
    return job;
  }
  return { both, current: () => job, counts: () => ({ applied, refused }) };
}

const SAFETY: OfflineJobChange = {
  kind: 'acknowledge-safety',
  body: { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
};
const INSPECTION = { kind: 'record-inspection', body: passingInspection() } as OfflineJobChange;
const setup = (sides: ('left' | 'right')[]) =>
  ({ kind: 'record-setup', body: setupBody(sides) }) as OfflineJobChange;
const run = (body: object) => ({ kind: 'add-run', body }) as OfflineJobChange;
const compute = (method: 'one-run' | 'single-plane' | 'multi-plane' | 'four-run'): OfflineJobChange => ({
  kind: 'compute-correction',
  body: { method },
});
const installed = (
  correctionSequence: number,
  weights: { planeIndex: number; massGrams: number; angleDeg: number; radiusMm?: number }[],
): OfflineJobChange => ({
  kind: 'record-installed',
  correctionSequence,
  body: {
    weights: weights.map((weight) => ({
      planeIndex: weight.planeIndex,
      massGrams: Math.round(weight.massGrams * 10) / 10,
      angleDeg: (Math.round(weight.angleDeg * 10) / 10) % 360,
      radiusMm: weight.radiusMm ?? 210,
      fixing: 'welded' as const,
    })),
  },
});

/** A weight at `radiusMm` as the plane's model sees it at the planes' 210 mm. */
const atPlane = (weight: { planeIndex: number; massGrams: number; angleDeg: number; radiusMm: number }) => ({
  ...weight,
  massGrams: (weight.massGrams * weight.radiusMm) / 210,
});

describe('a job changed offline against the same change sent to the server', () => {
  it('one plane: trial weight, a correction fitted in two pieces, a trim and the refusals on the way', async () => {
    const { machineId } = await machineOfFamily(test, test.tokens.owner, { planeCount: 1 });
    const rotor: ModelRotor = {
      initial: [{ amplitude: 0.62, phaseDeg: 140 }],
      coefficients: [[{ amplitudePerMass: 0.0045, phaseDeg: 35 }]],
    };
    const twin = await newJob(machineId);
    // Out of order: the inspection before the safety cautions, a run before the set-up.
    expect(await twin.both(INSPECTION)).toBeInstanceOf(JobChangeRefusal);
    await twin.both(SAFETY);
    expect(
      await twin.both(run({ kind: 'initial', readings: runReadings(['left'], rotor.initial) })),
    ).toBeInstanceOf(JobChangeRefusal);
    await twin.both(INSPECTION);
    await twin.both(setup(['left']));
    // A body the schema refuses: a trial run without its trial weight, a sensor the set-up does not have.
    expect(
      await twin.both(run({ kind: 'trial', readings: runReadings(['left'], rotor.initial) })),
    ).toBeInstanceOf(JobChangeRefusal);
    expect(
      await twin.both(run({ kind: 'initial', readings: runReadings(['right'], rotor.initial) })),
    ).toBeInstanceOf(JobChangeRefusal);
    await twin.both(run({ kind: 'initial', readings: runReadings(['left'], rotor.initial, { repeats: 3 }) }));
    expect(await twin.both(compute('single-plane'))).toBeInstanceOf(JobChangeRefusal);
    expect(
      await twin.both(run({ kind: 'verification', readings: runReadings(['left'], rotor.initial) })),
    ).toBeInstanceOf(JobChangeRefusal);
    const trial = { planeIndex: 0, massGrams: 80, angleDeg: 0 };
    await twin.both(
      run({
        kind: 'trial',
        trialWeight: trial,
        readings: runReadings(['left'], modelReadings(rotor, [trial]), { speedRpm: 2190 }),
      }),
    );
    const first = (await twin.both(compute('single-plane'))) as Job;
    const plan = first.corrections[0]!.plan[0]!;
    // Fitted as two pieces either side of the plan, one of them at a smaller radius.
    const fitted = [
      { planeIndex: 0, massGrams: plan.massGrams * 0.6, angleDeg: plan.angleDeg + 8, radiusMm: 200 },
      { planeIndex: 0, massGrams: plan.massGrams * 0.45, angleDeg: plan.angleDeg - 10, radiusMm: 210 },
    ];
    expect(await twin.both(installed(2, fitted))).toBeInstanceOf(JobChangeRefusal);
    await twin.both(installed(1, fitted));
    const onRotor = fitted.map(atPlane);
    await twin.both(
      run({ kind: 'verification', readings: runReadings(['left'], modelReadings(rotor, onRotor)) }),
    );
    const trim = (await twin.both(compute('single-plane'))) as Job;
    expect(trim.corrections[1]!.basis).toBe('trim');
    await twin.both(installed(2, trim.corrections[1]!.plan));
    const final = (await twin.both(
      run({
        kind: 'verification',
        readings: runReadings(['left'], modelReadings(rotor, [...onRotor, ...trim.corrections[1]!.plan])),
      }),
    )) as Job;
    expect(final.nextStep).toBe('completion');
    // Fitting the first correction again once a run was taken after the second.
    expect(await twin.both(installed(1, fitted))).toBeInstanceOf(JobChangeRefusal);
    expect(twin.counts()).toEqual({ applied: 11, refused: 8 });
  });

  it('two planes: both sensors, a trial run in each plane, a least-squares trim with the verification', async () => {
    const { machineId } = await machineOfFamily(test, test.tokens.owner, { planeCount: 2 });
    const rotor: ModelRotor = {
      initial: [
        { amplitude: 0.48, phaseDeg: 75 },
        { amplitude: 0.36, phaseDeg: 210 },
      ],
      coefficients: [
        [
          { amplitudePerMass: 0.004, phaseDeg: 30 },
          { amplitudePerMass: 0.0012, phaseDeg: 95 },
        ],
        [
          { amplitudePerMass: 0.0015, phaseDeg: 110 },
          { amplitudePerMass: 0.0042, phaseDeg: 40 },
        ],
      ],
    };
    const sides = ['left', 'right'] as const;
    const twin = await newJob(machineId);
    await twin.both(SAFETY);
    await twin.both(INSPECTION);
    await twin.both(setup([...sides]));
    await twin.both(run({ kind: 'initial', readings: runReadings(sides, rotor.initial) }));
    const left = { planeIndex: 0, massGrams: 90, angleDeg: 0 };
    await twin.both(
      run({ kind: 'trial', trialWeight: left, readings: runReadings(sides, modelReadings(rotor, [left])) }),
    );
    expect(await twin.both(compute('multi-plane'))).toBeInstanceOf(JobChangeRefusal);
    const right = { planeIndex: 1, massGrams: 90, angleDeg: 90 };
    await twin.both(
      run({ kind: 'trial', trialWeight: right, readings: runReadings(sides, modelReadings(rotor, [right])) }),
    );
    const first = (await twin.both(compute('multi-plane'))) as Job;
    const fitted = first.corrections[0]!.plan.map((weight) => ({
      ...weight,
      massGrams: weight.massGrams * 1.05,
    }));
    await twin.both(installed(1, fitted));
    const rounded = fitted.map((weight) => ({
      ...weight,
      massGrams: Math.round(weight.massGrams * 10) / 10,
      angleDeg: (Math.round(weight.angleDeg * 10) / 10) % 360,
    }));
    await twin.both(
      run({ kind: 'verification', readings: runReadings(sides, modelReadings(rotor, rounded)) }),
    );
    const trim = (await twin.both(compute('multi-plane'))) as Job;
    expect(trim.corrections[1]!.basis).toBe('trim');
    expect(trim.corrections[1]!.plan).toHaveLength(2);
    expect(twin.counts()).toEqual({ applied: 10, refused: 1 });
  });

  it('amplitude only: the initial run and the same trial weight at three positions, read without phase', async () => {
    const { machineId } = await machineOfFamily(test, test.tokens.owner, { planeCount: 1 });
    const rotor: ModelRotor = {
      initial: [{ amplitude: 0.5, phaseDeg: 60 }],
      coefficients: [[{ amplitudePerMass: 0.004, phaseDeg: 30 }]],
    };
    const twin = await newJob(machineId);
    await twin.both(SAFETY);
    await twin.both(INSPECTION);
    await twin.both(setup(['left']));
    await twin.both(run({ kind: 'initial', readings: amplitudeReadings(['left'], rotor.initial) }));
    // Methods with phase refuse runs read without it.
    expect(await twin.both(compute('single-plane'))).toBeInstanceOf(JobChangeRefusal);
    for (const angleDeg of [0, 120]) {
      const trial = { planeIndex: 0, massGrams: 50, angleDeg };
      await twin.both(
        run({
          kind: 'trial',
          trialWeight: trial,
          readings: amplitudeReadings(['left'], modelReadings(rotor, [trial])),
        }),
      );
    }
    expect(await twin.both(compute('four-run'))).toBeInstanceOf(JobChangeRefusal);
    const last = { planeIndex: 0, massGrams: 50, angleDeg: 240 };
    await twin.both(
      run({
        kind: 'trial',
        trialWeight: last,
        readings: amplitudeReadings(['left'], modelReadings(rotor, [last])),
      }),
    );
    const computed = (await twin.both(compute('four-run'))) as Job;
    const plan = computed.corrections[0]!.plan;
    const withPredicted = (await twin.both(installed(1, plan))) as Job;
    expect(withPredicted.corrections[0]!.predicted![0]!.reading.phaseDeg).toBeNull();
    await twin.both(
      run({ kind: 'verification', readings: amplitudeReadings(['left'], modelReadings(rotor, plan)) }),
    );
    expect(twin.counts()).toEqual({ applied: 10, refused: 2 });
  });

  it('a stored sensitivity: one run computes the correction from the family’s figure', async () => {
    const { machineId } = await machineOfFamily(test, test.tokens.owner, {
      planeCount: 1,
      sensitivities: [
        { sensorSide: 'left', planeIndex: 0, gramsPerUnit: 240, unit: 'in/s-pk', phaseLagDeg: 35 },
      ],
    });
    const twin = await newJob(machineId);
    await twin.both(SAFETY);
    await twin.both(INSPECTION);
    await twin.both(setup(['left']));
    await twin.both(
      run({ kind: 'initial', readings: runReadings(['left'], [{ amplitude: 0.4, phaseDeg: 200 }]) }),
    );
    const computed = (await twin.both(compute('one-run'))) as Job;
    expect(computed.corrections[0]!.basis).toBe('sensitivity');
    await twin.both(installed(1, computed.corrections[0]!.plan));
    expect(twin.counts()).toEqual({ applied: 6, refused: 0 });
  });

  it('an inspection over the family’s limits puts the job on hold on both sides; a re-measure opens it', async () => {
    const { machineId } = await machineOfFamily(test, test.tokens.owner, { planeCount: 2 });
    const twin = await newJob(machineId);
    await twin.both(SAFETY);
    const failed = (await twin.both({
      kind: 'record-inspection',
      body: {
        bearingEndPlayMm: 0.45,
        shaftRunoutMm: 0.05,
        checks: { teethOrKnives: 'fault', buildUpCleaned: 'ok', welds: 'ok', beltsAndPulleys: 'fixed' },
        notes: '  Two teeth missing on the left end  ',
      },
    })) as Job;
    expect(failed.status).toBe('on-hold');
    expect(failed.inspection!.reasons).toHaveLength(2);
    expect(await twin.both(setup(['left', 'right']))).toBeInstanceOf(JobChangeRefusal);
    const passed = (await twin.both(INSPECTION)) as Job;
    expect(passed.status).toBe('open');
    await twin.both(setup(['left', 'right']));
    // Before the first run the set-up may still change.
    expect(((await twin.both(setup(['left']))) as Job).setup!.sensors).toHaveLength(1);
    expect(twin.counts()).toEqual({ applied: 5, refused: 1 });
  });

  it('a machine without a family: the common practice inspection limits, and no stored sensitivity', async () => {
    const owner = as(test.app, test.tokens.owner);
    const customer = await owner.post('/api/v1/customers', customerBody(`local-${Date.now()}`));
    const machine = await owner.post(
      '/api/v1/machines',
      machineBody(customer.body.id as number, { planeCount: 1 }),
    );
    expect(machine.status, JSON.stringify(machine.body)).toBe(201);
    const twin = await newJob(machine.body.id as number);
    await twin.both(SAFETY);
    await twin.both({
      kind: 'record-inspection',
      body: { ...(passingInspection() as object), bearingEndPlayMm: 3.5 } as never,
    });
    expect(twin.current().status).toBe('on-hold');
    await twin.both(INSPECTION);
    await twin.both(setup(['left']));
    await twin.both(
      run({ kind: 'initial', readings: runReadings(['left'], [{ amplitude: 0.3, phaseDeg: 10 }]) }),
    );
    expect(await twin.both(compute('one-run'))).toBeInstanceOf(JobChangeRefusal);
    expect(twin.counts()).toEqual({ applied: 5, refused: 1 });
  });

  it('the server’s stored correction agrees with the device’s by compareCorrections', async () => {
    const { machineId } = await machineOfFamily(test, test.tokens.owner, { planeCount: 1 });
    const rotor: ModelRotor = {
      initial: [{ amplitude: 0.3, phaseDeg: 300 }],
      coefficients: [[{ amplitudePerMass: 0.003, phaseDeg: 20 }]],
    };
    const twin = await newJob(machineId);
    for (const change of [SAFETY, INSPECTION, setup(['left'])]) await twin.both(change);
    await twin.both(run({ kind: 'initial', readings: runReadings(['left'], rotor.initial) }));
    const trial = { planeIndex: 0, massGrams: 60, angleDeg: 45 };
    await twin.both(
      run({
        kind: 'trial',
        trialWeight: trial,
        readings: runReadings(['left'], modelReadings(rotor, [trial])),
      }),
    );
    const before = twin.current();
    const device = applyJobChange(before, compute('single-plane'), await contextOf(before), {
      actor: before.technician,
      at: new Date(),
    });
    const server = (await twin.both(compute('single-plane'))) as Job;
    expect(device.corrections[0]!.id).toBeLessThan(0);
    expect(compareCorrections(device.corrections[0]!, server.corrections[0]!, 1)).toEqual({
      agrees: true,
      differences: [],
    });
  });
});

describe('parallel sends of the same queued change', () => {
  it('land once: the second gets 412 with the job as stored, which the device’s change was already applied to', async () => {
    const { machineId } = await machineOfFamily(test, test.tokens.owner, { planeCount: 1 });
    const twin = await newJob(machineId);
    for (const change of [SAFETY, INSPECTION, setup(['left'])]) await twin.both(change);
    const job = twin.current();
    const change = run({
      kind: 'initial',
      readings: runReadings(['left'], [{ amplitude: 0.3, phaseDeg: 10 }]),
    });
    const local = applyJobChange(job, change, await contextOf(job), {
      actor: job.technician,
      at: new Date(),
    });
    const jobs = jobsAs(test, test.tokens.technician);
    const answers = await Promise.all([
      send(jobs, job, change),
      send(jobs, job, change),
      send(jobs, job, change),
    ]);
    expect(answers.map((answer) => answer.status).sort()).toEqual([201, 412, 412]);
    const landed = answers.find((answer) => answer.status === 201)!.body as Job;
    expect(comparable(local)).toEqual(comparable(landed));
    for (const refused of answers.filter((answer) => answer.status === 412)) {
      expect(comparable(refused.body.current as Job)).toEqual(comparable(landed));
    }
  });
});
