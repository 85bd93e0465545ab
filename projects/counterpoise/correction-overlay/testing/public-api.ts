/* Test harnesses of `@counterpoise/ng/correction-overlay`, for our specs and for dealers' own tests. */
export {
  CpCorrectionOverlayHarness,
  type CorrectionOverlayHarnessFilters,
} from './correction-overlay-harness';
