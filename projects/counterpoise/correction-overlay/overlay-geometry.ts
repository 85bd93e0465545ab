/**
 * Geometry of the correction-location overlay, in the pixels of its stage (the SVG's viewBox is the stage's
 * size, so a label of 12 px is 12 px on the tablet whatever the width). Framework-free: tested without TestBed.
 * Rotor angles go to the screen through the shared dial geometry of `@counterpoise/ng/core`.
 */
import {
  type DialConvention,
  type RotationDirection,
  type ScreenPoint,
  angularDistanceDeg,
  normalizeDeg,
  pointAtScreenAngle,
  screenAngleDeg,
  screenAngleOfPoint,
  screenSense,
} from '@counterpoise/ng/core';
import type { BlockedSector, CalibrationHandle, PhotoCalibration, PhotoPoint } from './overlay-model';

/** The size of the stage, in CSS pixels. */
export interface StageSize {
  /** Width in CSS pixels. */
  readonly width: number;
  /** Height in CSS pixels. */
  readonly height: number;
}

/** Where the rotor is drawn on the stage: its centre, its radius and the screen angle of the reference mark. */
export interface OverlayFrame {
  /** The centre of the rotor (the shaft). */
  readonly center: ScreenPoint;
  /** The radius of the circle where weights go. */
  readonly radius: number;
  /** The screen angle of 0 degrees, clockwise from 12 o'clock. */
  readonly zeroAtDeg: number;
}

/** A rectangle on the stage, from its top-left corner. */
export interface Box {
  /** Left edge. */
  readonly x: number;
  /** Top edge. */
  readonly y: number;
  /** Width. */
  readonly width: number;
  /** Height. */
  readonly height: number;
}

/** An area labels keep clear of (a drawn symbol, a scale number); `key` names the element it covers. */
export interface Obstacle extends Box {
  /** The element it belongs to. */
  readonly key?: string;
  /** How much covering it costs against moving the label a pixel farther away; 100 when omitted. */
  readonly weight?: number;
}

const MIN_RADIUS_PX = 8;

/** A number rounded to hundredths, so SVG paths stay short and stable in tests. */
function px(value: number): number {
  return Math.round(value * 100) / 100;
}

function clamp(value: number, min: number, max: number): number {
  return Math.min(max, Math.max(min, value));
}

/** The room kept around the rotor for labels outside its rim: 15 % of the smaller side, 28 to 84 px. */
export function labelMargin(size: StageSize): number {
  return clamp(Math.round(0.15 * Math.min(size.width, size.height)), 28, 84);
}

/** The rotor centred on the stage, as large as the label margin allows, with zero at `zeroAtDeg`. */
export function fittedFrame(size: StageSize, zeroAtDeg: number): OverlayFrame {
  const radius = Math.max(Math.min(size.width, size.height) / 2 - labelMargin(size), MIN_RADIUS_PX);
  return { center: { x: size.width / 2, y: size.height / 2 }, radius, zeroAtDeg: normalizeDeg(zeroAtDeg) };
}

/** A photo point (fractions of the image) on the stage, which has the photo's proportions. */
export function photoToStage(point: PhotoPoint, size: StageSize): ScreenPoint {
  return { x: point.x * size.width, y: point.y * size.height };
}

/** A stage point as a photo point, kept on the photo. */
export function stageToPhoto(point: ScreenPoint, size: StageSize): PhotoPoint {
  return {
    x: size.width > 0 ? clamp(point.x / size.width, 0, 1) : 0,
    y: size.height > 0 ? clamp(point.y / size.height, 0, 1) : 0,
  };
}

/**
 * The frame a calibration sets: the centre handle is the centre, its distance to the rim handle the radius,
 * and the direction of the reference-mark handle the screen angle of zero.
 */
export function frameFromCalibration(calibration: PhotoCalibration, size: StageSize): OverlayFrame {
  const center = photoToStage(calibration.centre, size);
  const rim = photoToStage(calibration.rim, size);
  const mark = photoToStage(calibration.referenceMark, size);
  const radius = Math.max(Math.hypot(rim.x - center.x, rim.y - center.y), 1);
  return { center, radius, zeroAtDeg: screenAngleOfPoint(center, mark) };
}

/** Where the handles start on an uncalibrated photo: the fitted rotor, the mark at `zeroAtDeg`, the rim a quarter turn on. */
export function defaultCalibration(size: StageSize, zeroAtDeg: number): PhotoCalibration {
  const frame = fittedFrame(size, zeroAtDeg);
  return {
    centre: stageToPhoto(frame.center, size),
    rim: stageToPhoto(pointAtScreenAngle(frame.center, frame.radius, frame.zeroAtDeg + 90), size),
    referenceMark: stageToPhoto(pointAtScreenAngle(frame.center, frame.radius, frame.zeroAtDeg), size),
  };
}

