/**
 * The one label placer of the end-view widgets (phase dial, correction overlay, polar plot). It takes what
 * each label names (an anchor, a direction to try first, its size, how much it matters, whether it may be
 * left out) and what is already drawn (marks and glyphs it must never cover, softer things it should avoid,
 * the rotor's rim as a band, the widget's box), and gives every label a box. Framework-free and
 * deterministic: the same scene always gives the same drawing.
 *
 * What it promises: no two label boxes overlap; no label box overlaps a mark; no label box crosses the rim
 * band; every label box lies inside the widget's box. A label that finds no room beside its anchor moves
 * outside the rotor, beyond the rim, with a leader line back to its anchor; an optional label that finds no
 * room there either is dropped (the widget's text alternative still names it); a required one gets a row of
 * its own below the drawing, and the widget's box grows to hold it (`height` of the answer).
 */
import type { ScreenPoint } from './dial-geometry';

/** A rectangle on screen, from its top-left corner, in CSS pixels. */
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

/** A label to place. */
export interface EndViewLabelRequest {
  /** Identifies the label and the element it names. */
  readonly key: string;
  /** The point of the element the label names. */
  readonly anchor: ScreenPoint;
  /** The screen direction to try first, clockwise from 12 o'clock (usually away from the rotor's centre). */
  readonly preferredDeg: number;
  /** The label's width, in pixels. */
  readonly width: number;
  /** The label's height, in pixels. */
  readonly height: number;
  /** Clear space between the anchor and the label's near edge (room for the element's own glyph). */
  readonly gapPx: number;
  /** Higher goes first and gets the nearest room; equal priorities keep the order given. */
  readonly priority: number;
  /** May be left out when no room is left anywhere. */
  readonly optional?: boolean;
  /** An optional label that finds room only farther than this from its anchor is left out instead. */
  readonly maxDistancePx?: number;
}

/**
 * Something drawn that labels keep clear of. A `mark` (a symbol, a glyph, the reference mark, the rotation
 * arrow) is never covered; a `soft` one (a scale number, a line) is covered only when nothing else is free,
 * at a cost of `weight` per square pixel (1 when omitted).
 */
export interface EndViewObstacle extends Box {
  /** Whether labels may ever cover it. */
  readonly kind: 'mark' | 'soft';
  /** The cost of covering a square pixel of a soft obstacle. */
  readonly weight?: number;
}

/** The rotor as the placer sees it: its rim is a band no label crosses, and labels that move go beyond it. */
export interface EndViewRim {
  /** The rotor's centre. */
  readonly center: ScreenPoint;
  /** The radius of the rim. */
  readonly radius: number;
  /** How far the band reaches inside the rim (the ticks and glyphs on it). */
  readonly insidePx: number;
  /** How far the band reaches outside the rim (marks drawn just beyond it). */
  readonly outsidePx: number;
}

/** Where labels go. */
export interface EndViewLabelStage {
  /** The widget's box: labels stay inside it. */
  readonly bounds: Box;
  /** The rotor's rim. */
  readonly rim: EndViewRim;
  /** Drawn things labels keep clear of. */
  readonly obstacles: readonly EndViewObstacle[];
  /** Space kept between two labels and between a label and the widget's edge; 2 px when omitted. */
  readonly spacingPx?: number;
}

/** A straight line from an anchor to its label. */
export interface LeaderLine {
  /** At the anchor. */
  readonly from: ScreenPoint;
  /** On the label's edge nearest the anchor. */
  readonly to: ScreenPoint;
}

/** A label with its box. */
export interface PlacedEndViewLabel {
  /** The key of the request. */
  readonly key: string;
  /** Where the label goes. */
  readonly box: Box;
  /** The point of the element it names. */
  readonly anchor: ScreenPoint;
  /** A line back to the anchor when the label had to move away from it. */
  readonly leader: LeaderLine | null;
}

/** What the placer answers. */
export interface EndViewLabelLayout {
  /** The labels placed, in the order of the requests. */
  readonly placed: readonly PlacedEndViewLabel[];
  /** The keys of the optional labels left out for want of room, in the order of the requests. */
  readonly dropped: readonly string[];
  /** The widget's height with the rows added below for required labels; the bounds' bottom when none. */
  readonly height: number;
}

