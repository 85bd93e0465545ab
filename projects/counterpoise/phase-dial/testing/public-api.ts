/* Test harnesses of `@counterpoise/ng/phase-dial`, for our specs and for dealers' own tests. */
export {
  CpPhaseDialHarness,
  type PhaseDialHarnessFilters,
  type PhaseDialKey,
  type PhaseDialMarkerInfo,
} from './phase-dial-harness';
