/* Test harnesses of `@counterpoise/ng/core`, for our specs and for dealers' own tests. */
export { CpSafetyNoticeHarness, type SafetyNoticeHarnessFilters } from './safety-notice-harness';
