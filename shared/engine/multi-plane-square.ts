/**
 * The square two-plane system (two planes, two sensors, two runs) of {@link multiPlaneBalance} in closed form.
 * Internal to the engine. Same model and sources as the general path (multi-plane-least-squares.ts):
 * r_k = r_0 + A w_k, with complex numbers held as plain re/im numbers, nothing allocated but the answer.
 *
 *   W = [[w_11, w_12], [w_21, w_22]]   plane unbalances of run k (row) in plane j (column)
 *   D = [[d_11, d_12], [d_21, d_22]]   reading changes r_k - r_0 of run k (row) at sensor i (column)
 *   A^T = W^-1 D, with W^-1 = [[w_22, -w_12], [-w_21, w_11]] / det W          (Cramer's rule)
 *   c = -A^-1 r_0, with A^-1 = [[a_22, -a_12], [-a_21, a_11]] / det A          (Cramer's rule)
 *   condition number sigma_1 / sigma_2 = sigma_1^2 / |det A|, with sigma_1^2 the larger eigenvalue of A^H A:
 *   (p + t) / 2 + sqrt(((p - t) / 2)^2 + |q|^2), p and t the squared column norms of A, q their inner product
 *   (sigma_1 sigma_2 = |det A| for a 2 x 2 matrix; G. H. Golub and C. F. Van Loan, Matrix Computations,
 *   4th ed., 2013, sections 2.4 and 8.5, from memory).
 *
 * It answers only when the answer is plain: every input well formed, the runs clearly separating the planes
 * (|det W| > 1e-7 |w_1| |w_2|, ten times the general path's limit), every trial weight clearly felt (ten times
 * its limit) and the condition number clear of the refusal limit and of the warning limit (by 1e-9 of the
 * limit). Otherwise it returns undefined and the general path solves the system and gives every refusal, so
 * the codes, messages and fields of the errors are the general path's by construction. Where both answer,
 * they agree to within rounding (multi-plane-square.spec.ts compares them on random systems).
 */
import type {
  MultiPlaneInput,
  MultiPlaneResult,
  PlaneInfluenceCoefficient,
  PlaneWeight,
} from './multi-plane';
import { degToRad, normalizeAngleDeg, radToDeg, type Reading } from './phasor';

/** Margin kept from the general path's limits, so that rounding never decides which path refuses. */
const RUN_SEPARATION_LIMIT = 1e-7;
const TRIAL_EFFECT_LIMIT = 1e-8;
/**
 * The condition number of the two paths differs by about eps cond(A) cond(W) relative (A carries the rounding
 * of W^-1, and sigma_min moves by the change of A); this many times eps, and never less than 1e-9, is kept
 * from a limit.
 */
const CONDITION_ROUNDING = 1e-12;
const CONDITION_LIMIT_MARGIN = 1e-9;

/**
 * The square two-plane solve, or undefined when the system is not square two-plane, has bad input, or is
 * near one of the general path's refusals (then the general path answers or refuses).
 */
