/**
 * What the phase dial draws, in the coordinates of its SVG view box: ticks, labels, the reference mark,
 * the rotation arrow, the pointer and the markers. Framework-free, so it is tested without TestBed; every
 * angle goes through the shared end-view geometry of `@counterpoise/ng/core`.
 */
import {
  type DialConvention,
  type _ScreenPoint as ScreenPoint,
  _formatAngle as formatAngle,
  _labelCentreBeside as labelCentreBeside,
  _normalizeDeg as normalizeDeg,
  _pointAtAngle as pointAtAngle,
  _pointAtScreenAngle as pointAtScreenAngle,
  _radialLine as radialLine,
  _referenceMark as endViewReferenceMark,
  _rotationArrow as endViewRotationArrow,
  _roundPx as round,
  _scaleTicks as scaleTicks,
  _screenAngleDeg as screenAngleDeg,
} from '@counterpoise/ng/core';
import type { PhaseDialMarker, PhaseDialMarkerKind } from './phase-dial-values';

/** The side of the square view box. */
export const DIAL_VIEW_SIZE = 256;
/** The centre of the dial in the view box. */
export const DIAL_CENTER: ScreenPoint = { x: DIAL_VIEW_SIZE / 2, y: DIAL_VIEW_SIZE / 2 };
/** The radius of the rim, where the thumb runs. */
export const DIAL_RIM_RADIUS = 86;
/** How close the angle labels come to the centre: clear of the thumb on the rim. */
const LABEL_INNER_RADIUS = 99;
/** Half the height of a label, and half the width of one of its digits, in view box units (16-unit font). */
const LABEL_HALF_HEIGHT = 8;
const LABEL_HALF_DIGIT_WIDTH = 4.4;
/** The inner end of the pointer, clear of the value read out in the middle. */
const POINTER_INNER_RADIUS = 44;
/** The radius of the thumb, the pointer's handle on the rim. */
export const DIAL_THUMB_RADIUS = 11;
/** The radius of the needle tip that replaces the thumb on a dial that can only be read. */
export const DIAL_NEEDLE_TIP_RADIUS = 5.5;
/** More positions than this and only the quarter angles are labelled, to keep the labels legible. */
const MAX_LABELLED_POSITIONS = 8;

/** A straight line in the view box. */
export interface DialLine {
  readonly x1: number;
  readonly y1: number;
  readonly x2: number;
  readonly y2: number;
}

/** A tick on the rim: a graduation (`minor`, `major`) or an allowed position. */
export interface DialTick extends DialLine {
  /** What the tick marks. */
  readonly kind: 'minor' | 'major' | 'position';
  /** The rotor angle it marks, in degrees. */
  readonly angleDeg: number;
}

/** A text label round the rim. */
export interface DialLabel {
  /** Where its centre sits. */
  readonly x: number;
  readonly y: number;
  /** The angle it names, as written. */
  readonly text: string;
}

/** A marker placed on the dial, ready to draw. */
export interface PlacedMarker {
  /** What the marker stands for. */
  readonly kind: PhaseDialMarkerKind;
  /** Its rotor angle, in degrees, in [0, 360). */
  readonly angleDeg: number;
  /** The marker's own detail, or an empty string. */
  readonly label: string;
  /** The transform that puts the kind's glyph in place, turned to point outwards. */
  readonly transform: string;
}

/** The shape of a marker kind: an SVG path drawn around (0, 0) and pointing up, and whether it is filled. */
export interface MarkerGlyph {
  /** The path data. */
  readonly d: string;
  /** Filled shapes read as solid; the open ring reads as a measurement. */
  readonly filled: boolean;
}

/**
 * One shape per marker kind, so that kinds differ by shape as well as by colour and legend: a reading is
 * an open ring, the heavy spot a diamond, a trial weight a square and the correction a triangle pointing
 * out to the rim where the weight goes.
 */
export const MARKER_GLYPHS: Readonly<Record<PhaseDialMarkerKind, MarkerGlyph>> = {
  reading: { d: 'M -7.5 0 A 7.5 7.5 0 1 0 7.5 0 A 7.5 7.5 0 1 0 -7.5 0 Z', filled: false },
  heavySpot: { d: 'M 0 -11 L 9 0 L 0 11 L -9 0 Z', filled: true },
  trialWeight: { d: 'M -8 -8 H 8 V 8 H -8 Z', filled: true },
  correction: { d: 'M 0 -11 L 10 8 L -10 8 Z', filled: true },
};

/** How far from the centre each kind is drawn, so that a heavy spot and a reading at one angle both show. */
const MARKER_RADIUS: Readonly<Record<PhaseDialMarkerKind, number>> = {
  reading: 68,
  trialWeight: 68,
  correction: 68,
  heavySpot: 54,
};

