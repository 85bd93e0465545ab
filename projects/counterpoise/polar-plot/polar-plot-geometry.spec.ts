import { describe, expect, it } from 'vitest';
import { type DialConvention, _pointAtAngle as pointAtAngle } from '@counterpoise/ng/core';
import {
  addVectors,
  clampRingCount,
  dashOf,
  fixedRingScale,
  formatAmplitude,
  isDrawable,
  markerPath,
  niceRingScale,
  POLAR_SERIES_KINDS,
  type PolarSeries,
  quietestDirectionDeg,
  screenVector,
  segmentHitsBox,
  unitScales,
  vectorHead,
  vectorPath,
} from './polar-plot-geometry';

const clockwiseAgainst: DialConvention = { rotation: 'clockwise', counting: 'againstRotation', zeroAtDeg: 0 };
const frame = { center: { x: 100, y: 100 }, radius: 80, convention: clockwiseAgainst };

describe('niceRingScale', () => {
  it('rounds the outer ring up to a round step above the largest value', () => {
    expect(niceRingScale(0.31, 4)).toEqual({ max: 0.4, step: 0.1, rings: [0.1, 0.2, 0.3, 0.4] });
    expect(niceRingScale(0.41, 4)).toEqual({ max: 0.6, step: 0.15, rings: [0.15, 0.3, 0.45, 0.6] });
    expect(niceRingScale(7.3, 4).max).toBe(8);
    expect(niceRingScale(180, 4)).toEqual({ max: 200, step: 50, rings: [50, 100, 150, 200] });
    expect(niceRingScale(2.2, 5)).toEqual({ max: 2.5, step: 0.5, rings: [0.5, 1, 1.5, 2, 2.5] });
  });

  it('keeps a value that already sits on a round ring', () => {
    expect(niceRingScale(0.4, 4).max).toBe(0.4);
    expect(niceRingScale(1000, 4).max).toBe(1000);
  });

  it('never leaves the largest value outside, nor more than half as much again of empty rings', () => {
    for (let exponent = -3; exponent <= 3; exponent++) {
      for (let mantissa = 1; mantissa < 10; mantissa += 0.37) {
        const largest = mantissa * 10 ** exponent;
        for (const count of [3, 4, 5]) {
          const { max, rings } = niceRingScale(largest, count);
          expect(max).toBeGreaterThanOrEqual(largest * (1 - 1e-9));
          expect(max / largest).toBeLessThanOrEqual(1.5 + 1e-9);
          expect(rings).toHaveLength(count);
        }
      }
    }
  });

  it('gives rings up to 1 when there is nothing to show, and reads negatives by their size', () => {
    expect(niceRingScale(0, 4).max).toBe(1);
    expect(niceRingScale(Number.NaN, 4).max).toBe(1);
    expect(niceRingScale(-0.31, 4).max).toBe(0.4);
  });

  it('keeps the ring count between 1 and 12', () => {
    expect(clampRingCount(0)).toBe(1);
    expect(clampRingCount(40)).toBe(12);
    expect(clampRingCount(Number.NaN)).toBe(4);
    expect(niceRingScale(0.31, 0).rings).toEqual([0.4]);
  });
});

describe('fixedRingScale', () => {
  it('divides a given outer ring into equal steps without floating-point noise', () => {
    expect(fixedRingScale(0.3, 3)).toEqual({ max: 0.3, step: 0.1, rings: [0.1, 0.2, 0.3] });
    expect(fixedRingScale(-2, 4).max).toBe(1);
  });
});

describe('unitScales', () => {
  const series: PolarSeries[] = [
    {
      id: 'a',
      label: 'Sensor A',
      kind: 'reading',
      unit: 'in/s',
      points: [{ amplitude: 0.12, angleDeg: 30, from: { amplitude: 0.3, angleDeg: 30 } }],
    },
    { id: 'w', label: 'Trial weight', kind: 'weight', unit: 'g', points: [{ amplitude: 85, angleDeg: 0 }] },
    { id: 'b', label: 'Sensor B', kind: 'reading', unit: 'in/s', points: [{ amplitude: 0.2, angleDeg: 90 }] },
  ];

  it('gives each unit its own scale, first unit first, counting where vectors end', () => {
    const scales = unitScales(series, 4);
    expect(scales.map((s) => [s.unit, s.scale.max, s.primary])).toEqual([
      ['in/s', 0.6, true],
      ['g', 100, false],
    ]);
  });

  it('takes a given outer ring for the first unit only', () => {
    const scales = unitScales(series, 4, 1);
    expect(scales[0]?.scale.max).toBe(1);
    expect(scales[1]?.scale.max).toBe(100);
  });

  it('skips points that cannot be drawn', () => {
    const broken: PolarSeries[] = [
      { id: 'x', label: 'X', kind: 'run', unit: 'mm/s', points: [{ amplitude: Number.NaN, angleDeg: 0 }] },
    ];
    expect(isDrawable({ amplitude: 1, angleDeg: Number.POSITIVE_INFINITY })).toBe(false);
    expect(isDrawable({ amplitude: 1, angleDeg: 0, from: { amplitude: Number.NaN, angleDeg: 0 } })).toBe(
      false,
    );
    expect(unitScales(broken, 4)[0]?.scale.max).toBe(1);
  });
});

