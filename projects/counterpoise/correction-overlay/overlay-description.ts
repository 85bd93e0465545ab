/**
 * The overlay's words: the short labels drawn beside each element, and the text alternative that says in
 * sentences everything the drawing shows. Framework-free, so both are tested without TestBed.
 */
import {
  type RotationCounting,
  type RotationDirection,
  _degreesText as degreesText,
  _formatAngle as formatAngle,
  _normalizeDeg as normalizeDeg,
} from '@counterpoise/ng/core';
import { sectorContaining, sectorSweepDeg } from './overlay-geometry';
import type { BlockedSector, OverlayPoint, OverlayWeight } from './overlay-model';

/** A mass as shown: at most one decimal, no trailing zero ("84", "12.5"). */
export function formatMass(mass: number): string {
  return String(Math.round(mass * 10) / 10);
}

/** The short label drawn beside a weight: "84 g at 100°", or "Split A: 84 g at 100°". */
export function weightLabel(weight: OverlayWeight): string {
  const text = `${formatMass(weight.mass)} ${weight.unit} at ${degreesText(weight.angleDeg, 1)}`;
  return weight.label ? `${weight.label}: ${text}` : text;
}

/** A screen angle as the hour on a clock face, for saying where the reference mark is drawn. */
export function clockPosition(screenDeg: number): string {
  const hour = Math.round(normalizeDeg(screenDeg) / 30) % 12;
  return `${hour === 0 ? 12 : hour} o'clock`;
}

/** Whether sorted angles are evenly spaced around the whole turn. */
function evenlySpaced(angles: readonly number[]): boolean {
  if (angles.length < 3) return false;
  const step = 360 / angles.length;
  return angles.every((angle, i) => Math.abs(normalizeDeg(angle - angles[0]! - i * step + 180) - 180) < 0.01);
}

/** The allowed positions in words: every one listed, or their count and spacing when evenly spread and many. */
export function describePositions(positions: readonly number[]): string {
  if (positions.length === 0) return '';
  if (positions.length > 8 && evenlySpaced(positions)) {
    const step = formatAngle(360 / positions.length);
    return `${positions.length} allowed positions, every ${step} degrees from ${formatAngle(positions[0]!)} degrees.`;
  }
  const list = positions.map((angle) => formatAngle(angle)).join(', ');
  return positions.length === 1
    ? `One allowed position, at ${list} degrees.`
    : `${positions.length} allowed positions, at ${list} degrees.`;
}

/** A blocked sector in words: "holder 20 to 40 degrees". */
export function describeSector(sector: BlockedSector): string {
  if (sectorSweepDeg(sector.fromDeg, sector.toDeg) >= 360) return `${sector.label} all the way round`;
  return `${sector.label} ${formatAngle(sector.fromDeg)} to ${formatAngle(sector.toDeg)} degrees`;
}

/** What the photo behind the drawing is like. */
export type PhotoState = 'none' | 'calibrated' | 'uncalibrated' | 'failed';

/** Everything the text alternative speaks of. */
export interface OverlayDescriptionInput {
  /** The way the rotor turns in the view. */
  readonly rotation: RotationDirection;
  /** Which way angles are counted. */
  readonly counting: RotationCounting;
  /** The screen angle the reference mark is drawn at, clockwise from 12 o'clock. */
  readonly zeroScreenDeg: number;
  /** The angle in line with the sensor, if drawn. */
  readonly sensorAngleDeg: number | null;
  /** The heavy spot, if drawn. */
  readonly heavySpotDeg: number | null;
  /** The corrections to fit. */
  readonly corrections: readonly OverlayWeight[];
  /** The weights already on. */
  readonly existingWeights: readonly OverlayWeight[];
  /** Allowed positions, sorted. */
  readonly allowedPositions: readonly number[];
  /** Where no weight can go. */
  readonly blockedSectors: readonly BlockedSector[];
  /** The point marked last. */
  readonly markedPoint: OverlayPoint | null;
  /** The photo behind the drawing. */
  readonly photo: PhotoState;
  /** Whether the calibration handles are shown. */
  readonly calibrating: boolean;
}

function weightSentence(
  kind: string,
  weight: OverlayWeight,
  counting: RotationCounting,
  sectors: readonly BlockedSector[],
): string {
  const direction = counting === 'withRotation' ? 'with' : 'against';
  const name = weight.label ? `${kind} ${weight.label}` : kind;
  const at = `${formatMass(weight.mass)} ${weight.unit} at ${formatAngle(weight.angleDeg)} degrees ${direction} rotation`;
  const blocked = sectorContaining(weight.angleDeg, sectors);
  return blocked
    ? `${name}: ${at}, inside the blocked sector ${describeSector(blocked)}.`
    : `${name}: ${at}.`;
}

/**
 * The text alternative of the drawing, one sentence per line, in the order a technician needs them: how to
 * read the angles, the corrections, what is already there, the heavy spot and the sensor, where weights can
 * and cannot go, the marked point, the photo.
 */
export function describeOverlay(input: OverlayDescriptionInput): string[] {
  const direction = input.counting === 'withRotation' ? 'with' : 'against';
  const turning = input.rotation === 'clockwise' ? 'clockwise' : 'counter-clockwise';
  const lines = [
    `End view of the rotor, turning ${turning}. Angles are counted ${direction} rotation from the reference mark, drawn at ${clockPosition(input.zeroScreenDeg)}.`,
  ];
  if (input.corrections.length === 0) lines.push('No correction weight to show.');
  for (const weight of input.corrections) {
    lines.push(weightSentence('Correction', weight, input.counting, input.blockedSectors));
  }
  for (const weight of input.existingWeights) {
    lines.push(weightSentence('Existing weight', weight, input.counting, input.blockedSectors));
  }
  if (input.heavySpotDeg !== null) lines.push(`Heavy spot at ${formatAngle(input.heavySpotDeg)} degrees.`);
  if (input.sensorAngleDeg !== null)
    lines.push(`Sensor in line with ${formatAngle(input.sensorAngleDeg)} degrees.`);
  if (input.allowedPositions.length > 0) lines.push(describePositions(input.allowedPositions));
  if (input.blockedSectors.length > 0) {
    lines.push(`Blocked: ${input.blockedSectors.map(describeSector).join('; ')}.`);
  }
  if (input.markedPoint) {
    const percent = Math.round(input.markedPoint.radiusFraction * 100);
    lines.push(
      `Marked point: ${formatAngle(input.markedPoint.angleDeg)} degrees, at ${percent}% of the radius.`,
    );
  }
  const photo: Record<PhotoState, string | null> = {
    none: null,
    calibrated: 'Drawn over a calibrated photo of the rotor.',
    uncalibrated:
      'Drawn over a photo of the rotor that is not calibrated yet: the drawing is centred on the photo.',
    failed: 'The photo of the rotor could not be loaded.',
  };
  const photoLine = photo[input.photo];
  if (photoLine) lines.push(photoLine);
  if (input.calibrating && input.photo !== 'none' && input.photo !== 'failed') {
    lines.push('Calibrating: move the centre, rim and reference-mark handles onto the photo.');
  }
  return lines;
}
