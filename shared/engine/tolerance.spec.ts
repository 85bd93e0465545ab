import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { EngineError } from './errors';
import {
  BALANCE_GRADES,
  balanceTolerance,
  findBalanceGrade,
  STANDARD_GRAVITY,
  trialWeightSize,
} from './tolerance';

describe('balanceTolerance', () => {
  it('gives U_per = 9549 G m / n and the specific unbalance', () => {
    const r = balanceTolerance({ grade: 'G6.3', rotorMassKg: 100, speedRpm: 3000 });
    expect(r.permissibleUnbalanceGmm).toBeCloseTo(((60000 / (2 * Math.PI)) * 6.3 * 100) / 3000, 9);
    expect(r.specificUnbalanceUm).toBeCloseTo(r.permissibleUnbalanceGmm / 100, 12);
    expect(r.planes.map((p) => p.permissibleUnbalanceGmm)).toEqual([
      r.permissibleUnbalanceGmm / 2,
      r.permissibleUnbalanceGmm / 2,
    ]);
  });

  it('allocates by the lever rule within 30 % to 70 %, and judges a residual', () => {
    const r = balanceTolerance({
      grade: 'G 16',
      rotorMassKg: 400,
      speedRpm: 2000,
      radiusMm: 250,
      bearingDistancesMm: { a: 600, b: 900 },
      residualUnbalanceGmm: 1000,
    });
    expect(r.planes[0]!.permissibleUnbalanceGmm / r.permissibleUnbalanceGmm).toBeCloseTo(0.6, 12);
    expect(r.massAtRadiusGrams).toBeCloseTo(r.permissibleUnbalanceGmm / 250, 12);
    expect(r.pass).toBe(true);
    const edge = balanceTolerance({
      grade: 'G16',
      rotorMassKg: 400,
      speedRpm: 2000,
      bearingDistancesMm: { a: 50, b: 950 },
    });
    expect(edge.planes[0]!.permissibleUnbalanceGmm / edge.permissibleUnbalanceGmm).toBeCloseTo(0.7, 12);
    expect(edge.warnings.length).toBe(1);
    expect(
      balanceTolerance({ grade: 'G16', rotorMassKg: 400, speedRpm: 2000, residualUnbalanceGmm: 1e6 }).pass,
    ).toBe(false);
  });

  it('scales with mass and inversely with speed (property)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...BALANCE_GRADES.map((g) => g.grade)),
        fc.double({ min: 1, max: 1e4, noNaN: true }),
        fc.double({ min: 100, max: 30000, noNaN: true }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        (grade, m, n, k) => {
          const a = balanceTolerance({ grade, rotorMassKg: m, speedRpm: n }).permissibleUnbalanceGmm;
          expect(
            balanceTolerance({ grade, rotorMassKg: m * k, speedRpm: n }).permissibleUnbalanceGmm / a,
          ).toBeCloseTo(k, 9);
          expect(
            balanceTolerance({ grade, rotorMassKg: m, speedRpm: n * k }).permissibleUnbalanceGmm / a,
          ).toBeCloseTo(1 / k, 9);
        },
      ),
    );
  });

  it('refuses unknown grades, negative masses and zero speed', () => {
    expect(() => findBalanceGrade('G7')).toThrowError(EngineError);
    expect(() => balanceTolerance({ grade: 'G6.3', rotorMassKg: -1, speedRpm: 1000 })).toThrowError(
      /rotorMassKg/,
    );
    expect(() => balanceTolerance({ grade: 'G6.3', rotorMassKg: 1, speedRpm: 0 })).toThrowError(/speedRpm/);
  });
});

describe('trialWeightSize', () => {
  it('makes a trial weight whose centrifugal force is 10 % of the rotor weight', () => {
    const r = trialWeightSize({ rotorMassKg: 300, speedRpm: 2200, radiusMm: 250 });
    const omega = (2 * Math.PI * 2200) / 60;
    expect(r.forceN).toBeCloseTo(0.1 * 300 * STANDARD_GRAVITY, 9);
    expect((r.massGrams / 1000) * 0.25 * omega * omega).toBeCloseTo(r.forceN, 9);
    expect(r.unbalanceGmm).toBeCloseTo(r.massGrams * 250, 9);
    expect(
      trialWeightSize({ rotorMassKg: 300, speedRpm: 2200, radiusMm: 250, forceFraction: 0.2 }).massGrams,
    ).toBeCloseTo(2 * r.massGrams, 9);
    expect(() => trialWeightSize({ rotorMassKg: 300, speedRpm: Number.NaN, radiusMm: 250 })).toThrowError(
      EngineError,
    );
  });
});
