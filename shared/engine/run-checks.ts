import { EngineError, requirePositive } from './errors';

/** Input of {@link speedDrift}. */
export interface SpeedDriftInput {
  /** The speed of each run (or each reading), in rpm, in the order they were taken. */
  speedsRpm: number[];
  /** The speed the others are compared with; the first of `speedsRpm` when absent (the initial run). */
  referenceSpeedRpm?: number;
  /**
   * Largest departure from the reference, as a fraction of it, still treated as the same speed. Default
   * 0.02 (2 %): a product default, not a standard.
   */
  maxDriftRatio?: number;
}

/** Result of {@link speedDrift}. */
export interface SpeedDriftResult {
  referenceSpeedRpm: number;
  minSpeedRpm: number;
  maxSpeedRpm: number;
  /** max |speed - reference| / reference. */
  driftRatio: number;
  /** Index (into `speedsRpm`) of the speed farthest from the reference. */
  farthestIndex: number;
  /** false when driftRatio exceeds maxDriftRatio. */
  withinLimit: boolean;
  warnings: string[];
}

/** The default limit of {@link speedDrift}: 2 % of the reference speed (product default). */
export const DEFAULT_MAX_SPEED_DRIFT_RATIO = 0.02;

/**
 * Whether runs were taken at the same speed. The influence coefficient method assumes that the rotor's
 * response is the same in every run; it changes with speed (the phase most of all near a resonance), so
 * readings taken at different speeds mix two responses (common practice: balance at one operating speed).
 * Formula: drift = max_k |n_k - n_ref| / n_ref, with n_ref the reference speed (the first run's unless
 * given). The limit is a product default.
 */
export function speedDrift(input: SpeedDriftInput): SpeedDriftResult {
  const speeds = input?.speedsRpm;
  if (!Array.isArray(speeds) || speeds.length === 0) {
    throw new EngineError('INVALID_INPUT', 'Enter the speed of at least one run.', 'speedsRpm');
  }
  const checked = speeds.map((speed, index) => requirePositive(speed, `speedsRpm[${index}]`, 'speed'));
  const reference =
    input.referenceSpeedRpm === undefined
      ? checked[0]!
      : requirePositive(input.referenceSpeedRpm, 'referenceSpeedRpm', 'speed');
  const limit = input.maxDriftRatio ?? DEFAULT_MAX_SPEED_DRIFT_RATIO;
  if (!(limit > 0) || !Number.isFinite(limit)) {
    throw new EngineError('INVALID_NUMBER', 'maxDriftRatio must be a positive number.', 'maxDriftRatio');
  }
  let farthest = 0;
  let largest = -1;
  checked.forEach((speed, index) => {
    const departure = Math.abs(speed - reference);
    if (departure > largest) {
      largest = departure;
      farthest = index;
    }
  });
  const driftRatio = largest / reference;
  const withinLimit = driftRatio <= limit;
  const warnings: string[] = [];
  if (!withinLimit) {
    warnings.push(
      `The speed drifted by ${(driftRatio * 100).toFixed(1)} % from ${Math.round(reference)} rpm ` +
        `(limit ${(limit * 100).toFixed(1)} %; reading ${farthest + 1} at ${Math.round(checked[farthest]!)} rpm): ` +
        'bring the machine back to its operating speed and read again.',
    );
  }
  return {
    referenceSpeedRpm: reference,
    minSpeedRpm: Math.min(...checked),
    maxSpeedRpm: Math.max(...checked),
    driftRatio,
    farthestIndex: farthest,
    withinLimit,
    warnings,
  };
}
