import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { EngineError } from './errors';
import { DEFAULT_MAX_SPEED_DRIFT_RATIO, speedDrift } from './run-checks';

describe('speedDrift', () => {
  it('accepts runs at one speed', () => {
    const result = speedDrift({ speedsRpm: [2150, 2150, 2150] });
    expect(result.driftRatio).toBe(0);
    expect(result.withinLimit).toBe(true);
    expect(result.warnings).toEqual([]);
  });

  it('measures the drift from the first run and names the farthest', () => {
    const result = speedDrift({ speedsRpm: [2000, 2010, 2100, 1990] });
    expect(result.referenceSpeedRpm).toBe(2000);
    expect(result.driftRatio).toBeCloseTo(0.05, 12);
    expect(result.farthestIndex).toBe(2);
    expect(result.minSpeedRpm).toBe(1990);
    expect(result.maxSpeedRpm).toBe(2100);
    expect(result.withinLimit).toBe(false);
    expect(result.warnings.join(' ')).toMatch(/reading 3 at 2100 rpm/);
  });

  it('compares with a given reference and limit', () => {
    const result = speedDrift({ speedsRpm: [2150, 2190], referenceSpeedRpm: 2200, maxDriftRatio: 0.03 });
    expect(result.driftRatio).toBeCloseTo(50 / 2200, 12);
    expect(result.withinLimit).toBe(true);
  });

  it('holds the product default of 2 % at its boundary', () => {
    expect(DEFAULT_MAX_SPEED_DRIFT_RATIO).toBe(0.02);
    expect(speedDrift({ speedsRpm: [1000, 1020] }).withinLimit).toBe(true);
    expect(speedDrift({ speedsRpm: [1000, 1021] }).withinLimit).toBe(false);
  });

  it('does not depend on the order of the later runs', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 100, max: 5000, noNaN: true }),
        fc.array(fc.double({ min: 100, max: 5000, noNaN: true }), { minLength: 1, maxLength: 8 }),
        (first, rest) => {
          const forward = speedDrift({ speedsRpm: [first, ...rest] });
          const backward = speedDrift({ speedsRpm: [first, ...[...rest].reverse()] });
          expect(backward.driftRatio).toBeCloseTo(forward.driftRatio, 12);
          expect(forward.driftRatio).toBeGreaterThanOrEqual(0);
        },
      ),
    );
  });

  it('refuses no speeds, a zero speed and a bad limit with the field at fault', () => {
    expect(() => speedDrift({ speedsRpm: [] })).toThrow(EngineError);
    expect(() => speedDrift({ speedsRpm: [2000, 0] })).toThrow(/speedsRpm\[1\]/);
    expect(() => speedDrift({ speedsRpm: [2000], maxDriftRatio: 0 })).toThrow(/maxDriftRatio/);
  });
});
