/**
 * Cross-checks against general-purpose reference libraries: mathjs (complex arithmetic, linear solve, median
 * and median absolute deviation) and ml-matrix (SVD, condition number, pseudo-inverse). They share no code
 * with the engine.
 */
import fc from 'fast-check';
import { complex, divide, lusolve, mad, median, subtract, unaryMinus, type Complex } from 'mathjs';
import { Matrix, pseudoInverse, SVD } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import {
  add,
  complexMatrix,
  conditionNumber,
  modifiedZScores,
  multiPlaneBalance,
  multiply as mul,
  phasor,
  phasorToReading,
  singlePlaneBalance,
} from '@counterpoise/engine';

const mod = (z: Complex): number => Math.hypot(z.re, z.im);
const c = (a: number, deg: number): Complex => complex({ r: a, phi: (deg * Math.PI) / 180 });
const amp = fc.double({ min: 0.1, max: 20, noNaN: true });
const ang = fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true });

describe('single plane against mathjs complex arithmetic', () => {
  it('H = (V1 - V0) / T and U = -V0 / H match (property)', () => {
    fc.assert(
      fc.property(amp, ang, amp, ang, amp, ang, (a0, p0, a1, p1, tm, ta) => {
        if (
          Math.hypot(
            a1 * Math.cos((p1 * Math.PI) / 180) - a0 * Math.cos((p0 * Math.PI) / 180),
            a1 * Math.sin((p1 * Math.PI) / 180) - a0 * Math.sin((p0 * Math.PI) / 180),
          ) < 1e-3
        )
          return;
        const r = singlePlaneBalance({
          initial: { amplitude: a0, phaseDeg: p0 },
          trialWeight: { mass: tm, angleDeg: ta },
          withTrial: { amplitude: a1, phaseDeg: p1 },
        });
        const h = divide(subtract(c(a1, p1), c(a0, p0)), c(tm, ta)) as Complex;
        const u = unaryMinus(divide(c(a0, p0), h)) as Complex;
        const ref = complex(u);
        const got = c(r.correction.mass, r.correction.angleDeg);
        expect(mod(subtract(got, ref) as Complex) / mod(ref)).toBeLessThan(1e-9);
        expect(Math.abs(r.influenceCoefficient.amplitudePerMass - mod(h)) / mod(h)).toBeLessThan(1e-9);
      }),
    );
  });
});