/**
 * The ticks round the rim: with positions, one notch per position; otherwise a graduation every 10
 * degrees, longer every 30. None at 0, where the reference mark is.
 */
export function dialTicks(positions: readonly number[], convention: DialConvention): DialTick[] {
  return scaleTicks(DIAL_CENTER, DIAL_RIM_RADIUS, convention, {
    positions,
    minorLengthPx: 8,
    majorLengthPx: 14,
    positionLengthPx: 13,
    skipZero: true,
  });
}

/**
 * The rotor angles that get a label: 0 and each position when there are few, otherwise 0, 90, 180 and 270.
 * 0 is always labelled so that the reference mark is named even when it is no position.
 */
export function labelledAngles(positions: readonly number[]): readonly number[] {
  if (positions.length === 0 || positions.length > MAX_LABELLED_POSITIONS) return [0, 90, 180, 270];
  return [...new Set([0, ...positions])];
}

/** The labels round the rim, at {@link labelledAngles}. */
export function dialLabels(positions: readonly number[], convention: DialConvention): DialLabel[] {
  return labelledAngles(positions).map((angleDeg) => {
    const text = formatAngle(angleDeg, 1);
    const width = text.length * 2 * LABEL_HALF_DIGIT_WIDTH;
    const screenDeg = screenAngleDeg(angleDeg, convention);
    const point = labelCentreBeside(DIAL_CENTER, LABEL_INNER_RADIUS, screenDeg, width, 2 * LABEL_HALF_HEIGHT);
    return { x: round(point.x), y: round(point.y), text };
  });
}

/** The reference mark: a bar across the rim at 0, like the strip of reflective tape it stands for. */
export function referenceMark(convention: DialConvention): DialLine {
  return endViewReferenceMark(DIAL_CENTER, DIAL_RIM_RADIUS, convention, {
    insidePx: 10,
    outsidePx: 10,
    pointerPx: 0,
  }).line;
}

/** The pointer of the value: from clear of the read-out to the rim, where the thumb or needle tip sits. */
export function pointerLine(angleDeg: number, convention: DialConvention): DialLine {
  return radialLine(DIAL_CENTER, angleDeg, POINTER_INNER_RADIUS, DIAL_RIM_RADIUS, convention);
}

/** The centre of the thumb for an angle. */
export function thumbCenter(angleDeg: number, convention: DialConvention): ScreenPoint {
  const point = pointAtAngle(DIAL_CENTER, DIAL_RIM_RADIUS, angleDeg, convention);
  return { x: round(point.x), y: round(point.y) };
}

/** Each marker at its angle, glyph turned to point outwards; markers with no finite angle are left out. */
export function placeMarkers(
  markers: readonly PhaseDialMarker[],
  convention: DialConvention,
): PlacedMarker[] {
  return markers
    .filter((marker) => Number.isFinite(marker.angleDeg))
    .map((marker) => {
      const screenDeg = screenAngleDeg(marker.angleDeg, convention);
      const at = pointAtScreenAngle(DIAL_CENTER, MARKER_RADIUS[marker.kind], screenDeg);
      return {
        kind: marker.kind,
        angleDeg: normalizeDeg(marker.angleDeg),
        label: marker.label ?? '',
        transform: `translate(${round(at.x)} ${round(at.y)}) rotate(${round(screenDeg)})`,
      };
    });
}

/** The small arrow outside the rim that shows which way the rotor turns as seen by the viewer. */
export interface RotationArrow {
  /** The arc. */
  readonly arc: string;
  /** The arrowhead at the end the rotor turns towards. */
  readonly head: string;
}

/**
 * The rotation arrow: an arc outside the rim with its head in the direction of rotation, in the widest gap
 * between the labels and the reference mark (by default 135 degrees clockwise on screen from the mark).
 */
export function rotationArrow(
  convention: DialConvention,
  labelledDeg: readonly number[] = [0, 90, 180, 270],
): RotationArrow {
  const arrow = endViewRotationArrow(DIAL_CENTER, convention, {
    radius: DIAL_RIM_RADIUS + 14,
    takenScreenDeg: [0, ...labelledDeg].map((angle) => screenAngleDeg(angle, convention)),
    preferredScreenDeg: convention.zeroAtDeg + 135,
    maxHalfSpanDeg: 20,
    minHalfSpanDeg: 8,
    clearanceDeg: 14,
    headLengthPx: 16,
    headHalfWidthPx: 6,
  });
  return { arc: arrow.arcPath, head: arrow.headPath };
}
