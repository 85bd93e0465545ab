import { EngineError, requireNonNegative } from './errors';
import { magnitude, phasorToReading, validateReading, type Reading } from './phasor';

/** Input of {@link averageReadings}. */
export interface AverageReadingsInput {
  readings: Reading[];
  /** Largest spread, as a fraction of the mean amplitude, still trusted. Default 0.2 (a product default). */
  maxSpreadRatio?: number;
}

/** Result of {@link averageReadings}. */
export interface AverageReadingsResult {
  mean: Reading;
  /** RMS vector distance of the readings from the mean, in amplitude units. */
  spread: number;
  /** spread / mean amplitude; Infinity when the mean is zero and the readings are not. */
  spreadRatio: number;
  /** Largest vector distance of one reading from the mean. */
  maxDeviation: number;
  /** Index of the reading farthest from the mean. */
  farthestIndex: number;
  /** false when spreadRatio exceeds maxSpreadRatio: take the readings again before balancing. */
  trusted: boolean;
  warnings: string[];
}

/**
 * Vector average of repeated readings of one sensor, with their spread.
 * Formula: z_mean = (1/N) sum z_k, z_k = A_k e^(i phi_k); spread s = sqrt((1/N) sum |z_k - z_mean|^2);
 * ratio = s / |z_mean|. Averaging vectors, not amplitudes and phases apart, is the synchronous (vector)
 * average described for 1x readings in the balancing literature; the spread is the RMS distance used for
 * repeatability of vectors. Source: the definition of the mean and RMS deviation of complex data
 * (any statistics text); the trust limit is a product default, not a standard.
 */
export function averageReadings(input: AverageReadingsInput): AverageReadingsResult {
  const readings = input?.readings;
  if (!Array.isArray(readings) || readings.length === 0) {
    throw new EngineError('INVALID_INPUT', 'Enter at least one reading to average.', 'readings');
  }
  const limit = input.maxSpreadRatio ?? 0.2;
  if (!(limit > 0) || !Number.isFinite(limit)) {
    throw new EngineError('INVALID_NUMBER', 'maxSpreadRatio must be a positive number.', 'maxSpreadRatio');
  }
  const n = readings.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  let sumRe = 0;
  let sumIm = 0;
  for (let k = 0; k < n; k++) {
    const r = validateReading(readings[k], `readings[${k}]`);
    const a = (r.phaseDeg * Math.PI) / 180;
    re[k] = r.amplitude * Math.cos(a);
    im[k] = r.amplitude * Math.sin(a);
    sumRe += re[k]!;
    sumIm += im[k]!;
  }
  const mRe = sumRe / n;
  const mIm = sumIm / n;
  let sq = 0;
  let maxDev = 0;
  let farthest = 0;
  for (let k = 0; k < n; k++) {
    const d = Math.hypot(re[k]! - mRe, im[k]! - mIm);
    sq += d * d;
    if (d > maxDev) {
      maxDev = d;
      farthest = k;
    }
  }
  const spread = Math.sqrt(sq / n);
  const meanAmp = magnitude({ re: mRe, im: mIm });
  const spreadRatio = meanAmp > 0 ? spread / meanAmp : spread > 0 ? Infinity : 0;
  const trusted = spreadRatio <= limit;
  const warnings: string[] = [];
  if (n === 1) warnings.push('Only one reading: the spread cannot be judged. Take two or more readings.');
  if (!trusted) {
    warnings.push(
      `The readings spread by ${(spreadRatio * 100).toFixed(0)} % of their average (limit ${(limit * 100).toFixed(0)} %). ` +
        `Check the sensor mounting, the reference tape and the speed, then read again (reading ${farthest + 1} is farthest off).`,
    );
  }
  return {
    mean: phasorToReading({ re: mRe, im: mIm }),
    spread,
    spreadRatio,
    maxDeviation: maxDev,
    farthestIndex: farthest,
    trusted,
    warnings,
  };
}

/** Input of {@link averageAmplitudes}. */
export interface AverageAmplitudesInput {
  /** Amplitudes read without phase, in one unit. */
  amplitudes: number[];
  /** Largest spread, as a fraction of the mean amplitude, still trusted. Default 0.2 (as for vectors). */
  maxSpreadRatio?: number;
}

/** Result of {@link averageAmplitudes}. */
export interface AverageAmplitudesResult {
  /** The plain mean of the amplitudes. */
  mean: number;
  /** RMS distance of the amplitudes from the mean, in amplitude units. */
  spread: number;
  /** spread / mean; Infinity when the mean is zero and the amplitudes are not. */
  spreadRatio: number;
  /** Index of the amplitude farthest from the mean. */
  farthestIndex: number;
  /** false when spreadRatio exceeds maxSpreadRatio: take the readings again before balancing. */
  trusted: boolean;
  warnings: string[];
}

/**
 * Plain average of repeated amplitudes of one sensor read without phase (amplitude-only balancing), with
 * their spread. Formula: mean = (1/N) sum A_k; spread s = sqrt((1/N) sum (A_k - mean)^2); ratio = s / mean,
 * the same RMS deviation and trust limit as {@link averageReadings} applied to real numbers. Source: the
 * definition of the mean and RMS deviation (any statistics text); the trust limit is a product default.
 */
export function averageAmplitudes(input: AverageAmplitudesInput): AverageAmplitudesResult {
  const amplitudes = input?.amplitudes;
  if (!Array.isArray(amplitudes) || amplitudes.length === 0) {
    throw new EngineError('INVALID_INPUT', 'Enter at least one amplitude to average.', 'amplitudes');
  }
  const limit = input.maxSpreadRatio ?? 0.2;
  if (!(limit > 0) || !Number.isFinite(limit)) {
    throw new EngineError('INVALID_NUMBER', 'maxSpreadRatio must be a positive number.', 'maxSpreadRatio');
  }
  const values = amplitudes.map((amplitude, k) =>
    requireNonNegative(amplitude, `amplitudes[${k}]`, 'vibration amplitude'),
  );
  const n = values.length;
  const mean = values.reduce((sum, value) => sum + value, 0) / n;
  let sq = 0;
  let farthest = 0;
  values.forEach((value, k) => {
    sq += (value - mean) ** 2;
    if (Math.abs(value - mean) > Math.abs(values[farthest]! - mean)) farthest = k;
  });
  const spread = Math.sqrt(sq / n);
  const spreadRatio = mean > 0 ? spread / mean : spread > 0 ? Infinity : 0;
  const trusted = spreadRatio <= limit;
  const warnings: string[] = [];
  if (n === 1) warnings.push('Only one reading: the spread cannot be judged. Take two or more readings.');
  if (!trusted) {
    warnings.push(
      `The amplitudes spread by ${Number.isFinite(spreadRatio) ? `${(spreadRatio * 100).toFixed(0)} %` : 'far'} of their average (limit ${(limit * 100).toFixed(0)} %). ` +
        `Check the sensor mounting and the speed, then read again (reading ${farthest + 1} is farthest off).`,
    );
  }
  return { mean, spread, spreadRatio, farthestIndex: farthest, trusted, warnings };
}
