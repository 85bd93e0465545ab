import { weightSign, weightToModel, type WeightAngles } from './conventions';
import { EngineError, requireFinite, requireNonNegative, requirePositive } from './errors';
import {
  add,
  angleDegOf,
  divide,
  magnitude,
  multiply,
  negate,
  normalizeAngleDeg,
  phasor,
  phasorToReading,
  readingToPhasor,
  subtract,
  validateReading,
  validateWeight,
  type Phasor,
  type Reading,
  type Weight,
} from './phasor';

/** An influence coefficient: vibration per unit of mass at the correction radius, and its phase. */
export interface InfluenceCoefficient {
  amplitudePerMass: number;
  phaseDeg: number;
}

/** A stored sensitivity of a machine family: mass per unit of amplitude, and a phase offset (default 0). */
export interface Sensitivity {
  massPerAmplitude: number;
  offsetDeg?: number;
}

/** Input of {@link oneRunCorrection}. */
export interface OneRunInput {
  reading: Reading;
  sensitivity: Sensitivity;
  /** How weight angles are counted; default `againstRotation` (see {@link WeightAngles}). */
  weightAngles?: WeightAngles;
}

/** Result of {@link oneRunCorrection}. */
export interface OneRunResult {
  correction: Weight;
  /** Where the unbalance is, from the reading and the offset: the correction goes opposite. */
  heavySpotDeg: number;
  warnings: string[];
}

const EMPTY: readonly string[] = Object.freeze([]);

/**
 * One-run correction from a known sensitivity of a machine family.
 * Formula: mass = k A; heavy spot at s (phi - offset); correction angle = heavy spot + 180 degrees,
 * where k is the stored mass per unit of amplitude, A and phi the reading, s = +1 for angles counted
 * against rotation and -1 with it. This is the single-plane influence-coefficient solution
 * U = -V / H with a stored H = (1/k) e^(i offset) (see {@link singlePlaneBalance}). With offset 0 the weight
 * goes 180 degrees from the heavy spot (common practice). The factor k is always data: manufacturers give it
 * for their own machine family (common practice).
 */
export function oneRunCorrection(input: OneRunInput): OneRunResult {
  const reading = validateReading(input?.reading, 'reading');
  if (input.sensitivity === null || typeof input.sensitivity !== 'object') {
    throw new EngineError(
      'INVALID_INPUT',
      "Enter the machine family's sensitivity (mass per unit of amplitude).",
      'sensitivity',
    );
  }
  const k = requirePositive(
    input.sensitivity.massPerAmplitude,
    'sensitivity.massPerAmplitude',
    'sensitivity',
  );
  const offset =
    input.sensitivity.offsetDeg === undefined
      ? 0
      : requireFinite(input.sensitivity.offsetDeg, 'sensitivity.offsetDeg');
  const s = weightSign(input.weightAngles);
  const heavy = normalizeAngleDeg(s * (reading.phaseDeg - offset));
  return {
    correction: { mass: k * reading.amplitude, angleDeg: normalizeAngleDeg(heavy + 180) },
    heavySpotDeg: heavy,
    warnings:
      reading.amplitude === 0 ? ['The reading is zero: no correction is needed.'] : (EMPTY as string[]),
  };
}

/**
 * The one-run sensitivity equivalent to an influence coefficient: massPerAmplitude = 1 / |H|, offset = arg H.
 * Store it for a machine family after a trial-weight balance.
 */
export function sensitivityFromInfluenceCoefficient(
  coefficient: InfluenceCoefficient,
): Required<Sensitivity> {
  const a = requirePositive(coefficient.amplitudePerMass, 'amplitudePerMass', 'influence coefficient');
  return {
    massPerAmplitude: 1 / a,
    offsetDeg: normalizeAngleDeg(requireFinite(coefficient.phaseDeg, 'phaseDeg')),
  };
}

/** Input of {@link singlePlaneBalance}. */
export interface SinglePlaneInput {
  initial: Reading;
  trialWeight: Weight;
  withTrial: Reading;
  /** true (default) when the trial weight was taken off before the correction; false when it stays on. */
  trialWeightRemoved?: boolean;
  weightAngles?: WeightAngles;
  /** The weight actually installed, if it differs from the computed one: the residual is predicted for it. */
  installed?: Weight;
  /** Trial effect below this fraction of the initial amplitude raises a warning; default 0.1 (product default). */
  minTrialEffectRatio?: number;
}

