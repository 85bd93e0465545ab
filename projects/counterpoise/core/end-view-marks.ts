/**
 * The marks every end view of a rotor draws the same way (the phase dial, the correction overlay, the polar
 * plot): scale ticks round the rim, the reference mark across it, the arrow that shows which way the rotor
 * turns (in the quietest stretch of rim), and where a scale number sits beside the rim. Plain data in the
 * coordinates of the widget's drawing; framework-free, so tested without TestBed.
 */
import {
  type DialConvention,
  type ScreenPoint,
  angularDistanceDeg,
  normalizeDeg,
  pointAtAngle,
  pointAtScreenAngle,
  screenAngleDeg,
} from './dial-geometry';
import { type Box, boxReachPx } from './end-view-labels';

/** A straight line in the drawing. */
export interface EndViewLine {
  /** Start, across. */
  readonly x1: number;
  /** Start, down. */
  readonly y1: number;
  /** End, across. */
  readonly x2: number;
  /** End, down. */
  readonly y2: number;
}

/** A tick on the rim: a graduation (`minor`, `major`) or an allowed position. */
export interface EndViewTick extends EndViewLine {
  /** What the tick marks. */
  readonly kind: 'minor' | 'major' | 'position';
  /** The rotor angle it marks, in degrees. */
  readonly angleDeg: number;
}

/** Two decimals are plenty for a drawing and keep the DOM short. */
export function roundPx(value: number): number {
  return Math.round(value * 100) / 100;
}

/** A line between two radii along a rotor angle. */
export function radialLine(
  center: ScreenPoint,
  angleDeg: number,
  innerRadius: number,
  outerRadius: number,
  convention: DialConvention,
): EndViewLine {
  const from = pointAtAngle(center, innerRadius, angleDeg, convention);
  const to = pointAtAngle(center, outerRadius, angleDeg, convention);
  return { x1: roundPx(from.x), y1: roundPx(from.y), x2: roundPx(to.x), y2: roundPx(to.y) };
}

/** How the scale round the rim is graduated. */
export interface ScaleTickOptions {
  /** Allowed positions: one notch each instead of a graduation, when there are any. */
  readonly positions?: readonly number[];
  /** Degrees between two graduations; 10 when omitted. */
  readonly everyDeg?: number;
  /** Degrees between two longer graduations; 30 when omitted. */
  readonly majorEveryDeg?: number;
  /** The length of a graduation, inward from the rim. */
  readonly minorLengthPx: number;
  /** The length of a longer graduation. */
  readonly majorLengthPx: number;
  /** The length of a position's notch; the longer graduation's when omitted. */
  readonly positionLengthPx?: number;
  /** Leaves 0 to the reference mark. */
  readonly skipZero?: boolean;
}

/**
 * The ticks round the rim, drawn inward from it: with positions, one notch per position; otherwise a
 * graduation every `everyDeg`, longer every `majorEveryDeg`.
 */
export function scaleTicks(
  center: ScreenPoint,
  rimRadius: number,
  convention: DialConvention,
  options: ScaleTickOptions,
): EndViewTick[] {
  const positions = options.positions ?? [];
  if (positions.length > 0) {
    const length = options.positionLengthPx ?? options.majorLengthPx;
    return positions.map((angleDeg) => ({
      kind: 'position',
      angleDeg,
      ...radialLine(center, angleDeg, rimRadius - length, rimRadius, convention),
    }));
  }
  const every = options.everyDeg ?? 10;
  const majorEvery = options.majorEveryDeg ?? 30;
  const ticks: EndViewTick[] = [];
  for (let step = options.skipZero ? 1 : 0; step * every < 360 - 1e-9; step++) {
    const angleDeg = step * every;
    const major = Math.abs(angleDeg / majorEvery - Math.round(angleDeg / majorEvery)) < 1e-9;
    const length = major ? options.majorLengthPx : options.minorLengthPx;
    ticks.push({
      kind: major ? 'major' : 'minor',
      angleDeg,
      ...radialLine(center, angleDeg, rimRadius - length, rimRadius, convention),
    });
  }
  return ticks;
}

/**
 * The centre of a box of the given size beside a circle of `radius`, in a screen direction: `outside`, the
 * whole box lies beyond the circle; `inside`, its far side touches the line tangent at `radius`.
 */
