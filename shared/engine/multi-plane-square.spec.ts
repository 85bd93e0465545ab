import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { WeightAngles } from './conventions';
import { conditionNumber, complexMatrix } from './linalg';
import {
  multiPlaneBalance,
  type MultiPlaneInput,
  type MultiPlaneResult,
  type PlaneWeight,
} from './multi-plane';
import { multiPlaneByLeastSquares } from './multi-plane-least-squares';
import { solveSquareTwoPlane } from './multi-plane-square';
import { add, magnitude, multiply, phasor, phasorToReading, type Phasor } from './phasor';

/** The benchmark's system (bench/engine/engine-inputs.ts): two planes, two sensors, one trial run per plane. */
const twoPlane: MultiPlaneInput = {
  planes: 2,
  initial: [
    { amplitude: 7.1, phaseDeg: 60 },
    { amplitude: 5.4, phaseDeg: 215 },
  ],
  runs: [
    {
      weights: [{ plane: 1, mass: 8, angleDeg: 270 }],
      readings: [
        { amplitude: 9.1, phaseDeg: 110 },
        { amplitude: 4.2, phaseDeg: 225 },
      ],
    },
    {
      weights: [{ plane: 2, mass: 10, angleDeg: 180 }],
      readings: [
        { amplitude: 6.0, phaseDeg: 35 },
        { amplitude: 2.2, phaseDeg: 160 },
      ],
    },
  ],
};

const amp = fc.double({ min: 0.1, max: 20, noNaN: true });
const ang = fc.double({ min: -720, max: 720, noNaN: true });
const coefficientAmp = fc.double({ min: 0.02, max: 3, noNaN: true });
const mass = fc.double({ min: 0.5, max: 50, noNaN: true });
const weightAngles = fc.constantFrom<WeightAngles | undefined>(undefined, 'againstRotation', 'withRotation');
const planeWeight = (plane: number) => fc.record({ plane: fc.constant(plane), mass, angleDeg: ang });

/**
 * The trial runs of a two-plane balance as technicians make them: one weight per plane and run, a run's weight
 * taken off or left on for the next, or several weights in one run.
 */
const trialRuns = fc.oneof(
  fc.tuple(planeWeight(1), planeWeight(2)).map(([a, b]) => [[a], [b]]),
  fc.tuple(planeWeight(1), planeWeight(2)).map(([a, b]) => [[a], [a, b]]),
  fc.tuple(planeWeight(1), planeWeight(2), planeWeight(2)).map(([a, b, c]) => [[a, b], [c]]),
  fc.tuple(planeWeight(2), planeWeight(1), planeWeight(1)).map(([a, b, c]) => [[a], [b, c]]),
);

/** A square two-plane system whose readings follow r_k = r_0 + A w_k (w_k as the engine models the weights). */
function modelled(
  r0: Phasor[],
  a: Phasor[][],
  runs: PlaneWeight[][],
  angles: WeightAngles | undefined,
): MultiPlaneInput {
  const s = angles === 'withRotation' ? -1 : 1;
  return {
    planes: 2,
    initial: r0.map(phasorToReading),
    weightAngles: angles,
    runs: runs.map((weights) => {
      const w = [0, 1].map((j) =>
        weights
          .filter((x) => x.plane === j + 1)
          .reduce((sum, x) => add(sum, phasor(x.mass, s * x.angleDeg)), { re: 0, im: 0 } as Phasor),
      );
      return {
        weights,
        readings: r0.map((z, i) =>
          phasorToReading(add(z, add(multiply(a[i]![0]!, w[0]!), multiply(a[i]![1]!, w[1]!)))),
        ),
      };
    }),
  };
}

function conditionOf(a: Phasor[][]): number {
  const m = complexMatrix(2, 2);
  a.flat().forEach((z, k) => {
    m.re[k] = z.re;
    m.im[k] = z.im;
  });
  return conditionNumber(m);
}

/** |x - y| of two weights as vectors (angle differences near 0/360 do not count as 360 degrees). */
function weightDistance(x: PlaneWeight, y: PlaneWeight): number {
  expect(x.plane).toBe(y.plane);
  return magnitude(add(phasor(x.mass, x.angleDeg), phasor(-y.mass, y.angleDeg)));
}

/**
 * The two answers agree to within rounding: every weight and coefficient as a vector to `rel` of the largest
 * of its kind, the condition number to `rel`, residuals (zero in exact arithmetic) below `rel` of the readings'
 * scale, and the same warnings.
 */
