import type { Problem } from '@counterpoise/ng/api';

/** Why a solver could not give an answer. */
export type BalanceSolverErrorReason =
  | 'invalid'
  | 'unauthorized'
  | 'revoked'
  /** The service refuses the key from this page's web origin (a key limited to its portal's origins). */
  | 'origin-refused'
  | 'rate-limited'
  | 'unreachable'
  | 'server';

/** What else a `BalanceSolverError` carries. */
export interface BalanceSolverErrorDetails {
  /** The problem the engine answered, with the fields at fault for `invalid`. */
  readonly problem?: Problem;
  /** For `rate-limited`: how long to wait before the next try. */
  readonly retryAfterSeconds?: number;
  /** The HTTP status, when the remote solver got one. */
  readonly status?: number;
  /** The underlying error, for the developer's console. */
  readonly cause?: unknown;
}

/**
 * Why a calculation gave no answer. `message` is written for the technician: what happened and what to
 * do; `reason` is for the program, to decide what to offer next (the local solver, a new sign-in...).
 */
export class BalanceSolverError extends Error {
  /** Always `BalanceSolverError`, so that the error can be told apart in logs. */
  override readonly name = 'BalanceSolverError';
  /** Why there is no answer. */
  readonly reason: BalanceSolverErrorReason;
  /** The problem the engine answered, with `errors: [{ path, message }]` for the fields at fault. */
  readonly problem?: Problem;
  /** For `rate-limited`: seconds to wait before the next try, when the service said. */
  readonly retryAfterSeconds?: number;
  /** The HTTP status, when the remote solver got one (0 when no answer came). */
  readonly status?: number;

  constructor(reason: BalanceSolverErrorReason, message: string, details: BalanceSolverErrorDetails = {}) {
    super(message, details.cause === undefined ? undefined : { cause: details.cause });
    this.reason = reason;
    if (details.problem !== undefined) this.problem = details.problem;
    if (details.retryAfterSeconds !== undefined) this.retryAfterSeconds = details.retryAfterSeconds;
    if (details.status !== undefined) this.status = details.status;
  }
}

/** The reasons for which computing on the device is worth offering: the values are fine, the service is not. */
const FALLBACK_REASONS: ReadonlySet<BalanceSolverErrorReason> = new Set([
  'unreachable',
  'server',
  'rate-limited',
]);

/** Whether the local solver would likely answer where this error stopped the remote one. */
export function canFallBackToLocal(error: BalanceSolverError): boolean {
  return FALLBACK_REASONS.has(error.reason);
}