export function labelCentreBeside(
  center: ScreenPoint,
  radius: number,
  screenDeg: number,
  width: number,
  height: number,
  side: 'outside' | 'inside' = 'outside',
): ScreenPoint {
  const reach = boxReachPx(width, height, screenDeg);
  const distance = side === 'outside' ? radius + reach : Math.max(radius - reach, 0);
  return pointAtScreenAngle(center, distance, screenDeg);
}

/** The reference mark: where the strip of reflective tape (or key) that zero is counted from sits. */
export interface EndViewReferenceMark {
  /** A bar across the rim at zero. */
  readonly line: EndViewLine;
  /** A triangle beyond the rim pointing at it, as an SVG path. */
  readonly pointerPath: string;
  /** The screen angle of zero. */
  readonly screenDeg: number;
  /** The room the mark takes: labels never cover it. */
  readonly box: Box;
}

/** The size of the reference mark. */
export interface ReferenceMarkOptions {
  /** How far the bar reaches inside the rim; 0 for none. */
  readonly insidePx: number;
  /** How far the bar reaches outside the rim. */
  readonly outsidePx: number;
  /** The length of the pointer beyond the bar's outer end, from its tip on the bar; 0 for none. */
  readonly pointerPx: number;
}

/** The reference mark at zero: a bar across the rim and a pointer just beyond it. */
export function referenceMark(
  center: ScreenPoint,
  rimRadius: number,
  convention: DialConvention,
  options: ReferenceMarkOptions,
): EndViewReferenceMark {
  const screenDeg = screenAngleDeg(0, convention);
  const line = radialLine(center, 0, rimRadius - options.insidePx, rimRadius + options.outsidePx, convention);
  const tipRadius = rimRadius + options.outsidePx;
  const baseRadius = tipRadius + options.pointerPx;
  const halfWidthPx = options.pointerPx * 0.6;
  const halfDeg = baseRadius > 0 ? (halfWidthPx / baseRadius) * (180 / Math.PI) : 0;
  const tip = pointAtScreenAngle(center, tipRadius, screenDeg);
  const left = pointAtScreenAngle(center, baseRadius, screenDeg - halfDeg);
  const right = pointAtScreenAngle(center, baseRadius, screenDeg + halfDeg);
  const pointerPath =
    options.pointerPx > 0
      ? `M${roundPx(tip.x)} ${roundPx(tip.y)}L${roundPx(left.x)} ${roundPx(left.y)}L${roundPx(right.x)} ${roundPx(right.y)}Z`
      : '';
  const inner = pointAtScreenAngle(center, rimRadius - options.insidePx, screenDeg);
  const xs = [inner.x, tip.x, left.x, right.x];
  const ys = [inner.y, tip.y, left.y, right.y];
  const pad = 3;
  const box = {
    x: Math.min(...xs) - pad,
    y: Math.min(...ys) - pad,
    width: Math.max(...xs) - Math.min(...xs) + 2 * pad,
    height: Math.max(...ys) - Math.min(...ys) + 2 * pad,
  };
  return { line, pointerPath, screenDeg, box };
}

/** The widest stretch of rim between taken screen angles. */
export interface RimGap {
  /** The screen angle of its middle. */
  readonly middleDeg: number;
  /** How wide it is, in degrees (360 when nothing is taken). */
  readonly widthDeg: number;
}

/**
 * The widest stretch of rim between taken screen angles; of stretches within a degree as wide, the one whose
 * middle is nearest `preferredDeg`. Nothing taken gives the whole turn, centred on `preferredDeg`.
 */
export function quietestRimGap(takenScreenDeg: readonly number[], preferredDeg: number): RimGap {
  const preferred = normalizeDeg(preferredDeg);
  const taken = [...new Set(takenScreenDeg.map(normalizeDeg))].sort((a, b) => a - b);
  if (taken.length === 0) return { middleDeg: preferred, widthDeg: 360 };
  let best: RimGap = { middleDeg: preferred, widthDeg: -1 };
  taken.forEach((from, index) => {
    const to = index + 1 < taken.length ? taken[index + 1]! : taken[0]! + 360;
    const widthDeg = to - from;
    const middleDeg = normalizeDeg(from + widthDeg / 2);
    const wider = widthDeg > best.widthDeg + 1;
    const asWideButCloser =
      Math.abs(widthDeg - best.widthDeg) <= 1 &&
      angularDistanceDeg(middleDeg, preferred) < angularDistanceDeg(best.middleDeg, preferred);
    if (wider || asWideButCloser) best = { middleDeg, widthDeg };
  });
  return best;
}

