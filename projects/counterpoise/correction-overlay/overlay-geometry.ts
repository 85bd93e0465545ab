/**
 * Geometry of the correction-location overlay, in the pixels of its stage (the SVG's viewBox is the stage's
 * size, so a label of 12 px is 12 px on the tablet whatever the width). Framework-free: tested without TestBed.
 * Rotor angles go to the screen through the shared dial geometry of `@counterpoise/ng/core`.
 */
import {
  type DialConvention,
  type _ScreenPoint as ScreenPoint,
  _normalizeDeg as normalizeDeg,
  _pointAtScreenAngle as pointAtScreenAngle,
  _screenAngleDeg as screenAngleDeg,
  _screenAngleOfPoint as screenAngleOfPoint,
  _screenSense as screenSense,
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