/** The calibration with one handle at `point`, kept on the photo. */
export function withHandleAt(
  calibration: PhotoCalibration,
  handle: CalibrationHandle,
  point: PhotoPoint,
): PhotoCalibration {
  return { ...calibration, [handle]: { x: clamp(point.x, 0, 1), y: clamp(point.y, 0, 1) } };
}

/** The calibration with one handle moved by fractions of the photo, kept on the photo. */
export function nudgeHandle(
  calibration: PhotoCalibration,
  handle: CalibrationHandle,
  dx: number,
  dy: number,
): PhotoCalibration {
  const from = calibration[handle];
  return withHandleAt(calibration, handle, { x: from.x + dx, y: from.y + dy });
}

/** How far a sector runs from `fromDeg` to `toDeg` the way angles increase: 0 when they meet, 360 for a full turn. */
export function sectorSweepDeg(fromDeg: number, toDeg: number): number {
  const sweep = normalizeDeg(toDeg - fromDeg);
  return sweep === 0 && toDeg !== fromDeg ? 360 : sweep;
}

/** The rotor angle halfway along a sector. */
export function sectorMidDeg(sector: BlockedSector): number {
  return normalizeDeg(sector.fromDeg + sectorSweepDeg(sector.fromDeg, sector.toDeg) / 2);
}

/** Whether a rotor angle lies in a sector, ends included. */
export function isInSector(angleDeg: number, sector: BlockedSector): boolean {
  const sweep = sectorSweepDeg(sector.fromDeg, sector.toDeg);
  const offset = normalizeDeg(angleDeg - sector.fromDeg);
  return offset <= sweep + 1e-9 || 360 - offset < 1e-9;
}

/** The first blocked sector an angle lies in, if any. */
export function sectorContaining(
  angleDeg: number,
  sectors: readonly BlockedSector[],
): BlockedSector | undefined {
  return sectors.find((sector) => isInSector(angleDeg, sector));
}

function point(p: ScreenPoint): string {
  return `${px(p.x)} ${px(p.y)}`;
}

function fullRing(center: ScreenPoint, radius: number, clockwise: boolean): string {
  const sweep = clockwise ? 1 : 0;
  const right = { x: center.x + radius, y: center.y };
  const left = { x: center.x - radius, y: center.y };
  const r = px(radius);
  return `M ${point(right)} A ${r} ${r} 0 1 ${sweep} ${point(left)} A ${r} ${r} 0 1 ${sweep} ${point(right)} Z`;
}

/**
 * The SVG path of the ring sector between two radii, from rotor angle `fromDeg` to `toDeg` the way angles
 * increase; a wedge from the centre when `innerRadius` is 0, a whole ring for a full turn, empty when the
 * ends meet.
 */
export function sectorPath(
  center: ScreenPoint,
  innerRadius: number,
  outerRadius: number,
  fromDeg: number,
  toDeg: number,
  convention: DialConvention,
): string {
  const sweep = sectorSweepDeg(fromDeg, toDeg);
  if (sweep === 0 || outerRadius <= 0) return '';
  if (sweep >= 360) {
    const outer = fullRing(center, outerRadius, true);
    return innerRadius > 0 ? `${outer} ${fullRing(center, innerRadius, false)}` : outer;
  }
  const sense = screenSense(convention);
  const start = screenAngleDeg(fromDeg, convention);
  const end = start + sense * sweep;
  const large = sweep > 180 ? 1 : 0;
  const outwardSweep = sense === 1 ? 1 : 0;
  const ro = px(outerRadius);
  const outerStart = pointAtScreenAngle(center, outerRadius, start);
  const outerEnd = pointAtScreenAngle(center, outerRadius, end);
  const outerArc = `M ${point(outerStart)} A ${ro} ${ro} 0 ${large} ${outwardSweep} ${point(outerEnd)}`;
  if (innerRadius <= 0) return `${outerArc} L ${point(center)} Z`;
  const ri = px(innerRadius);
  const innerEnd = pointAtScreenAngle(center, innerRadius, end);
  const innerStart = pointAtScreenAngle(center, innerRadius, start);
  return `${outerArc} L ${point(innerEnd)} A ${ri} ${ri} 0 ${large} ${1 - outwardSweep} ${point(innerStart)} Z`;
}