function expectSameAnswer(
  fast: MultiPlaneResult,
  general: MultiPlaneResult,
  scale: number,
  rel: number,
): void {
  const weightScale = Math.max(
    ...general.corrections.map((c) => c.mass),
    ...general.toAdd.map((c) => c.mass),
  );
  for (const k of [0, 1]) {
    expect(weightDistance(fast.corrections[k]!, general.corrections[k]!)).toBeLessThanOrEqual(
      rel * weightScale,
    );
    expect(weightDistance(fast.toAdd[k]!, general.toAdd[k]!)).toBeLessThanOrEqual(rel * weightScale);
    expect(fast.predictedResidual[k]!.amplitude).toBeLessThanOrEqual(rel * scale);
    expect(general.predictedResidual[k]!.amplitude).toBeLessThanOrEqual(rel * scale);
  }
  const coefficientScale = Math.max(...general.influenceCoefficients.map((c) => c.amplitudePerMass));
  fast.influenceCoefficients.forEach((c, k) => {
    const g = general.influenceCoefficients[k]!;
    expect([c.sensor, c.plane]).toEqual([g.sensor, g.plane]);
    const d = add(phasor(c.amplitudePerMass, c.phaseDeg), phasor(-g.amplitudePerMass, g.phaseDeg));
    expect(magnitude(d)).toBeLessThanOrEqual(rel * coefficientScale);
  });
  expect(Math.abs(fast.conditionNumber - general.conditionNumber)).toBeLessThanOrEqual(
    rel * general.conditionNumber,
  );
  expect(fast.warnings).toEqual(general.warnings);
}

/** What a call gave: its answer, or its error's name, code, message and field. */
function outcome(solve: () => MultiPlaneResult) {
  try {
    return { answer: solve() };
  } catch (e) {
    const { name, code, message, field } = e as {
      name: string;
      code?: string;
      message: string;
      field?: string;
    };
    return { error: { name, code, message, field } };
  }
}

/** The condition number of W, the runs' plane unbalances (runs as rows, planes as columns). */
function runsCondition(input: MultiPlaneInput): number {
  const s = input.weightAngles === 'withRotation' ? -1 : 1;
  const w = complexMatrix(2, 2);
  input.runs.forEach((run, k) =>
    run.weights.forEach((x) => {
      const z = phasor(x.mass, s * x.angleDeg);
      w.re[k * 2 + x.plane - 1]! += z.re;
      w.im[k * 2 + x.plane - 1]! += z.im;
    }),
  );
  return conditionNumber(w);
}

function readingScale(input: MultiPlaneInput): number {
  return Math.max(
    ...input.initial.map((r) => r.amplitude),
    ...input.runs.flatMap((r) => r.readings.map((x) => x.amplitude)),
  );
}

