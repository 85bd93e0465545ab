/**
 * Everything the polar plot draws, worked out from its inputs and its size as plain data, so that the
 * component is a thin template over it and the drawing is tested without TestBed.
 */
import {
  type DialConvention,
  type _Box as Box,
  type _EndViewObstacle as EndViewObstacle,
  type _ScreenPoint as ScreenPoint,
  _boxAround as boxAround,
  _degreesText as degreesText,
  _estimateTextWidthPx as estimateTextWidthPx,
  _labelCentreBeside as labelCentreBeside,
  _overlapArea as overlapArea,
  _placeEndViewLabels as placeEndViewLabels,
  _pointAtAngle as pointAtAngle,
  _pointAtScreenAngle as pointAtScreenAngle,
  _referenceMark as referenceMark,
  _rotationArrow as rotationArrow,
  _screenAngleDeg as screenAngleDeg,
  _screenAngleOfPoint as screenAngleOfPoint,
} from '@counterpoise/ng/core';
import {
  dashOf,
  fixedRingScale,
  formatAmplitude,
  markerPath,
  type PolarSeries,
  type PolarSeriesKind,
  quietestDirectionDeg,
  RING_LABEL_DIRECTIONS_DEG,
  screenVector,
  segmentHitsBox,
  type UnitScale,
  unitScales,
  vectorPath,
} from './polar-plot-geometry';
import { describePoint, KIND_NAMES, plottedPoints, pointsWithDrawnLabels } from './polar-plot-model';

/** What the layout needs to know. */
export interface PolarPlotLayoutInput {
  /** The series to draw. */
  readonly series: readonly PolarSeries[];
  /** How rotor angles map onto the screen. */
  readonly convention: DialConvention;
  /** The outer ring of the first unit, or null for a nice value above the largest vector. */
  readonly maxAmplitude: number | null;
  /** How many rings to draw. */
  readonly ringCount: number;
  /** The width of the drawing, and its height before labels ask for more, in screen units (CSS pixels). */
  readonly size: number;
}

/** A ring and, when there is room, its label. */
export interface LaidOutRing {
  /** Radius in screen units. */
  readonly radius: number;
  /** The label text, or null when the ring is left unlabelled for want of room. */
  readonly label: string | null;
  /** Where the label's middle sits. */
  readonly x: number;
  /** Where the label's middle sits. */
  readonly y: number;
}

/** A line from the centre to the outer ring every 30 degrees of rotor angle. */
export interface LaidOutSpoke {
  /** Where the spoke meets the outer ring. */
  readonly end: ScreenPoint;
  /** Whether it is a quarter-turn spoke (0, 90, 180, 270 degrees), drawn a little stronger. */
  readonly major: boolean;
}

/** An angle label outside the outer ring. */
export interface LaidOutAngleLabel {
  /** "90°". */
  readonly text: string;
  /** The x of the text anchor. */
  readonly x: number;
  /** The y of the middle of the text. */
  readonly y: number;
  /** SVG `text-anchor`. */
  readonly textAnchor: 'start' | 'middle' | 'end';
  /** Whether it labels the reference mark. */
  readonly reference: boolean;
}

/** One point of one series, as drawn. */
export interface LaidOutPoint {
  /** Position in focus order across every series. */
  readonly index: number;
  /** The series' position in the plot. */
  readonly seriesIndex: number;
  /** The kind of its series. */
  readonly kind: PolarSeriesKind;
  /** Which shade of the kind's colour (0-2), so that two series of one kind can be told apart. */
  readonly shade: number;
  /** The SVG path of the vector's line. */
  readonly linePath: string;
  /** The SVG path of the marker at the head. */
  readonly markerPath: string;
  /** The SVG dash pattern of the line. */
  readonly dash: string;
  /** Where the head is. */
  readonly head: ScreenPoint;
  /** Whether it was drawn on the outer ring because it lies beyond. */
  readonly offScale: boolean;
  /** The point in words. */
  readonly detail: string;
  /** The point's own short label beside the head, when it is drawn (see `pointsWithDrawnLabels`). */
  readonly label: {
    readonly text: string;
    /** The middle of the text. */
    readonly x: number;
    /** The middle of the text. */
    readonly y: number;
    readonly textAnchor: string;
    /** The box the text is expected to fill. */
    readonly box: { readonly x: number; readonly y: number; readonly width: number; readonly height: number };
    /** A line back to the marker when the label had to move away from it. */
    readonly leader: {
      readonly x1: number;
      readonly y1: number;
      readonly x2: number;
      readonly y2: number;
    } | null;
  } | null;
}

