/** Why a calculation was refused; stable strings the API can map to a status and a message. */
export type EngineErrorCode =
  | 'INVALID_NUMBER'
  | 'NEGATIVE_VALUE'
  | 'ZERO_VALUE'
  | 'INVALID_INPUT'
  | 'ZERO_TRIAL_EFFECT'
  | 'TOO_FEW_RUNS'
  | 'TOO_FEW_SENSORS'
  | 'RUNS_DO_NOT_SEPARATE_PLANES'
  | 'ILL_CONDITIONED'
  | 'NO_SOLUTION'
  | 'UNKNOWN_GRADE'
  | 'UNKNOWN_UNIT';

/**
 * The one error the engine throws. `message` is written for the technician (what is wrong and what to do);
 * `field` is the path of the input at fault, e.g. `trialRuns[1].amplitude`, when one field is to blame.
 */
export class EngineError extends Error {
  override readonly name = 'EngineError';
  readonly code: EngineErrorCode;
  readonly field: string | undefined;

  constructor(code: EngineErrorCode, message: string, field?: string) {
    super(message);
    this.code = code;
    this.field = field;
  }
}

/** A finite number, or an `INVALID_NUMBER` error naming the field. */
export function requireFinite(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new EngineError(
      'INVALID_NUMBER',
      `${field} must be a finite number (got ${String(value)}); check the value typed in.`,
      field,
    );
  }
  return value;
}

/** A finite number >= 0; masses, amplitudes and radii are never negative. */
export function requireNonNegative(value: unknown, field: string, what = 'value'): number {
  const v = requireFinite(value, field);
  if (v < 0) {
    throw new EngineError(
      'NEGATIVE_VALUE',
      `${field} is negative (${v}); a ${what} cannot be negative. Enter its size and give the direction as an angle.`,
      field,
    );
  }
  return v;
}

/** A finite number > 0. */
export function requirePositive(value: unknown, field: string, what = 'value'): number {
  const v = requireNonNegative(value, field, what);
  if (v === 0) {
    throw new EngineError('ZERO_VALUE', `${field} is zero; a ${what} of zero cannot be used here.`, field);
  }
  return v;
}
