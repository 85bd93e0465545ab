/* Public API of `@counterpoise/ng/engine`: how the widgets compute, remotely or on the device. */
export {
  BALANCE_ENGINE,
  LOCAL_BALANCE_ENGINE,
  type BalanceEngine,
  type BalanceEngineKind,
} from './balance-engine';
export {
  BalanceEngineError,
  canFallBackToLocal,
  type BalanceEngineErrorDetails,
  type BalanceEngineErrorReason,
} from './balance-engine-error';
export {
  COUNTERPOISE_CONFIG,
  DEFAULT_TIMEOUT_MS,
  calcRouteUrl,
  checkCounterpoiseConfig,
  type CounterpoiseConfig,
} from './counterpoise-config';
export {
  engineErrorFromProblem,
  engineErrorFromResponse,
  parseProblem,
  parseRetryAfter,
  type FailedResponse,
} from './engine-errors';
export { API_RUNTIME_LOADER, loadApiRuntime, type ApiRuntime } from './api-runtime';
export { LocalBalanceEngine } from './local-balance-engine';
export { RemoteBalanceEngine } from './remote-balance-engine';
export { provideCounterpoise } from './provide-counterpoise';