export function solveSquareTwoPlane(input: MultiPlaneInput): MultiPlaneResult | undefined {
  if (input === null || typeof input !== 'object' || input.planes !== 2) return undefined;
  const initial = input.initial;
  const runs = input.runs;
  if (!Array.isArray(initial) || initial.length !== 2 || !Array.isArray(runs) || runs.length !== 2) {
    return undefined;
  }
  const angles = input.weightAngles;
  const s = angles === undefined || angles === 'againstRotation' ? 1 : angles === 'withRotation' ? -1 : 0;
  if (s === 0) return undefined;
  const maxCond = input.maxConditionNumber ?? 1000;
  const warnCond = input.warnConditionNumber ?? 10;
  if (typeof maxCond !== 'number' || typeof warnCond !== 'number') return undefined;
  const run1 = runs[0];
  const run2 = runs[1];
  if (!isSquareRun(run1) || !isSquareRun(run2)) return undefined;

  // Readings as phasors, converted exactly as the general path converts them.
  const i1 = initial[0];
  const a01 = amplitudeOf(i1);
  if (!(a01 >= 0)) return undefined;
  const p01 = phaseOf(i1);
  if (p01 !== p01) return undefined;
  const i2 = initial[1];
  const a02 = amplitudeOf(i2);
  if (!(a02 >= 0)) return undefined;
  const p02 = phaseOf(i2);
  if (p02 !== p02) return undefined;
  const x11 = run1.readings[0];
  const a11 = amplitudeOf(x11);
  if (!(a11 >= 0)) return undefined;
  const p11 = phaseOf(x11);
  if (p11 !== p11) return undefined;
  const x12 = run1.readings[1];
  const a12 = amplitudeOf(x12);
  if (!(a12 >= 0)) return undefined;
  const p12 = phaseOf(x12);
  if (p12 !== p12) return undefined;
  const x21 = run2.readings[0];
  const a21 = amplitudeOf(x21);
  if (!(a21 >= 0)) return undefined;
  const p21 = phaseOf(x21);
  if (p21 !== p21) return undefined;
  const x22 = run2.readings[1];
  const a22 = amplitudeOf(x22);
  if (!(a22 >= 0)) return undefined;
  const p22 = phaseOf(x22);
  if (p22 !== p22) return undefined;
  const scaleRef = Math.max(a01, a02, a11, a12, a21, a22);

  let rad = (p01 * Math.PI) / 180;
  const o1r = a01 * Math.cos(rad);
  const o1i = a01 * Math.sin(rad);
  rad = (p02 * Math.PI) / 180;
  const o2r = a02 * Math.cos(rad);
  const o2i = a02 * Math.sin(rad);
  // d_ki: change of sensor i's reading in run k.
  rad = (p11 * Math.PI) / 180;
  const d11r = a11 * Math.cos(rad) - o1r;
  const d11i = a11 * Math.sin(rad) - o1i;
  rad = (p12 * Math.PI) / 180;
  const d12r = a12 * Math.cos(rad) - o2r;
  const d12i = a12 * Math.sin(rad) - o2i;
  rad = (p21 * Math.PI) / 180;
  const d21r = a21 * Math.cos(rad) - o1r;
  const d21i = a21 * Math.sin(rad) - o1i;
  rad = (p22 * Math.PI) / 180;
  const d22r = a22 * Math.cos(rad) - o2r;
  const d22i = a22 * Math.sin(rad) - o2i;

  // w_kj: sum of run k's weights in plane j, as model phasors m e^(i s theta).
  let w11r = 0;
  let w11i = 0;
  let w12r = 0;
  let w12i = 0;
  let w21r = 0;
  let w21i = 0;
  let w22r = 0;
  let w22i = 0;
  for (let k = 0; k < 2; k++) {
    const weights = (k === 0 ? run1 : run2).weights;
    let p1r = 0;
    let p1i = 0;
    let p2r = 0;
    let p2i = 0;
    for (const w of weights) {
      if (w === null || typeof w !== 'object') return undefined;
      const { plane, mass, angleDeg } = w as unknown as Record<string, unknown>;
      if (typeof mass !== 'number' || !(mass >= 0) || mass === Infinity) return undefined;
      if (typeof angleDeg !== 'number' || angleDeg - angleDeg !== 0) return undefined;
      const a = degToRad(s * angleDeg);
      if (plane === 1) {
        p1r += mass * Math.cos(a);
        p1i += mass * Math.sin(a);
      } else if (plane === 2) {
        p2r += mass * Math.cos(a);
        p2i += mass * Math.sin(a);
      } else {
        return undefined;
      }
    }
    if (k === 0) {
      w11r = p1r;
      w11i = p1i;
      w12r = p2r;
      w12i = p2i;
    } else {
      w21r = p1r;
      w21i = p1i;
      w22r = p2r;
      w22i = p2i;
    }
  }

  // det W and the runs' separation of the planes: the part of plane 2's column of W not along plane 1's
  // is |det W| / |w_1|, which the general path refuses below 1e-8 |w_2|.
  const dwr = w11r * w22r - w11i * w22i - (w12r * w21r - w12i * w21i);
  const dwi = w11r * w22i + w11i * w22r - (w12r * w21i + w12i * w21r);
  const dw2 = dwr * dwr + dwi * dwi;
  const n1 = w11r * w11r + w11i * w11i + w21r * w21r + w21i * w21i;
  const n2 = w12r * w12r + w12i * w12i + w22r * w22r + w22i * w22i;
  if (!(dw2 > RUN_SEPARATION_LIMIT * RUN_SEPARATION_LIMIT * n1 * n2) || !inRange(dw2)) return undefined;
  const iwr = dwr / dw2;
  const iwi = -dwi / dw2;

  // A (sensor i, plane j): a_i1 = (w_22 d_1i - w_12 d_2i) / det W, a_i2 = (w_11 d_2i - w_21 d_1i) / det W.
  let tr = w22r * d11r - w22i * d11i - (w12r * d21r - w12i * d21i);
  let ti = w22r * d11i + w22i * d11r - (w12r * d21i + w12i * d21r);
  const c11r = tr * iwr - ti * iwi;
  const c11i = tr * iwi + ti * iwr;
  tr = w11r * d21r - w11i * d21i - (w21r * d11r - w21i * d11i);
  ti = w11r * d21i + w11i * d21r - (w21r * d11i + w21i * d11r);
  const c12r = tr * iwr - ti * iwi;
  const c12i = tr * iwi + ti * iwr;
  tr = w22r * d12r - w22i * d12i - (w12r * d22r - w12i * d22i);
  ti = w22r * d12i + w22i * d12r - (w12r * d22i + w12i * d22r);
  const c21r = tr * iwr - ti * iwi;
  const c21i = tr * iwi + ti * iwr;
  tr = w11r * d22r - w11i * d22i - (w21r * d12r - w21i * d12i);
  ti = w11r * d22i + w11i * d22r - (w21r * d12i + w21i * d12r);
  const c22r = tr * iwr - ti * iwi;
  const c22i = tr * iwi + ti * iwr;

  // Each plane's trial weight felt by some sensor: max_i |a_ij| max_k |w_kj| well above 1e-9 of the readings.
  const col1 = Math.max(c11r * c11r + c11i * c11i, c21r * c21r + c21i * c21i);
  const col2 = Math.max(c12r * c12r + c12i * c12i, c22r * c22r + c22i * c22i);
  const wmax1 = Math.max(w11r * w11r + w11i * w11i, w21r * w21r + w21i * w21i);
  const wmax2 = Math.max(w12r * w12r + w12i * w12i, w22r * w22r + w22i * w22i);
  const effectLimit = TRIAL_EFFECT_LIMIT * TRIAL_EFFECT_LIMIT * scaleRef * scaleRef;
  if (!(col1 * wmax1 > effectLimit) || !(col2 * wmax2 > effectLimit)) return undefined;

  // Condition number from the eigenvalues of A^H A: p, t its diagonal, q = conj(a_1)^T a_2.
  const p = c11r * c11r + c11i * c11i + c21r * c21r + c21i * c21i;
  const t = c12r * c12r + c12i * c12i + c22r * c22r + c22i * c22i;
  const qr = c11r * c12r + c11i * c12i + c21r * c22r + c21i * c22i;
  const qi = c11r * c12i - c11i * c12r + c21r * c22i - c21i * c22r;
  const half = (p - t) / 2;
  const sigma1Squared = (p + t) / 2 + Math.sqrt(half * half + qr * qr + qi * qi);
  const dar = c11r * c22r - c11i * c22i - (c12r * c21r - c12i * c21i);
  const dai = c11r * c22i + c11i * c22r - (c12r * c21i + c12i * c21r);
  const cond = sigma1Squared / modulus(dar, dai);
  // 1 / separation, the runs' |w_1| |w_2| / |det W|, stands for cond(W).
  const margin = Math.max(CONDITION_LIMIT_MARGIN, CONDITION_ROUNDING * cond * Math.sqrt((n1 * n2) / dw2));
  if (!(cond < Infinity) || cond > maxCond || nearLimit(cond, maxCond, margin)) return undefined;
  const warned = cond > warnCond;
  if (nearLimit(cond, warnCond, margin) || (warned && nearHalfTenth(cond, margin))) return undefined;

  // c = -A^-1 r_0.
  const da2 = dar * dar + dai * dai;
  if (!inRange(da2)) return undefined;
  const iar = dar / da2;
  const iai = -dai / da2;
  tr = c22r * o1r - c22i * o1i - (c12r * o2r - c12i * o2i);
  ti = c22r * o1i + c22i * o1r - (c12r * o2i + c12i * o2r);
  const u1r = -(tr * iar - ti * iai);
  const u1i = -(tr * iai + ti * iar);
  tr = c11r * o2r - c11i * o2i - (c21r * o1r - c21i * o1i);
  ti = c11r * o2i + c11i * o2r - (c21r * o1i + c21i * o1r);
  const u2r = -(tr * iar - ti * iai);
  const u2i = -(tr * iai + ti * iar);
  if (!(Math.abs(u1r) + Math.abs(u1i) + Math.abs(u2r) + Math.abs(u2i) < Infinity)) return undefined;

  // The answer's phasors go through a scratch array, not as arguments: V8 boxes a number passed to a function
  // it does not inline, and the builders below are not inlined into this large function. Written only after
  // the last read of the input, so no code of the caller's runs between writing and reading it.
  const x = SCRATCH;
  x[A11] = c11r;
  x[A11 + 1] = c11i;
  x[A12] = c12r;
  x[A12 + 1] = c12i;
  x[A21] = c21r;
  x[A21 + 1] = c21i;
  x[A22] = c22r;
  x[A22 + 1] = c22i;
  x[C1] = u1r;
  x[C1 + 1] = u1i;
  x[C2] = u2r;
  x[C2 + 1] = u2i;
  // c - w_2, the weight to add per plane; a plane without weight in the last run adds its whole correction.
  const keep1 = w21r === 0 && w21i === 0;
  const keep2 = w22r === 0 && w22i === 0;
  x[ADD1] = u1r - w21r;
  x[ADD1 + 1] = u1i - w21i;
  x[ADD2] = u2r - w22r;
  x[ADD2 + 1] = u2i - w22i;
  // r_0 + A c, summed in the order of the general path.
  x[R1] = o1r + (c11r * u1r - c11i * u1i) + (c12r * u2r - c12i * u2i);
  x[R1 + 1] = o1i + (c11r * u1i + c11i * u1r) + (c12r * u2i + c12i * u2r);
  x[R2] = o2r + (c21r * u1r - c21i * u1i) + (c22r * u2r - c22i * u2i);
  x[R2 + 1] = o2i + (c21r * u1i + c21i * u1r) + (c22r * u2i + c22i * u2r);
  x[SCALE] = scaleRef;
  x[COND] = cond;
  return squareResult(s, keep1, keep2, warned);
}

