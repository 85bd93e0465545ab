import { describe, expect, it } from 'vitest';
import { type DialConvention, screenAngleOfPoint } from './dial-geometry';
import { boxReachPx } from './end-view-labels';
import {
  labelCentreBeside,
  quietestRimGap,
  referenceMark,
  rotationArrow,
  scaleTicks,
} from './end-view-marks';

const center = { x: 100, y: 100 };
const upright: DialConvention = { rotation: 'clockwise', counting: 'withRotation', zeroAtDeg: 0 };
const mirrored: DialConvention = { rotation: 'clockwise', counting: 'againstRotation', zeroAtDeg: 90 };

/** The screen angle of the point an SVG path starts at. */
function startDeg(path: string): number {
  const [, x, y] = /^M ?(-?[\d.]+) (-?[\d.]+)/.exec(path)!.map(Number);
  return screenAngleOfPoint(center, { x: x!, y: y! });
}

describe('scaleTicks', () => {
  it('graduates every 10 degrees, longer every 30, inward from the rim', () => {
    const ticks = scaleTicks(center, 80, upright, { minorLengthPx: 5, majorLengthPx: 9 });
    expect(ticks).toHaveLength(36);
    expect(ticks.filter((tick) => tick.kind === 'major')).toHaveLength(12);
    const [zero] = ticks;
    expect(zero).toEqual({ kind: 'major', angleDeg: 0, x1: 100, y1: 29, x2: 100, y2: 20 });
    expect(
      scaleTicks(center, 80, upright, { minorLengthPx: 5, majorLengthPx: 9, skipZero: true }),
    ).toHaveLength(35);
  });

  it('draws one notch per position where the convention puts it', () => {
    const ticks = scaleTicks(center, 80, mirrored, {
      positions: [0, 120, 240],
      minorLengthPx: 5,
      majorLengthPx: 9,
    });
    expect(ticks.map((tick) => tick.kind)).toEqual(['position', 'position', 'position']);
    expect(screenAngleOfPoint(center, { x: ticks[1]!.x2, y: ticks[1]!.y2 })).toBeCloseTo(330, 1);
  });
});

describe('labelCentreBeside', () => {
  it('puts a scale label wholly outside the circle, touching the tangent in its direction', () => {
    for (const screenDeg of [0, 30, 90, 135, 200, 315]) {
      const at = labelCentreBeside(center, 80, screenDeg, 30, 14);
      expect(Math.hypot(at.x - center.x, at.y - center.y)).toBeCloseTo(80 + boxReachPx(30, 14, screenDeg), 9);
    }
    const inside = labelCentreBeside(center, 80, 90, 30, 14, 'inside');
    expect(inside.x).toBeCloseTo(100 + 80 - 15, 9);
  });
});

describe('referenceMark', () => {
  it('crosses the rim at zero and points at it from beyond', () => {
    const mark = referenceMark(center, 80, mirrored, { insidePx: 10, outsidePx: 4, pointerPx: 12 });
    expect(mark.screenDeg).toBe(90);
    expect(mark.line).toEqual({ x1: 170, y1: 100, x2: 184, y2: 100 });
    expect(startDeg(mark.pointerPath)).toBeCloseTo(90, 1);
    expect(mark.box.x).toBeLessThanOrEqual(170);
    expect(mark.box.x + mark.box.width).toBeGreaterThanOrEqual(196);
    expect(
      referenceMark(center, 80, upright, { insidePx: 10, outsidePx: 10, pointerPx: 0 }).pointerPath,
    ).toBe('');
  });
});

describe('rotationArrow', () => {
  it('finds the widest stretch of rim, the one nearest the preferred angle on a tie', () => {
    expect(quietestRimGap([], 135)).toEqual({ middleDeg: 135, widthDeg: 360 });
    expect(quietestRimGap([0, 90, 180], 0)).toEqual({ middleDeg: 270, widthDeg: 180 });
    expect(quietestRimGap([0, 90, 180, 270], 135).middleDeg).toBe(135);
    expect(quietestRimGap([350, 10, 20], 0).middleDeg).toBe(185);
  });

  it('sweeps the way the rotor turns, in the quietest stretch, clear of what is taken', () => {
    const options = { radius: 90, takenScreenDeg: [0, 90, 180, 270], preferredScreenDeg: 135 };
    const clockwise = rotationArrow(center, upright, options);
    const counter = rotationArrow(center, { ...upright, rotation: 'counterClockwise' }, options);
    expect(clockwise.arcPath).toMatch(/ 0 0 1 /);
    expect(counter.arcPath).toMatch(/ 0 0 0 /);
    expect(clockwise.middleDeg).toBe(135);
    expect(startDeg(clockwise.arcPath)).toBeCloseTo(115, 1);
    expect(startDeg(counter.arcPath)).toBeCloseTo(155, 1);
    const narrow = rotationArrow(center, upright, {
      ...options,
      takenScreenDeg: [0, 60, 120, 180, 240, 300],
    });
    expect(startDeg(narrow.arcPath)).toBeCloseTo(134, 1);
  });

  it('takes up a box round its arc and head', () => {
    const arrow = rotationArrow(center, upright, {
      radius: 90,
      takenScreenDeg: [0, 180],
      preferredScreenDeg: 90,
    });
    expect(arrow.box.x).toBeGreaterThan(100);
    expect(arrow.box.x + arrow.box.width).toBeGreaterThanOrEqual(190);
    expect(arrow.box.y).toBeLessThan(100 - 90 * Math.sin((20 * Math.PI) / 180) + 1);
  });
});
