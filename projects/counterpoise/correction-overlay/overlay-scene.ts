/**
 * Everything the overlay draws, worked out as plain data (points, paths, placed labels) from its inputs, so
 * that the component's template only copies numbers into SVG and the layout is tested without TestBed.
 */
import {
  type DialConvention,
  type RotationCounting,
  type RotationDirection,
  type _Box as Box,
  type _EndViewLabelRequest as EndViewLabelRequest,
  type _EndViewObstacle as EndViewObstacle,
  type _EndViewRim as EndViewRim,
  type _ScreenPoint as ScreenPoint,
  _boxAround as boxAround,
  _boxInside as boxInside,
  _degreesText as degreesText,
  _estimateTextWidthPx as estimateTextWidthPx,
  _formatAngle as formatAngle,
  _placeEndViewLabels as placeEndViewLabels,
  _pointAtAngle as pointAtAngle,
  _referenceMark as referenceMark,
  _rotationArrow as rotationArrow,
  _scaleTicks as scaleTicks,
  _screenAngleDeg as screenAngleDeg,
} from '@counterpoise/ng/core';
import { weightLabel } from './overlay-description';
import {
  type OverlayFrame,
  type StageSize,
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
  /** The drawing's width: the stage's. */
  readonly width: number;
  /** The drawing's height: the stage's, or more when labels needed rows below the rotor. */
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
  /** The reference mark: a bar across the rim and a pointer beyond it. */
  readonly reference: { readonly line: SceneLine; readonly pointerPath: string };
  /** The rotation arrow: its arc and head, in the quietest stretch of rim. */
  readonly rotationArrow: { readonly arcPath: string; readonly headPath: string };
  /** The marked point. */
  readonly marked: ScreenPoint | null;
  /** Every label, placed. */
  readonly labels: readonly SceneLabel[];
  /** The keys of optional labels left out for want of room (the text alternative still names them). */
  readonly droppedLabels: readonly string[];
}

/** Font sizes of the labels, in CSS pixels: the correction stands out, the rest stay readable in sunlight. */
export const LABEL_FONT_PX = { correction: 15, other: 12, scale: 11 } as const;
/** The smallest font a correction's label shrinks to on a narrow stage: still legible at arm's length. */
const MIN_CORRECTION_FONT_PX = 12;
const LABEL_PADDING_PX = 6;
/** Weights sit just inside the rim, where they do the most per gram. */
const WEIGHT_INSET_PX = 10;
const WEIGHT_GLYPH = { tangential: 24, radial: 14 } as const;
/** The rim as a band labels never cross: the ticks, the weights and the allowed positions inside it. */
const RIM_BAND = { insidePx: 22, outsidePx: 4 } as const;
/** How far from its sensor or sector a name may go, as a fraction of the radius, before it is left out. */
const NAME_REACH = 0.5;
/** How a label's priority ranks: the corrections first, the optional names of things last. */
const PRIORITY: Readonly<Record<SceneLabelKind, number>> = {
  correction: 100,
  marked: 90,
  heavySpot: 80,
  existing: 70,
  reference: 60,
  sensor: 40,
  blocked: 30,
};

function line(from: ScreenPoint, to: ScreenPoint): SceneLine {
  return { x1: from.x, y1: from.y, x2: to.x, y2: to.y };
}

function glyph(at: ScreenPoint, screenDeg: number): SceneGlyph {
  return { x: at.x, y: at.y, rotateDeg: screenDeg };
}

