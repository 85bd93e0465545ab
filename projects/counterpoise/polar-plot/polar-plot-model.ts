/**
 * What the polar plot says about its points, in words and in keyboard moves. Framework-free, so it is tested
 * without TestBed; the component only draws it.
 */
import { type RotationCounting, _formatAngle as formatAngle } from '@counterpoise/ng/core';
import {
  formatAmplitude,
  isDrawable,
  type PolarPoint,
  type PolarSeries,
  type PolarSeriesKind,
  type PolarValue,
} from './polar-plot-geometry';

/** A point with the series it belongs to and its place in the plot's focus order. */
export interface PlottedPoint {
  /** The position in focus order, across every series. */
  readonly index: number;
  /** The series the point belongs to. */
  readonly series: PolarSeries;
  /** The position of the series in the plot's series. */
  readonly seriesIndex: number;
  /** The position of the point in its series. */
  readonly pointIndex: number;
  /** The point itself. */
  readonly point: PolarPoint;
}

/** Every drawable point of every series, in series order then point order: the order focus visits them. */
export function plottedPoints(series: readonly PolarSeries[]): PlottedPoint[] {
  const points: PlottedPoint[] = [];
  series.forEach((one, seriesIndex) =>
    one.points.forEach((point, pointIndex) => {
      if (isDrawable(point))
        points.push({ index: points.length, series: one, seriesIndex, pointIndex, point });
    }),
  );
  return points;
}

/** An amplitude with its unit: "0.31 in/s". */
export function amplitudeText(value: PolarValue, unit: string): string {
  return unit ? `${formatAmplitude(value.amplitude)} ${unit}` : formatAmplitude(value.amplitude);
}

/** An amplitude and angle in words: "0.31 in/s at 141 degrees". */
export function valueText(value: PolarValue, unit: string): string {
  return `${amplitudeText(value, unit)} at ${formatAngle(value.angleDeg)} degrees`;
}

/** The name of a point: its own label and its series' label, "Run 2, Sensor A". */
export function pointName(series: PolarSeries, point: PolarPoint): string {
  return point.label ? `${point.label}, ${series.label}` : series.label;
}

/** A label as compared: trimmed, one case. */
function labelKey(text: string): string {
  return text.trim().toLowerCase();
}

/**
 * The points whose own label is drawn beside them, by focus index: a label is drawn only when it tells its
 * point apart, from the other points of its series or from the points of every other series. A label that
 * repeats its series' name, or that every series gives its lone point alike (each run "Drive end"), says
 * nothing the legend does not, and would only crowd the plot; the point's name, its detail and the table
 * still carry it.
 */
export function pointsWithDrawnLabels(points: readonly PlottedPoint[]): Set<number> {
  const seriesOfLabel = new Map<string, Set<number>>();
  const labelsInSeries = new Map<number, string[]>();
  for (const p of points) {
    const key = labelKey(p.point.label ?? '');
    if (!seriesOfLabel.has(key)) seriesOfLabel.set(key, new Set());
    seriesOfLabel.get(key)!.add(p.seriesIndex);
    labelsInSeries.set(p.seriesIndex, [...(labelsInSeries.get(p.seriesIndex) ?? []), key]);
  }
  const drawn = new Set<number>();
  for (const p of points) {
    const key = labelKey(p.point.label ?? '');
    if (key === '' || key === labelKey(p.series.label)) continue;
    const ownSeries = labelsInSeries.get(p.seriesIndex) ?? [];
    const apartInSeries = ownSeries.length > 1 && ownSeries.some((other) => other !== key);
    const apartAcrossSeries = (seriesOfLabel.get(key)?.size ?? 0) === 1 && labelsInSeries.size > 1;
    if (apartInSeries || apartAcrossSeries) drawn.add(p.index);
  }
  return drawn;
}

/**
 * The detail of a point, as the tooltip shows it and a screen reader speaks it:
 * "Run 2, Sensor A: 0.31 in/s at 141 degrees", with where a vector starts when it does not start at the
 * origin, and a note when it lies beyond the outer ring.
 */
export function describePoint(series: PolarSeries, point: PolarPoint, offScale = false): string {
  const from = point.from ? `, from ${valueText(point.from, series.unit)}` : '';
  const beyond = offScale ? ', beyond the outer ring' : '';
  return `${pointName(series, point)}: ${valueText(point, series.unit)}${from}${beyond}`;
}

/** What a kind is called in the legend of shapes. */
export const KIND_NAMES: Readonly<Record<PolarSeriesKind, string>> = {
  reading: 'Reading',
  run: 'Run',
  trialEffect: 'Trial effect',
  residual: 'Predicted residual',
  weight: 'Weight',
};

/** The sentence that says how to read the angles of the plot. */
export function conventionText(
  rotation: 'clockwise' | 'counterClockwise',
  counting: RotationCounting,
): string {
  const turn = rotation === 'clockwise' ? 'clockwise' : 'counter-clockwise';
  const direction = counting === 'withRotation' ? 'with' : 'against';
  return `Rotor turns ${turn} in this view; angles are counted ${direction} rotation from the reference mark (0°).`;
}

/**
 * The point focus moves to on a key, or null when the key is not one the plot handles: arrows step to the
 * next or previous point (wrapping), Page keys jump to the first point of the next or previous series,
 * Home and End go to the first and last point.
 */
export function focusTarget(key: string, current: number, points: readonly PlottedPoint[]): number | null {
  const count = points.length;
  if (count === 0) return null;
  const at = Math.min(Math.max(current, 0), count - 1);
  switch (key) {
    case 'ArrowRight':
    case 'ArrowDown':
      return (at + 1) % count;
    case 'ArrowLeft':
    case 'ArrowUp':
      return (at - 1 + count) % count;
    case 'Home':
      return 0;
    case 'End':
      return count - 1;
    case 'PageDown': {
      const seriesIndex = points[at]?.seriesIndex ?? 0;
      const next = points.find((p) => p.seriesIndex > seriesIndex);
      return next ? next.index : 0;
    }
    case 'PageUp': {
      const seriesIndex = points[at]?.seriesIndex ?? 0;
      const earlier = points.filter((p) => p.seriesIndex < seriesIndex);
      const previousSeries = earlier.at(-1)?.seriesIndex ?? points[count - 1]?.seriesIndex;
      return points.find((p) => p.seriesIndex === previousSeries)?.index ?? 0;
    }
    default:
      return null;
  }
}