/** Result of {@link singlePlaneBalance}. */
export interface SinglePlaneResult {
  influenceCoefficient: InfluenceCoefficient;
  /** The weight to add now (with the trial weight left on, what to add to it). */
  correction: Weight;
  /** The single weight that balances the rotor without the trial weight. */
  totalCorrection: Weight;
  trialEffect: Reading;
  predictedResidual: Reading;
  warnings: string[];
}

/**
 * Single-plane balancing with a trial weight (influence coefficient method).
 * Formulas, with V0 the initial reading, V1 the reading with the trial weight T, all as phasors:
 *   H = (V1 - V0) / T            influence coefficient
 *   U = -V0 / H                  correction on a rotor without trial weight
 *   U_add = U - T                when the trial weight stays on
 *   R = V0 + H U_installed       predicted residual
 * Sources: R. B. McMillan, Rotating Machinery: Practical Solutions to Unbalance and Misalignment
 * (Fairmont Press, 2004), ch. 5, eq. (5.1) "correction weight = trial weight x O / T" with the angle
 * from the vector diagram; J. Vance, F. Zeidan, B. Murphy, Machinery Vibration and Rotordynamics
 * (Wiley, 2010), ch. 6, influence coefficient method (from memory).
 */
export function singlePlaneBalance(input: SinglePlaneInput): SinglePlaneResult {
  const v0r = validateReading(input?.initial, 'initial');
  const tw = validateWeight(input.trialWeight, 'trialWeight');
  requirePositive(tw.mass, 'trialWeight.mass', 'trial weight');
  const v1r = validateReading(input.withTrial, 'withTrial');
  const s = weightSign(input.weightAngles);
  const removed = input.trialWeightRemoved ?? true;
  if (typeof removed !== 'boolean') {
    throw new EngineError('INVALID_INPUT', 'trialWeightRemoved must be true or false.', 'trialWeightRemoved');
  }
  const v0 = readingToPhasor(v0r);
  const v1 = readingToPhasor(v1r);
  const t = weightToModel(tw.mass, tw.angleDeg, s);
  const effect = subtract(v1, v0);
  const effectAmp = magnitude(effect);
  const scaleRef = Math.max(v0r.amplitude, v1r.amplitude);
  if (effectAmp === 0 || effectAmp <= 1e-9 * scaleRef) {
    throw new EngineError(
      'ZERO_TRIAL_EFFECT',
      'The trial weight did not change the reading, so its effect cannot be measured. ' +
        'Use a larger trial weight, or check that it was fitted and that the readings were taken at the same speed.',
      'withTrial',
    );
  }
  const h = divide(effect, t);
  const warnings: string[] = [];
  const minRatio = input.minTrialEffectRatio ?? 0.1;
  if (v0r.amplitude > 0 && effectAmp < minRatio * v0r.amplitude) {
    warnings.push(
      `The trial weight changed the vibration by only ${((effectAmp / v0r.amplitude) * 100).toFixed(0)} % of the initial reading; ` +
        'reading scatter may dominate. A larger trial weight gives a more reliable correction.',
    );
  }
  const total = negate(divide(v0, h));
  const toAdd = removed ? total : subtract(total, t);
  const installed = input.installed === undefined ? undefined : validateWeight(input.installed, 'installed');
  const onRotor = installed
    ? add(weightToModel(installed.mass, installed.angleDeg, s), removed ? { re: 0, im: 0 } : t)
    : total;
  const residual = add(v0, multiply(h, onRotor));
  return {
    influenceCoefficient: coefficientOf(h),
    correction: modelToWeight(toAdd, s),
    totalCorrection: modelToWeight(total, s),
    trialEffect: phasorToReading(effect),
    predictedResidual: cleanResidual(residual, scaleRef),
    warnings,
  };
}

