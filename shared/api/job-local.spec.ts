/*
 * A job's changes applied on the device, without a server: each step in order on a one-plane fan, with the
 * ids, versions and next steps the device gives; the refusals the server would answer, with its problem;
 * and whether two corrections agree, in words.
 */
import {
  add,
  multiply,
  phasor,
  phasorToReading,
  type Reading,
  readingToPhasor,
  weightToModel,
} from '@counterpoise/engine';
import { describe, expect, it } from 'vitest';
import { JobChangeRefusal } from './job-calculations';
import {
  applyJobChange,
  compareCorrections,
  CORRECTION_ANGLE_TOLERANCE_DEG,
  CORRECTION_MASS_TOLERANCE,
  type LocalJobContext,
  type OfflineJobChange,
} from './job-local';
import type { Job, JobCorrection } from './jobs';
import type { Machine, MachineFamily } from './records';

const AT = new Date('2026-05-04T09:30:00.000Z');
const TECHNICIAN = { id: 4, name: 'Iris Calloway' };
const BY = { actor: TECHNICIAN, at: AT };

const FAMILY: MachineFamily = {
  id: 2,
  version: 3,
  createdAt: '2026-01-10T08:00:00.000Z',
  updatedAt: '2026-03-01T08:00:00.000Z',
  archivedAt: null,
  name: 'Barn fan, 1.2 m',
  rotorType: 'fan',
  nominalSpeedRpm: 1450,
  planeCount: 1,
  correctionRadiiMm: [520],
  inspectionLimits: { bearingEndPlayMm: 0.3, shaftRunoutMm: 0.2 },
  acceptance: { kind: 'shop-target', amplitude: 0.12, unit: 'in/s-pk' },
  sensitivities: [],
  notes: null,
  machineCount: 1,
};

const MACHINE: Machine = {
  id: 11,
  version: 1,
  createdAt: '2026-01-10T08:00:00.000Z',
  updatedAt: '2026-01-10T08:00:00.000Z',
  archivedAt: null,
  customerId: 7,
  customerName: 'Hollin Dairy',
  familyId: FAMILY.id,
  familyName: FAMILY.name,
  make: 'Airdale',
  model: 'AD-1200',
  serialNumber: 'AD1200-3381',
  hours: 5200,
  rotorMassKg: 42,
  operatingSpeedRpm: 1450,
  sensorSides: ['left'],
  rotationSeenFromLeft: 'clockwise',
  planes: [{ correctionRadiusMm: 520, positions: null, blockedSectors: [] }],
  stockWeightsGrams: [10, 20, 50],
  acceptance: null,
  notes: null,
};

const CONTEXT: LocalJobContext = { machine: MACHINE, family: FAMILY };

const NEW_JOB: Job = {
  id: 31,
  version: 1,
  status: 'open',
  nextStep: 'safety',
  scheduledFor: '2026-05-04',
  machine: {
    id: MACHINE.id,
    serialNumber: MACHINE.serialNumber,
    make: MACHINE.make,
    model: MACHINE.model,
    customerId: MACHINE.customerId,
    customerName: MACHINE.customerName,
    familyId: FAMILY.id,
    familyName: FAMILY.name,
  },
  technician: TECHNICIAN,
  createdAt: '2026-05-04T07:00:00.000Z',
  updatedAt: '2026-05-04T07:00:00.000Z',
  safety: null,
  inspection: null,
  setup: null,
  runs: [],
  corrections: [],
  verification: null,
  completion: null,
  abandonment: null,
};

/** A modelled fan: 0.42 in/s at 110° with nothing added, 0.0021 in/s per gram at 25°. */
function reads(weights: readonly { massGrams: number; angleDeg: number }[]): Reading {
  let z = readingToPhasor({ amplitude: 0.42, phaseDeg: 110 });
  for (const weight of weights) {
    z = add(z, multiply(phasor(0.0021, 25), weightToModel(weight.massGrams, weight.angleDeg, 1)));
  }
  return phasorToReading(z);
}

const repeats = (reading: Reading, count = 2) =>
  Array.from({ length: count }, () => ({ ...reading, speedRpm: 1450 }));

