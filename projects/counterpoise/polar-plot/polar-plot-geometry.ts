/**
 * The drawing of the polar plot as plain functions: ring scales, vector ends, marker shapes, where ring
 * labels go. Framework-free, so it is tested without TestBed. Screen angles and the placement of rotor
 * angles come from the shared end-view geometry of `@counterpoise/ng/core`.
 */
import {
  type DialConvention,
  type _Box as Box,
  type _ScreenPoint as ScreenPoint,
  _angularDistanceDeg as angularDistanceDeg,
  _normalizeDeg as normalizeDeg,
  _pointAtAngle as pointAtAngle,
  _pointAtScreenAngle as pointAtScreenAngle,
} from '@counterpoise/ng/core';

/** What a series shows; each kind has its own marker shape and line dash. */
export type PolarSeriesKind = 'reading' | 'trialEffect' | 'residual' | 'weight' | 'run';

/** Every kind, in the order the legend of shapes lists them. */
export const POLAR_SERIES_KINDS: readonly PolarSeriesKind[] = [
  'reading',
  'run',
  'trialEffect',
  'residual',
  'weight',
];

/** An amplitude and a rotor angle: a reading, a weight, or where a vector starts. */
export interface PolarValue {
  /** The length of the vector, in the series' unit. */
  readonly amplitude: number;
  /** The rotor angle, in degrees from the reference mark, counted as the plot's convention says. */
  readonly angleDeg: number;
}

/**
 * One vector of a series. `amplitude` and `angleDeg` are the vector itself; it is drawn from `from` (the
 * origin when absent), so its head lands at `from` + the vector. A trial effect is given as the effect
 * itself, from the initial reading: its head lands on the reading with the trial weight.
 */
export interface PolarPoint extends PolarValue {
  /** A short name of the point, shown beside its head and in its detail ("Run 2"). */
  readonly label?: string;
  /** Where the vector starts, in the series' unit; the origin when absent. */
  readonly from?: PolarValue;
}

/** A set of vectors of one kind and one unit, e.g. the runs read by one sensor. */
export interface PolarSeries {
  /** A stable identifier, unique within the plot. */
  readonly id: string;
  /** The name shown in the legend and in every detail ("Sensor A"). */
  readonly label: string;
  /** What the vectors are: it sets the marker shape and the line dash. */
  readonly kind: PolarSeriesKind;
  /** The unit of the amplitudes ("in/s", "mm/s", "g"). */
  readonly unit: string;
  /** The vectors, in the order keyboard focus visits them. */
  readonly points: readonly PolarPoint[];
}

/** The rings of one unit: `ringCount` equal steps up to `max`. */
export interface RingScale {
  /** The amplitude of the outer ring. */
  readonly max: number;
  /** The amplitude between two rings. */
  readonly step: number;
  /** The amplitude of every ring, inner to outer. */
  readonly rings: readonly number[];
}

const NICE_MULTIPLES = [1, 1.5, 2, 2.5, 3, 4, 5, 6, 7.5, 10] as const;

/** Rounds away floating-point noise such as 0.30000000000000004. */
function tidy(value: number): number {
  return Number(value.toPrecision(12));
}

/** A ring count brought into 1 to 12; 4 when it is not a number. */
export function clampRingCount(ringCount: number): number {
  if (!Number.isFinite(ringCount)) return 4;
  return Math.min(12, Math.max(1, Math.round(ringCount)));
}

/**
 * Rings whose step is a round number (1, 1.5, 2, 2.5, 3, 4, 5, 6 or 7.5 times a power of ten) and whose outer
 * ring is the smallest such value at or above `largest`, so never more than half as much again. Nothing to
 * show gives rings up to 1.
 */
export function niceRingScale(largest: number, ringCount = 4): RingScale {
  const count = clampRingCount(ringCount);
  const target = Number.isFinite(largest) ? Math.abs(largest) : 0;
  if (target === 0) return fixedRingScale(1, count);
  const exponent = Math.floor(Math.log10(target / count));
  for (const multiple of NICE_MULTIPLES) {
    const step = tidy(multiple * 10 ** exponent);
    if (step * count >= target * (1 - 1e-9)) return ringsOf(step, count);
  }
  return ringsOf(tidy(10 ** (exponent + 1)), count);
}

/** Rings in equal steps up to a given outer amplitude (a positive number, else 1). */
export function fixedRingScale(max: number, ringCount = 4): RingScale {
  const count = clampRingCount(ringCount);
  const outer = Number.isFinite(max) && max > 0 ? max : 1;
  return ringsOf(tidy(outer / count), count);
}

