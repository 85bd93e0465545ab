import { describe, expect, it } from 'vitest';
import { averageReadings } from './averaging';
import { EngineError } from './errors';

describe('averageReadings', () => {
  it('averages as vectors, not amplitudes', () => {
    const r = averageReadings({
      readings: [
        { amplitude: 1, phaseDeg: 0 },
        { amplitude: 1, phaseDeg: 90 },
      ],
    });
    expect(r.mean.amplitude).toBeCloseTo(Math.SQRT2 / 2, 12);
    expect(r.mean.phaseDeg).toBeCloseTo(45, 12);
    expect(r.spread).toBeCloseTo(Math.SQRT2 / 2, 12);
    expect(r.spreadRatio).toBeCloseTo(1, 12);
    expect(r.trusted).toBe(false);
    expect(r.warnings.join(' ')).toMatch(/read again/);
  });

  it('trusts steady readings', () => {
    const r = averageReadings({
      readings: [
        { amplitude: 0.5, phaseDeg: 120 },
        { amplitude: 0.52, phaseDeg: 122 },
        { amplitude: 0.49, phaseDeg: 118 },
      ],
    });
    expect(r.trusted).toBe(true);
    expect(r.mean.amplitude).toBeCloseTo(0.5, 1);
    expect(r.mean.phaseDeg).toBeCloseTo(120, 0);
  });

  it('handles phases either side of 0', () => {
    const r = averageReadings({
      readings: [
        { amplitude: 1, phaseDeg: 350 },
        { amplitude: 1, phaseDeg: 10 },
      ],
    });
    expect(r.mean.phaseDeg).toBeCloseTo(0, 9);
  });

  it('refuses an empty list and bad numbers', () => {
    expect(() => averageReadings({ readings: [] })).toThrowError(EngineError);
    expect(() =>
      averageReadings({ readings: [{ amplitude: Number.POSITIVE_INFINITY, phaseDeg: 0 }] }),
    ).toThrowError(/readings\[0\]\.amplitude/);
  });
});