/** A curved arrow along a circle, centred on a screen angle, pointing the way the rotor turns. */
export function rotationArrow(
  center: ScreenPoint,
  radius: number,
  atScreenDeg: number,
  spanDeg: number,
  rotation: RotationDirection,
): { readonly path: string; readonly head: string } {
  const direction = rotation === 'clockwise' ? 1 : -1;
  const start = atScreenDeg - (direction * spanDeg) / 2;
  const end = atScreenDeg + (direction * spanDeg) / 2;
  const from = pointAtScreenAngle(center, radius, start);
  const to = pointAtScreenAngle(center, radius, end);
  const r = px(radius);
  const large = spanDeg > 180 ? 1 : 0;
  const path = `M ${point(from)} A ${r} ${r} 0 ${large} ${direction === 1 ? 1 : 0} ${point(to)}`;
  const radians = (end * Math.PI) / 180;
  const outward = { x: Math.sin(radians), y: -Math.cos(radians) };
  const along = { x: direction * Math.cos(radians), y: direction * Math.sin(radians) };
  const size = Math.max(5, Math.min(9, radius * 0.08));
  const tip = { x: to.x + along.x * size * 1.6, y: to.y + along.y * size * 1.6 };
  const left = { x: to.x + outward.x * size, y: to.y + outward.y * size };
  const right = { x: to.x - outward.x * size, y: to.y - outward.y * size };
  const corner = (p: ScreenPoint) => `${px(p.x)},${px(p.y)}`;
  return { path, head: `${corner(tip)} ${corner(left)} ${corner(right)}` };
}

/**
 * The screen angle farthest from every occupied one (on a 5-degree grid), so the rotation arrow finds an
 * empty stretch of rim; `preferredDeg` wins ties and an empty rim.
 */
export function quietestScreenAngle(occupied: readonly number[], preferredDeg = 45): number {
  if (occupied.length === 0) return normalizeDeg(preferredDeg);
  let best = normalizeDeg(preferredDeg);
  let bestClearance = -1;
  let bestPreference = Infinity;
  for (let candidate = 0; candidate < 360; candidate += 5) {
    const clearance = Math.min(...occupied.map((angle) => angularDistanceDeg(candidate, angle)));
    const preference = angularDistanceDeg(candidate, preferredDeg);
    if (
      clearance > bestClearance + 1e-9 ||
      (Math.abs(clearance - bestClearance) <= 1e-9 && preference < bestPreference)
    ) {
      best = candidate;
      bestClearance = clearance;
      bestPreference = preference;
    }
  }
  return best;
}

/** A label to place near a drawn element. */
export interface LabelRequest {
  /** Identifies the label and the element it names. */
  readonly key: string;
  /** The screen angle of the element, clockwise from 12 o'clock. */
  readonly screenDeg: number;
  /** The element's distance from the centre. */
  readonly anchorRadius: number;
  /** The label's width, in pixels. */
  readonly width: number;
  /** The label's height, in pixels. */
  readonly height: number;
  /** Clear space between the element and its label; 6 px when omitted. */
  readonly gap?: number;
  /** Left out rather than drawn over another label or element. */
  readonly optional?: boolean;
}

/** A placed label, with a leader line back to its element when it had to move away from it. */
export interface PlacedLabel {
  /** The key of the request. */
  readonly key: string;
  /** Where the label goes. */
  readonly box: Box;
  /** The point of the element it names. */
  readonly anchor: ScreenPoint;
  /** A line from the element to the label, when they are apart. */
  readonly leader: { readonly from: ScreenPoint; readonly to: ScreenPoint } | null;
}

/** A rough width of a one-line label: the stage has no text metrics in tests, and a little slack is harmless. */
export function estimateLabelWidth(text: string, fontSizePx: number, paddingPx: number): number {
  return Math.ceil(text.length * fontSizePx * 0.6 + 2 * paddingPx);
}

/** The area two boxes share. */
export function overlapArea(a: Box, b: Box): number {
  const w = Math.min(a.x + a.width, b.x + b.width) - Math.max(a.x, b.x);
  const h = Math.min(a.y + a.height, b.y + b.height) - Math.max(a.y, b.y);
  return w > 0 && h > 0 ? w * h : 0;
}