/** One entry of the legend. */
export interface LaidOutLegendEntry {
  /** The series' id. */
  readonly id: string;
  /** The series' label. */
  readonly label: string;
  /** The series' kind. */
  readonly kind: PolarSeriesKind;
  /** The series' unit. */
  readonly unit: string;
  /** Which shade of the kind's colour. */
  readonly shade: number;
  /** "outer ring 200 g" for a series in another unit than the rings', else null. */
  readonly scaleNote: string | null;
  /** The line under the label: the kind (unless the label names it), the unit and the scale note. */
  readonly meta: string;
}

/** The whole drawing. */
export interface PolarPlotLayout {
  /** Width, in screen units. */
  readonly size: number;
  /** Height, in screen units: the width, or more when point labels needed rows below the plot. */
  readonly height: number;
  /** The centre of the rings. */
  readonly center: ScreenPoint;
  /** The radius of the outer ring. */
  readonly radius: number;
  /** Font size of every label. */
  readonly fontSize: number;
  /** The rings, inner to outer. */
  readonly rings: readonly LaidOutRing[];
  /** The spokes. */
  readonly spokes: readonly LaidOutSpoke[];
  /** The angle labels round the outside. */
  readonly angleLabels: readonly LaidOutAngleLabel[];
  /** A triangle just outside the outer ring at the reference mark. */
  readonly referenceMarkPath: string;
  /** A curved arrow just outside the outer ring, in its quietest stretch, turning the way the rotor turns. */
  readonly rotationGlyph: { readonly arcPath: string; readonly headPath: string };
  /** One scale per unit; the first labels the rings. */
  readonly scales: readonly UnitScale[];
  /** Every drawable point. */
  readonly points: readonly LaidOutPoint[];
  /** The legend. */
  readonly legend: readonly LaidOutLegendEntry[];
}

/** Font size of the plot's labels: readable outdoors on the smallest plot. */
export const PLOT_FONT_SIZE = 13;
const MARKER_SIZE = 11;
/** The radius of the focus ring round a marker; labels keep outside it. */
export const FOCUS_RING_RADIUS = 13;
const ANGLE_LABEL_GAP = 11;
/** The rotation arrow runs between the outer ring and the angle labels. */
const ROTATION_ARROW_OFFSET = 6;
/** The side of the square round the centre that point labels keep clear of, as a fraction of the radius. */
const CENTRE_KEPT_CLEAR = 0.4;
/** Point labels keep off the outer ring: wholly inside it or wholly beyond it. */
const RING_BAND_PX = 2;