/** Where solveSquareTwoPlane leaves the answer's numbers for squareResult: re at the index, im after it. */
const SCRATCH = new Float64Array(22);
const A11 = 0;
const A12 = 2;
const A21 = 4;
const A22 = 6;
const C1 = 8;
const C2 = 10;
const ADD1 = 12;
const ADD2 = 14;
const R1 = 16;
const R2 = 18;
const SCALE = 20;
const COND = 21;

/** The answer, in the general path's shape, from the numbers in SCRATCH. */
function squareResult(s: 1 | -1, keep1: boolean, keep2: boolean, warned: boolean): MultiPlaneResult {
  const correction1 = planeWeight(1, C1, s);
  const correction2 = planeWeight(2, C2, s);
  const cond = SCRATCH[COND]!;
  return {
    corrections: [correction1, correction2],
    // c - 0 is exactly c: the same weight, as a separate object.
    toAdd: [
      keep1 ? { plane: 1, mass: correction1.mass, angleDeg: correction1.angleDeg } : planeWeight(1, ADD1, s),
      keep2 ? { plane: 2, mass: correction2.mass, angleDeg: correction2.angleDeg } : planeWeight(2, ADD2, s),
    ],
    influenceCoefficients: [
      coefficient(1, 1, A11),
      coefficient(1, 2, A12),
      coefficient(2, 1, A21),
      coefficient(2, 2, A22),
    ],
    conditionNumber: cond,
    predictedResidual: [residual(R1), residual(R2)],
    warnings: warned
      ? [
          `The planes are poorly separated (condition number ${cond.toFixed(1)}): small reading errors make large changes in the weights. ` +
            'Expect a trim run.',
        ]
      : [],
  };
}

