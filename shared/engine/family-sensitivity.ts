import { EngineError, requireFinite, requirePositive } from './errors';
import { angleDegOf, magnitude, phasor, type Phasor } from './phasor';
import {
  sensitivityFromInfluenceCoefficient,
  type InfluenceCoefficient,
  type Sensitivity,
} from './single-plane';

/** Input of {@link refineFamilySensitivity}. */
export interface FamilySensitivityInput {
  /** The influence coefficients measured on machines of one family, one per job and side, oldest first. */
  coefficients: InfluenceCoefficient[];
  /**
   * A coefficient whose modified z-score exceeds this is set aside; default 3.5, the cut-off Iglewicz and
   * Hoaglin recommend.
   */
  outlierScore?: number;
}

/** Result of {@link refineFamilySensitivity}. */
export interface FamilySensitivityResult {
  /** The vector mean of the coefficients kept. */
  coefficient: InfluenceCoefficient;
  /** The same as a stored sensitivity for the one-run method: mass per amplitude and offset. */
  sensitivity: Required<Sensitivity>;
  /** How many coefficients the mean stands on. */
  count: number;
  /** RMS vector distance of the kept coefficients from their mean, as a fraction of its size. */
  spreadRatio: number;
  /** Indexes (into `coefficients`) of those set aside as outliers, with their modified z-scores. */
  setAside: { index: number; score: number }[];
  warnings: string[];
}

/** The median of a non-empty list (the mean of the middle two for an even count). */
export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

/**
 * Modified z-scores of a list: M_i = 0.6745 (x_i - median) / MAD, MAD = median |x_i - median|.
 * Source: B. Iglewicz and D. C. Hoaglin, How to Detect and Handle Outliers (ASQC Basic References in Quality
 * Control vol. 16, 1993), section 3.3: observations with |M_i| > 3.5 are labelled potential outliers.
 * A MAD of zero (more than half the values equal) gives 0 for those values and Infinity for any other.
 */
export function modifiedZScores(values: readonly number[]): number[] {
  const centre = median(values);
  const mad = median(values.map((x) => Math.abs(x - centre)));
  return values.map((x) => {
    const deviation = x - centre;
    if (mad === 0) return deviation === 0 ? 0 : Math.sign(deviation) * Infinity;
    return (0.6745 * deviation) / mad;
  });
}

/**
 * A machine family's stored sensitivity, refined from the influence coefficients its jobs measured, so that
 * the next machine of that model can be balanced in one run.
 * Steps: (1) each coefficient as a phasor H_i = a_i e^(i phi_i); (2) its distance d_i = |H_i - H_med| from the
 * component-wise median H_med (robust to the outliers being judged); (3) the modified z-score of each d_i
 * (Iglewicz and Hoaglin 1993, see {@link modifiedZScores}); those above `outlierScore` are set aside;
 * (4) the vector mean of the rest, H = (1/N) sum H_i, and the spread sqrt((1/N) sum |H_i - H|^2) / |H|;
 * (5) the sensitivity 1/|H| at offset arg H ({@link sensitivityFromInfluenceCoefficient}). With fewer than
 * three coefficients nothing is set aside: a median of one or two cannot tell an outlier (common practice).
 */
export function refineFamilySensitivity(input: FamilySensitivityInput): FamilySensitivityResult {
  const list = input?.coefficients;
  if (!Array.isArray(list) || list.length === 0) {
    throw new EngineError(
      'INVALID_INPUT',
      'A family sensitivity needs at least one measured influence coefficient.',
      'coefficients',
    );
  }
  const limit = input.outlierScore ?? 3.5;
  if (!(limit > 0) || !Number.isFinite(limit)) {
    throw new EngineError('INVALID_NUMBER', 'outlierScore must be a positive number.', 'outlierScore');
  }
  const phasors: Phasor[] = list.map((c, i) =>
    phasor(
      requirePositive(c?.amplitudePerMass, `coefficients[${i}].amplitudePerMass`, 'influence coefficient'),
      requireFinite(c.phaseDeg, `coefficients[${i}].phaseDeg`),
    ),
  );
  const centre = { re: median(phasors.map((z) => z.re)), im: median(phasors.map((z) => z.im)) };
  const distances = phasors.map((z) => Math.hypot(z.re - centre.re, z.im - centre.im));
  const scores = phasors.length >= 3 ? modifiedZScores(distances) : distances.map(() => 0);
  const setAside = scores.map((score, index) => ({ index, score })).filter(({ score }) => score > limit);
  const kept = phasors.filter((_, i) => !(scores[i]! > limit));
  const mean = {
    re: kept.reduce((sum, z) => sum + z.re, 0) / kept.length,
    im: kept.reduce((sum, z) => sum + z.im, 0) / kept.length,
  };
  const size = magnitude(mean);
  if (!(size > 0)) {
    throw new EngineError(
      'ZERO_VALUE',
      'The measured coefficients cancel each other out; check the angle convention of the jobs.',
      'coefficients',
    );
  }
  const spread = Math.sqrt(
    kept.reduce((sum, z) => sum + (z.re - mean.re) ** 2 + (z.im - mean.im) ** 2, 0) / kept.length,
  );
  const coefficient = { amplitudePerMass: size, phaseDeg: angleDegOf(mean) };
  const warnings: string[] = [];
  if (kept.length < 3) {
    warnings.push(
      `Only ${kept.length} job${kept.length === 1 ? '' : 's'} behind this sensitivity: ` +
        'check the first one-run corrections with a verification run.',
    );
  }
  if (spread / size > 0.25) {
    warnings.push(
      `The jobs disagree by ${Math.round((100 * spread) / size)} % of the mean coefficient: ` +
        'machines of this family may differ (rotor build, bearings, speed); prefer a trial weight.',
    );
  }
  return {
    coefficient,
    sensitivity: sensitivityFromInfluenceCoefficient(coefficient),
    count: kept.length,
    spreadRatio: spread / size,
    setAside,
    warnings,
  };
}
