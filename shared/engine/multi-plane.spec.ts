import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { EngineError } from './errors';
import { multiPlaneBalance, type BalanceRun } from './multi-plane';
import { add, angleDifferenceDeg, magnitude, multiply, phasor, phasorToReading, type Phasor } from './phasor';

const amp = fc.double({ min: 0.1, max: 20, noNaN: true });
const ang = fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true });

/** A modelled m-sensor, n-plane rotor: r = r0 + A w. */
function rotor(r0: Phasor[], a: Phasor[][]) {
  const read = (w: Phasor[]) =>
    r0.map((z, i) => phasorToReading(w.reduce((s, wj, j) => add(s, multiply(a[i]![j]!, wj)), z)));
  return { read };
}

function solveModelled(
  r0: Phasor[],
  a: Phasor[][],
  trials: { plane: number; mass: number; angleDeg: number }[][],
) {
  const n = a[0]!.length;
  const m = rotor(r0, a);
  const runs: BalanceRun[] = trials.map((weights) => {
    const w = Array.from({ length: n }, () => ({ re: 0, im: 0 }) as Phasor);
    for (const x of weights) w[x.plane - 1] = add(w[x.plane - 1]!, phasor(x.mass, x.angleDeg));
    return { weights, readings: m.read(w) };
  });
  return { runs, initial: r0.map(phasorToReading), read: m.read };
}

const wellSeparated = [
  [phasor(1, 30), phasor(0.3, 200)],
  [phasor(0.25, 100), phasor(0.9, 300)],
];