const STEPS = {
  safety: {
    kind: 'acknowledge-safety',
    body: { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection', 'lockout'] },
  },
  inspection: {
    kind: 'record-inspection',
    body: {
      bearingEndPlayMm: 0.1,
      shaftRunoutMm: 0.05,
      checks: { teethOrKnives: 'ok', buildUpCleaned: 'fixed', welds: 'ok', beltsAndPulleys: 'ok' },
      notes: '  Belt tension set  ',
    },
  },
  setup: {
    kind: 'record-setup',
    body: {
      sensors: [{ side: 'left', position: ' Motor-side bearing, horizontal ' }],
      tachometer: 'On the guard',
      referenceMark: 'Tape on blade 1',
      rotationSeenFromLeft: 'clockwise',
      operatingSpeedRpm: 1450,
      amplitudeUnit: 'in/s-pk',
      phaseSense: 'lag',
      weightAngles: 'againstRotation',
    },
  },
  initial: {
    kind: 'add-run',
    body: { kind: 'initial', readings: [{ sensorSide: 'left', repeats: repeats(reads([]), 3) }] },
  },
  trial: {
    kind: 'add-run',
    body: {
      kind: 'trial',
      trialWeight: { planeIndex: 0, massGrams: 60, angleDeg: 0 },
      readings: [{ sensorSide: 'left', repeats: repeats(reads([{ massGrams: 60, angleDeg: 0 }])) }],
    },
  },
  compute: { kind: 'compute-correction', body: { method: 'single-plane' } },
} satisfies Record<string, OfflineJobChange>;

function applyAll(job: Job, changes: readonly OfflineJobChange[]): Job {
  return changes.reduce((current, change) => applyJobChange(current, change, CONTEXT, BY), job);
}

function refusalOf(job: Job, change: OfflineJobChange, context = CONTEXT): JobChangeRefusal {
  try {
    applyJobChange(job, change, context, BY);
  } catch (error) {
    if (error instanceof JobChangeRefusal) return error;
    throw error;
  }
  throw new Error(`${change.kind} was not refused`);
}

describe('applyJobChange', () => {
  it('walks a one-plane job through every step, as the server would store it', () => {
    const safe = applyJobChange(NEW_JOB, STEPS.safety, CONTEXT, BY);
    expect(safe.safety).toEqual({
      topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
      acknowledgedAt: AT.toISOString(),
      by: TECHNICIAN,
    });
    expect([safe.version, safe.updatedAt, safe.nextStep]).toEqual([2, AT.toISOString(), 'inspection']);

    const inspected = applyJobChange(safe, STEPS.inspection, CONTEXT, BY);
    expect(inspected.inspection).toMatchObject({
      passed: true,
      reasons: [],
      notes: 'Belt tension set',
      limits: FAMILY.inspectionLimits,
      override: null,
    });
    expect(inspected.nextStep).toBe('setup');

    const setUp = applyJobChange(inspected, STEPS.setup, CONTEXT, BY);
    expect(setUp.setup!.sensors).toEqual([{ side: 'left', position: 'Motor-side bearing, horizontal' }]);
    expect(setUp.nextStep).toBe('runs');

    const withRuns = applyAll(setUp, [STEPS.initial, STEPS.trial]);
    expect(withRuns.runs.map((run) => [run.id, run.sequence, run.kind, run.amplitudeOnly])).toEqual([
      [-1, 1, 'initial', false],
      [-2, 2, 'trial', false],
    ]);
    expect(withRuns.runs[0]!.readings[0]!.average.amplitude).toBeCloseTo(0.42, 9);
    expect(withRuns.verification).toMatchObject({ runId: -1, accepted: false, nextSide: 'left' });
    expect(withRuns.nextStep).toBe('correction');

    const computed = applyJobChange(withRuns, STEPS.compute, CONTEXT, BY);
    const correction = computed.corrections[0]!;
    expect([correction.id, correction.sequence, correction.basis, correction.runIds]).toEqual([
      -1,
      1,
      'trial',
      [-1, -2],
    ]);
    // The plan cancels the modelled fan.
    expect(reads(correction.plan).amplitude).toBeLessThan(1e-9);

    const fitted = applyJobChange(
      computed,
      {
        kind: 'record-installed',
        correctionSequence: 1,
        body: { weights: [{ ...correction.plan[0]!, radiusMm: 520, fixing: 'bolted' }] },
      },
      CONTEXT,
      BY,
    );
    expect(fitted.corrections[0]!.installedAt).toBe(AT.toISOString());
    expect(fitted.corrections[0]!.predicted![0]!.reading.amplitude).toBeLessThan(1e-9);
    expect(fitted.nextStep).toBe('verification');

    const verified = applyJobChange(
      fitted,
      {
        kind: 'add-run',
        body: {
          kind: 'verification',
          readings: [{ sensorSide: 'left', repeats: repeats({ amplitude: 0.03, phaseDeg: 80 }) }],
        },
      },
      CONTEXT,
      BY,
    );
    expect(verified.runs.at(-1)!.weightsOnRotor).toHaveLength(1);
    expect(verified.verification).toMatchObject({ runId: -3, accepted: true, nextSide: null });
    expect([verified.version, verified.nextStep]).toEqual([NEW_JOB.version + 8, 'completion']);
    // The job given is never changed.
    expect(fitted.runs).toHaveLength(2);
  });

  it('refuses a step out of order with the server’s 409 and its code', () => {
    expect(refusalOf(NEW_JOB, STEPS.inspection)).toMatchObject({
      status: 409,
      code: 'STEP_MISSING',
      detail: 'Acknowledge the safety cautions first.',
    });
    const safe = applyJobChange(NEW_JOB, STEPS.safety, CONTEXT, BY);
    expect(refusalOf(safe, STEPS.setup).detail).toBe('Record the inspection first.');
    const setUp = applyAll(safe, [STEPS.inspection, STEPS.setup]);
    expect(refusalOf(setUp, STEPS.trial).detail).toBe('Take the initial run first.');
    const initial = applyJobChange(setUp, STEPS.initial, CONTEXT, BY);
    expect(refusalOf(initial, STEPS.initial).detail).toBe('The job has its initial run already.');
    expect(refusalOf(initial, STEPS.setup).detail).toMatch(/can no longer change/);
    expect(refusalOf(initial, STEPS.compute)).toMatchObject({ status: 409, code: 'METHOD_NOT_POSSIBLE' });
    expect(
      refusalOf(initial, {
        kind: 'add-run',
        body: { kind: 'verification', readings: STEPS.initial.body.readings },
      }).detail,
    ).toBe('Record the weights installed before a verification run.');
    expect(refusalOf(initial, { ...STEPS.compute, body: { method: 'one-run' } }).detail).toMatch(
      /no stored sensitivity/,
    );
  });

  it('refuses a body the route’s schema refuses with 400 and every field at fault', () => {
    const setUp = applyAll(NEW_JOB, [STEPS.safety, STEPS.inspection, STEPS.setup]);
    const refusal = refusalOf(setUp, {
      kind: 'add-run',
      body: {
        kind: 'initial',
        readings: [
          {
            sensorSide: 'left',
            repeats: [
              { amplitude: 0.4, phaseDeg: 110, speedRpm: 1450 },
              { amplitude: -1, speedRpm: 1450 },
            ],
          },
        ],
      },
    });
    expect(refusal.status).toBe(400);
    expect(refusal.code).toBe('INVALID_REQUEST');
    expect(refusal.errors!.map((error) => error.path).sort()).toEqual([
      'readings[0].repeats[1].amplitude',
      'readings[0].repeats[1].phaseDeg',
    ]);
    expect(
      refusalOf(setUp, {
        kind: 'add-run',
        body: { kind: 'initial', readings: [{ sensorSide: 'right', repeats: repeats(reads([])) }] },
      }),
    ).toMatchObject({
      status: 400,
      code: 'UNKNOWN_REFERENCE',
      errors: [{ path: 'readings[0].sensorSide', message: 'The set-up has no sensor on the right side.' }],
    });
  });

  it('puts a job on hold over the family’s limits, and then refuses the set-up for its status', () => {
    const held = applyAll(NEW_JOB, [
      STEPS.safety,
      {
        kind: 'record-inspection',
        body: {
          ...STEPS.inspection.body,
          shaftRunoutMm: 0.35,
          checks: { ...STEPS.inspection.body.checks, welds: 'fault' },
        },
      },
    ]);
    expect(held.status).toBe('on-hold');
    expect(held.nextStep).toBe('inspection');
    expect(held.inspection!.reasons).toHaveLength(2);
    expect(held.inspection!.reasons[1]).toBe('Welds: a fault is left; fix it before balancing.');
    expect(refusalOf(held, STEPS.setup)).toMatchObject({
      status: 409,
      code: 'JOB_NOT_OPEN',
      detail: 'The job is on-hold: this step needs it open.',
    });
    expect(applyJobChange(held, STEPS.inspection, CONTEXT, BY).status).toBe('open');
  });

  it('fits only the latest correction, named by its sequence, until a run is taken after it', () => {
    const computed = applyAll(NEW_JOB, [
      STEPS.safety,
      STEPS.inspection,
      STEPS.setup,
      STEPS.initial,
      STEPS.trial,
      STEPS.compute,
    ]);
    const weights = [
      { planeIndex: 0, massGrams: 120, angleDeg: 200, radiusMm: 520, fixing: 'welded' as const },
    ];
    expect(
      refusalOf(computed, { kind: 'record-installed', correctionSequence: 2, body: { weights } }),
    ).toMatchObject({
      status: 404,
    });
    expect(
      refusalOf(computed, {
        kind: 'record-installed',
        correctionSequence: 1,
        body: { weights: [{ ...weights[0]!, planeIndex: 1 }] },
      }),
    ).toMatchObject({
      status: 400,
      errors: [{ path: 'weights[0].planeIndex', message: 'The machine has 1 plane(s).' }],
    });
    const again = applyJobChange(computed, STEPS.trial, CONTEXT, BY);
    expect(
      refusalOf(again, { kind: 'record-installed', correctionSequence: 1, body: { weights } }).detail,
    ).toMatch(/A run was taken after this correction/);
  });

  it('needs the machine’s own family in its context (a programming error otherwise, not a refusal)', () => {
    expect(() => applyJobChange(NEW_JOB, STEPS.safety, { machine: MACHINE, family: null }, BY)).toThrow(
      /family of the job’s machine/,
    );
    expect(() =>
      applyJobChange(NEW_JOB, STEPS.safety, { machine: { ...MACHINE, id: 12 }, family: FAMILY }, BY),
    ).toThrow(/another machine/);
  });
});

describe('compareCorrections', () => {
  const correction = (plan: JobCorrection['plan'], method: JobCorrection['method'] = 'multi-plane') => ({
    method,
    plan,
  });
  const BOTH = correction([
    { planeIndex: 0, massGrams: 200, angleDeg: 30 },
    { planeIndex: 1, massGrams: 10, angleDeg: 359.8 },
  ]);

  it('states its tolerance: 0.5 % or 0.1 g, whichever is larger, and 0.5°', () => {
    expect(CORRECTION_MASS_TOLERANCE).toEqual({ fraction: 0.005, grams: 0.1 });
    expect(CORRECTION_ANGLE_TOLERANCE_DEG).toBe(0.5);
  });

  it('agrees within the tolerance, across 0°, and ignores the angle of weights too small to place', () => {
    expect(compareCorrections(BOTH, BOTH)).toEqual({ agrees: true, differences: [] });
    const close = correction([
      { planeIndex: 0, massGrams: 200.99, angleDeg: 30.49 },
      { planeIndex: 1, massGrams: 9.91, angleDeg: 0.2 },
    ]);
    expect(compareCorrections(close, BOTH)).toEqual({ agrees: true, differences: [] });
    const tiny = correction([{ planeIndex: 0, massGrams: 0.04, angleDeg: 10 }], 'single-plane');
    const tinyElsewhere = correction([{ planeIndex: 0, massGrams: 0.06, angleDeg: 190 }], 'single-plane');
    expect(compareCorrections(tiny, tinyElsewhere).agrees).toBe(true);
  });

  it('says in words how a mass, an angle, a plane or the method differs', () => {
    const device = correction(
      [
        { planeIndex: 0, massGrams: 201.2, angleDeg: 30 },
        { planeIndex: 1, massGrams: 10, angleDeg: 1 },
      ],
      'multi-plane',
    );
    expect(compareCorrections(device, BOTH).differences).toEqual([
      'Left plane: the server computed 200.0 g, this device 201.2 g (1.2 g apart; up to 1.0 g agrees).',
      'Right plane: the server computed the angle 359.8°, this device 1.0° (1.2° apart; up to 0.5° agrees).',
    ]);
    const onePlane = correction([{ planeIndex: 0, massGrams: 200, angleDeg: 30 }], 'single-plane');
    expect(compareCorrections(onePlane, BOTH)).toEqual({
      agrees: false,
      differences: [
        'The server used the method multi-plane; this device used single-plane.',
        'Right plane: the server computed 10.0 g; this device computed no weight there.',
      ],
    });
    expect(
      compareCorrections(
        onePlane,
        correction([{ planeIndex: 0, massGrams: 150, angleDeg: 30 }], 'single-plane'),
        1,
      ),
    ).toEqual({
      agrees: false,
      differences: [
        'The plane: the server computed 150.0 g, this device 200.0 g (50.0 g apart; up to 1.0 g agrees).',
      ],
    });
  });
});