/** A run with its weights and exactly two readings. */
function isSquareRun(run: unknown): run is { weights: unknown[]; readings: unknown[] } {
  if (run === null || typeof run !== 'object') return false;
  const { weights, readings } = run as Record<string, unknown>;
  return Array.isArray(weights) && Array.isArray(readings) && readings.length === 2;
}

/** A reading's amplitude when it is a finite number >= 0, else NaN. */
function amplitudeOf(reading: unknown): number {
  if (reading === null || typeof reading !== 'object') return NaN;
  const a = (reading as Record<string, unknown>)['amplitude'];
  return typeof a === 'number' && a >= 0 && a !== Infinity ? a : NaN;
}

/** A reading's phase when it is a finite number, else NaN. */
function phaseOf(reading: unknown): number {
  const p = (reading as Record<string, unknown>)['phaseDeg'];
  return typeof p === 'number' && p - p === 0 ? p : NaN;
}

/** Whether a squared magnitude is far from underflow and overflow, so that its inverse is accurate. */
function inRange(squared: number): boolean {
  return squared > 1e-290 && squared < 1e290;
}

/** Whether a condition number is so near a limit (within `margin` of it, relative) that rounding could put it on the other side. */
function nearLimit(cond: number, limit: number, margin: number): boolean {
  return Math.abs(limit) < Infinity && Math.abs(cond - limit) <= margin * Math.abs(limit);
}