/** Input of {@link trimRun}. */
export interface TrimRunInput {
  /** Reading before the correction run. */
  before: Reading;
  /** Every weight added for the correction run (all in the one plane). */
  added: Weight[];
  /** Reading after the correction run, with those weights on. */
  after: Reading;
  weightAngles?: WeightAngles;
  /** The coefficient used so far, to report how much it changed. */
  previous?: InfluenceCoefficient;
}

/** Result of {@link trimRun}. */
export interface TrimRunResult {
  influenceCoefficient: InfluenceCoefficient;
  /** The trim weight to add now, with the correction weights left on. */
  correction: Weight;
  predictedResidual: Reading;
  /** |H_new - H_prev| / |H_prev| when `previous` is given. */
  coefficientChange?: number;
  warnings: string[];
}

/**
 * Trim run: refines the influence coefficient from a correction run and gives the trim weight.
 * Formulas: H = (V_after - V_before) / sum(U_added); U_trim = -V_after / H.
 * The correction run is a trial run whose weight is the correction, so the same relation as the trial run holds
 * (McMillan 2004, ch. 5, trim balancing; the single-plane relations of {@link singlePlaneBalance}).
 */
export function trimRun(input: TrimRunInput): TrimRunResult {
  const before = validateReading(input?.before, 'before');
  const after = validateReading(input.after, 'after');
  const s = weightSign(input.weightAngles);
  if (!Array.isArray(input.added) || input.added.length === 0) {
    throw new EngineError('INVALID_INPUT', 'List the weights added for the correction run.', 'added');
  }
  let sum: Phasor = { re: 0, im: 0 };
  input.added.forEach((w, i) => {
    const v = validateWeight(w, `added[${i}]`);
    sum = add(sum, weightToModel(v.mass, v.angleDeg, s));
  });
  if (magnitude(sum) === 0) {
    throw new EngineError(
      'ZERO_VALUE',
      'The weights added cancel each other out; nothing was changed on the rotor.',
      'added',
    );
  }
  const result = singlePlaneBalance({
    initial: before,
    trialWeight: modelToWeight(sum, s),
    withTrial: after,
    trialWeightRemoved: false,
    weightAngles: input.weightAngles ?? 'againstRotation',
  });
  const out: TrimRunResult = {
    influenceCoefficient: result.influenceCoefficient,
    correction: result.correction,
    predictedResidual: result.predictedResidual,
    warnings: result.warnings,
  };
  if (input.previous) {
    const prevAmp = requirePositive(
      input.previous.amplitudePerMass,
      'previous.amplitudePerMass',
      'influence coefficient',
    );
    const prev = phasor(prevAmp, requireFinite(input.previous.phaseDeg, 'previous.phaseDeg'));
    const now = phasor(result.influenceCoefficient.amplitudePerMass, result.influenceCoefficient.phaseDeg);
    out.coefficientChange = magnitude(subtract(now, prev)) / prevAmp;
    if (out.coefficientChange > 0.3) {
      out.warnings.push(
        `The rotor's response changed by ${(out.coefficientChange * 100).toFixed(0)} % since the last run; ` +
          'check for loose parts, a changed speed or a sensor moved.',
      );
    }
  }
  return out;
}

/** Internal: influence coefficient of a model phasor H. */
export function coefficientOf(h: Phasor): InfluenceCoefficient {
  return { amplitudePerMass: magnitude(h), phaseDeg: angleDegOf(h) };
}

/** Internal: a model phasor back to a weight in the caller's angle convention. */
export function modelToWeight(z: Phasor, sign: 1 | -1): Weight {
  const mass = magnitude(z);
  return { mass, angleDeg: mass === 0 ? 0 : normalizeAngleDeg(sign * angleDegOf(z)) };
}

/** Internal: a predicted residual with round-off below 1e-12 of the data's scale shown as zero. */
export function cleanResidual(z: Phasor, scaleRef: number): Reading {
  const r = phasorToReading(z);
  return r.amplitude <= 1e-12 * scaleRef ? { amplitude: 0, phaseDeg: 0 } : r;
}

/** Internal: a non-negative mass, named for errors. */
export function massOf(value: unknown, field: string): number {
  return requireNonNegative(value, field, 'mass');
}