/** The rotation arrow: an arc round the rim with its head the way the rotor turns. */
export interface EndViewRotationArrow {
  /** The arc, as an SVG path. */
  readonly arcPath: string;
  /** The arrowhead at the end the rotor turns towards, as a closed SVG path. */
  readonly headPath: string;
  /** The screen angle of the arc's middle. */
  readonly middleDeg: number;
  /** The room the arrow takes: labels never cover it. */
  readonly box: Box;
}

/** Where and how large the rotation arrow is drawn. */
export interface RotationArrowOptions {
  /** The radius of the arc. */
  readonly radius: number;
  /** Screen angles already taken round the rim (the reference mark's included): the arrow keeps off them. */
  readonly takenScreenDeg: readonly number[];
  /** Where the arrow goes when the rim is free, or between equally wide gaps. */
  readonly preferredScreenDeg: number;
  /** Half the arc, in degrees, when the gap allows; 20 when omitted. */
  readonly maxHalfSpanDeg?: number;
  /** Half the arc at least, in degrees; 8 when omitted. */
  readonly minHalfSpanDeg?: number;
  /** The arc keeps this far from a taken angle, in degrees; 14 when omitted. */
  readonly clearanceDeg?: number;
  /** The length of the arrowhead along the arc, in pixels; 10 when omitted. */
  readonly headLengthPx?: number;
  /** Half the width of the arrowhead across the arc, in pixels; 6 when omitted. */
  readonly headHalfWidthPx?: number;
}

/**
 * The rotation arrow in the quietest stretch of rim (the widest gap between taken angles, nearest the
 * preferred one), sweeping the way the rotor turns as seen by the viewer.
 */
export function rotationArrow(
  center: ScreenPoint,
  convention: DialConvention,
  options: RotationArrowOptions,
): EndViewRotationArrow {
  const { radius } = options;
  const gap = quietestRimGap(options.takenScreenDeg, options.preferredScreenDeg);
  const halfSpan = Math.max(
    options.minHalfSpanDeg ?? 8,
    Math.min(options.maxHalfSpanDeg ?? 20, gap.widthDeg / 2 - (options.clearanceDeg ?? 14)),
  );
  const sense = convention.rotation === 'clockwise' ? 1 : -1;
  const startDeg = gap.middleDeg - sense * halfSpan;
  const endDeg = gap.middleDeg + sense * halfSpan;
  const start = pointAtScreenAngle(center, radius, startDeg);
  const end = pointAtScreenAngle(center, radius, endDeg);
  // SVG's sweep flag 1 draws clockwise on screen.
  const sweep = sense === 1 ? 1 : 0;
  const r = roundPx(radius);
  const arcPath = `M ${roundPx(start.x)} ${roundPx(start.y)} A ${r} ${r} 0 0 ${sweep} ${roundPx(end.x)} ${roundPx(end.y)}`;
  const toDeg = (px: number) => (radius > 0 ? (px / radius) * (180 / Math.PI) : 0);
  const headLength = options.headLengthPx ?? 10;
  const halfWidth = options.headHalfWidthPx ?? 6;
  const tip = pointAtScreenAngle(center, radius, endDeg + sense * toDeg(headLength * 0.6));
  const back = endDeg - sense * toDeg(headLength * 0.4);
  const outer = pointAtScreenAngle(center, radius + halfWidth, back);
  const inner = pointAtScreenAngle(center, radius - halfWidth, back);
  const headPath = `M ${roundPx(tip.x)} ${roundPx(tip.y)} L ${roundPx(outer.x)} ${roundPx(outer.y)} L ${roundPx(inner.x)} ${roundPx(inner.y)} Z`;
  const along: ScreenPoint[] = [tip, outer, inner];
  for (let deg = startDeg; sense * (endDeg - deg) >= 0; deg += sense * 2) {
    along.push(pointAtScreenAngle(center, radius, deg));
  }
  const xs = along.map((p) => p.x);
  const ys = along.map((p) => p.y);
  const pad = 2;
  const box = {
    x: Math.min(...xs) - pad,
    y: Math.min(...ys) - pad,
    width: Math.max(...xs) - Math.min(...xs) + 2 * pad,
    height: Math.max(...ys) - Math.min(...ys) + 2 * pad,
  };
  return { arcPath, headPath, middleDeg: gap.middleDeg, box };
}