/** A label farther than this beyond its gap gets a leader line back to its anchor. */
export const LEADER_AFTER_PX = 10;

/** The turns tried, in order, from a label's preferred direction. */
const TURNS_DEG = [0, 22.5, -22.5, 45, -45, 67.5, -67.5, 90, -90, 135, -135, 180];
/** How many label heights a label may step away from its anchor before it is sent beyond the rim. */
const NEAR_STEPS = 2;
/** The step round the rim, in degrees, between the places tried for a label beyond it. */
const RIM_TURN_STEP_DEG = 4;
/** How many rows of labels are tried outward from the rim. */
const RIM_ROWS = 8;

/** The area two boxes share (0 when apart or only touching). */
export function overlapArea(a: Box, b: Box): number {
  const w = Math.min(a.x + a.width, b.x + b.width) - Math.max(a.x, b.x);
  const h = Math.min(a.y + a.height, b.y + b.height) - Math.max(a.y, b.y);
  return w > 0 && h > 0 ? w * h : 0;
}

/** Whether two boxes overlap by more than a rounding error. */
export function boxesOverlap(a: Box, b: Box, tolerancePx = 1e-6): boolean {
  const w = Math.min(a.x + a.width, b.x + b.width) - Math.max(a.x, b.x);
  const h = Math.min(a.y + a.height, b.y + b.height) - Math.max(a.y, b.y);
  return w > tolerancePx && h > tolerancePx;
}

/** Whether `inner` lies inside `outer` (to a rounding error). */
export function boxInside(inner: Box, outer: Box, tolerancePx = 1e-6): boolean {
  return (
    inner.x >= outer.x - tolerancePx &&
    inner.y >= outer.y - tolerancePx &&
    inner.x + inner.width <= outer.x + outer.width + tolerancePx &&
    inner.y + inner.height <= outer.y + outer.height + tolerancePx
  );
}

/** A box grown by `by` on every side. */
export function inflateBox(box: Box, by: number): Box {
  return { x: box.x - by, y: box.y - by, width: box.width + 2 * by, height: box.height + 2 * by };
}

/** A square of side `side` centred on a point: the room a glyph takes. */
export function boxAround(at: ScreenPoint, side: number): Box {
  return { x: at.x - side / 2, y: at.y - side / 2, width: side, height: side };
}

/** The point of a box nearest to another point. */
export function nearestPointOnBox(box: Box, to: ScreenPoint): ScreenPoint {
  return {
    x: Math.min(Math.max(to.x, box.x), box.x + box.width),
    y: Math.min(Math.max(to.y, box.y), box.y + box.height),
  };
}

/** The distance from a point to a box (0 inside it). */
export function distanceToBox(box: Box, from: ScreenPoint): number {
  const nearest = nearestPointOnBox(box, from);
  return Math.hypot(nearest.x - from.x, nearest.y - from.y);
}

/** The distance from a point to the farthest corner of a box. */
function farthestCornerDistance(box: Box, from: ScreenPoint): number {
  const dx = Math.max(Math.abs(box.x - from.x), Math.abs(box.x + box.width - from.x));
  const dy = Math.max(Math.abs(box.y - from.y), Math.abs(box.y + box.height - from.y));
  return Math.hypot(dx, dy);
}

/** Whether a box crosses the rim band (lies neither wholly inside it nor wholly beyond it). */
export function boxCrossesRim(box: Box, rim: EndViewRim): boolean {
  const inner = rim.radius - rim.insidePx;
  const outer = rim.radius + rim.outsidePx;
  return distanceToBox(box, rim.center) < outer && farthestCornerDistance(box, rim.center) > inner;
}

/** Whether a box lies wholly beyond the rim band. */
export function boxBeyondRim(box: Box, rim: EndViewRim): boolean {
  return distanceToBox(box, rim.center) >= rim.radius + rim.outsidePx;
}

/** How far a box of this size reaches from its centre in a screen direction (its support distance). */
export function boxReachPx(width: number, height: number, screenDeg: number): number {
  const radians = (screenDeg * Math.PI) / 180;
  return (Math.abs(Math.sin(radians)) * width) / 2 + (Math.abs(Math.cos(radians)) * height) / 2;
}

