/* Public API of `@counterpoise/ng/solver`: how the widgets compute, remotely or on the device. */
export {
  BALANCE_SOLVER,
  LOCAL_BALANCE_SOLVER,
  type BalanceSolver,
  type BalanceSolverKind,
} from './balance-solver';
export {
  BalanceSolverError,
  canFallBackToLocal,
  type BalanceSolverErrorDetails,
  type BalanceSolverErrorReason,
} from './balance-solver-error';
export {
  COUNTERPOISE_CONFIG,
  DEFAULT_TIMEOUT_MS,
  calcRouteUrl,
  checkCounterpoiseConfig,
  type CounterpoiseConfig,
} from './counterpoise-config';
export {
  solverErrorFromProblem,
  solverErrorFromResponse,
  parseProblem,
  parseRetryAfter,
  type FailedResponse,
} from './solver-errors';
export { API_RUNTIME_LOADER, loadApiRuntime, type ApiRuntime } from './api-runtime';
export { LocalBalanceSolver } from './local-balance-solver';
export { RemoteBalanceSolver } from './remote-balance-solver';
export { provideCounterpoise } from './provide-counterpoise';
