/*
 * What the server computes for a job from its stored runs, without the app: the verdict against each kind
 * of acceptance level, phases counted as a lead, the family's sensitivity refined across units, and the
 * refusals of a correction the stored runs do not allow.
 */
import { describe, expect, it } from 'vitest';
import { balanceTolerance, convertVibration } from '@counterpoise/engine';
import {
  averageRun,
  computeCorrection,
  JobChangeRefusal,
  predictInstalled,
  refinedSensitivities,
  verdictOf,
} from '@counterpoise/api';
import type { StoredSetup } from './job-records';
import type { CorrectionRow, RunRow } from './jobs.repo';
import { type ModelRotor, modelReadings } from './model-rotor';

const SETUP: StoredSetup = {
  sensors: [{ side: 'left', position: 'left bearing' }],
  tachometer: 'on the skid',
  referenceMark: 'tape',
  rotationSeenFromLeft: 'clockwise',
  operatingSpeedRpm: 2000,
  amplitudeUnit: 'mm/s-rms',
  phaseSense: 'lag',
  weightAngles: 'againstRotation',
  recordedAt: '2026-04-14T08:00:00.000Z',
};

let nextId = 1;
/** A stored run with one reading per side, as the repo gives it. */
function run(
  kind: RunRow['kind'],
  readings: Partial<Record<'left' | 'right', { amplitude: number; phaseDeg: number }>>,
  options: Partial<Pick<RunRow, 'trialWeight' | 'weightsOnRotor' | 'sequence'>> = {},
): RunRow {
  const id = nextId++;
  return {
    id,
    organisationId: 1,
    jobId: 1,
    sequence: options.sequence ?? id,
    kind,
    trialWeight: options.trialWeight ?? null,
    weightsOnRotor: options.weightsOnRotor ?? [],
    readings: Object.entries(readings).map(([side, average]) => ({
      sensorSide: side as 'left' | 'right',
      repeats: [{ ...average, speedRpm: 2000 }],
      average,
      spread: 0,
      spreadRatio: 0,
      trusted: true,
      speedRpm: 2000,
    })),
    warnings: [],
    createdById: 1,
    createdAt: new Date('2026-04-14T08:00:00Z'),
    retyped: [],
  };
}

const GRADE = { rotorMassKg: 300, speedRpm: 2000, planeRadiiMm: [200] };

describe('verdictOf', () => {
  it('converts a shop target to the job’s unit and names the worse side first', () => {
    const latest = run('initial', {
      left: { amplitude: 3, phaseDeg: 0 },
      right: { amplitude: 5, phaseDeg: 0 },
    });
    const verdict = verdictOf(
      latest,
      { kind: 'shop-target', amplitude: 0.15, unit: 'in/s-pk' },
      SETUP,
      GRADE,
      [],
    );
    const limit = convertVibration(0.15, 'in/s-pk', 'mm/s-rms');
    expect(verdict.sides.map((side) => side.limit)).toEqual([limit, limit]);
    expect(verdict.accepted).toBe(false);
    expect(verdict.nextSide).toBe('right');
    expect(verdict.why).toMatch(/right side reads 5 mm\/s-rms.*above the left side/);
  });

  it('reads a severity zone as its upper bound in mm/s RMS', () => {
    const latest = run('verification', { left: { amplitude: 2.7, phaseDeg: 0 } });
    const zoneB = verdictOf(
      latest,
      { kind: 'severity-zone', zone: 'B', group: 2, foundation: 'rigid' },
      SETUP,
      GRADE,
      [],
    );
    expect(zoneB.sides[0]!.limit).toBeCloseTo(2.8, 12);
    expect(zoneB.accepted).toBe(true);
    expect(zoneB.nextSide).toBeNull();
    const zoneA = verdictOf(
      latest,
      { kind: 'severity-zone', zone: 'A', group: 2, foundation: 'rigid' },
      SETUP,
      GRADE,
      [],
    );
    expect(zoneA.accepted).toBe(false);
  });

  it('reads a balance grade through the measured coefficient, and cannot judge without one', () => {
    const latest = run('verification', { left: { amplitude: 0.5, phaseDeg: 0 } });
    const level = { kind: 'balance-grade', grade: 'G16' } as const;
    const unjudged = verdictOf(latest, level, SETUP, GRADE, []);
    expect(unjudged.sides[0]!.limit).toBeNull();
    expect(unjudged.why).toMatch(/cannot be judged/);
    const correction = {
      basis: 'trial',
      method: 'single-plane',
      calc: { route: 'single-plane', request: {}, sensorSides: ['left'] },
      result: { influenceCoefficient: { amplitudePerMass: 0.01, phaseDeg: 30 } },
      plan: [{ planeIndex: 0, massGrams: 10, angleDeg: 0 }],
    } as unknown as CorrectionRow;
    const judged = verdictOf(latest, level, SETUP, GRADE, [correction]);
    const permissibleGmm = balanceTolerance({
      grade: 'G16',
      rotorMassKg: 300,
      speedRpm: 2000,
    }).permissibleUnbalanceGmm;
    expect(judged.sides[0]!.limit).toBeCloseTo((permissibleGmm / 200) * 0.01, 9);
  });
});

