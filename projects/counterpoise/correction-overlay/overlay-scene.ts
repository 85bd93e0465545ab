/**
 * Everything the overlay draws, worked out as plain data (points, paths, placed labels) from its inputs, so
 * that the component's template only copies numbers into SVG and the layout is tested without TestBed.
 */
import {
  type RotationCounting,
  type DialConvention,
  type RotationDirection,
  type ScreenPoint,
  pointAtAngle,
  pointAtScreenAngle,
  screenAngleDeg,
} from '@counterpoise/ng/core';
import { formatDegrees, weightLabel } from './overlay-description';
import {
  type LabelRequest,
  type Obstacle,
  type OverlayFrame,
  type StageSize,
  estimateLabelWidth,
  placeLabels,
  quietestScreenAngle,
  rotationArrow,
  sectorContaining,
  sectorMidDeg,
  sectorPath,
} from './overlay-geometry';
import type { BlockedSector, OverlayPoint, OverlayWeight } from './overlay-model';

/** What the scene is built from. */
export interface OverlaySceneInput {
  /** The stage. */
  readonly size: StageSize;
  /** Where the rotor is on it. */
  readonly frame: OverlayFrame;
  /** The way the rotor turns in the view. */
  readonly rotation: RotationDirection;
  /** Which way angles are counted. */
  readonly counting: RotationCounting;
  /** The angle in line with the sensor; none when null. */
  readonly sensorAngleDeg: number | null;
  /** The heavy spot; none when null. */
  readonly heavySpotDeg: number | null;
  /** The corrections to fit. */
  readonly corrections: readonly OverlayWeight[];
  /** The weights already on. */
  readonly existingWeights: readonly OverlayWeight[];
  /** Allowed positions, as angles. */
  readonly allowedPositions: readonly number[];
  /** Where no weight can go. */
  readonly blockedSectors: readonly BlockedSector[];
  /** The point marked last. */
  readonly markedPoint: OverlayPoint | null;
}

/** A straight line. */
export interface SceneLine {
  /** Start, across. */
  readonly x1: number;
  /** Start, down. */
  readonly y1: number;
  /** End, across. */
  readonly x2: number;
  /** End, down. */
  readonly y2: number;
}

/** A symbol drawn centred on a point and turned to lie along the rim. */
export interface SceneGlyph {
  /** Centre, across. */
  readonly x: number;
  /** Centre, down. */
  readonly y: number;
  /** The screen angle of the glyph's position; the glyph is turned by it. */
  readonly rotateDeg: number;
}

/** What a label names, which sets its look. */
export type SceneLabelKind =
  'correction' | 'existing' | 'heavySpot' | 'sensor' | 'reference' | 'blocked' | 'marked';

/** A label, placed. */
export interface SceneLabel {
  /** The element it names. */
  readonly key: string;
  /** What kind of element that is. */
  readonly kind: SceneLabelKind;
  /** The words shown. */
  readonly text: string;
  /** Left edge of its box. */
  readonly x: number;
  /** Top edge of its box. */
  readonly y: number;
  /** Width of its box. */
  readonly width: number;
  /** Height of its box. */
  readonly height: number;
  /** Font size, in pixels. */
  readonly fontSize: number;
  /** A line back to the element when the label sits apart. */
  readonly leader: SceneLine | null;
  /** A weight drawn inside a blocked sector. */
  readonly conflict: boolean;
}

/** A weight's symbol. */
export interface SceneWeight {
  /** The element's key, shared with its label. */
  readonly key: string;
  /** The weight symbol, just inside the rim. */
  readonly glyph: SceneGlyph;
  /** Whether it lies in a blocked sector. */
  readonly conflict: boolean;
}

/** A correction: its weight symbol and a bold line to it from the centre. */
export interface SceneCorrection extends SceneWeight {
  /** The line from the centre. */
  readonly line: SceneLine;
}

/** The whole drawing. */
export interface OverlayScene {
  readonly width: number;
  readonly height: number;
  /** The rotor's centre. */
  readonly center: ScreenPoint;
  /** The rotor's radius. */
  readonly radius: number;
  /** How rotor angles map to the screen, zero included. */
  readonly convention: DialConvention;
  /** Scale ticks every 10 degrees, longer every 30. */
  readonly ticks: readonly (SceneLine & { readonly major: boolean })[];
  /** Scale numbers inside the rim. */
  readonly scaleNumbers: readonly { readonly x: number; readonly y: number; readonly text: string }[];
  /** Blocked sectors as ring-sector paths. */
  readonly blocked: readonly { readonly key: string; readonly path: string }[];
  /** Allowed positions. */
  readonly allowed: readonly ScreenPoint[];
  /** The sensor line and symbol. */
  readonly sensor: { readonly line: SceneLine; readonly glyph: SceneGlyph } | null;
  /** The heavy spot line and dot. */
  readonly heavySpot: { readonly line: SceneLine; readonly dot: ScreenPoint } | null;
  readonly corrections: readonly SceneCorrection[];
  /** Each existing weight's symbol. */
  readonly existing: readonly SceneWeight[];
  /** The reference mark. */
  readonly reference: { readonly line: SceneLine; readonly glyph: SceneGlyph };
  /** The rotation arrow: its arc and head. */
  readonly rotationArrow: { readonly path: string; readonly head: string };
  /** The marked point. */
  readonly marked: ScreenPoint | null;
  /** Every label, placed. */
  readonly labels: readonly SceneLabel[];
}

