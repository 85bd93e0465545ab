import { describe, expect, it } from 'vitest';
import { averageAmplitudes, averageReadings } from './averaging';
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

describe('averageAmplitudes', () => {
  it('takes the plain mean and the RMS distance from it', () => {
    // Mean (0.4 + 0.5 + 0.6) / 3 = 0.5; spread sqrt((0.01 + 0 + 0.01) / 3) = 0.0816…; ratio 16 %.
    const result = averageAmplitudes({ amplitudes: [0.4, 0.5, 0.6] });
    expect(result.mean).toBeCloseTo(0.5, 12);
    expect(result.spread).toBeCloseTo(Math.sqrt(0.02 / 3), 12);
    expect(result.spreadRatio).toBeCloseTo(Math.sqrt(0.02 / 3) / 0.5, 12);
    expect(result.trusted).toBe(true);
    expect(result.warnings).toEqual([]);
  });

  it('warns when the amplitudes disagree, naming the farthest', () => {
    const result = averageAmplitudes({ amplitudes: [0.5, 0.5, 0.9] });
    expect(result.trusted).toBe(false);
    expect(result.farthestIndex).toBe(2);
    expect(result.warnings.join(' ')).toMatch(/spread by 30 % of their average \(limit 20 %\).*reading 3/);
  });

  it('says one reading cannot show a spread, and refuses none or a negative amplitude', () => {
    expect(averageAmplitudes({ amplitudes: [0.3] }).warnings[0]).toMatch(/Only one reading/);
    expect(() => averageAmplitudes({ amplitudes: [] })).toThrow(EngineError);
    expect(() => averageAmplitudes({ amplitudes: [0.3, -0.1] })).toThrow(EngineError);
  });
});