/** A mark no label may cover: a square of `side` round a glyph's centre. */
function mark(at: ScreenPoint, side: number): EndViewObstacle {
  return { kind: 'mark', ...boxAround(at, side) };
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
  const obstacles: EndViewObstacle[] = [mark(center, 10)];

  const ticks = scaleTicks(center, radius, convention, { minorLengthPx: 5, majorLengthPx: 9 }).map(
    ({ kind, angleDeg: _angleDeg, ...tick }) => ({ ...tick, major: kind === 'major' }),
  );
  const scaleNumbers: { x: number; y: number; text: string }[] = [];
  const numberStep = radius >= 120 ? 30 : 90;
  if (radius >= 40) {
    for (let angle = 0; angle < 360; angle += numberStep) {
      const p = at(radius - 26, angle);
      scaleNumbers.push({ x: p.x, y: p.y, text: formatAngle(angle, 0) });
      // A label may cover a scale number when nothing else is free: the weights' labels matter more.
      obstacles.push({ kind: 'soft', weight: 4, x: p.x - 11, y: p.y - 7, width: 22, height: 14 });
    }
  }

  const blocked = input.blockedSectors.map((sector, i) => ({
    key: `blocked-${i}`,
    path: sectorPath(center, radius * BLOCKED_BAND_INNER, radius, sector.fromDeg, sector.toDeg, convention),
  }));

  const allowed = input.allowedPositions.map((angle) => at(weightRadius, angle));
  for (const position of allowed) obstacles.push(mark(position, 11));

  const sensor =
    input.sensorAngleDeg === null
      ? null
      : {
          line: line(center, at(radius + 10, input.sensorAngleDeg)),
          glyph: glyph(at(radius + 17, input.sensorAngleDeg), screen(input.sensorAngleDeg)),
        };
  if (sensor) obstacles.push(mark(sensor.glyph, 20));

  const heavySpot =
    input.heavySpotDeg === null
      ? null
      : {
          line: line(center, at(radius * 0.72, input.heavySpotDeg)),
          dot: at(radius * 0.72, input.heavySpotDeg),
        };
  if (heavySpot) obstacles.push(mark(heavySpot.dot, 16));

  const corrections = input.corrections.map((weight, i) => {
    const p = at(weightRadius, weight.angleDeg);
    obstacles.push(mark(p, 28));
    return {
      key: `correction-${i}`,
      line: line(center, at(weightRadius - WEIGHT_GLYPH.radial / 2, weight.angleDeg)),
      glyph: glyph(p, screen(weight.angleDeg)),
      conflict: sectorContaining(weight.angleDeg, input.blockedSectors) !== undefined,
    };
  });

  const existing = input.existingWeights.map((weight, i) => {
    const p = at(weightRadius, weight.angleDeg);
    obstacles.push(mark(p, 28));
    return {
      key: `existing-${i}`,
      glyph: glyph(p, screen(weight.angleDeg)),
      conflict: sectorContaining(weight.angleDeg, input.blockedSectors) !== undefined,
    };
  });

  const referenceDrawn = referenceMark(center, radius, convention, {
    insidePx: 16,
    outsidePx: 4,
    pointerPx: 12,
  });
  obstacles.push({ kind: 'mark', ...referenceDrawn.box });
  const reference = { line: referenceDrawn.line, pointerPath: referenceDrawn.pointerPath };

  const marked = input.markedPoint
    ? at(radius * input.markedPoint.radiusFraction, input.markedPoint.angleDeg)
    : null;
  if (marked) obstacles.push(mark(marked, 30));

  const taken = [
    frame.zeroAtDeg,
    ...input.corrections.map((w) => screen(w.angleDeg)),
    ...input.existingWeights.map((w) => screen(w.angleDeg)),
    ...input.blockedSectors.map((s) => screen(sectorMidDeg(s))),
    ...[input.heavySpotDeg, input.sensorAngleDeg, input.markedPoint?.angleDeg ?? null]
      .filter((angle): angle is number => angle !== null)
      .map(screen),
  ];
  const arrowAt = (arrowRadius: number) =>
    rotationArrow(center, convention, {
      radius: arrowRadius,
      takenScreenDeg: taken,
      preferredScreenDeg: frame.zeroAtDeg + 45,
      maxHalfSpanDeg: 22,
      minHalfSpanDeg: 10,
      clearanceDeg: 8,
      headLengthPx: 14,
      headHalfWidthPx: 7,
    });
  const outside = arrowAt(radius + 12);
  const stageBox = { x: 0, y: 0, width: size.width, height: size.height };
  const arrow = boxInside(outside.box, stageBox) ? outside : arrowAt(radius * 0.55);
  obstacles.push({ kind: 'mark', ...arrow.box });

  const { labels, dropped, height } = labelScene(input, convention, weightRadius, obstacles);
  return {
    width: size.width,
    height,
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
    rotationArrow: { arcPath: arrow.arcPath, headPath: arrow.headPath },
    marked,
    labels,
    droppedLabels: dropped,
  };
}