describe('multiPlaneBalance', () => {
  it('cancels the modelled vibration with two planes and two sensors (property)', () => {
    fc.assert(
      fc.property(amp, ang, amp, ang, ang, ang, (a1, p1, a2, p2, t1, t2) => {
        const r0 = [phasor(a1, p1), phasor(a2, p2)];
        const s = solveModelled(r0, wellSeparated, [
          [{ plane: 1, mass: 5, angleDeg: t1 }],
          [{ plane: 2, mass: 5, angleDeg: t2 }],
        ]);
        const r = multiPlaneBalance({ planes: 2, initial: s.initial, runs: s.runs });
        const after = s.read(r.corrections.map((c) => phasor(c.mass, c.angleDeg)));
        const worst = Math.max(...after.map((x) => x.amplitude));
        expect(worst / Math.max(a1, a2)).toBeLessThan(1e-9);
        expect(r.conditionNumber).toBeGreaterThan(1);
      }),
    );
  });

  it('handles trial weights left on: toAdd plus the last run weights equals the correction', () => {
    const r0 = [phasor(6, 40), phasor(3, 250)];
    const s = solveModelled(r0, wellSeparated, [
      [{ plane: 1, mass: 4, angleDeg: 0 }],
      [
        { plane: 1, mass: 4, angleDeg: 0 },
        { plane: 2, mass: 6, angleDeg: 90 },
      ],
    ]);
    const r = multiPlaneBalance({ planes: 2, initial: s.initial, runs: s.runs });
    const lastPlane2 = add(phasor(6, 90), phasor(r.toAdd[1]!.mass, r.toAdd[1]!.angleDeg));
    expect(
      magnitude(add(lastPlane2, phasor(-r.corrections[1]!.mass, r.corrections[1]!.angleDeg))),
    ).toBeLessThan(1e-9);
    const after = s.read(r.corrections.map((c) => phasor(c.mass, c.angleDeg)));
    expect(Math.max(...after.map((x) => x.amplitude))).toBeLessThan(1e-9);
  });

  it('solves by least squares with more sensors than planes and predicts the residual per sensor', () => {
    const a = [
      [phasor(1, 30), phasor(0.3, 200)],
      [phasor(0.25, 100), phasor(0.9, 300)],
      [phasor(0.5, 10), phasor(0.5, 170)],
    ];
    const r0 = [phasor(5, 10), phasor(4, 200), phasor(2, 90)];
    const s = solveModelled(r0, a, [
      [{ plane: 1, mass: 3, angleDeg: 0 }],
      [{ plane: 2, mass: 3, angleDeg: 0 }],
      [{ plane: 1, mass: 3, angleDeg: 180 }],
    ]);
    const r = multiPlaneBalance({ planes: 2, initial: s.initial, runs: s.runs });
    const after = s.read(r.corrections.map((c) => phasor(c.mass, c.angleDeg)));
    after.forEach((x, i) => {
      expect(x.amplitude).toBeCloseTo(r.predictedResidual[i]!.amplitude, 9);
    });
    expect(r.influenceCoefficients).toHaveLength(6);
  });

  it('rotating every input angle by t rotates every output angle by t (property)', () => {
    fc.assert(
      fc.property(amp, ang, amp, ang, ang, (a1, p1, a2, p2, t) => {
        const r0 = [phasor(a1, p1), phasor(a2, p2)];
        const s = solveModelled(r0, wellSeparated, [
          [{ plane: 1, mass: 5, angleDeg: 10 }],
          [{ plane: 2, mass: 5, angleDeg: 200 }],
        ]);
        const base = multiPlaneBalance({ planes: 2, initial: s.initial, runs: s.runs });
        const turn = multiPlaneBalance({
          planes: 2,
          initial: s.initial.map((x) => ({ ...x, phaseDeg: x.phaseDeg + t })),
          runs: s.runs.map((run) => ({
            weights: run.weights.map((w) => ({ ...w, angleDeg: w.angleDeg + t })),
            readings: run.readings.map((x) => ({ ...x, phaseDeg: x.phaseDeg + t })),
          })),
        });
        base.corrections.forEach((c, j) => {
          expect(turn.corrections[j]!.mass / c.mass).toBeCloseTo(1, 8);
          expect(Math.abs(angleDifferenceDeg(c.angleDeg + t, turn.corrections[j]!.angleDeg))).toBeLessThan(
            1e-6,
          );
        });
      }),
    );
  });

  it('refuses fewer runs than planes, fewer sensors than planes, and runs that do not separate the planes', () => {
    const s = solveModelled([phasor(5, 10), phasor(4, 200)], wellSeparated, [
      [{ plane: 1, mass: 3, angleDeg: 0 }],
      [{ plane: 1, mass: 3, angleDeg: 90 }],
    ]);
    expect(() => multiPlaneBalance({ planes: 2, initial: s.initial, runs: s.runs.slice(0, 1) })).toThrowError(
      /at least 2 trial runs/,
    );
    expect(() => multiPlaneBalance({ planes: 2, initial: s.initial.slice(0, 1), runs: s.runs })).toThrowError(
      EngineError,
    );
    try {
      multiPlaneBalance({ planes: 2, initial: s.initial, runs: s.runs });
      expect.unreachable();
    } catch (e) {
      expect((e as EngineError).code).toBe('RUNS_DO_NOT_SEPARATE_PLANES');
    }
  });

  it('refuses an ill-conditioned system and warns on a poorly separated one', () => {
    const nearlySame = [
      [phasor(1, 30), phasor(1, 30.01)],
      [phasor(1, 100), phasor(1, 100.01)],
    ];
    const s = solveModelled([phasor(5, 10), phasor(4, 200)], nearlySame, [
      [{ plane: 1, mass: 3, angleDeg: 0 }],
      [{ plane: 2, mass: 3, angleDeg: 0 }],
    ]);
    try {
      multiPlaneBalance({ planes: 2, initial: s.initial, runs: s.runs });
      expect.unreachable();
    } catch (e) {
      expect((e as EngineError).code).toBe('ILL_CONDITIONED');
      expect((e as EngineError).message).toMatch(/cannot tell the planes apart/);
    }
    const poor = [
      [phasor(1, 30), phasor(1, 45)],
      [phasor(1, 100), phasor(1, 125)],
    ];
    const p = solveModelled([phasor(5, 10), phasor(4, 200)], poor, [
      [{ plane: 1, mass: 3, angleDeg: 0 }],
      [{ plane: 2, mass: 3, angleDeg: 0 }],
    ]);
    const r = multiPlaneBalance({ planes: 2, initial: p.initial, runs: p.runs });
    expect(r.conditionNumber).toBeGreaterThan(10);
    expect(r.warnings.join(' ')).toMatch(/poorly separated/);
  });

  it('refuses a plane whose trial weight changed nothing, bad plane numbers and NaN', () => {
    const zero = [
      [phasor(1, 30), phasor(0, 0)],
      [phasor(0.2, 100), phasor(0, 0)],
    ];
    const s = solveModelled([phasor(5, 10), phasor(4, 200)], zero, [
      [{ plane: 1, mass: 3, angleDeg: 0 }],
      [{ plane: 2, mass: 3, angleDeg: 0 }],
    ]);
    expect(() => multiPlaneBalance({ planes: 2, initial: s.initial, runs: s.runs })).toThrowError(
      /plane 2 did not change/,
    );
    const bad = structuredClone(s.runs);
    bad[0]!.weights[0]!.plane = 3;
    expect(() => multiPlaneBalance({ planes: 2, initial: s.initial, runs: bad })).toThrowError(
      /runs\[0\]\.weights\[0\]\.plane/,
    );
    const nan = structuredClone(s.runs);
    nan[1]!.readings[0]!.amplitude = Number.NaN;
    try {
      multiPlaneBalance({ planes: 2, initial: s.initial, runs: nan });
    } catch (e) {
      expect((e as EngineError).field).toBe('runs[1].readings[0].amplitude');
    }
  });
});