/** Font sizes of the labels, in CSS pixels: the correction stands out, the rest stay readable in sunlight. */
export const LABEL_FONT_PX = { correction: 15, other: 12, scale: 11 } as const;
const LABEL_PADDING_PX = 6;
/** Weights sit just inside the rim, where they do the most per gram. */
const WEIGHT_INSET_PX = 10;
const WEIGHT_GLYPH = { tangential: 24, radial: 14 } as const;

function line(from: ScreenPoint, to: ScreenPoint): SceneLine {
  return { x1: from.x, y1: from.y, x2: to.x, y2: to.y };
}

function glyph(at: ScreenPoint, screenDeg: number): SceneGlyph {
  return { x: at.x, y: at.y, rotateDeg: screenDeg };
}

function squareAround(at: ScreenPoint, half: number, key: string): Obstacle {
  return { key, x: at.x - half, y: at.y - half, width: 2 * half, height: 2 * half };
}

/** The inner radius of a blocked sector's band, as a fraction of the radius: holders and welds sit near the rim. */
export const BLOCKED_BAND_INNER = 0.68;

/** Builds the drawing: geometry of every element and labels placed clear of each other. */
export function buildOverlayScene(input: OverlaySceneInput): OverlayScene {
  const { frame, size } = input;
  const { center, radius } = frame;
  const convention: DialConvention = {
    rotation: input.rotation,
    counting: input.counting,
    zeroAtDeg: frame.zeroAtDeg,
  };
  const at = (r: number, angleDeg: number) => pointAtAngle(center, r, angleDeg, convention);
  const screen = (angleDeg: number) => screenAngleDeg(angleDeg, convention);
  const weightRadius = Math.max(radius - WEIGHT_INSET_PX, radius * 0.5);

  const ticks: (SceneLine & { major: boolean })[] = [];
  const scaleNumbers: { x: number; y: number; text: string }[] = [];
  const obstacles: Obstacle[] = [];
  const numberStep = radius >= 120 ? 30 : 90;
  for (let angle = 0; angle < 360; angle += 10) {
    const major = angle % 30 === 0;
    ticks.push({ ...line(at(radius, angle), at(radius - (major ? 9 : 5), angle)), major });
    if (angle % numberStep === 0 && radius >= 40) {
      const p = at(radius - 26, angle);
      scaleNumbers.push({ x: p.x, y: p.y, text: String(angle) });
      // A scale number may be covered: the label of a weight right beside it matters more.
      obstacles.push({ x: p.x - 11, y: p.y - 7, width: 22, height: 14, weight: 0.5 });
    }
  }

  const blocked = input.blockedSectors.map((sector, i) => ({
    key: `blocked-${i}`,
    path: sectorPath(center, radius * BLOCKED_BAND_INNER, radius, sector.fromDeg, sector.toDeg, convention),
  }));

  const allowed = input.allowedPositions.map((angle) => at(weightRadius, angle));

  const sensor =
    input.sensorAngleDeg === null
      ? null
      : {
          line: line(center, at(radius + 10, input.sensorAngleDeg)),
          glyph: glyph(at(radius + 17, input.sensorAngleDeg), screen(input.sensorAngleDeg)),
        };
  if (sensor) obstacles.push(squareAround(sensor.glyph, 8, 'sensor'));

  const heavySpot =
    input.heavySpotDeg === null
      ? null
      : {
          line: line(center, at(radius * 0.72, input.heavySpotDeg)),
          dot: at(radius * 0.72, input.heavySpotDeg),
        };
  if (heavySpot) obstacles.push(squareAround(heavySpot.dot, 8, 'heavy-spot'));

  const corrections = input.corrections.map((weight, i) => {
    const p = at(weightRadius, weight.angleDeg);
    obstacles.push(squareAround(p, 10, `correction-${i}`));
    return {
      key: `correction-${i}`,
      line: line(center, at(weightRadius - WEIGHT_GLYPH.radial / 2, weight.angleDeg)),
      glyph: glyph(p, screen(weight.angleDeg)),
      conflict: sectorContaining(weight.angleDeg, input.blockedSectors) !== undefined,
    };
  });

  const existing = input.existingWeights.map((weight, i) => {
    const p = at(weightRadius, weight.angleDeg);
    obstacles.push(squareAround(p, 10, `existing-${i}`));
    return {
      key: `existing-${i}`,
      glyph: glyph(p, screen(weight.angleDeg)),
      conflict: sectorContaining(weight.angleDeg, input.blockedSectors) !== undefined,
    };
  });

  const reference = {
    line: line(at(radius - 16, 0), at(radius + 10, 0)),
    glyph: glyph(at(radius + 10, 0), frame.zeroAtDeg),
  };
  obstacles.push(squareAround(reference.glyph, 9, 'reference'));

  const marked = input.markedPoint
    ? at(radius * input.markedPoint.radiusFraction, input.markedPoint.angleDeg)
    : null;
  if (marked) obstacles.push(squareAround(marked, 10, 'marked'));

  const occupied = [
    frame.zeroAtDeg,
    ...input.corrections.map((w) => screen(w.angleDeg)),
    ...input.existingWeights.map((w) => screen(w.angleDeg)),
    ...input.blockedSectors.map((s) => screen(sectorMidDeg(s))),
    ...[input.heavySpotDeg, input.sensorAngleDeg, input.markedPoint?.angleDeg ?? null]
      .filter((angle): angle is number => angle !== null)
      .map(screen),
  ];
  const arrowAt = quietestScreenAngle(occupied, frame.zeroAtDeg + 45);
  const outsideArrow = pointAtScreenAngle(center, radius + 22, arrowAt);
  const arrowFits =
    outsideArrow.x > 0 && outsideArrow.y > 0 && outsideArrow.x < size.width && outsideArrow.y < size.height;
  const arrow = rotationArrow(center, arrowFits ? radius + 12 : radius - 40, arrowAt, 44, input.rotation);

  const labels = labelScene(input, convention, weightRadius, obstacles);
  return {
    width: size.width,
    height: size.height,
    center,
    radius,
    convention,
    ticks,
    scaleNumbers,
    blocked,
    allowed,
    sensor,
    heavySpot,
    corrections,
    existing,
    reference,
    rotationArrow: arrow,
    marked,
    labels,
  };
}