/** Whether a condition number written to one decimal could round either way (the warning prints it). */
function nearHalfTenth(cond: number, margin: number): boolean {
  const tenths = cond * 10;
  return Math.abs(tenths - Math.floor(tenths) - 0.5) <= margin * tenths + 1e-6;
}

/** Angle of re + i im in degrees, in [0, 360), as angleDegOf gives it, without a phasor object. */
function angleDeg(re: number, im: number): number {
  if (re === 0 && im === 0) return 0;
  const deg = radToDeg(Math.atan2(im, re));
  // normalizeAngleDeg for deg in [-180, 180], without its division and floor: deg - 360 floor(deg / 360) is
  // deg + 360 below zero and deg (+0 for -0) otherwise.
  const a = deg < 0 ? deg + 360 : deg + 0;
  return a >= 360 - 1e-9 ? 0 : a;
}

/**
 * |re + i im|: sqrt(re^2 + im^2), which is Math.hypot to within rounding and several times quicker; Math.hypot
 * itself where the squares would overflow or underflow.
 */
function modulus(re: number, im: number): number {
  const squared = re * re + im * im;
  return inRange(squared) ? Math.sqrt(squared) : Math.hypot(re, im);
}

/** A plane's model phasor (at SCRATCH[k]) as a weight in the caller's convention, as the general path gives it. */
function planeWeight(plane: number, k: number, s: 1 | -1): PlaneWeight {
  const re = SCRATCH[k]!;
  const im = SCRATCH[k + 1]!;
  const mass = modulus(re, im);
  // normalizeAngleDeg leaves an angle in [0, 360) as it is, so it is needed only for angles counted with rotation.
  const angle = mass === 0 ? 0 : s === 1 ? angleDeg(re, im) : normalizeAngleDeg(-angleDeg(re, im));
  return { plane, mass, angleDeg: angle };
}

/** The influence coefficient of a sensor for a plane (at SCRATCH[k]). */
function coefficient(sensor: number, plane: number, k: number): PlaneInfluenceCoefficient {
  const re = SCRATCH[k]!;
  const im = SCRATCH[k + 1]!;
  return { sensor, plane, amplitudePerMass: modulus(re, im), phaseDeg: angleDeg(re, im) };
}

/** A predicted residual (at SCRATCH[k]), round-off below 1e-12 of the data's scale shown as zero. */
function residual(k: number): Reading {
  const re = SCRATCH[k]!;
  const im = SCRATCH[k + 1]!;
  const amplitude = modulus(re, im);
  return amplitude <= 1e-12 * SCRATCH[SCALE]!
    ? { amplitude: 0, phaseDeg: 0 }
    : { amplitude, phaseDeg: angleDeg(re, im) };
}