function ringsOf(step: number, count: number): RingScale {
  const rings = Array.from({ length: count }, (_, i) => tidy(step * (i + 1)));
  return { max: rings[count - 1] ?? step, step, rings };
}

/** The scale of one unit; the first unit's scale labels the rings. */
export interface UnitScale {
  /** The unit, as the series give it. */
  readonly unit: string;
  /** Its rings; every unit's outer ring is drawn at the same radius. */
  readonly scale: RingScale;
  /** Whether the rings are labelled in this unit (the unit of the first series). */
  readonly primary: boolean;
}

/**
 * One scale per unit, in the order the units first appear. The first unit's outer ring is `maxAmplitude`
 * when given, else a nice value above its largest vector end; every other unit (say, grams of weight
 * beside in/s of vibration) gets its own nice scale, drawn to the same outer ring and named in the
 * legend, so that readings and weights both fill the plot.
 */
export function unitScales(
  series: readonly PolarSeries[],
  ringCount: number,
  maxAmplitude: number | null = null,
): UnitScale[] {
  const largestByUnit = new Map<string, number>();
  for (const one of series) {
    let largest = largestByUnit.get(one.unit) ?? 0;
    for (const point of one.points) {
      if (!isDrawable(point)) continue;
      largest = Math.max(
        largest,
        Math.abs(vectorHead(point).amplitude),
        Math.abs(point.from?.amplitude ?? 0),
      );
    }
    largestByUnit.set(one.unit, largest);
  }
  return [...largestByUnit].map(([unit, largest], index) => {
    const fixed = index === 0 && maxAmplitude !== null && maxAmplitude > 0;
    return {
      unit,
      scale: fixed ? fixedRingScale(maxAmplitude, ringCount) : niceRingScale(largest, ringCount),
      primary: index === 0,
    };
  });
}

/** Whether a point has finite numbers everywhere, so that it can be drawn. */
export function isDrawable(point: PolarPoint): boolean {
  const finite = (value: PolarValue) => Number.isFinite(value.amplitude) && Number.isFinite(value.angleDeg);
  return finite(point) && (point.from === undefined || finite(point.from));
}

/** The sum of two vectors given as amplitude and angle. Adding is the same whichever way angles count. */
export function addVectors(a: PolarValue, b: PolarValue): PolarValue {
  const toRadians = Math.PI / 180;
  const x = a.amplitude * Math.cos(a.angleDeg * toRadians) + b.amplitude * Math.cos(b.angleDeg * toRadians);
  const y = a.amplitude * Math.sin(a.angleDeg * toRadians) + b.amplitude * Math.sin(b.angleDeg * toRadians);
  const amplitude = Math.hypot(x, y);
  if (amplitude < 1e-12) return { amplitude: 0, angleDeg: 0 };
  return { amplitude: tidy(amplitude), angleDeg: tidy(normalizeDeg((Math.atan2(y, x) * 180) / Math.PI)) };
}

/** Where the head of a point's vector lands: `from` plus the vector. */
export function vectorHead(point: PolarPoint): PolarValue {
  return point.from
    ? addVectors(point.from, point)
    : { amplitude: point.amplitude, angleDeg: point.angleDeg };
}

/** The plot on screen: its centre, the radius of the outer ring, and the convention of its angles. */
export interface PlotFrame {
  /** The centre of the rings. */
  readonly center: ScreenPoint;
  /** The radius of the outer ring, in screen units. */
  readonly radius: number;
  /** How rotor angles map onto the screen. */
  readonly convention: DialConvention;
}

/** A vector on screen. */
export interface ScreenVector {
  /** Where the line starts. */
  readonly tail: ScreenPoint;
  /** Where the line ends and the marker sits. */
  readonly head: ScreenPoint;
  /** The screen direction from tail to head, clockwise from 12 o'clock. */
  readonly directionDeg: number;
  /** Whether an end lay beyond the outer ring and was drawn on it instead. */
  readonly offScale: boolean;
}

/**
 * A point's vector on screen at a unit's scale. An end beyond the outer ring is drawn on the ring in its
 * own direction (and flagged), so that one wild reading cannot push the others off the plot.
 */
export function screenVector(point: PolarPoint, scaleMax: number, frame: PlotFrame): ScreenVector {
  const place = (value: PolarValue) => {
    const radius = (value.amplitude / scaleMax) * frame.radius;
    const clamped = Math.min(Math.abs(radius), frame.radius) * Math.sign(radius);
    return {
      at: pointAtAngle(frame.center, clamped, value.angleDeg, frame.convention),
      off: Math.abs(radius) > frame.radius + 1e-9,
    };
  };
  const tail = point.from ? place(point.from) : { at: frame.center, off: false };
  const head = place(vectorHead(point));
  const dx = head.at.x - tail.at.x;
  const dy = head.at.y - tail.at.y;
  const directionDeg = dx === 0 && dy === 0 ? 0 : normalizeDeg((Math.atan2(dx, -dy) * 180) / Math.PI);
  return { tail: tail.at, head: head.at, directionDeg, offScale: tail.off || head.off };
}