describe('corrections from stored runs', () => {
  const rotor: ModelRotor = {
    initial: [{ amplitude: 4, phaseDeg: 100 }],
    coefficients: [[{ amplitudePerMass: 0.05, phaseDeg: 45 }]],
  };
  const trialWeight = { planeIndex: 0, massGrams: 40, angleDeg: 90 };

  it('counts an instrument’s lead as a lag for the engine, and predicts in the instrument’s counting', () => {
    const lead: StoredSetup = { ...SETUP, phaseSense: 'lead' };
    const asLead = (reading: { amplitude: number; phaseDeg: number }) => ({
      amplitude: reading.amplitude,
      phaseDeg: (360 - reading.phaseDeg) % 360,
    });
    const initial = run('initial', { left: asLead(rotor.initial[0]!) });
    const trial = run('trial', { left: asLead(modelReadings(rotor, [trialWeight])[0]!) }, { trialWeight });
    const runs = [initial, trial];
    const computed = computeCorrection({
      method: 'single-plane',
      setup: lead,
      planeRadiiMm: [200],
      runs,
      corrections: [],
      familySensitivities: [],
    });
    expect(modelReadings(rotor, computed.plan)[0]!.amplitude).toBeLessThan(1e-9);
    const half = {
      ...computed.plan[0]!,
      massGrams: computed.plan[0]!.massGrams / 2,
      radiusMm: 200,
      fixing: 'welded' as const,
    };
    const predicted = predictInstalled({ ...computed, runIds: computed.runIds }, [half], runs, lead, [200]);
    const modelled = modelReadings(rotor, [half])[0]!;
    expect(predicted[0]!.reading.amplitude).toBeCloseTo(modelled.amplitude, 9);
    expect(predicted[0]!.reading.phaseDeg).toBeCloseTo((360 - modelled.phaseDeg) % 360, 6);
  });

  it('refuses a correction while fitted weights have not been run, and one without its trial', () => {
    const initial = run('initial', { left: rotor.initial[0]! });
    const fitted = {
      id: 1,
      installed: [{ planeIndex: 0, massGrams: 20, angleDeg: 10, radiusMm: 200, fixing: 'bolted' }],
    } as unknown as CorrectionRow;
    const attempt = (corrections: CorrectionRow[], method: 'single-plane' | 'one-run') => () =>
      computeCorrection({
        method,
        setup: SETUP,
        planeRadiiMm: [200],
        runs: [initial],
        corrections,
        familySensitivities: [],
      });
    expect(attempt([fitted], 'single-plane')).toThrow(/verification run/);
    expect(attempt([], 'single-plane')).toThrow(JobChangeRefusal);
    expect(attempt([], 'single-plane')).toThrow(/trial run/);
    expect(attempt([], 'one-run')).toThrow(/no stored sensitivity/);
  });

  it('warns of repeats that disagree and a speed that drifted', () => {
    const averaged = averageRun(
      [
        {
          sensorSide: 'left',
          repeats: [
            { amplitude: 1, phaseDeg: 0, speedRpm: 2100 },
            { amplitude: 1, phaseDeg: 180, speedRpm: 2100 },
          ],
        },
      ],
      2000,
    );
    expect(averaged.readings[0]!.trusted).toBe(false);
    expect(averaged.warnings).toHaveLength(2);
    expect(averaged.warnings[1]).toMatch(/5.0 %/);
  });
});

describe('refinedSensitivities', () => {
  it('keeps the stored unit, converts the jobs’ coefficients to it, and leaves other figures alone', () => {
    const stored = [
      {
        sensorSide: 'left' as const,
        planeIndex: 0,
        gramsPerUnit: 600,
        unit: 'in/s-pk' as const,
        phaseLagDeg: 40,
        jobCount: 0,
        spread: null,
      },
      {
        sensorSide: 'right' as const,
        planeIndex: 1,
        gramsPerUnit: 640,
        unit: 'in/s-pk' as const,
        phaseLagDeg: 35,
        jobCount: 0,
        spread: null,
      },
    ];
    const perGramMmS = convertVibration(1 / 500, 'in/s-pk', 'mm/s-rms');
    const refined = refinedSensitivities(
      stored,
      [
        { sensorSide: 'left', planeIndex: 0, amplitudePerGram: perGramMmS, phaseDeg: 30, unit: 'mm/s-rms' },
        { sensorSide: 'left', planeIndex: 0, amplitudePerGram: 1 / 500, phaseDeg: 30, unit: 'in/s-pk' },
      ],
      'mm/s-rms',
    );
    expect(refined).toHaveLength(2);
    const left = refined.find((figure) => figure.sensorSide === 'left')!;
    expect(left.unit).toBe('in/s-pk');
    expect(left.gramsPerUnit).toBeCloseTo(500, 9);
    expect(left.phaseLagDeg).toBeCloseTo(30, 9);
    expect(left.jobCount).toBe(2);
    expect(left.spread?.massPercent).toBeCloseTo(0, 9);
    expect(refined.find((figure) => figure.sensorSide === 'right')).toEqual(stored[1]);
  });
});
