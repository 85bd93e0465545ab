import { describe, expect, it } from 'vitest';
import {
  type DialConvention,
  _pointAtAngle as pointAtAngle,
  _screenAngleOfPoint as screenAngleOfPoint,
} from '@counterpoise/ng/core';
import {
  defaultCalibration,
  fittedFrame,
  frameFromCalibration,
  isInSector,
  labelMargin,
  nudgeHandle,
  photoToStage,
  sectorContaining,
  sectorMidDeg,
  sectorPath,
  sectorSweepDeg,
  stageToPhoto,
  withHandleAt,
} from './overlay-geometry';
import type { PhotoCalibration } from './overlay-model';

const clockwiseWith: DialConvention = { rotation: 'clockwise', counting: 'withRotation', zeroAtDeg: 0 };
const clockwiseAgainst: DialConvention = { rotation: 'clockwise', counting: 'againstRotation', zeroAtDeg: 0 };

describe('frames', () => {
  it('keeps a label margin of 15 % of the smaller side, between 28 and 84 px', () => {
    expect(labelMargin({ width: 240, height: 240 })).toBe(36);
    expect(labelMargin({ width: 100, height: 100 })).toBe(28);
    expect(labelMargin({ width: 1000, height: 800 })).toBe(84);
  });

  it('centres an uncalibrated rotor and leaves the margin around it', () => {
    const frame = fittedFrame({ width: 400, height: 300 }, 450);
    expect(frame.center).toEqual({ x: 200, y: 150 });
    expect(frame.radius).toBe(150 - 45);
    expect(frame.zeroAtDeg).toBe(90);
  });

  it('takes centre, radius and zero from the three calibration points', () => {
    const size = { width: 400, height: 300 };
    const calibration: PhotoCalibration = {
      centre: { x: 0.5, y: 0.5 },
      rim: { x: 0.5, y: 0.9 },
      referenceMark: { x: 0.75, y: 0.5 },
    };
    const frame = frameFromCalibration(calibration, size);
    expect(frame.center).toEqual({ x: 200, y: 150 });
    expect(frame.radius).toBeCloseTo(120, 9);
    expect(frame.zeroAtDeg).toBeCloseTo(90, 9);
    const zeroOnScreen = pointAtAngle(frame.center, frame.radius, 0, {
      ...clockwiseWith,
      zeroAtDeg: frame.zeroAtDeg,
    });
    expect(screenAngleOfPoint(frame.center, zeroOnScreen)).toBeCloseTo(
      screenAngleOfPoint(frame.center, photoToStage(calibration.referenceMark, size)),
      9,
    );
  });

  it('never gives a radius of zero when the rim handle sits on the centre', () => {
    const point = { x: 0.3, y: 0.3 };
    expect(
      frameFromCalibration({ centre: point, rim: point, referenceMark: point }, { width: 200, height: 200 })
        .radius,
    ).toBe(1);
  });

  it.each([
    [{ width: 400, height: 300 }, 0],
    [{ width: 240, height: 320 }, 135],
    [{ width: 600, height: 600 }, 270],
  ])('starts the handles on the fitted rotor (%o, zero at %i)', (size, zeroAtDeg) => {
    const fitted = fittedFrame(size, zeroAtDeg);
    const calibrated = frameFromCalibration(defaultCalibration(size, zeroAtDeg), size);
    expect(calibrated.center.x).toBeCloseTo(fitted.center.x, 9);
    expect(calibrated.center.y).toBeCloseTo(fitted.center.y, 9);
    expect(calibrated.radius).toBeCloseTo(fitted.radius, 6);
    expect(calibrated.zeroAtDeg).toBeCloseTo(fitted.zeroAtDeg, 6);
  });
});

describe('calibration handles', () => {
  const calibration: PhotoCalibration = {
    centre: { x: 0.5, y: 0.5 },
    rim: { x: 0.8, y: 0.5 },
    referenceMark: { x: 0.5, y: 0.2 },
  };

  it('moves one handle and leaves the others where they were', () => {
    const moved = nudgeHandle(calibration, 'rim', 0.05, -0.1);
    expect(moved.rim.x).toBeCloseTo(0.85, 12);
    expect(moved.rim.y).toBeCloseTo(0.4, 12);
    expect(moved.centre).toBe(calibration.centre);
    expect(moved.referenceMark).toBe(calibration.referenceMark);
  });

  it('keeps handles on the photo', () => {
    expect(nudgeHandle(calibration, 'rim', 0.5, 0).rim).toEqual({ x: 1, y: 0.5 });
    expect(withHandleAt(calibration, 'centre', { x: -0.2, y: 1.4 }).centre).toEqual({ x: 0, y: 1 });
    expect(stageToPhoto({ x: -5, y: 500 }, { width: 400, height: 300 })).toEqual({ x: 0, y: 1 });
    expect(
      stageToPhoto(photoToStage({ x: 0.25, y: 0.75 }, { width: 400, height: 300 }), {
        width: 400,
        height: 300,
      }),
    ).toEqual({
      x: 0.25,
      y: 0.75,
    });
  });
});

describe('sectors', () => {
  it('measures a sector the way angles increase, across zero too', () => {
    expect(sectorSweepDeg(20, 40)).toBe(20);
    expect(sectorSweepDeg(350, 10)).toBe(20);
    expect(sectorSweepDeg(40, 20)).toBe(340);
    expect(sectorSweepDeg(10, 10)).toBe(0);
    expect(sectorSweepDeg(0, 360)).toBe(360);
    expect(sectorMidDeg({ fromDeg: 350, toDeg: 10, label: 'weld' })).toBe(0);
  });

  it('finds the sector an angle lies in, ends included', () => {
    const weld = { fromDeg: 350, toDeg: 10, label: 'weld' };
    const holder = { fromDeg: 20, toDeg: 40, label: 'holder' };
    expect(isInSector(355, weld)).toBe(true);
    expect(isInSector(10, weld)).toBe(true);
    expect(isInSector(350, weld)).toBe(true);
    expect(isInSector(11, weld)).toBe(false);
    expect(sectorContaining(30, [weld, holder])).toBe(holder);
    expect(sectorContaining(45, [weld, holder])).toBeUndefined();
  });

  it('draws a ring sector clockwise on screen when angles grow clockwise', () => {
    expect(sectorPath({ x: 100, y: 100 }, 50, 100, 0, 90, clockwiseWith)).toBe(
      'M 100 0 A 100 100 0 0 1 200 100 L 150 100 A 50 50 0 0 0 100 50 Z',
    );
  });

  it('draws it counter-clockwise when angles are counted against a clockwise rotor', () => {
    expect(sectorPath({ x: 100, y: 100 }, 50, 100, 0, 90, clockwiseAgainst)).toBe(
      'M 100 0 A 100 100 0 0 0 0 100 L 50 100 A 50 50 0 0 1 100 50 Z',
    );
  });

  it('takes the large arc past half a turn, a wedge without inner radius, a ring for a full turn, nothing when the ends meet', () => {
    expect(sectorPath({ x: 100, y: 100 }, 50, 100, 0, 270, clockwiseWith)).toContain('A 100 100 0 1 1 0 100');
    expect(sectorPath({ x: 100, y: 100 }, 0, 100, 0, 90, clockwiseWith)).toBe(
      'M 100 0 A 100 100 0 0 1 200 100 L 100 100 Z',
    );
    expect(sectorPath({ x: 100, y: 100 }, 50, 100, 0, 360, clockwiseWith).match(/M /g)).toHaveLength(2);
    expect(sectorPath({ x: 100, y: 100 }, 50, 100, 30, 30, clockwiseWith)).toBe('');
  });
});
