import { describe, expect, it } from 'vitest';
import { type DialConvention, pointAtAngle, screenAngleOfPoint } from '@counterpoise/ng/core';
import {
  type Box,
  type LabelRequest,
  boxAtDistance,
  defaultCalibration,
  estimateLabelWidth,
  fittedFrame,
  frameFromCalibration,
  isInSector,
  labelMargin,
  nudgeHandle,
  overlapArea,
  photoToStage,
  placeLabels,
  quietestScreenAngle,
  rotationArrow,
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

function inside(box: Box, size: { width: number; height: number }): boolean {
  return box.x >= 0 && box.y >= 0 && box.x + box.width <= size.width && box.y + box.height <= size.height;
}

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

describe('rotation arrow', () => {
  it('points the way the rotor turns', () => {
    const center = { x: 0, y: 0 };
    const tipAngle = (rotation: 'clockwise' | 'counterClockwise') => {
      const [x, y] = rotationArrow(center, 100, 90, 40, rotation).head.split(' ')[0]!.split(',').map(Number);
      return screenAngleOfPoint(center, { x: x!, y: y! });
    };
    expect(tipAngle('clockwise')).toBeGreaterThan(110);
    expect(tipAngle('counterClockwise')).toBeLessThan(70);
    expect(rotationArrow(center, 100, 90, 40, 'clockwise').path).toMatch(
      /^M 93\.97 -34\.2 A 100 100 0 0 1 93\.97 34\.2$/,
    );
  });

  it('goes where the rim is emptiest, preferring the given angle on a tie', () => {
    expect(quietestScreenAngle([0, 90, 180])).toBe(270);
    expect(quietestScreenAngle([0, 180])).toBe(90);
    expect(quietestScreenAngle([], 120)).toBe(120);
    expect(quietestScreenAngle([350, 10, 20], 0)).toBe(185);
  });
});

describe('label placement', () => {
  const size = { width: 360, height: 360 };
  const frame = fittedFrame(size, 0);
  const request = (key: string, screenDeg: number, extra: Partial<LabelRequest> = {}): LabelRequest => ({
    key,
    screenDeg,
    anchorRadius: frame.radius,
    width: estimateLabelWidth('84 g at 100°', 15, 6),
    height: 26,
    ...extra,
  });

  it('puts a lone label just outside the rim in the direction of its element', () => {
    const [label] = placeLabels([request('a', 0)], frame, size);
    expect(label!.box.y + label!.box.height).toBeCloseTo(frame.center.y - frame.radius - 6, 6);
    expect(label!.box.x + label!.box.width / 2).toBeCloseTo(frame.center.x, 6);
    expect(label!.leader).toBeNull();
  });

  it('finds a box whose near edge is at the distance asked, whatever the direction', () => {
    const up = boxAtDistance({ x: 0, y: 0 }, 0, 50, 40, 20, 'outside');
    expect(up.y + up.height).toBeCloseTo(-50, 9);
    const right = boxAtDistance({ x: 0, y: 0 }, 90, 50, 40, 20, 'inside');
    expect(right.x + right.width).toBeCloseTo(50, 9);
  });

  it('keeps a crowd of labels at one angle apart from each other and on the stage', () => {
    const crowd = Array.from({ length: 6 }, (_, i) => request(`w${i}`, 100 + i));
    const placed = placeLabels(crowd, frame, size);
    expect(placed).toHaveLength(6);
    for (const [i, a] of placed.entries()) {
      expect(inside(a.box, size)).toBe(true);
      for (const b of placed.slice(i + 1)) expect(overlapArea(a.box, b.box)).toBe(0);
    }
    expect(placed.some((label) => label.leader !== null)).toBe(true);
  });

  it('keeps labels off obstacles and inside a narrow stage', () => {
    const narrow = { width: 240, height: 240 };
    const small = fittedFrame(narrow, 0);
    const obstacle = {
      key: 'other',
      ...boxAtDistance(small.center, 90, small.radius + 6, 40, 26, 'outside'),
    };
    const [label] = placeLabels(
      [{ key: 'a', screenDeg: 90, anchorRadius: small.radius, width: 110, height: 26 }],
      small,
      narrow,
      [obstacle],
    );
    expect(inside(label!.box, narrow)).toBe(true);
    expect(overlapArea(label!.box, obstacle)).toBe(0);
  });

  it('weighs covering an obstacle against moving away: a faint one is covered, a solid one avoided', () => {
    const ideal = boxAtDistance(frame.center, 0, frame.radius + 6, 60, 20, 'outside');
    const label = request('a', 0, { width: 60, height: 20 });
    const [overFaint] = placeLabels([label], frame, size, [{ ...ideal, weight: 0.0005 }]);
    const [clearOfSolid] = placeLabels([label], frame, size, [ideal]);
    expect(overFaint!.box.x).toBeCloseTo(ideal.x, 6);
    expect(overFaint!.box.y).toBeCloseTo(ideal.y, 6);
    expect(overlapArea(clearOfSolid!.box, ideal)).toBe(0);
  });

  it('leaves out an optional label that has no free spot, never a required one', () => {
    const tiny = { width: 100, height: 40 };
    const tight = fittedFrame(tiny, 0);
    const big = (key: string, optional: boolean): LabelRequest => ({
      key,
      screenDeg: 0,
      anchorRadius: tight.radius,
      width: 90,
      height: 30,
      optional,
    });
    expect(placeLabels([big('a', false), big('b', true)], tight, tiny).map((l) => l.key)).toEqual(['a']);
    expect(placeLabels([big('a', false), big('b', false)], tight, tiny).map((l) => l.key)).toEqual([
      'a',
      'b',
    ]);
  });

  it('measures overlaps and estimates widths', () => {
    expect(overlapArea({ x: 0, y: 0, width: 10, height: 10 }, { x: 5, y: 5, width: 10, height: 10 })).toBe(
      25,
    );
    expect(overlapArea({ x: 0, y: 0, width: 10, height: 10 }, { x: 10, y: 0, width: 10, height: 10 })).toBe(
      0,
    );
    expect(estimateLabelWidth('Heavy spot', 12, 6)).toBe(84);
  });
});
