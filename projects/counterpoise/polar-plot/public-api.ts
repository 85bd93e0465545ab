/* Public API of `@counterpoise/ng/polar-plot`: readings and weights as vectors on a polar chart. */
export { CpPolarPlot } from './polar-plot';
export {
  POLAR_SERIES_KINDS,
  type PolarPoint,
  type PolarSeries,
  type PolarSeriesKind,
  type PolarValue,
} from './polar-plot-geometry';