interface LabelDraft extends EndViewLabelRequest {
  readonly kind: SceneLabelKind;
  readonly text: string;
  readonly fontSize: number;
  readonly conflict: boolean;
}

function labelScene(
  input: OverlaySceneInput,
  convention: DialConvention,
  weightRadius: number,
  obstacles: readonly EndViewObstacle[],
): { labels: SceneLabel[]; dropped: string[]; height: number } {
  const { frame, size } = input;
  const { center } = frame;
  const roomPx = size.width - 8;
  const draft = (
    key: string,
    kind: SceneLabelKind,
    text: string,
    angleDeg: number,
    anchorRadius: number,
    extra: { gapPx: number; optional?: boolean; conflict?: boolean; maxDistancePx?: number },
  ): LabelDraft => {
    const wanted = kind === 'correction' ? LABEL_FONT_PX.correction : LABEL_FONT_PX.other;
    const fits = (fontSize: number) => estimateTextWidthPx(text, fontSize, LABEL_PADDING_PX) <= roomPx;
    const fontSize = kind === 'correction' && !fits(wanted) ? MIN_CORRECTION_FONT_PX : wanted;
    const screenDeg = screenAngleDeg(angleDeg, convention);
    return {
      key,
      kind,
      text,
      fontSize,
      anchor: pointAtAngle(center, anchorRadius, angleDeg, convention),
      preferredDeg: screenDeg,
      width: estimateTextWidthPx(text, fontSize, LABEL_PADDING_PX),
      height: Math.round(fontSize * 1.7),
      gapPx: extra.gapPx,
      priority: PRIORITY[kind],
      optional: extra.optional,
      maxDistancePx: extra.maxDistancePx,
      conflict: extra.conflict ?? false,
    };
  };
  const r = frame.radius;
  const weightGap = WEIGHT_GLYPH.tangential / 2 + 4;
  const drafts: LabelDraft[] = input.corrections.map((weight, i) =>
    draft(`correction-${i}`, 'correction', weightLabel(weight), weight.angleDeg, weightRadius, {
      gapPx: weightGap,
      conflict: sectorContaining(weight.angleDeg, input.blockedSectors) !== undefined,
    }),
  );
  if (input.markedPoint) {
    const { angleDeg, radiusFraction } = input.markedPoint;
    drafts.push(
      draft('marked', 'marked', `Marked ${degreesText(angleDeg)}`, angleDeg, r * radiusFraction, {
        gapPx: 16,
      }),
    );
  }
  if (input.heavySpotDeg !== null) {
    drafts.push(draft('heavy-spot', 'heavySpot', 'Heavy spot', input.heavySpotDeg, r * 0.72, { gapPx: 10 }));
  }
  input.existingWeights.forEach((weight, i) =>
    drafts.push(
      draft(`existing-${i}`, 'existing', weightLabel(weight), weight.angleDeg, weightRadius, {
        gapPx: weightGap,
        conflict: sectorContaining(weight.angleDeg, input.blockedSectors) !== undefined,
      }),
    ),
  );
  drafts.push(draft('reference', 'reference', `Ref ${degreesText(0, 0)}`, 0, r + 10, { gapPx: 12 }));
  if (input.sensorAngleDeg !== null) {
    drafts.push(
      draft('sensor', 'sensor', 'Sensor', input.sensorAngleDeg, r + 17, {
        gapPx: 12,
        optional: true,
        maxDistancePx: NAME_REACH * r,
      }),
    );
  }
  input.blockedSectors.forEach((sector, i) =>
    drafts.push(
      draft(`blocked-${i}`, 'blocked', sector.label, sectorMidDeg(sector), r * 0.84, {
        gapPx: r * 0.16 + RIM_BAND.outsidePx + 2,
        optional: true,
        maxDistancePx: NAME_REACH * r,
      }),
    ),
  );

  const rim: EndViewRim = { center, radius: r, ...RIM_BAND };
  const bounds: Box = { x: 0, y: 0, width: size.width, height: size.height };
  const layout = placeEndViewLabels(drafts, { bounds, rim, obstacles });
  const byKey = new Map(drafts.map((d) => [d.key, d]));
  const labels = layout.placed.map((label) => {
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
  return { labels, dropped: [...layout.dropped], height: Math.ceil(layout.height) };
}
