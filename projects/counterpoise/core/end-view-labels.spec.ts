import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  type Box,
  type EndViewLabelRequest,
  type EndViewLabelStage,
  type EndViewObstacle,
  boxBeside,
  boxBeyondRim,
  boxCrossesRim,
  boxInside,
  boxesOverlap,
  distanceToBox,
  estimateTextWidthPx,
  overlapArea,
  placeEndViewLabels,
} from './end-view-labels';

const bounds: Box = { x: 0, y: 0, width: 400, height: 400 };
const rim = { center: { x: 200, y: 200 }, radius: 140, insidePx: 20, outsidePx: 4 };
const stage = (obstacles: readonly EndViewObstacle[] = [], more: Partial<EndViewLabelStage> = {}) => ({
  bounds,
  rim,
  obstacles,
  ...more,
});
/** A label at a rotor point `radius` from the centre in a screen direction, asking to sit outward. */
function request(
  key: string,
  screenDeg: number,
  more: Partial<EndViewLabelRequest> = {},
): EndViewLabelRequest {
  const radians = (screenDeg * Math.PI) / 180;
  const radius = more.anchor ? 0 : 130;
  return {
    key,
    anchor: { x: 200 + radius * Math.sin(radians), y: 200 - radius * Math.cos(radians) },
    preferredDeg: screenDeg,
    width: 90,
    height: 24,
    gapPx: 14,
    priority: 0,
    ...more,
  };
}

describe('boxes', () => {
  it('measures overlaps, ignoring boxes that only touch', () => {
    const a = { x: 0, y: 0, width: 10, height: 10 };
    expect(overlapArea(a, { x: 5, y: 5, width: 10, height: 10 })).toBe(25);
    expect(overlapArea(a, { x: 10, y: 0, width: 10, height: 10 })).toBe(0);
    expect(boxesOverlap(a, { x: 10, y: 0, width: 10, height: 10 })).toBe(false);
    expect(boxesOverlap(a, { x: 9, y: 9, width: 10, height: 10 })).toBe(true);
    expect(boxInside({ x: 1, y: 1, width: 8, height: 8 }, a)).toBe(true);
    expect(boxInside({ x: 1, y: 1, width: 10, height: 8 }, a)).toBe(false);
    expect(distanceToBox(a, { x: 13, y: 14 })).toBe(5);
  });

  it('puts a box beside a point with its near side at the gap, whatever the direction', () => {
    const anchor = { x: 0, y: 0 };
    const up = boxBeside(anchor, 0, 10, 40, 20);
    expect(up.y + up.height).toBeCloseTo(-10, 9);
    expect(up.x + up.width / 2).toBeCloseTo(0, 9);
    const left = boxBeside(anchor, 270, 10, 40, 20);
    expect(left.x + left.width).toBeCloseTo(-10, 9);
    // A diagonal box lies wholly past the line at the gap across its direction.
    const diagonal = boxBeside(anchor, 45, 10, 40, 20);
    const u = { x: Math.SQRT1_2, y: -Math.SQRT1_2 };
    for (const [x, y] of [
      [diagonal.x, diagonal.y],
      [diagonal.x + 40, diagonal.y],
      [diagonal.x, diagonal.y + 20],
      [diagonal.x + 40, diagonal.y + 20],
    ]) {
      expect(x! * u.x + y! * u.y).toBeGreaterThanOrEqual(10 - 1e-9);
    }
  });

  it('tells a box across the rim band from one inside it or beyond it', () => {
    expect(boxCrossesRim({ x: 190, y: 55, width: 20, height: 10 }, rim)).toBe(true);
    expect(boxCrossesRim({ x: 190, y: 40, width: 20, height: 10 }, rim)).toBe(false);
    expect(boxBeyondRim({ x: 190, y: 40, width: 20, height: 10 }, rim)).toBe(true);
    expect(boxCrossesRim({ x: 190, y: 190, width: 20, height: 20 }, rim)).toBe(false);
    expect(boxBeyondRim({ x: 190, y: 190, width: 20, height: 20 }, rim)).toBe(false);
  });

  it('estimates the width of a line of text from its length', () => {
    expect(estimateTextWidthPx('Heavy spot', 12, 6)).toBe(84);
    expect(estimateTextWidthPx('90°', 13)).toBe(24);
  });
});