describe('vectors', () => {
  it('adds vectors given as amplitude and angle', () => {
    const sum = addVectors({ amplitude: 1, angleDeg: 0 }, { amplitude: 1, angleDeg: 90 });
    expect(sum.amplitude).toBeCloseTo(Math.SQRT2, 9);
    expect(sum.angleDeg).toBeCloseTo(45, 9);
    expect(addVectors({ amplitude: 0.3, angleDeg: 200 }, { amplitude: 0.3, angleDeg: 20 })).toEqual({
      amplitude: 0,
      angleDeg: 0,
    });
  });

  it('lands the head of a trial effect on the reading with the trial weight', () => {
    const initial = { amplitude: 0.42, angleDeg: 128 };
    const withTrial = { amplitude: 0.29, angleDeg: 196 };
    const effect = addVectors(withTrial, { amplitude: initial.amplitude, angleDeg: initial.angleDeg + 180 });
    const head = vectorHead({ ...effect, from: initial });
    expect(head.amplitude).toBeCloseTo(withTrial.amplitude, 9);
    expect(head.angleDeg).toBeCloseTo(withTrial.angleDeg, 9);
    expect(vectorHead({ amplitude: 0.2, angleDeg: 15 })).toEqual({ amplitude: 0.2, angleDeg: 15 });
  });

  it('draws a vector from the origin to where the shared dial geometry puts its angle', () => {
    const vector = screenVector({ amplitude: 0.2, angleDeg: 90 }, 0.4, frame);
    const expected = pointAtAngle(frame.center, 40, 90, clockwiseAgainst);
    expect(vector.tail).toEqual(frame.center);
    expect(vector.head.x).toBeCloseTo(expected.x, 9);
    expect(vector.head.y).toBeCloseTo(expected.y, 9);
    // Against a clockwise rotor, 90 degrees sits at 9 o'clock: the vector points left.
    expect(vector.head.x).toBeCloseTo(60, 9);
    expect(vector.directionDeg).toBeCloseTo(270, 9);
    expect(vector.offScale).toBe(false);
    expect(vectorPath(vector)).toBe('M100 100L60 100');
  });

  it('draws an end beyond the outer ring on the ring, in its own direction, and says so', () => {
    const vector = screenVector({ amplitude: 0.9, angleDeg: 0 }, 0.4, frame);
    expect(vector.head.x).toBeCloseTo(100, 9);
    expect(vector.head.y).toBeCloseTo(20, 9);
    expect(vector.offScale).toBe(true);
  });

  it('starts a vector at its from point', () => {
    const vector = screenVector(
      { amplitude: 0.1, angleDeg: 180, from: { amplitude: 0.2, angleDeg: 0 } },
      0.4,
      frame,
    );
    expect(vector.tail.y).toBeCloseTo(60, 9);
    expect(vector.head.y).toBeCloseTo(80, 9);
    expect(vector.directionDeg).toBeCloseTo(180, 9);
  });
});

describe('markers and dashes', () => {
  it('tells every kind apart by its shape and line, without colour', () => {
    const looks = POLAR_SERIES_KINDS.map((kind) => {
      const shape = markerPath(kind, { x: 0, y: 0 }, 10)
        .replace(/-?\d+(\.\d+)?/g, '#')
        .replace(/\s+/g, '');
      return `${kind === 'residual' ? 'hollow' : 'filled'} ${shape} ${dashOf(kind)}`;
    });
    expect(new Set(looks).size).toBe(POLAR_SERIES_KINDS.length);
  });

  it('points the arrowhead of a trial effect along the vector', () => {
    const right = markerPath('trialEffect', { x: 50, y: 50 }, 10, 90);
    expect(right.startsWith('M55.5 50')).toBe(true);
    const up = markerPath('trialEffect', { x: 50, y: 50 }, 10, 0);
    expect(up.startsWith('M50 44.5')).toBe(true);
  });
});

describe('ring labels', () => {
  it('tells whether a vector crosses a label box', () => {
    const box = { x: 10, y: 10, width: 20, height: 10 };
    expect(segmentHitsBox({ x: 0, y: 0 }, { x: 40, y: 40 }, box)).toBe(true);
    expect(segmentHitsBox({ x: 0, y: 15 }, { x: 5, y: 15 }, box)).toBe(false);
    expect(segmentHitsBox({ x: 15, y: 12 }, { x: 16, y: 13 }, box)).toBe(true);
    expect(segmentHitsBox({ x: 0, y: 30 }, { x: 40, y: 30 }, box)).toBe(false);
    expect(segmentHitsBox({ x: 20, y: 0 }, { x: 20, y: 5 }, box)).toBe(false);
  });

  it('puts ring labels where the data leaves the most room', () => {
    expect(quietestDirectionDeg([])).toBe(15);
    expect(quietestDirectionDeg([10, 20])).toBe(195);
    expect(quietestDirectionDeg([190, 170], [15, 165, 195, 345])).toBe(15);
  });
});

describe('formatting', () => {
  it('gives amplitudes three significant figures and whole numbers from 100 up', () => {
    expect(formatAmplitude(0.3149)).toBe('0.315');
    expect(formatAmplitude(0.1 + 0.2)).toBe('0.3');
    expect(formatAmplitude(12.34)).toBe('12.3');
    expect(formatAmplitude(148.6)).toBe('149');
    expect(formatAmplitude(0)).toBe('0');
  });
});