/** A box of the given size whose edge nearest the centre (outside) or farthest from it (inside) sits at `distance`. */
export function boxAtDistance(
  center: ScreenPoint,
  screenDeg: number,
  distance: number,
  width: number,
  height: number,
  side: 'outside' | 'inside',
): Box {
  const radians = (screenDeg * Math.PI) / 180;
  const ux = Math.sin(radians);
  const uy = -Math.cos(radians);
  const halfExtent = Math.min(
    Math.abs(ux) > 1e-9 ? width / 2 / Math.abs(ux) : Infinity,
    Math.abs(uy) > 1e-9 ? height / 2 / Math.abs(uy) : Infinity,
  );
  const reach = side === 'outside' ? distance + halfExtent : Math.max(distance - halfExtent, 0);
  return { x: center.x + ux * reach - width / 2, y: center.y + uy * reach - height / 2, width, height };
}

/** A box moved, as little as possible, to lie inside the stage with `inset` to spare. */
export function clampBox(box: Box, size: StageSize, inset = 2): Box {
  const x = clamp(box.x, inset, Math.max(inset, size.width - inset - box.width));
  const y = clamp(box.y, inset, Math.max(inset, size.height - inset - box.height));
  return { ...box, x, y };
}

/** The point of a box nearest to another point. */
export function nearestPointOnBox(box: Box, to: ScreenPoint): ScreenPoint {
  return { x: clamp(to.x, box.x, box.x + box.width), y: clamp(to.y, box.y, box.y + box.height) };
}

function inflate(box: Box, by: number): Box {
  return { x: box.x - by, y: box.y - by, width: box.width + 2 * by, height: box.height + 2 * by };
}

const NUDGES_DEG = [0, 6, -6, 12, -12, 20, -20, 30, -30, 45, -45];
const PUSHES = [0, 1, 2, 3];
const LEADER_AFTER_PX = 12;

/**
 * Places labels one after the other (first = most important) as close to their elements as they can go:
 * outside the rim if there is room, otherwise turned a little, pushed out, or inside; always on the stage;
 * never over a label already placed or an obstacle (its own element's symbol included) when a free spot
 * exists. An optional label with no free spot is left out.
 */
export function placeLabels(
  requests: readonly LabelRequest[],
  frame: OverlayFrame,
  size: StageSize,
  obstacles: readonly Obstacle[] = [],
): PlacedLabel[] {
  const placed: PlacedLabel[] = [];
  for (const request of requests) {
    const gap = request.gap ?? 6;
    const anchor = pointAtScreenAngle(frame.center, request.anchorRadius, request.screenDeg);
    const blockers: Obstacle[] = [...placed.map((label) => inflate(label.box, 2)), ...obstacles];
    const candidates: { ideal: Box; penalty: number }[] = [];
    for (const side of ['outside', 'inside'] as const) {
      for (const push of PUSHES) {
        const step = Math.max(request.height, 10) * push;
        const distance =
          side === 'outside' ? request.anchorRadius + gap + step : request.anchorRadius - gap - step;
        if (distance < 0) continue;
        for (const nudge of NUDGES_DEG) {
          const { width, height } = request;
          candidates.push({
            ideal: boxAtDistance(frame.center, request.screenDeg + nudge, distance, width, height, side),
            penalty: (side === 'inside' ? 12 : 0) + Math.abs(nudge) * 0.05,
          });
        }
      }
    }
    // Right beside the element, in the eight compass directions: where a crowded small stage has room.
    for (let direction = 0; direction < 360; direction += 45) {
      const ideal = boxAtDistance(anchor, direction, gap, request.width, request.height, 'outside');
      const middle = { x: ideal.x + ideal.width / 2, y: ideal.y + ideal.height / 2 };
      const inward = Math.hypot(middle.x - frame.center.x, middle.y - frame.center.y) < request.anchorRadius;
      candidates.push({ ideal, penalty: (inward ? 12 : 0) + 1 });
    }
    let best: { box: Box; cost: number; overlap: number } | undefined;
    for (const { ideal, penalty } of candidates) {
      const box = clampBox(ideal, size);
      let overlap = 0;
      let covering = 0;
      for (const blocker of blockers) {
        const area = overlapArea(box, blocker);
        overlap += area;
        covering += area * (blocker.weight ?? 100);
      }
      const nearest = nearestPointOnBox(box, anchor);
      const away = Math.max(0, Math.hypot(nearest.x - anchor.x, nearest.y - anchor.y) - gap);
      const cost = covering + away + penalty;
      if (!best || cost < best.cost) best = { box, cost, overlap };
    }
    if (!best || (request.optional && best.overlap > 0)) continue;
    const nearest = nearestPointOnBox(best.box, anchor);
    const far = Math.hypot(nearest.x - anchor.x, nearest.y - anchor.y) > gap + LEADER_AFTER_PX;
    placed.push({
      key: request.key,
      box: best.box,
      anchor,
      leader: far ? { from: anchor, to: nearest } : null,
    });
  }
  return placed;
}
