/**
 * Everything the polar plot draws, worked out from its inputs and its size as plain data, so that the
 * component is a thin template over it and the drawing is tested without TestBed.
 */
import {
  type DialConvention,
  normalizeDeg,
  pointAtAngle,
  pointAtScreenAngle,
  type RotationDirection,
  screenAngleDeg,
  type ScreenPoint,
} from '@counterpoise/ng/core';
import {
  type Box,
  dashOf,
  estimateTextWidth,
  fixedRingScale,
  formatAmplitude,
  labelBoxAt,
  markerPath,
  overlapArea,
  placeLabels,
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
import { describePoint, KIND_NAMES, plottedPoints } from './polar-plot-model';

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
  /** The width and height of the drawing, in screen units (CSS pixels). */
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
  /** The point's own short label beside the head, when it has one. */
  readonly label: {
    readonly text: string;
    readonly x: number;
    readonly y: number;
    readonly textAnchor: string;
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
  /** Width and height, in screen units. */
  readonly size: number;
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
  /** A curved arrow in the top right corner, turning the way the rotor turns. */
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

/** Works out the whole drawing. */
export function layoutPolarPlot(input: PolarPlotLayoutInput): PolarPlotLayout {
  const size = input.size;
  const fontSize = PLOT_FONT_SIZE;
  const center = { x: size / 2, y: size / 2 };
  const sideRoom = ANGLE_LABEL_GAP + estimateTextWidth('270°', fontSize) + 4;
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
  const markerBoxes = markerAt.map((at) => squareAround(at, FOCUS_RING_RADIUS * 2));
  const segments = vectors.map((v, i) => [v.tail, markerAt[i]!] as const);
  const takenDirections = vectors
    .flatMap((v) => [v.head, v.tail])
    .filter((end) => !isAtCentre(center, end))
    .map((end) => directionFrom(center, end));
  const rings = ringsInQuietestPlace(primary, input.ringCount, frame, fontSize, takenDirections, (boxes) =>
    boxes.reduce(
      (cost, box) =>
        cost +
        segments.filter(([a, b]) => segmentHitsBox(a, b, box)).length +
        2 * markerBoxes.filter((marker) => overlapArea(marker, box) > 0).length,
      0,
    ),
  );

  const ringLabelBoxes = rings
    .filter((ring) => ring.label !== null)
    .map((ring) => centredBox({ x: ring.x, y: ring.y }, ring.label as string, fontSize));
  const glyphCenter = pointAtScreenAngle(center, radius * 1.2, 45);
  const labelled = plotted
    .map((p, i) => ({ p, vector: vectors[i]!, at: markerAt[i]! }))
    .filter(({ p }) => Boolean(p.point.label));
  const placements = placeLabels(
    labelled.map(({ p, vector, at }) => ({
      anchor: at,
      text: p.point.label as string,
      preferredDeg: isAtCentre(center, at) ? vector.directionDeg : directionFrom(center, at),
    })),
    {
      bounds: { x: 2, y: 2, width: size - 4, height: size - 4 },
      fontSize,
      gap: FOCUS_RING_RADIUS,
      avoid: [
        ...ringLabelBoxes,
        ...markerBoxes,
        ...angleLabels.map((label) => label.box),
        squareAround(pointAtScreenAngle(center, radius + 5, screenAngleDeg(0, frame.convention)), 12),
        squareAround(glyphCenter, 24),
      ],
    },
  );
  const labelByIndex = new Map(labelled.map(({ p }, i) => [p.index, placements[i]!]));

  const points: LaidOutPoint[] = plotted.map((p, i) => {
    const vector = vectors[i]!;
    const at = markerAt[i]!;
    const placement = labelByIndex.get(p.index);
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
      label: placement
        ? { text: p.point.label as string, x: placement.x, y: placement.y, textAnchor: placement.textAnchor }
        : null,
    };
  });

  return {
    size,
    center,
    radius,
    fontSize,
    rings,
    spokes: layoutSpokes(frame),
    angleLabels: angleLabels.map(({ box: _box, ...label }) => label),
    referenceMarkPath: referenceMark(frame),
    rotationGlyph: rotationGlyph(glyphCenter, 9, input.convention.rotation),
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
): (LaidOutAngleLabel & { box: Box })[] {
  const everyDeg = frame.radius >= 140 ? 30 : 90;
  return Array.from({ length: 360 / everyDeg }, (_, i) => {
    const angle = i * everyDeg;
    const screenDeg = screenAngleDeg(angle, frame.convention);
    const anchor = pointAtScreenAngle(frame.center, frame.radius, screenDeg);
    const text = `${angle}°`;
    const placed = labelBoxAt(anchor, screenDeg, text, fontSize, ANGLE_LABEL_GAP);
    return {
      text,
      x: placed.x,
      y: placed.y,
      textAnchor: placed.textAnchor,
      reference: angle === 0,
      box: placed.box,
    };
  });
}

function referenceMark(frame: { center: ScreenPoint; radius: number; convention: DialConvention }): string {
  const screenDeg = screenAngleDeg(0, frame.convention);
  const tip = pointAtScreenAngle(frame.center, frame.radius + 1, screenDeg);
  const left = pointAtScreenAngle(frame.center, frame.radius + 9, screenDeg - 2.2);
  const right = pointAtScreenAngle(frame.center, frame.radius + 9, screenDeg + 2.2);
  const r = (v: number) => Math.round(v * 100) / 100;
  return `M${r(tip.x)} ${r(tip.y)}L${r(left.x)} ${r(left.y)}L${r(right.x)} ${r(right.y)}Z`;
}

/**
 * A three-quarter circle with an arrowhead, turning the way the rotor turns on screen. The arc starts at 12
 * o'clock and ends at 9 o'clock (clockwise) or 3 o'clock (counter-clockwise).
 */
export function rotationGlyph(
  center: ScreenPoint,
  radius: number,
  rotation: RotationDirection,
): { arcPath: string; headPath: string } {
  const clockwise = rotation === 'clockwise';
  const r = (v: number) => Math.round(v * 100) / 100;
  const start = pointAtScreenAngle(center, radius, 0);
  const endDeg = clockwise ? 270 : 90;
  const end = pointAtScreenAngle(center, radius, endDeg);
  const tangentDeg = normalizeDeg(endDeg + (clockwise ? 90 : -90));
  const tip = pointAtScreenAngle(end, radius * 0.55, tangentDeg);
  const back1 = pointAtScreenAngle(end, radius * 0.45, tangentDeg + 120);
  const back2 = pointAtScreenAngle(end, radius * 0.45, tangentDeg - 120);
  return {
    arcPath: `M${r(start.x)} ${r(start.y)}A${r(radius)} ${r(radius)} 0 1 ${clockwise ? 1 : 0} ${r(end.x)} ${r(end.y)}`,
    headPath: `M${r(tip.x)} ${r(tip.y)}L${r(back1.x)} ${r(back1.y)}L${r(back2.x)} ${r(back2.y)}Z`,
  };
}

function directionFrom(center: ScreenPoint, point: ScreenPoint): number {
  const dx = point.x - center.x;
  const dy = point.y - center.y;
  return normalizeDeg((Math.atan2(dx, -dy) * 180) / Math.PI);
}

function isAtCentre(center: ScreenPoint, point: ScreenPoint): boolean {
  return Math.hypot(point.x - center.x, point.y - center.y) < 1;
}

function squareAround(at: ScreenPoint, side: number): Box {
  return { x: at.x - side / 2, y: at.y - side / 2, width: side, height: side };
}

function centredBox(at: ScreenPoint, text: string, fontSize: number): Box {
  const width = estimateTextWidth(text, fontSize);
  const height = fontSize * 1.2;
  return { x: at.x - width / 2, y: at.y - height / 2, width, height };
}