/**
 * A box of the given size beside a point in a screen direction, its near side `gapPx` beyond the point:
 * the whole box lies past the line at `gapPx` across that direction, so it never covers the point.
 */
export function boxBeside(
  anchor: ScreenPoint,
  screenDeg: number,
  gapPx: number,
  width: number,
  height: number,
): Box {
  const radians = (screenDeg * Math.PI) / 180;
  const reach = gapPx + boxReachPx(width, height, screenDeg);
  const cx = anchor.x + reach * Math.sin(radians);
  const cy = anchor.y - reach * Math.cos(radians);
  return { x: cx - width / 2, y: cy - height / 2, width, height };
}

interface Candidate {
  readonly box: Box;
  readonly cost: number;
}

/** Everything one placement run keeps track of. */
class Placer {
  private readonly taken: Box[] = [];
  private readonly marks: Box[];
  private readonly soft: EndViewObstacle[];
  private readonly spacing: number;
  private readonly usable: Box;
  /** The bottom of the rows added below the bounds for required labels. */
  grownBottom: number;
  /** Sizes that found no room in the margin: a label at least as large finds none either, later. */
  private readonly marginFull: { width: number; height: number }[] = [];
  /** Sizes that found no room on the rows beyond the rim. */
  private readonly rimFull: { width: number; height: number }[] = [];

  constructor(private readonly stage: EndViewLabelStage) {
    this.spacing = stage.spacingPx ?? 2;
    this.marks = stage.obstacles.filter((o) => o.kind === 'mark');
    this.soft = stage.obstacles.filter((o) => o.kind === 'soft');
    const { bounds } = stage;
    this.usable = inflateBox(bounds, -this.spacing);
    this.grownBottom = bounds.y + bounds.height;
  }

  /** Whether a box keeps every promise: inside, clear of labels and marks, off the rim band. */
  free(box: Box): boolean {
    if (!boxInside(box, this.usable)) return false;
    if (boxCrossesRim(box, this.stage.rim)) return false;
    return this.clearOfLabelsAndMarks(box);
  }

  softCost(box: Box): number {
    let cost = 0;
    for (const obstacle of this.soft) cost += overlapArea(box, obstacle) * (obstacle.weight ?? 1);
    return cost;
  }

  take(box: Box): void {
    this.taken.push(box);
  }

  /** The best free box beside the anchor, a step or two away at most; null when there is none. */
  near(request: EndViewLabelRequest): Box | null {
    let best: Candidate | null = null;
    for (let step = 0; step <= NEAR_STEPS; step++) {
      const gap = request.gapPx + step * request.height * 0.75;
      for (const turn of TURNS_DEG) {
        const box = boxBeside(
          request.anchor,
          request.preferredDeg + turn,
          gap,
          request.width,
          request.height,
        );
        if (!this.free(box)) continue;
        const cost = this.softCost(box) + Math.abs(turn) * 0.4 + step * request.height * 2;
        if (!best || cost < best.cost) best = { box, cost };
      }
    }
    return best?.box ?? null;
  }

  /**
   * The nearest free box beyond the rim, on rows outward from it and every few degrees round it. The
   * candidates depend on the label's size alone, so a size that found none is not searched again.
   */
  beyondRim(request: EndViewLabelRequest): Box | null {
    const full = this.rimFull.some((size) => request.width >= size.width && request.height >= size.height);
    if (full) return null;
    const found = this.searchBeyondRim(request);
    if (!found) this.rimFull.push({ width: request.width, height: request.height });
    return found;
  }