describe('square two-plane solve (closed form) against the general least-squares path', () => {
  it('takes the closed form for the benchmark system and gives the general path answer', () => {
    const fast = solveSquareTwoPlane(twoPlane);
    expect(fast).toBeDefined();
    expectSameAnswer(fast!, multiPlaneByLeastSquares(twoPlane), readingScale(twoPlane), 1e-12);
    expect(multiPlaneBalance(twoPlane)).toEqual(fast);
  });

  it('agrees with the general path on random well-conditioned systems (property)', () => {
    const coefficientMatrix = fc
      .tuple(coefficientAmp, ang, coefficientAmp, ang, coefficientAmp, ang, coefficientAmp, ang)
      .map(([a, p, b, q, c, r, d, t]) => [
        [phasor(a, p), phasor(b, q)],
        [phasor(c, r), phasor(d, t)],
      ])
      .filter((a) => conditionOf(a) < 200);
    fc.assert(
      fc.property(
        amp,
        ang,
        amp,
        ang,
        coefficientMatrix,
        trialRuns,
        weightAngles,
        (a1, p1, a2, p2, a, runs, angles) => {
          const input = modelled([phasor(a1, p1), phasor(a2, p2)], a, runs, angles);
          const general = multiPlaneByLeastSquares(input);
          const fast = solveSquareTwoPlane(input);
          expect(fast).toBeDefined();
          expectSameAnswer(fast!, general, readingScale(input), 1e-9);
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('gives exactly the general path outcome on any square system, ill-conditioned and singular ones too (property)', () => {
    // Nearly parallel columns of A (sensors that cannot tell the planes apart) down to exactly parallel, trial
    // weights of every size down to zero, both runs in the same plane, and limits set anywhere.
    // Sizes spread evenly over decades, so that the limits of the general path (1e-8, 1e-9, the condition
    // number limits) are crossed in both directions.
    // (fc.double draws evenly over the doubles, not over the range, so the exponent comes from an integer.)
    const small = (decades: number) =>
      fc.integer({ min: 0, max: 1_000_000 }).map((k) => 10 ** ((-decades * k) / 1_000_000));
    const nearlyParallel = fc
      .tuple(
        coefficientAmp,
        ang,
        coefficientAmp,
        ang,
        fc.oneof(small(8), fc.constant(0)),
        ang,
        coefficientAmp,
      )
      .map(([a, p, c, r, eps, t, k]) => [
        [phasor(a, p), add(multiply(phasor(a, p), phasor(k, t)), phasor(eps * a, r))],
        [phasor(c, r), multiply(phasor(c, r), phasor(k, t))],
      ]);
    // One plane's trial weight, or both, hardly felt by the sensors.
    const feeble = fc
      .tuple(
        coefficientAmp,
        ang,
        coefficientAmp,
        ang,
        coefficientAmp,
        ang,
        coefficientAmp,
        ang,
        small(14),
        fc.boolean(),
      )
      .map(([a, p, b, q, c, r, d, t, eps, both]) => [
        [phasor(both ? eps * a : a, p), phasor(eps * b, q)],
        [phasor(both ? eps * c : c, r), phasor(eps * d, t)],
      ]);
    const anyMass = fc.oneof(mass, fc.constant(0), small(14));
    const anyRuns = fc
      .tuple(fc.constantFrom(1, 2), anyMass, ang, fc.constantFrom(1, 2), anyMass, ang)
      .map(([j1, m1, t1, j2, m2, t2]) => [
        [{ plane: j1, mass: m1, angleDeg: t1 }],
        [{ plane: j2, mass: m2, angleDeg: t2 }],
      ]);
    // The second run repeats the first run's weights, scaled, with one plane's weight a little changed: runs
    // that hardly separate the planes.
    const hardlySeparating = fc
      .tuple(mass, ang, mass, ang, fc.double({ min: 0.1, max: 10, noNaN: true }), small(12))
      .map(([m1, t1, m2, t2, k, eps]) => [
        [
          { plane: 1, mass: m1, angleDeg: t1 },
          { plane: 2, mass: m2, angleDeg: t2 },
        ],
        [
          { plane: 1, mass: k * m1, angleDeg: t1 },
          { plane: 2, mass: k * m2 * (1 + eps), angleDeg: t2 },
        ],
      ]);
    const limit = fc.option(fc.double({ min: 1, max: 5000, noNaN: true }), { nil: undefined });
    fc.assert(
      fc.property(
        amp,
        ang,
        amp,
        ang,
        fc.oneof(nearlyParallel, feeble),
        fc.oneof(anyRuns, trialRuns, hardlySeparating),
        weightAngles,
        limit,
        limit,
        (a1, p1, a2, p2, a, runs, angles, maxCond, warnCond) => {
          const input = {
            ...modelled([phasor(a1, p1), phasor(a2, p2)], a, runs, angles),
            maxConditionNumber: maxCond,
            warnConditionNumber: warnCond,
          };
          const general = outcome(() => multiPlaneByLeastSquares(input));
          const used = outcome(() => multiPlaneBalance(input));
          if (general.error || used.error) {
            expect(used.error).toEqual(general.error);
            expect(solveSquareTwoPlane(input)).toBeUndefined();
            return;
          }
          // Rounding grows with the condition numbers of A and of the runs' weights W: eps cond(A) cond(W), with room.
          const tolerance = 1e-12 * general.answer!.conditionNumber * runsCondition(input);
          expectSameAnswer(used.answer!, general.answer!, readingScale(input), Math.max(1e-12, tolerance));
        },
      ),
      { numRuns: 5000 },
    );
  });

  it('leaves the refusals to the general path, with its codes, messages and fields', () => {
    const base = modelled(
      [phasor(5, 10), phasor(4, 200)],
      [
        [phasor(1, 30), phasor(0.3, 200)],
        [phasor(0.25, 100), phasor(0.9, 300)],
      ],
      [[{ plane: 1, mass: 3, angleDeg: 0 }], [{ plane: 2, mass: 3, angleDeg: 90 }]],
      undefined,
    );
    const cases: [string, MultiPlaneInput][] = [
      [
        'both runs in plane 1',
        { ...base, runs: base.runs.map((r) => ({ ...r, weights: [{ plane: 1, mass: 3, angleDeg: 0 }] })) },
      ],
      [
        'a trial weight that changed nothing',
        { ...base, runs: [base.runs[0]!, { ...base.runs[1]!, readings: base.initial }] },
      ],
      [
        'sensors that cannot tell the planes apart',
        modelled(
          [phasor(5, 10), phasor(4, 200)],
          [
            [phasor(1, 30), phasor(1, 30.01)],
            [phasor(1, 100), phasor(1, 100.01)],
          ],
          [[{ plane: 1, mass: 3, angleDeg: 0 }], [{ plane: 2, mass: 3, angleDeg: 0 }]],
          undefined,
        ),
      ],
      ['a limit below the condition number', { ...base, maxConditionNumber: 1 }],
      ['a NaN amplitude', { ...base, initial: [{ amplitude: Number.NaN, phaseDeg: 0 }, base.initial[1]!] }],
      ['a negative amplitude', { ...base, initial: [base.initial[0]!, { amplitude: -1, phaseDeg: 0 }] }],
      ['an infinite phase', { ...base, initial: [{ amplitude: 1, phaseDeg: Infinity }, base.initial[1]!] }],
      [
        'a reading missing',
        { ...base, runs: [{ ...base.runs[0]!, readings: [base.initial[0]!] }, base.runs[1]!] },
      ],
      [
        'a plane 3',
        {
          ...base,
          runs: [{ ...base.runs[0]!, weights: [{ plane: 3, mass: 3, angleDeg: 0 }] }, base.runs[1]!],
        },
      ],
      [
        'a mass as text',
        {
          ...base,
          runs: [
            base.runs[0]!,
            { ...base.runs[1]!, weights: [{ plane: 2, mass: '3' as unknown as number, angleDeg: 0 }] },
          ],
        },
      ],
      [
        'a weight angle convention that does not exist',
        { ...base, weightAngles: 'sideways' as WeightAngles },
      ],
      [
        'a run without weights',
        { ...base, runs: [{ readings: base.runs[0]!.readings } as never, base.runs[1]!] },
      ],
    ];
    for (const [, input] of cases) {
      expect(solveSquareTwoPlane(input)).toBeUndefined();
      const general = outcome(() => multiPlaneByLeastSquares(input));
      expect(general.error).toBeDefined();
      expect(outcome(() => multiPlaneBalance(input))).toEqual(general);
    }
    expect(solveSquareTwoPlane(base)).toBeDefined();
  });

  it('hands a condition number at a limit to the general path, which decides', () => {
    const input = modelled(
      [phasor(5, 10), phasor(4, 200)],
      [
        [phasor(1, 30), phasor(1, 45)],
        [phasor(1, 100), phasor(1, 125)],
      ],
      [[{ plane: 1, mass: 3, angleDeg: 0 }], [{ plane: 2, mass: 3, angleDeg: 0 }]],
      undefined,
    );
    const cond = multiPlaneByLeastSquares(input).conditionNumber;
    for (const limits of [{ maxConditionNumber: cond }, { warnConditionNumber: cond }]) {
      const atLimit = { ...input, ...limits };
      expect(solveSquareTwoPlane(atLimit)).toBeUndefined();
      expect(outcome(() => multiPlaneBalance(atLimit))).toEqual(
        outcome(() => multiPlaneByLeastSquares(atLimit)),
      );
    }
    const warned = solveSquareTwoPlane(input);
    expect(warned?.warnings.join(' ')).toMatch(/poorly separated \(condition number \d+\.\d\)/);
  });

  it('solves only the square two-plane system: other sizes take the general path', () => {
    const three = {
      planes: 2,
      initial: [...twoPlane.initial, { amplitude: 1, phaseDeg: 0 }],
      runs: twoPlane.runs.map((r) => ({ ...r, readings: [...r.readings, { amplitude: 2, phaseDeg: 40 }] })),
    };
    const thirdRun = { ...twoPlane, runs: [...twoPlane.runs, twoPlane.runs[1]!] };
    const onePlane = {
      planes: 1,
      initial: [twoPlane.initial[0]!],
      runs: [{ ...twoPlane.runs[0]!, readings: [twoPlane.runs[0]!.readings[0]!] }],
    };
    for (const input of [three, thirdRun, onePlane]) {
      expect(solveSquareTwoPlane(input)).toBeUndefined();
      expect(multiPlaneBalance(input)).toEqual(multiPlaneByLeastSquares(input));
    }
  });
});
