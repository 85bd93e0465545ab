import { describe, expect, it } from 'vitest';
import {
  angleAtPoint,
  angleFromScreenDeg,
  type DialConvention,
  describeAngle,
  expandPositions,
  isAllowedPosition,
  nearestPosition,
  normalizeDeg,
  pointAtAngle,
  screenAngleDeg,
  screenSense,
  snapAngle,
} from './dial-geometry';

const conventions: DialConvention[] = [
  { rotation: 'clockwise', counting: 'againstRotation', zeroAtDeg: 0 },
  { rotation: 'clockwise', counting: 'withRotation', zeroAtDeg: 90 },
  { rotation: 'counterClockwise', counting: 'againstRotation', zeroAtDeg: 180 },
  { rotation: 'counterClockwise', counting: 'withRotation', zeroAtDeg: 270 },
];

describe('screen geometry', () => {
  it('counts against a clockwise rotor counter-clockwise on screen, and with it clockwise', () => {
    expect(screenSense(conventions[0]!)).toBe(-1);
    expect(screenSense(conventions[1]!)).toBe(1);
    expect(screenSense(conventions[2]!)).toBe(1);
    expect(screenSense(conventions[3]!)).toBe(-1);
  });

  it('puts the reference mark where zeroAtDeg says and 90 degrees a quarter turn away', () => {
    const c = { rotation: 'clockwise', counting: 'withRotation', zeroAtDeg: 0 } as const;
    const center = { x: 100, y: 100 };
    const zero = pointAtAngle(center, 50, 0, c);
    const ninety = pointAtAngle(center, 50, 90, c);
    expect(zero.x).toBeCloseTo(100, 12);
    expect(zero.y).toBeCloseTo(50, 12);
    expect(ninety.x).toBeCloseTo(150, 12);
    expect(ninety.y).toBeCloseTo(100, 12);
  });

  it.each(conventions)('maps a pointer back to the angle it was drawn at (%o)', (convention) => {
    const center = { x: 40, y: 60 };
    for (let angle = 0; angle < 360; angle += 7.5) {
      const point = pointAtAngle(center, 30, angle, convention);
      expect(angleAtPoint(center, point, convention)).toBeCloseTo(angle, 9);
      expect(angleFromScreenDeg(screenAngleDeg(angle, convention), convention)).toBeCloseTo(angle, 9);
    }
  });
});

describe('positions and snapping', () => {
  it('spreads a count of positions evenly from the first', () => {
    expect(expandPositions({ count: 4, firstDeg: 45 })).toEqual([45, 135, 225, 315]);
    expect(expandPositions(3)).toEqual([0, 120, 240]);
    expect(expandPositions([370, -10, 10])).toEqual([10, 350]);
    expect(expandPositions(null)).toEqual([]);
  });

  it('snaps to the nearest position across 0, or to the step', () => {
    expect(nearestPosition(355, [0, 120, 240])).toBe(0);
    expect(snapAngle(62, { positions: [0, 120, 240] })).toBe(120);
    expect(snapAngle(62.4, { step: 5 })).toBe(60);
    expect(snapAngle(359.7, {})).toBe(0);
    expect(isAllowedPosition(120.001, [0, 120, 240])).toBe(true);
    expect(isAllowedPosition(121, [0, 120, 240])).toBe(false);
  });

  it('normalises into [0, 360)', () => {
    expect(normalizeDeg(-90)).toBe(270);
    expect(normalizeDeg(720)).toBe(0);
    expect(normalizeDeg(-0)).toBe(0);
  });
});

describe('describeAngle', () => {
  it('speaks the angle and how it is counted', () => {
    expect(describeAngle(123, 'withRotation')).toBe(
      '123 degrees, counted with rotation from the reference mark',
    );
    expect(describeAngle(45.26, 'againstRotation')).toBe(
      '45.3 degrees, counted against rotation from the reference mark',
    );
  });
});