  private searchBeyondRim(request: EndViewLabelRequest): Box | null {
    const { rim } = this.stage;
    const start = rim.radius + rim.outsidePx + this.spacing;
    const anchorRadius = Math.hypot(request.anchor.x - rim.center.x, request.anchor.y - rim.center.y);
    // The same places round the rim for every label, tried from the anchor's direction outward.
    const steps = Math.round(360 / RIM_TURN_STEP_DEG);
    const first = Math.round(
      screenDegOf(rim.center, request.anchor, request.preferredDeg) / RIM_TURN_STEP_DEG,
    );
    const order = Array.from({ length: steps }, (_, i) => first + (i % 2 === 0 ? i / 2 : -(i + 1) / 2));
    let best: Candidate | null = null;
    for (let row = 0; row < RIM_ROWS; row++) {
      const distance = start + row * (request.height + this.spacing);
      // Every box of this row and the next lies at least this far from the anchor.
      if (best && best.cost <= distance - anchorRadius) break;
      for (const step of order) {
        const deg = (((step % steps) + steps) % steps) * RIM_TURN_STEP_DEG;
        const box = boxBeside(rim.center, deg, distance, request.width, request.height);
        const away = distanceToBox(box, request.anchor);
        if (best && away >= best.cost) continue;
        if (!this.free(box)) continue;
        const cost = away + this.softCost(box) + this.leaderAcrossRotorCost(request.anchor, box);
        if (!best || cost < best.cost) best = { box, cost };
      }
    }
    return best?.box ?? null;
  }

  /** A leader that would run across the middle of the rotor costs as much as going half round it. */
  private leaderAcrossRotorCost(anchor: ScreenPoint, box: Box): number {
    const { center, radius } = this.stage.rim;
    const to = nearestPointOnBox(box, anchor);
    const dx = to.x - anchor.x;
    const dy = to.y - anchor.y;
    const length = dx * dx + dy * dy;
    const t =
      length > 0
        ? Math.min(1, Math.max(0, ((center.x - anchor.x) * dx + (center.y - anchor.y) * dy) / length))
        : 0;
    const closest = Math.hypot(anchor.x + t * dx - center.x, anchor.y + t * dy - center.y);
    return closest < radius * 0.6 ? radius * Math.PI * 0.5 : 0;
  }

  /** The nearest free box anywhere in the margin beyond the rim, on a grid over the widget's box. */
  inMargin(request: EndViewLabelRequest): Box | null {
    const full = this.marginFull.some((size) => request.width >= size.width && request.height >= size.height);
    if (full) return null;
    const found = this.searchMargin(request);
    if (!found) this.marginFull.push({ width: request.width, height: request.height });
    return found;
  }

  private searchMargin(request: EndViewLabelRequest): Box | null {
    const { usable } = this;
    const stepX = 6;
    const stepY = Math.max(4, request.height / 3);
    let best: Candidate | null = null;
    for (let y = usable.y; y + request.height <= usable.y + usable.height + 1e-9; y += stepY) {
      for (let x = usable.x; x + request.width <= usable.x + usable.width + 1e-9; x += stepX) {
        const box = { x, y, width: request.width, height: request.height };
        const cost = distanceToBox(box, request.anchor);
        if (best && cost >= best.cost) continue;
        if (!boxBeyondRim(box, this.stage.rim) || !this.free(box)) continue;
        best = { box, cost: cost + this.softCost(box) };
      }
      // The right-hand edge too, so a label can sit flush with it.
      const x = usable.x + usable.width - request.width;
      const box = { x, y, width: request.width, height: request.height };
      const cost = distanceToBox(box, request.anchor);
      if (
        x >= usable.x &&
        (!best || cost < best.cost) &&
        boxBeyondRim(box, this.stage.rim) &&
        this.free(box)
      ) {
        best = { box, cost: cost + this.softCost(box) };
      }
    }
    return best?.box ?? null;
  }

  /**
   * A box below the widget's box, as high and as near under the anchor as the labels already there allow;
   * the grown bottom moves down to hold it.
   */
  below(request: EndViewLabelRequest): Box {
    const { bounds } = this.stage;
    const left = bounds.x + this.spacing;
    const right = Math.max(left, bounds.x + bounds.width - this.spacing - request.width);
    const wanted = Math.min(Math.max(request.anchor.x - request.width / 2, left), right);
    const firstTop = bounds.y + bounds.height;
    // A new row at the grown bottom is always free, so the search ends there at the latest.
    for (let top = firstTop; ; top += 2) {
      const fresh = top >= this.grownBottom;
      const box = fresh
        ? { x: wanted, y: this.grownBottom, width: request.width, height: request.height }
        : this.freeInRow(top, request, left, right, wanted);
      if (box) {
        this.grownBottom = Math.max(this.grownBottom, box.y + box.height + this.spacing);
        return box;
      }
    }
  }

