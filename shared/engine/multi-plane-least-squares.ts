import { weightSign, weightToModel } from './conventions';
import { EngineError } from './errors';
import { complexMatrix, conditionNumber, leastSquares, RankDeficient, type ComplexMatrix } from './linalg';
import type {
  MultiPlaneInput,
  MultiPlaneResult,
  PlaneInfluenceCoefficient,
  PlaneWeight,
} from './multi-plane';
import {
  angleDegOf,
  magnitude,
  normalizeAngleDeg,
  validateReading,
  validateWeight,
  type Reading,
} from './phasor';

/**
 * The general path of {@link multiPlaneBalance}: any number of planes, sensors (m >= n) and runs (K >= n),
 * solved by least squares (modified Gram-Schmidt, linalg.ts) with the condition number from singular values
 * (one-sided Jacobi). Every refusal of the method (its codes, messages and fields) is made here, in this order.
 * Internal to the engine: the square two-plane case has a closed form (multi-plane-square.ts) that hands
 * every system it cannot solve plainly back to this one.
 */
export function multiPlaneByLeastSquares(input: MultiPlaneInput): MultiPlaneResult {
  const n = input?.planes;
  if (typeof n !== 'number' || !Number.isInteger(n) || n < 1) {
    throw new EngineError(
      'INVALID_INPUT',
      'planes must be a whole number of correction planes, 1 or more.',
      'planes',
    );
  }
  if (!Array.isArray(input.initial) || input.initial.length === 0) {
    throw new EngineError('INVALID_INPUT', 'Enter the initial reading of every sensor.', 'initial');
  }
  const m = input.initial.length;
  if (m < n) {
    throw new EngineError(
      'TOO_FEW_SENSORS',
      `${n} planes need at least ${n} sensors (readings per run); there are ${m}. Add a sensor or balance fewer planes.`,
      'initial',
    );
  }
  const runs = input.runs;
  if (!Array.isArray(runs) || runs.length < n) {
    throw new EngineError(
      'TOO_FEW_RUNS',
      `${n} planes need at least ${n} trial runs (one trial weight per plane); there are ${Array.isArray(runs) ? runs.length : 0}.`,
      'runs',
    );
  }
  const s = weightSign(input.weightAngles);
  const maxCond = input.maxConditionNumber ?? 1000;
  const warnCond = input.warnConditionNumber ?? 10;
  const K = runs.length;
  const r0 = complexMatrix(m, 1);
  let scaleRef = 0;
  for (let i = 0; i < m; i++) {
    const r = validateReading(input.initial[i], `initial[${i}]`);
    const a = (r.phaseDeg * Math.PI) / 180;
    r0.re[i] = r.amplitude * Math.cos(a);
    r0.im[i] = r.amplitude * Math.sin(a);
    scaleRef = Math.max(scaleRef, r.amplitude);
  }
  const wt = complexMatrix(K, n);
  const dr = complexMatrix(K, m);
  for (let k = 0; k < K; k++) {
    const run = runs[k];
    if (!run || !Array.isArray(run.weights) || !Array.isArray(run.readings)) {
      throw new EngineError(
        'INVALID_INPUT',
        `Run ${k + 1} needs its weights and its readings.`,
        `runs[${k}]`,
      );
    }
    if (run.readings.length !== m) {
      throw new EngineError(
        'INVALID_INPUT',
        `Run ${k + 1} has ${run.readings.length} readings; every run needs one per sensor (${m}).`,
        `runs[${k}].readings`,
      );
    }
    run.weights.forEach((w, j) => {
      const field = `runs[${k}].weights[${j}]`;
      const plane = w?.plane;
      if (typeof plane !== 'number' || !Number.isInteger(plane) || plane < 1 || plane > n) {
        throw new EngineError(
          'INVALID_INPUT',
          `${field}.plane must be a plane number from 1 to ${n}.`,
          `${field}.plane`,
        );
      }
      const v = validateWeight(w, field);
      const z = weightToModel(v.mass, v.angleDeg, s);
      wt.re[k * n + plane - 1]! += z.re;
      wt.im[k * n + plane - 1]! += z.im;
    });
    for (let i = 0; i < m; i++) {
      const r = validateReading(run.readings[i], `runs[${k}].readings[${i}]`);
      const a = (r.phaseDeg * Math.PI) / 180;
      dr.re[k * m + i] = r.amplitude * Math.cos(a) - r0.re[i]!;
      dr.im[k * m + i] = r.amplitude * Math.sin(a) - r0.im[i]!;
      scaleRef = Math.max(scaleRef, r.amplitude);
    }
  }
  let at: ComplexMatrix;
  try {
    // A run that adds nothing new (a column within 1e-8 of the others' span) cannot separate its plane.
    at = leastSquares(wt, dr, 1e-8);
  } catch (e) {
    if (e instanceof RankDeficient) {
      throw new EngineError(
        'RUNS_DO_NOT_SEPARATE_PLANES',
        `Plane ${e.column + 1} is not separated from the others by the trial runs; make a run with a trial weight in plane ${e.column + 1} alone.`,
        'runs',
      );
    }
    throw e;
  }
  const a = complexMatrix(m, n);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < n; j++) {
      a.re[i * n + j] = at.re[j * m + i]!;
      a.im[i * n + j] = at.im[j * m + i]!;
    }
  }
  for (let j = 0; j < n; j++) {
    let col = 0;
    for (let i = 0; i < m; i++) col = Math.max(col, Math.hypot(a.re[i * n + j]!, a.im[i * n + j]!));
    let wmax = 0;
    for (let k = 0; k < K; k++) wmax = Math.max(wmax, Math.hypot(wt.re[k * n + j]!, wt.im[k * n + j]!));
    if (col * wmax <= 1e-9 * scaleRef) {
      throw new EngineError(
        'ZERO_TRIAL_EFFECT',
        `The trial weight in plane ${j + 1} did not change any reading, so its effect cannot be measured. ` +
          'Use a larger trial weight there, or check that it was fitted.',
        'runs',
      );
    }
  }
  const cond = conditionNumber(a);
  const warnings: string[] = [];
  if (!Number.isFinite(cond) || cond > maxCond) {
    throw new EngineError(
      'ILL_CONDITIONED',
      `The sensors cannot tell the planes apart (condition number ${Number.isFinite(cond) ? cond.toFixed(0) : 'infinite'}, limit ${maxCond}): ` +
        'the trial weights changed the readings in nearly the same way. Use larger trial weights, check the sensor positions, ' +
        'or balance in one plane.',
      'runs',
    );
  }
  if (cond > warnCond) {
    warnings.push(
      `The planes are poorly separated (condition number ${cond.toFixed(1)}): small reading errors make large changes in the weights. ` +
        'Expect a trim run.',
    );
  }
  const rhs = complexMatrix(m, 1);
  for (let i = 0; i < m; i++) {
    rhs.re[i] = -r0.re[i]!;
    rhs.im[i] = -r0.im[i]!;
  }
  const c = leastSquares(a, rhs);
  const corrections: PlaneWeight[] = [];
  const toAdd: PlaneWeight[] = [];
  const last = K - 1;
  for (let j = 0; j < n; j++) {
    corrections.push(planeWeight(j + 1, c.re[j]!, c.im[j]!, s));
    toAdd.push(planeWeight(j + 1, c.re[j]! - wt.re[last * n + j]!, c.im[j]! - wt.im[last * n + j]!, s));
  }
  const influenceCoefficients: PlaneInfluenceCoefficient[] = [];
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < n; j++) {
      const z = { re: a.re[i * n + j]!, im: a.im[i * n + j]! };
      influenceCoefficients.push({
        sensor: i + 1,
        plane: j + 1,
        amplitudePerMass: magnitude(z),
        phaseDeg: angleDegOf(z),
      });
    }
  }
  const predictedResidual: Reading[] = [];
  for (let i = 0; i < m; i++) {
    let zr = r0.re[i]!;
    let zi = r0.im[i]!;
    for (let j = 0; j < n; j++) {
      const ar = a.re[i * n + j]!;
      const ai = a.im[i * n + j]!;
      zr += ar * c.re[j]! - ai * c.im[j]!;
      zi += ar * c.im[j]! + ai * c.re[j]!;
    }
    const amp = Math.hypot(zr, zi);
    predictedResidual.push(
      amp <= 1e-12 * scaleRef
        ? { amplitude: 0, phaseDeg: 0 }
        : { amplitude: amp, phaseDeg: angleDegOf({ re: zr, im: zi }) },
    );
  }
  return { corrections, toAdd, influenceCoefficients, conditionNumber: cond, predictedResidual, warnings };
}

function planeWeight(plane: number, re: number, im: number, s: 1 | -1): PlaneWeight {
  const mass = Math.hypot(re, im);
  return { plane, mass, angleDeg: mass === 0 ? 0 : normalizeAngleDeg(s * angleDegOf({ re, im })) };
}