/** An SVG path of a straight vector from tail to head. */
export function vectorPath(vector: Pick<ScreenVector, 'tail' | 'head'>): string {
  return `M${round(vector.tail.x)} ${round(vector.tail.y)}L${round(vector.head.x)} ${round(vector.head.y)}`;
}

function round(value: number): number {
  return Math.round(value * 100) / 100;
}

/**
 * The SVG path of a kind's marker centred on `at`, about `size` across: a disc for a reading, a square for a
 * run, an arrowhead along the vector for a trial effect, a ring for a predicted residual (drawn hollow), a
 * diamond for a weight. Shapes carry the kind, so colour is never the only cue.
 */
export function markerPath(kind: PolarSeriesKind, at: ScreenPoint, size: number, directionDeg = 0): string {
  const r = size / 2;
  const { x, y } = at;
  switch (kind) {
    case 'reading':
    case 'residual':
      return `M${round(x - r)} ${round(y)}a${round(r)} ${round(r)} 0 1 0 ${round(2 * r)} 0a${round(r)} ${round(r)} 0 1 0 ${round(-2 * r)} 0Z`;
    case 'run': {
      const h = r * 0.9;
      return `M${round(x - h)} ${round(y - h)}H${round(x + h)}V${round(y + h)}H${round(x - h)}Z`;
    }
    case 'weight': {
      const d = r * 1.25;
      return `M${round(x)} ${round(y - d)}L${round(x + d)} ${round(y)}L${round(x)} ${round(y + d)}L${round(x - d)} ${round(y)}Z`;
    }
    case 'trialEffect': {
      const tip = pointAtScreenAngle(at, r * 1.1, directionDeg);
      const left = pointAtScreenAngle(at, r * 1.2, directionDeg + 140);
      const right = pointAtScreenAngle(at, r * 1.2, directionDeg - 140);
      return `M${round(tip.x)} ${round(tip.y)}L${round(left.x)} ${round(left.y)}L${round(right.x)} ${round(right.y)}Z`;
    }
  }
}

/** The dash pattern of a kind's line (SVG `stroke-dasharray`), empty for a solid line. */
export function dashOf(kind: PolarSeriesKind): string {
  switch (kind) {
    case 'trialEffect':
      return '7 4';
    case 'residual':
      return '1 5';
    case 'weight':
      return '10 3 2 3';
    default:
      return '';
  }
}

/**
 * Whether the straight segment from `a` to `b` crosses or touches a box (Liang-Barsky clipping: the segment
 * is clipped against each edge in turn; what is left is inside).
 */
export function segmentHitsBox(a: ScreenPoint, b: ScreenPoint, box: Box): boolean {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  let enter = 0;
  let leave = 1;
  const edges: [number, number][] = [
    [-dx, a.x - box.x],
    [dx, box.x + box.width - a.x],
    [-dy, a.y - box.y],
    [dy, box.y + box.height - a.y],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return false;
      continue;
    }
    const t = q / p;
    if (p < 0) enter = Math.max(enter, t);
    else leave = Math.min(leave, t);
    if (enter > leave) return false;
  }
  return true;
}

/** Screen directions that stack ring labels almost vertically, half-way between the 30-degree spokes. */
export const RING_LABEL_DIRECTIONS_DEG: readonly number[] = [15, 345, 165, 195];

/**
 * Of the candidate screen directions, the one farthest from every direction taken by data, so that ring
 * labels get in the way of the least. The first candidate wins a tie.
 */
export function quietestDirectionDeg(
  takenDeg: readonly number[],
  candidatesDeg: readonly number[] = RING_LABEL_DIRECTIONS_DEG,
): number {
  let best = candidatesDeg[0] ?? 0;
  let bestClearance = -1;
  for (const candidate of candidatesDeg) {
    const clearance = takenDeg.reduce(
      (least, taken) => Math.min(least, angularDistanceDeg(candidate, taken)),
      180,
    );
    if (clearance > bestClearance + 1e-9) {
      best = candidate;
      bestClearance = clearance;
    }
  }
  return best;
}

/** An amplitude as people read it: three significant figures, whole numbers from 100 up. */
export function formatAmplitude(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  if (Math.abs(value) >= 100) return String(Math.round(value));
  return String(Number(value.toPrecision(3)));
}
