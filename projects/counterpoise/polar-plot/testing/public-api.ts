/* Test harnesses of `@counterpoise/ng/polar-plot`, for our specs and for dealers' own tests. */
export {
  CpPolarPlotHarness,
  type PolarPlotHarnessFilters,
  type PolarPlotTableRow,
} from './polar-plot-harness';