interface LabelDraft extends LabelRequest {
  readonly kind: SceneLabelKind;
  readonly text: string;
  readonly fontSize: number;
  readonly conflict: boolean;
}

function labelScene(
  input: OverlaySceneInput,
  convention: DialConvention,
  weightRadius: number,
  obstacles: readonly Obstacle[],
): SceneLabel[] {
  const { frame, size } = input;
  const screen = (angleDeg: number) => screenAngleDeg(angleDeg, convention);
  const draft = (
    key: string,
    kind: SceneLabelKind,
    text: string,
    angleDeg: number,
    anchorRadius: number,
    extra: { gap?: number; optional?: boolean; conflict?: boolean } = {},
  ): LabelDraft => {
    const fontSize = kind === 'correction' ? LABEL_FONT_PX.correction : LABEL_FONT_PX.other;
    return {
      key,
      kind,
      text,
      fontSize,
      screenDeg: screen(angleDeg),
      anchorRadius,
      width: estimateLabelWidth(text, fontSize, LABEL_PADDING_PX),
      height: Math.round(fontSize * 1.7),
      gap: extra.gap,
      optional: extra.optional,
      conflict: extra.conflict ?? false,
    };
  };
  const r = frame.radius;
  const drafts: LabelDraft[] = [
    ...input.corrections.map((weight, i) =>
      draft(`correction-${i}`, 'correction', weightLabel(weight), weight.angleDeg, weightRadius, {
        gap: WEIGHT_GLYPH.radial / 2 + 8,
        conflict: sectorContaining(weight.angleDeg, input.blockedSectors) !== undefined,
      }),
    ),
  ];
  if (input.markedPoint) {
    const { angleDeg, radiusFraction } = input.markedPoint;
    drafts.push(
      draft('marked', 'marked', `Marked ${formatDegrees(angleDeg)}°`, angleDeg, r * radiusFraction, {
        gap: 12,
      }),
    );
  }
  if (input.heavySpotDeg !== null) {
    drafts.push(draft('heavy-spot', 'heavySpot', 'Heavy spot', input.heavySpotDeg, r * 0.72, { gap: 9 }));
  }
  input.existingWeights.forEach((weight, i) =>
    drafts.push(
      draft(`existing-${i}`, 'existing', weightLabel(weight), weight.angleDeg, weightRadius, {
        gap: WEIGHT_GLYPH.radial / 2 + 8,
        conflict: sectorContaining(weight.angleDeg, input.blockedSectors) !== undefined,
      }),
    ),
  );
  drafts.push(draft('reference', 'reference', 'Ref 0°', 0, r + 10, { gap: 11 }));
  if (input.sensorAngleDeg !== null) {
    drafts.push(
      draft('sensor', 'sensor', 'Sensor', input.sensorAngleDeg, r + 17, { gap: 10, optional: true }),
    );
  }
  input.blockedSectors.forEach((sector, i) =>
    drafts.push(
      draft(`blocked-${i}`, 'blocked', sector.label, sectorMidDeg(sector), r, { gap: 4, optional: true }),
    ),
  );

  const placed = placeLabels(drafts, frame, size, obstacles);
  const byKey = new Map(drafts.map((d) => [d.key, d]));
  return placed.map((label) => {
    const d = byKey.get(label.key)!;
    return {
      key: label.key,
      kind: d.kind,
      text: d.text,
      x: label.box.x,
      y: label.box.y,
      width: label.box.width,
      height: label.box.height,
      fontSize: d.fontSize,
      leader: label.leader ? line(label.leader.from, label.leader.to) : null,
      conflict: d.conflict,
    };
  });
}
