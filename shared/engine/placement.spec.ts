import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { EngineError } from './errors';
import { add, angleDifferenceDeg, magnitude, phasor, subtract } from './phasor';
import { combineWeights, moveToRadius, splitWeight, suggestStockWeights } from './placement';

describe('splitWeight', () => {
  it('splits between the two nearest positions and adds back to the weight (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1000, noNaN: true }),
        fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true }),
        fc.integer({ min: 3, max: 36 }),
        fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true }),
        (mass, angle, count, first) => {
          const r = splitWeight({ weight: { mass, angleDeg: angle }, positions: { count, firstDeg: first } });
          const sum = r.weights.reduce((s, w) => add(s, phasor(w.mass, w.angleDeg)), { re: 0, im: 0 });
          expect(magnitude(subtract(sum, phasor(mass, angle))) / mass).toBeLessThan(1e-9);
          for (const w of r.weights) expect(w.mass).toBeGreaterThanOrEqual(0);
        },
      ),
    );
  });

  it('keeps a weight on a position or inside an allowed sector whole', () => {
    expect(splitWeight({ weight: { mass: 10, angleDeg: 90 }, positionsDeg: [0, 90, 180] }).weights).toEqual([
      { mass: 10, angleDeg: 90 },
    ]);
    expect(
      splitWeight({ weight: { mass: 10, angleDeg: 20 }, sectors: [{ fromDeg: 350, toDeg: 30 }] }).weights,
    ).toEqual([{ mass: 10, angleDeg: 20 }]);
  });

  it('splits to the edges of the nearest sectors', () => {
    const r = splitWeight({
      weight: { mass: 10, angleDeg: 60 },
      sectors: [
        { fromDeg: 0, toDeg: 40 },
        { fromDeg: 80, toDeg: 120 },
      ],
    });
    expect(r.weights.map((w) => w.angleDeg)).toEqual([40, 80]);
    expect(r.weights[0]!.mass).toBeCloseTo(r.weights[1]!.mass, 9);
  });

  it('refuses places 180 degrees or more apart and mixed ways of giving them', () => {
    expect(() => splitWeight({ weight: { mass: 10, angleDeg: 90 }, positionsDeg: [0, 180] })).toThrowError(
      /180 degrees/,
    );
    expect(() =>
      splitWeight({
        weight: { mass: 10, angleDeg: 90 },
        positionsDeg: [0],
        positions: { count: 4, firstDeg: 0 },
      }),
    ).toThrowError(EngineError);
    expect(() => splitWeight({ weight: { mass: -10, angleDeg: 90 }, positionsDeg: [0, 120] })).toThrowError(
      /negative/,
    );
  });
});

describe('combineWeights and moveToRadius', () => {
  it('combines weights at their radii into one', () => {
    const r = combineWeights({
      weights: [
        { mass: 10, angleDeg: 0, radius: 200 },
        { mass: 20, angleDeg: 90, radius: 100 },
      ],
      radius: 200,
    });
    expect(r.weight.mass).toBeCloseTo(Math.SQRT2 * 10, 9);
    expect(r.weight.angleDeg).toBeCloseTo(45, 9);
    expect(r.weight.radius).toBe(200);
    const same = combineWeights({
      weights: [
        { mass: 3, angleDeg: 10 },
        { mass: 3, angleDeg: 190 },
      ],
    });
    expect(same.weight.mass).toBeCloseTo(0, 12);
    expect(() =>
      combineWeights({
        weights: [
          { mass: 1, angleDeg: 0, radius: 1 },
          { mass: 1, angleDeg: 0 },
        ],
      }),
    ).toThrowError(EngineError);
  });

  it('moves a weight to another radius keeping m r, and round-trips (property)', () => {
    expect(moveToRadius({ mass: 30, fromRadius: 200, toRadius: 300 }).mass).toBeCloseTo(20, 12);
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e4, noNaN: true }),
        fc.double({ min: 1, max: 1e3, noNaN: true }),
        fc.double({ min: 1, max: 1e3, noNaN: true }),
        (m, r1, r2) => {
          const there = moveToRadius({ mass: m, fromRadius: r1, toRadius: r2 }).mass;
          expect(moveToRadius({ mass: there, fromRadius: r2, toRadius: r1 }).mass).toBeCloseTo(m, 6);
        },
      ),
    );
    expect(() => moveToRadius({ mass: 1, fromRadius: 0, toRadius: 1 })).toThrowError(EngineError);
  });
});

describe('suggestStockWeights', () => {
  it('finds the nearest combination and the residual it leaves', () => {
    const r = suggestStockWeights({ weight: { mass: 73, angleDeg: 100 }, stockMasses: [10, 25, 50] });
    expect(r.placed.mass).toBe(75);
    expect(r.pieces.map((p) => p.mass).sort((a, b) => a - b)).toEqual([25, 50]);
    expect(r.residual.mass).toBeCloseTo(2, 12);
    expect(Math.abs(angleDifferenceDeg(r.residual.angleDeg, 280))).toBeLessThan(1e-9);
    const one = suggestStockWeights({
      weight: { mass: 12, angleDeg: 0 },
      stockMasses: [10, 25],
      maxPieces: 1,
    });
    expect(one.pieces).toEqual([{ mass: 10, angleDeg: 0 }]);
    expect(() => suggestStockWeights({ weight: { mass: 12, angleDeg: 0 }, stockMasses: [] })).toThrowError(
      EngineError,
    );
  });
});