/** Works out the whole drawing. */
export function layoutPolarPlot(input: PolarPlotLayoutInput): PolarPlotLayout {
  const size = input.size;
  const fontSize = PLOT_FONT_SIZE;
  const center = { x: size / 2, y: size / 2 };
  const sideRoom = ANGLE_LABEL_GAP + estimateTextWidthPx(degreesText(270, 0), fontSize) + 4;
  const radius = Math.max(40, size / 2 - sideRoom);
  const frame = { center, radius, convention: input.convention };
  const scales = unitScales(input.series, input.ringCount, input.maxAmplitude);
  const scaleOf = new Map(scales.map((s) => [s.unit, s.scale]));
  const primary = scales[0];

  const shadeOf = seriesShades(input.series);
  const plotted = plottedPoints(input.series);
  const vectors = plotted.map((p) => screenVector(p.point, scaleOf.get(p.series.unit)?.max ?? 1, frame));
  // An arrowhead stops short of the head, so that the marker it points at (a trial effect lands on the
  // reading with the trial weight) stays in sight.
  const markerAt = plotted.map((p, i) => {
    const vector = vectors[i]!;
    const length = Math.hypot(vector.head.x - vector.tail.x, vector.head.y - vector.tail.y);
    const pullBack = MARKER_SIZE * 1.1;
    return p.series.kind === 'trialEffect' && length > pullBack * 2
      ? pointAtScreenAngle(vector.head, -pullBack, vector.directionDeg)
      : vector.head;
  });

  const angleLabels = layoutAngleLabels(frame, fontSize);
  const markerBoxes = markerAt.map((at) => boxAround(at, FOCUS_RING_RADIUS * 2));
  const segments = vectors.map((v, i) => [v.tail, markerAt[i]!] as const);
  const takenDirections = vectors
    .flatMap((v) => [v.head, v.tail])
    .filter((end) => !isAtCentre(center, end))
    .map((end) => screenAngleOfPoint(center, end));
  const rings = ringsInQuietestPlace(primary, input.ringCount, frame, fontSize, takenDirections, (boxes) =>
    boxes.reduce(
      (cost, box) =>
        cost +
        segments.filter(([a, b]) => segmentHitsBox(a, b, box)).length +
        2 * markerBoxes.filter((marker) => overlapArea(marker, box) > 0).length,
      0,
    ),
  );

  const reference = referenceMark(center, radius, input.convention, {
    insidePx: 0,
    outsidePx: 1,
    pointerPx: 8,
  });
  const arrow = rotationArrow(center, input.convention, {
    radius: radius + ROTATION_ARROW_OFFSET,
    takenScreenDeg: [...angleLabels.map((label) => label.screenDeg), ...takenDirections],
    preferredScreenDeg: reference.screenDeg + 45,
    maxHalfSpanDeg: 14,
    minHalfSpanDeg: 6,
    clearanceDeg: 6,
    headLengthPx: 9,
    headHalfWidthPx: 4.5,
  });

  const ringLabelBoxes = rings
    .filter((ring) => ring.label !== null)
    .map((ring) => centredBox({ x: ring.x, y: ring.y }, ring.label as string, fontSize));
  const drawnLabels = pointsWithDrawnLabels(plotted);
  const labelled = plotted
    .map((p, i) => ({ p, vector: vectors[i]!, at: markerAt[i]! }))
    .filter(({ p }) => drawnLabels.has(p.index));
  const obstacles: EndViewObstacle[] = [
    ...ringLabelBoxes,
    ...markerBoxes,
    ...angleLabels.map((label) => label.box),
    reference.box,
    arrow.box,
    // The middle of the plot, where short vectors bunch together, is left to their markers.
    boxAround(center, Math.max(radius * CENTRE_KEPT_CLEAR, FOCUS_RING_RADIUS * 2)),
  ].map((box) => ({ kind: 'mark', ...box }));
  const labelHeight = Math.ceil(fontSize * 1.3);
  const placement = placeEndViewLabels(
    labelled.map(({ p, vector, at }) => ({
      key: String(p.index),
      anchor: at,
      preferredDeg: isAtCentre(center, at) ? vector.directionDeg : screenAngleOfPoint(center, at),
      width: estimateTextWidthPx(p.point.label as string, fontSize, 2),
      height: labelHeight,
      gapPx: FOCUS_RING_RADIUS - 2,
      // Points read first keep the nearest room.
      priority: -p.index,
      optional: true,
    })),
    {
      bounds: { x: 0, y: 0, width: size, height: size },
      rim: { center, radius, insidePx: RING_BAND_PX, outsidePx: RING_BAND_PX },
      obstacles,
    },
  );
  const labelByIndex = new Map(placement.placed.map((label) => [Number(label.key), label]));

  const points: LaidOutPoint[] = plotted.map((p, i) => {
    const vector = vectors[i]!;
    const at = markerAt[i]!;
    const placed = labelByIndex.get(p.index);
    return {
      index: p.index,
      seriesIndex: p.seriesIndex,
      kind: p.series.kind,
      shade: shadeOf[p.seriesIndex] ?? 0,
      linePath: vectorPath({ tail: vector.tail, head: at }),
      markerPath: markerPath(p.series.kind, at, MARKER_SIZE, vector.directionDeg),
      dash: dashOf(p.series.kind),
      head: at,
      offScale: vector.offScale,
      detail: describePoint(p.series, p.point, vector.offScale),
      label: placed
        ? {
            text: p.point.label as string,
            x: round(placed.box.x + placed.box.width / 2),
            y: round(placed.box.y + placed.box.height / 2),
            textAnchor: 'middle',
            box: placed.box,
            leader: placed.leader
              ? {
                  x1: round(placed.leader.from.x),
                  y1: round(placed.leader.from.y),
                  x2: round(placed.leader.to.x),
                  y2: round(placed.leader.to.y),
                }
              : null,
          }
        : null,
    };
  });

  return {
    size,
    height: Math.max(size, Math.ceil(placement.height)),
    center,
    radius,
    fontSize,
    rings,
    spokes: layoutSpokes(frame),
    angleLabels: angleLabels.map(({ box: _box, screenDeg: _screenDeg, ...label }) => label),
    referenceMarkPath: reference.pointerPath,
    rotationGlyph: { arcPath: arrow.arcPath, headPath: arrow.headPath },
    scales,
    points,
    legend: input.series.map((one, i) => {
      const scale = scaleOf.get(one.unit);
      const secondary = primary !== undefined && one.unit !== primary.unit && scale !== undefined;
      const kindName = KIND_NAMES[one.kind];
      const parts = one.label.toLowerCase().includes(kindName.toLowerCase()) ? [] : [kindName];
      if (one.unit) parts.push(one.unit);
      const scaleNote = secondary ? `outer ring ${formatAmplitude(scale.max)} ${one.unit}` : null;
      return {
        id: one.id,
        label: one.label,
        kind: one.kind,
        unit: one.unit,
        shade: shadeOf[i] ?? 0,
        scaleNote,
        meta: parts.join(', ') + (scaleNote ? ` (${scaleNote})` : ''),
      };
    }),
  };
}

