import { describe, expect, it } from 'vitest';
import { type PolarSeries } from './polar-plot-geometry';
import { conventionText, describePoint, focusTarget, plottedPoints } from './polar-plot-model';
import { SENSOR_A_RUNS, WEIGHTS } from './polar-plot.fixtures';

/** Sensor A's runs of the fixture job, with a run that could not be read. */
const sensorA: PolarSeries = {
  ...SENSOR_A_RUNS,
  points: [...SENSOR_A_RUNS.points, { amplitude: Number.NaN, angleDeg: 0, label: 'Unread' }],
};
// Not the fixture's trial effect: an angle to two decimals, so the description's rounding shows.
const trialEffect: PolarSeries = {
  id: 't',
  label: 'Trial effect',
  kind: 'trialEffect',
  unit: 'in/s',
  points: [{ amplitude: 0.25, angleDeg: 75.04, from: { amplitude: 0.42, angleDeg: 128 } }],
};
const weights = WEIGHTS;
const points = plottedPoints([sensorA, trialEffect, weights]);

describe('plottedPoints', () => {
  it('orders points by series, then within a series, and skips those that cannot be drawn', () => {
    expect(points.map((p) => [p.index, p.seriesIndex, p.pointIndex])).toEqual([
      [0, 0, 0],
      [1, 0, 1],
      [2, 0, 2],
      [3, 1, 0],
      [4, 2, 0],
      [5, 2, 1],
      [6, 2, 2],
    ]);
  });
});

describe('describePoint', () => {
  it('names the point and its series, then amplitude with unit and angle', () => {
    expect(describePoint(sensorA, sensorA.points[1]!)).toBe('Run 2, Sensor A: 0.29 in/s at 196 degrees');
  });

  it('says where a vector starts when it does not start at the origin', () => {
    expect(describePoint(trialEffect, trialEffect.points[0]!)).toBe(
      'Trial effect: 0.25 in/s at 75 degrees, from 0.42 in/s at 128 degrees',
    );
  });

  it('says when a point lies beyond the outer ring', () => {
    expect(describePoint(weights, weights.points[1]!, true)).toBe(
      'Ideal, Weights: 61 g at 41 degrees, beyond the outer ring',
    );
  });
});

describe('conventionText', () => {
  it('says which way the rotor turns and how angles are counted', () => {
    expect(conventionText('counterClockwise', 'withRotation')).toBe(
      'Rotor turns counter-clockwise in this view; angles are counted with rotation from the reference mark (0°).',
    );
  });
});

describe('focusTarget', () => {
  it('steps with the arrows and wraps round at both ends', () => {
    expect(focusTarget('ArrowRight', 0, points)).toBe(1);
    expect(focusTarget('ArrowDown', 6, points)).toBe(0);
    expect(focusTarget('ArrowLeft', 0, points)).toBe(6);
    expect(focusTarget('ArrowUp', 3, points)).toBe(2);
  });

  it('jumps to the ends with Home and End', () => {
    expect(focusTarget('Home', 3, points)).toBe(0);
    expect(focusTarget('End', 1, points)).toBe(6);
  });

  it('jumps between series with the Page keys', () => {
    expect(focusTarget('PageDown', 1, points)).toBe(3);
    expect(focusTarget('PageDown', 3, points)).toBe(4);
    expect(focusTarget('PageDown', 6, points)).toBe(0);
    expect(focusTarget('PageUp', 6, points)).toBe(3);
    expect(focusTarget('PageUp', 1, points)).toBe(4);
  });

  it('leaves other keys, and a plot without points, alone', () => {
    expect(focusTarget('Enter', 1, points)).toBeNull();
    expect(focusTarget('a', 1, points)).toBeNull();
    expect(focusTarget('ArrowRight', 0, [])).toBeNull();
  });
});