describe('multi-plane against mathjs lusolve and ml-matrix', () => {
  it('two planes, two sensors: the same correction as mathjs lusolve on A c = -r0 (property)', () => {
    fc.assert(
      fc.property(amp, ang, amp, ang, ang, ang, (a1, p1, a2, p2, q1, q2) => {
        const A = [
          [phasor(1, 30 + q1), phasor(0.3, 200)],
          [phasor(0.25, 100), phasor(0.9, 300 + q2)],
        ];
        if (Math.abs(q1 - q2) < 1) return;
        const r0 = [phasor(a1, p1), phasor(a2, p2)];
        const read = (w: ReturnType<typeof phasor>[]) =>
          r0.map((z, i) => phasorToReading(add(z, add(mul(A[i]![0]!, w[0]!), mul(A[i]![1]!, w[1]!)))));
        const runs = [
          { weights: [{ plane: 1, mass: 2, angleDeg: 0 }], readings: read([phasor(2, 0), phasor(0, 0)]) },
          { weights: [{ plane: 2, mass: 2, angleDeg: 0 }], readings: read([phasor(0, 0), phasor(2, 0)]) },
        ];
        const r = multiPlaneBalance({
          planes: 2,
          initial: r0.map(phasorToReading),
          runs,
          maxConditionNumber: 1e6,
        });
        const Am = A.map((row) => row.map((z) => complex(z.re, z.im)));
        const x = lusolve(
          Am,
          r0.map((z) => [complex(-z.re, -z.im)]),
        ) as unknown as Complex[][];
        r.corrections.forEach((w, j) => {
          const ref = complex(x[j]![0]!);
          expect(mod(subtract(c(w.mass, w.angleDeg), ref) as Complex)).toBeLessThan(
            1e-9 * Math.max(1, mod(ref)),
          );
        });
      }),
    );
  });

  it('condition number and least squares match ml-matrix SVD and pseudo-inverse on the real embedding (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 24, maxLength: 24 }),
        (v) => {
          const m = 4;
          const n = 3;
          const a = complexMatrix(m, n);
          for (let k = 0; k < m * n; k++) {
            a.re[k] = v[k]!;
            a.im[k] = v[k + 12]!;
          }
          const real = new Matrix(2 * m, 2 * n);
          for (let i = 0; i < m; i++) {
            for (let j = 0; j < n; j++) {
              real.set(i, j, a.re[i * n + j]!);
              real.set(i + m, j, a.im[i * n + j]!);
              real.set(i, j + n, -a.im[i * n + j]!);
              real.set(i + m, j + n, a.re[i * n + j]!);
            }
          }
          const svd = new SVD(real, { autoTranspose: true });
          const ref = svd.condition;
          if (!Number.isFinite(ref) || ref > 1e8) return;
          const mine = conditionNumber(a);
          expect(Math.abs(mine - ref) / ref).toBeLessThan(1e-8);
          const pinv = pseudoInverse(real);
          expect(pinv.rows).toBe(2 * n);
        },
      ),
    );
  });

  it('three sensors, two planes: the least-squares correction equals ml-matrix pseudo-inverse', () => {
    const A = [
      [phasor(1, 30), phasor(0.3, 200)],
      [phasor(0.25, 100), phasor(0.9, 300)],
      [phasor(0.5, 10), phasor(0.5, 170)],
    ];
    const r0 = [phasor(5, 10), phasor(4, 200), phasor(2, 90)];
    const read = (w: ReturnType<typeof phasor>[]) =>
      r0.map((z, i) => phasorToReading(add(z, add(mul(A[i]![0]!, w[0]!), mul(A[i]![1]!, w[1]!)))));
    const r = multiPlaneBalance({
      planes: 2,
      initial: r0.map(phasorToReading),
      runs: [
        { weights: [{ plane: 1, mass: 3, angleDeg: 0 }], readings: read([phasor(3, 0), phasor(0, 0)]) },
        { weights: [{ plane: 2, mass: 3, angleDeg: 0 }], readings: read([phasor(0, 0), phasor(3, 0)]) },
      ],
    });
    const real = new Matrix(6, 4);
    A.forEach((row, i) =>
      row.forEach((z, j) => {
        real.set(i, j, z.re);
        real.set(i + 3, j, z.im);
        real.set(i, j + 2, -z.im);
        real.set(i + 3, j + 2, z.re);
      }),
    );
    const rhs = Matrix.columnVector([...r0.map((z) => -z.re), ...r0.map((z) => -z.im)]);
    const x = pseudoInverse(real).mmul(rhs);
    r.corrections.forEach((w, j) => {
      const got = phasor(w.mass, w.angleDeg);
      expect(Math.hypot(got.re - x.get(j, 0), got.im - x.get(j + 2, 0))).toBeLessThan(1e-9);
    });
  });
});

describe('outlier scores against mathjs median and mad', () => {
  it('modified z-scores are 0.6745 (x - median) / MAD as mathjs computes them (property)', () => {
    // Iglewicz and Hoaglin (1993), section 3.3, define M_i with the median and the median absolute
    // deviation; mathjs computes both independently of the engine.
    fc.assert(
      fc.property(
        fc
          .uniqueArray(fc.integer({ min: -100_000, max: 100_000 }), { minLength: 3, maxLength: 40 })
          .map((values) => values.map((v) => v / 100)),
        (xs) => {
          const spread = mad(xs) as number;
          fc.pre(spread > 1e-9);
          const centre = median(xs) as number;
          modifiedZScores(xs).forEach((score, i) => {
            expect(score).toBeCloseTo((0.6745 * (xs[i]! - centre)) / spread, 9);
          });
        },
      ),
    );
  });
});