/**
 * The rings with their labels along whichever candidate direction puts the labels over the fewest vectors
 * and markers (`cost`); candidates are tried farthest from the data first, so the farthest wins a tie.
 */
function ringsInQuietestPlace(
  primary: UnitScale | undefined,
  ringCount: number,
  frame: { center: ScreenPoint; radius: number },
  fontSize: number,
  takenDeg: readonly number[],
  cost: (labelBoxes: Box[]) => number,
): LaidOutRing[] {
  const candidates = [...RING_LABEL_DIRECTIONS_DEG];
  const ordered: number[] = [];
  while (candidates.length > 0) {
    const next = quietestDirectionDeg(takenDeg, candidates);
    ordered.push(next);
    candidates.splice(candidates.indexOf(next), 1);
  }
  let best: LaidOutRing[] = [];
  let bestCost = Infinity;
  for (const direction of ordered) {
    const rings = layoutRings(primary, ringCount, frame.center, frame.radius, direction, fontSize);
    const boxes = rings
      .filter((ring) => ring.label !== null)
      .map((ring) => centredBox({ x: ring.x, y: ring.y }, ring.label as string, fontSize));
    const total = cost(boxes);
    if (total < bestCost) {
      best = rings;
      bestCost = total;
    }
    if (total === 0) break;
  }
  return best;
}

/** For each series, how many series of its kind come before it (0-2, then round again). */
function seriesShades(series: readonly PolarSeries[]): number[] {
  const seen = new Map<PolarSeriesKind, number>();
  return series.map((one) => {
    const count = seen.get(one.kind) ?? 0;
    seen.set(one.kind, count + 1);
    return count % 3;
  });
}

function layoutRings(
  primary: UnitScale | undefined,
  ringCount: number,
  center: ScreenPoint,
  radius: number,
  directionDeg: number,
  fontSize: number,
): LaidOutRing[] {
  const { rings, max } = primary?.scale ?? fixedRingScale(1, ringCount);
  const spacing = radius / rings.length;
  const stride = Math.max(1, Math.ceil((fontSize * 1.3) / (spacing * Math.cos((15 * Math.PI) / 180))));
  return rings.map((value, i) => {
    const ringRadius = (value / max) * radius;
    const at = pointAtScreenAngle(center, ringRadius, directionDeg);
    const outer = i === rings.length - 1;
    const shown = primary !== undefined && (outer || (rings.length - 1 - i) % stride === 0);
    const text =
      outer && primary?.unit ? `${formatAmplitude(value)} ${primary.unit}` : formatAmplitude(value);
    return { radius: ringRadius, label: shown ? text : null, x: at.x, y: at.y };
  });
}

function layoutSpokes(frame: {
  center: ScreenPoint;
  radius: number;
  convention: DialConvention;
}): LaidOutSpoke[] {
  return Array.from({ length: 12 }, (_, i) => ({
    end: pointAtAngle(frame.center, frame.radius, i * 30, frame.convention),
    major: i % 3 === 0,
  }));
}

function layoutAngleLabels(
  frame: { center: ScreenPoint; radius: number; convention: DialConvention },
  fontSize: number,
): (LaidOutAngleLabel & { box: Box; screenDeg: number })[] {
  const everyDeg = frame.radius >= 140 ? 30 : 90;
  return Array.from({ length: 360 / everyDeg }, (_, i) => {
    const angle = i * everyDeg;
    const screenDeg = screenAngleDeg(angle, frame.convention);
    const text = degreesText(angle, 0);
    const width = estimateTextWidthPx(text, fontSize);
    const height = fontSize * 1.2;
    const at = labelCentreBeside(frame.center, frame.radius + ANGLE_LABEL_GAP, screenDeg, width, height);
    return {
      text,
      x: round(at.x),
      y: round(at.y),
      textAnchor: 'middle' as const,
      reference: angle === 0,
      box: { x: at.x - width / 2, y: at.y - height / 2, width, height },
      screenDeg,
    };
  });
}

function round(value: number): number {
  return Math.round(value * 100) / 100;
}

function isAtCentre(center: ScreenPoint, point: ScreenPoint): boolean {
  return Math.hypot(point.x - center.x, point.y - center.y) < 1;
}

function centredBox(at: ScreenPoint, text: string, fontSize: number): Box {
  const width = estimateTextWidthPx(text, fontSize);
  const height = fontSize * 1.2;
  return { x: at.x - width / 2, y: at.y - height / 2, width, height };
}
