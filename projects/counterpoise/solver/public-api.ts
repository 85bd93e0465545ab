/*
 * Public API of `@counterpoise/ng/solver`: how the widgets compute, remotely or on the device. A dealer
 * configures it with `provideCounterpoise()`, or provides `BALANCE_SOLVER` with a solver of their own.
 */
export {
  BALANCE_SOLVER,
  LOCAL_BALANCE_SOLVER,
  type BalanceSolver,
  type BalanceSolverKind,
  type BalanceSolverOutcome,
} from './balance-solver';
export {
  BalanceSolverError,
  type BalanceSolverErrorDetails,
  type BalanceSolverErrorReason,
} from './balance-solver-error';
export { COUNTERPOISE_CONFIG, type CounterpoiseConfig } from './counterpoise-config';
export { LocalBalanceSolver } from './local-balance-solver';
export { RemoteBalanceSolver } from './remote-balance-solver';
export { provideCounterpoise } from './provide-counterpoise';

// Internal to the library: what the other entry points need and dealers do not (Angular Material's
// leading underscore). Not part of the public API; it may change in any release.
export { canFallBackToLocal as _canFallBackToLocal } from './balance-solver-error';
export { asSolverError as _asSolverError, calculateAll as _calculateAll } from './balance-solver';