  private freeInRow(
    top: number,
    request: EndViewLabelRequest,
    left: number,
    right: number,
    wanted: number,
  ): Box | null {
    if (top + request.height > this.grownBottom - this.spacing + 1e-9) return null;
    let best: Candidate | null = null;
    const xs = [wanted];
    for (let x = left; x <= right + 1e-9; x += 4) xs.push(x);
    for (const x of xs) {
      const box = { x, y: top, width: request.width, height: request.height };
      const cost = Math.abs(x - wanted);
      if (best && cost >= best.cost) continue;
      if (!this.clearOfLabelsAndMarks(box)) continue;
      best = { box, cost };
    }
    return best?.box ?? null;
  }

  private clearOfLabelsAndMarks(box: Box): boolean {
    const spaced = inflateBox(box, this.spacing / 2);
    return (
      this.taken.every((label) => !boxesOverlap(spaced, inflateBox(label, this.spacing / 2))) &&
      this.marks.every((mark) => !boxesOverlap(box, mark))
    );
  }
}

/** The screen direction of a point from a centre; `fallbackDeg` when they coincide. */
function screenDegOf(center: ScreenPoint, point: ScreenPoint, fallbackDeg: number): number {
  const dx = point.x - center.x;
  const dy = point.y - center.y;
  if (Math.hypot(dx, dy) < 1e-6) return fallbackDeg;
  return (Math.atan2(dx, -dy) * 180) / Math.PI;
}

/** The leader of a label placed at `box`: none when the label sits right beside its anchor. */
function leaderFor(request: EndViewLabelRequest, box: Box): LeaderLine | null {
  const to = nearestPointOnBox(box, request.anchor);
  const far = Math.hypot(to.x - request.anchor.x, to.y - request.anchor.y) > request.gapPx + LEADER_AFTER_PX;
  return far ? { from: request.anchor, to } : null;
}

/**
 * Places labels, most important first (by `priority`, then in the order given): beside the anchor in the
 * preferred direction or turned from it, a step or two out; else beyond the rim, as near the anchor as a
 * free spot allows, with a leader line; else anywhere free in the margin beyond the rim; else an optional
 * label is dropped (so is one whose only room lies beyond its `maxDistancePx`) and a required one gets a
 * row below the drawing (the answer's `height` grows).
 */
export function placeEndViewLabels(
  requests: readonly EndViewLabelRequest[],
  stage: EndViewLabelStage,
): EndViewLabelLayout {
  const placer = new Placer(stage);
  const order = requests
    .map((request, index) => ({ request, index }))
    .sort((a, b) => b.request.priority - a.request.priority || a.index - b.index);
  const boxes = new Map<number, Box>();
  for (const { request, index } of order) {
    const found = placer.near(request) ?? placer.beyondRim(request) ?? placer.inMargin(request);
    const tooFar =
      request.optional &&
      found !== null &&
      request.maxDistancePx !== undefined &&
      distanceToBox(found, request.anchor) > request.maxDistancePx;
    const box = found && !tooFar ? found : request.optional ? null : placer.below(request);
    if (!box) continue;
    placer.take(box);
    boxes.set(index, box);
  }
  const placed: PlacedEndViewLabel[] = [];
  const dropped: string[] = [];
  requests.forEach((request, index) => {
    const box = boxes.get(index);
    if (!box) {
      dropped.push(request.key);
      return;
    }
    placed.push({ key: request.key, box, anchor: request.anchor, leader: leaderFor(request, box) });
  });
  const bottom = stage.bounds.y + stage.bounds.height;
  return { placed, dropped, height: Math.max(bottom, placer.grownBottom) - stage.bounds.y };
}

/** A rough width of a one-line label: the drawing has no text metrics in tests, and a little slack is harmless. */
export function estimateTextWidthPx(text: string, fontSizePx: number, paddingPx = 0): number {
  return Math.ceil(text.length * fontSizePx * 0.6 + 2 * paddingPx);
}