describe('placeEndViewLabels', () => {
  it('puts a lone label right beside its anchor in the preferred direction, without a leader', () => {
    const { placed, dropped, height } = placeEndViewLabels([request('a', 0)], stage());
    expect(dropped).toEqual([]);
    expect(height).toBe(400);
    const [label] = placed;
    expect(label!.box.y + label!.box.height).toBeCloseTo(200 - 130 - 14, 6);
    expect(label!.box.x + label!.box.width / 2).toBeCloseTo(200, 6);
    expect(label!.leader).toBeNull();
  });

  it('keeps labels of weights at one angle apart, off the rim, and moves the crowd beyond it with leaders', () => {
    const crowd = Array.from({ length: 8 }, (_, i) => request(`w${i}`, 100 + i));
    const { placed, dropped } = placeEndViewLabels(crowd, stage());
    expect(dropped).toEqual([]);
    expect(placed.map((label) => label.key)).toEqual(crowd.map((r) => r.key));
    for (const [i, a] of placed.entries()) {
      expect(boxInside(a.box, bounds)).toBe(true);
      expect(boxCrossesRim(a.box, rim)).toBe(false);
      for (const b of placed.slice(i + 1)) expect(boxesOverlap(a.box, b.box)).toBe(false);
    }
    const led = placed.filter((label) => label.leader);
    expect(led.length).toBeGreaterThan(0);
    for (const label of led) {
      expect(label.leader!.from).toEqual(label.anchor);
      expect(distanceToBox(label.box, label.leader!.to)).toBeCloseTo(0, 9);
    }
  });

  it('never covers a mark, and covers a soft obstacle only when it saves a long way', () => {
    const ideal = boxBeside(request('a', 0).anchor, 0, 14, 90, 24);
    const [clearOfMark] = placeEndViewLabels([request('a', 0)], stage([{ kind: 'mark', ...ideal }])).placed;
    expect(boxesOverlap(clearOfMark!.box, ideal)).toBe(false);
    const [overFaint] = placeEndViewLabels(
      [request('a', 0)],
      stage([{ kind: 'soft', weight: 0.0001, ...ideal }]),
    ).placed;
    expect(overFaint!.box).toEqual(ideal);
  });

  it('gives the nearest room to the higher priority, whatever the order asked', () => {
    const low = request('low', 0);
    const high = request('high', 0, { priority: 10 });
    const { placed } = placeEndViewLabels([low, high], stage());
    expect(placed.map((label) => label.key)).toEqual(['low', 'high']);
    const byKey = new Map(placed.map((label) => [label.key, label]));
    const ideal = boxBeside(high.anchor, 0, 14, 90, 24);
    expect(byKey.get('high')!.box).toEqual(ideal);
    expect(byKey.get('low')!.box).not.toEqual(ideal);
  });

  it('drops an optional label that finds no room, and makes room below for a required one', () => {
    const tiny = { x: 0, y: 0, width: 120, height: 60 };
    const tight = { center: { x: 60, y: 30 }, radius: 20, insidePx: 4, outsidePx: 4 };
    const big = (key: string, optional: boolean): EndViewLabelRequest => ({
      key,
      anchor: { x: 60, y: 10 },
      preferredDeg: 0,
      width: 100,
      height: 24,
      gapPx: 4,
      priority: 0,
      optional,
    });
    const layout = placeEndViewLabels([big('a', false), big('b', true), big('c', false)], {
      bounds: tiny,
      rim: tight,
      obstacles: [],
    });
    expect(layout.dropped).toEqual(['b']);
    expect(layout.placed.map((label) => label.key)).toEqual(['a', 'c']);
    expect(layout.height).toBeGreaterThan(60);
    const grown = { ...tiny, height: layout.height };
    for (const label of layout.placed) expect(boxInside(label.box, grown)).toBe(true);
    expect(boxesOverlap(layout.placed[0]!.box, layout.placed[1]!.box)).toBe(false);
  });

  it('leaves out an optional name rather than draw it far from what it names', () => {
    const crowd = Array.from({ length: 6 }, (_, i) => request(`w${i}`, 100 + i));
    const name = request('name', 103, { optional: true, maxDistancePx: 20 });
    const near = placeEndViewLabels([request('alone', 103, { optional: true, maxDistancePx: 20 })], stage());
    expect(near.dropped).toEqual([]);
    const crowded = placeEndViewLabels([...crowd, name], stage());
    expect(crowded.dropped).toEqual(['name']);
    const unbounded = placeEndViewLabels([...crowd, { ...name, maxDistancePx: undefined }], stage());
    expect(unbounded.dropped).toEqual([]);
  });

  it('answers the same scene with the same layout', () => {
    const crowd = Array.from({ length: 12 }, (_, i) => request(`w${i}`, (i * 47) % 360, { priority: i % 3 }));
    expect(placeEndViewLabels(crowd, stage())).toEqual(placeEndViewLabels(crowd, stage()));
  });

  it('keeps every promise for any crowd of labels, marks and sizes (property)', () => {
    const box = fc.record({
      x: fc.integer({ min: 0, max: 380 }),
      y: fc.integer({ min: 0, max: 380 }),
      width: fc.integer({ min: 4, max: 30 }),
      height: fc.integer({ min: 4, max: 30 }),
    });
    const label = fc.record({
      screenDeg: fc.integer({ min: 0, max: 359 }),
      radius: fc.integer({ min: 0, max: 150 }),
      width: fc.integer({ min: 20, max: 160 }),
      height: fc.integer({ min: 14, max: 28 }),
      priority: fc.integer({ min: 0, max: 3 }),
      optional: fc.boolean(),
    });
    fc.assert(
      fc.property(fc.array(label, { maxLength: 40 }), fc.array(box, { maxLength: 20 }), (labels, marks) => {
        const requests = labels.map((l, i) =>
          request(`l${i}`, l.screenDeg, {
            anchor: {
              x: 200 + l.radius * Math.sin((l.screenDeg * Math.PI) / 180),
              y: 200 - l.radius * Math.cos((l.screenDeg * Math.PI) / 180),
            },
            width: l.width,
            height: l.height,
            priority: l.priority,
            optional: l.optional,
          }),
        );
        const obstacles = marks.map((m) => ({ kind: 'mark' as const, ...m }));
        const layout = placeEndViewLabels(requests, stage(obstacles));
        const grown = { ...bounds, height: layout.height };
        const faults: string[] = [];
        layout.placed.forEach((a, i) => {
          if (!boxInside(a.box, grown)) faults.push(`${a.key} outside`);
          if (a.box.y < bounds.y + bounds.height && boxCrossesRim(a.box, rim))
            faults.push(`${a.key} on the rim`);
          for (const b of layout.placed.slice(i + 1))
            if (boxesOverlap(a.box, b.box)) faults.push(`${a.key} over ${b.key}`);
          for (const mark of obstacles) if (boxesOverlap(a.box, mark)) faults.push(`${a.key} over a mark`);
        });
        expect(faults).toEqual([]);
        const optional = new Set(requests.filter((r) => r.optional).map((r) => r.key));
        for (const key of layout.dropped) expect(optional.has(key)).toBe(true);
        expect(layout.placed.length + layout.dropped.length).toBe(requests.length);
      }),
      { numRuns: 60 },
    );
  });
});
