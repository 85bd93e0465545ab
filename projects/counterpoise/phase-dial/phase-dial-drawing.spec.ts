import { type DialConvention, _screenAngleOfPoint as screenAngleOfPoint } from '@counterpoise/ng/core';
import { describe, expect, it } from 'vitest';
import {
  DIAL_CENTER,
  DIAL_RIM_RADIUS,
  DIAL_THUMB_RADIUS,
  DIAL_VIEW_SIZE,
  MARKER_GLYPHS,
  dialLabels,
  dialTicks,
  placeMarkers,
  pointerLine,
  referenceMark,
  rotationArrow,
  thumbCenter,
} from './phase-dial-drawing';
import { PHASE_DIAL_MARKER_KINDS } from './phase-dial-values';

const upright: DialConvention = { rotation: 'clockwise', counting: 'withRotation', zeroAtDeg: 0 };
const mirrored: DialConvention = { rotation: 'clockwise', counting: 'againstRotation', zeroAtDeg: 90 };

/** The screen angle (clockwise from 12 o'clock) of a point of the drawing. */
const screenAngleOf = (point: { x: number; y: number }) => screenAngleOfPoint(DIAL_CENTER, point);

/** The screen angle where an arc's path starts. */
function arcStartScreenDeg(arc: string): number {
  const [, x, y] = arc.match(/^M ([\d.]+) ([\d.]+)/)!;
  return screenAngleOf({ x: Number(x), y: Number(y) });
}

describe('ticks and labels', () => {
  it('graduates every 10 degrees, longer every 30, leaving 0 to the reference mark', () => {
    const ticks = dialTicks([], upright);
    expect(ticks).toHaveLength(35);
    expect(ticks.filter((tick) => tick.kind === 'major')).toHaveLength(11);
    expect(ticks.some((tick) => tick.angleDeg === 0)).toBe(false);
  });

  it('draws one notch per position where the convention puts it', () => {
    const ticks = dialTicks([0, 120, 240], mirrored);
    expect(ticks.map((tick) => tick.kind)).toEqual(['position', 'position', 'position']);
    // Counted against a clockwise rotor, 120 degrees lies 120 degrees counter-clockwise of the mark at 3 o'clock.
    expect(screenAngleOf({ x: ticks[1]!.x2, y: ticks[1]!.y2 })).toBeCloseTo(330, 0);
  });

  it('labels the quarters, or the reference mark and each of a few positions', () => {
    expect(dialLabels([], upright).map((label) => label.text)).toEqual(['0', '90', '180', '270']);
    expect(dialLabels([30, 150, 270], upright).map((label) => label.text)).toEqual(['0', '30', '150', '270']);
    expect(dialLabels([0, 180], upright).map((label) => label.text)).toEqual(['0', '180']);
    const many = Array.from({ length: 12 }, (_, i) => i * 30);
    expect(dialLabels(many, upright)).toHaveLength(4);
  });

  it('keeps every label inside the view box and clear of the thumb, wherever the mark sits', () => {
    for (let zeroAtDeg = 0; zeroAtDeg < 360; zeroAtDeg += 15) {
      for (const label of dialLabels([], { ...upright, zeroAtDeg })) {
        const halfWidth = label.text.length * 4.4;
        expect(label.x - halfWidth).toBeGreaterThanOrEqual(0);
        expect(label.x + halfWidth).toBeLessThanOrEqual(DIAL_VIEW_SIZE);
        expect(label.y - 8).toBeGreaterThanOrEqual(0);
        expect(label.y + 8).toBeLessThanOrEqual(DIAL_VIEW_SIZE);
        const distance = Math.hypot(label.x - DIAL_CENTER.x, label.y - DIAL_CENTER.y);
        expect(distance).toBeGreaterThan(DIAL_RIM_RADIUS + DIAL_THUMB_RADIUS);
      }
    }
  });

  it('puts the 90 label a quarter turn from the reference mark in the counting direction', () => {
    const [zero, ninety] = dialLabels([], mirrored);
    expect(screenAngleOf(zero!)).toBeCloseTo(90, 0);
    expect(screenAngleOf(ninety!)).toBeCloseTo(0, 0);
  });
});

describe('reference mark, pointer and rotation arrow', () => {
  it('crosses the rim with the reference mark at zeroAtDeg', () => {
    const mark = referenceMark(mirrored);
    expect(screenAngleOf({ x: mark.x2, y: mark.y2 })).toBeCloseTo(90, 0);
    expect(Math.hypot(mark.x1 - DIAL_CENTER.x, mark.y1 - DIAL_CENTER.y)).toBeLessThan(DIAL_RIM_RADIUS);
    expect(Math.hypot(mark.x2 - DIAL_CENTER.x, mark.y2 - DIAL_CENTER.y)).toBeGreaterThan(DIAL_RIM_RADIUS);
  });

  it('points at the value and puts the thumb on the rim', () => {
    const line = pointerLine(90, upright);
    const thumb = thumbCenter(90, upright);
    expect(screenAngleOf({ x: line.x2, y: line.y2 })).toBeCloseTo(90, 0);
    expect(thumb.x).toBeCloseTo(DIAL_CENTER.x + DIAL_RIM_RADIUS, 1);
    expect(thumb.y).toBeCloseTo(DIAL_CENTER.y, 1);
  });

  it('sweeps the rotation arrow the way the rotor turns, clear of the reference mark', () => {
    const clockwise = rotationArrow(upright);
    const counter = rotationArrow({ ...upright, rotation: 'counterClockwise' });
    expect(clockwise.arc).toMatch(/ 0 0 1 /);
    expect(counter.arc).toMatch(/ 0 0 0 /);
    expect(arcStartScreenDeg(clockwise.arc)).toBeCloseTo(115, 0);
  });

  it('moves the rotation arrow into the widest gap between position labels', () => {
    // Labels every 60 degrees on screen from 0 (against a clockwise rotor): the gaps are all 60 wide, and the
    // one nearest the usual place (135) is centred on 150, so the arc runs from 134 to 166.
    const arrow = rotationArrow(upright, [0, 60, 120, 180, 240, 300]);
    expect(arcStartScreenDeg(arrow.arc)).toBeCloseTo(134, 0);
    // One holder at 40 with the mark at 0: the widest gap is the 320 degrees from 40 round to 360.
    const lone = rotationArrow(upright, [40]);
    expect(arcStartScreenDeg(lone.arc)).toBeCloseTo(180, 0);
  });
});

describe('markers', () => {
  it('gives every kind its own shape', () => {
    const shapes = PHASE_DIAL_MARKER_KINDS.map((kind) => MARKER_GLYPHS[kind].d);
    expect(new Set(shapes).size).toBe(PHASE_DIAL_MARKER_KINDS.length);
  });

  it('places markers at their angle, turned outwards, and leaves out those without one', () => {
    const placed = placeMarkers(
      [
        { kind: 'heavySpot', angleDeg: 90 },
        { kind: 'trialWeight', angleDeg: Number.NaN },
        { kind: 'correction', angleDeg: -90, label: '58 g' },
      ],
      upright,
    );
    expect(placed.map((marker) => [marker.kind, marker.angleDeg, marker.label])).toEqual([
      ['heavySpot', 90, ''],
      ['correction', 270, '58 g'],
    ]);
    expect(placed[0]!.transform).toMatch(/rotate\(90\)$/);
    expect(placed[1]!.transform).toMatch(/rotate\(270\)$/);
  });
});
