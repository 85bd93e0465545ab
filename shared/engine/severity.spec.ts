import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { EngineError } from './errors';
import { convertVibration, severityZone, VIBRATION_UNITS, vibrationSeverity } from './severity';

describe('vibration units', () => {
  it('converts peak, RMS and peak-to-peak of one quantity', () => {
    expect(convertVibration(1, 'in/s-pk', 'mm/s-pk')).toBeCloseTo(25.4, 12);
    expect(convertVibration(1, 'mm/s-rms', 'mm/s-pk')).toBeCloseTo(Math.SQRT2, 12);
    expect(convertVibration(1, 'g-pk', 'm/s2-pk')).toBeCloseTo(9.80665, 12);
  });

  it('converts between displacement, velocity and acceleration at a frequency', () => {
    expect(convertVibration(1, 'um-pp', 'mm/s-pk', 10)).toBeCloseTo(2 * Math.PI * 10 * 0.5e-3, 12);
    expect(convertVibration(1, 'mm/s-pk', 'm/s2-pk', 50)).toBeCloseTo(2 * Math.PI * 50 * 1e-3, 12);
    expect(() => convertVibration(1, 'mil-pp', 'in/s-pk')).toThrowError(/frequencyHz/);
  });

  it('round-trips every pair of units (property)', () => {
    const unit = fc.constantFrom(...VIBRATION_UNITS);
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 1e3, noNaN: true }),
        unit,
        unit,
        fc.double({ min: 1, max: 1000, noNaN: true }),
        (v, a, b, f) => {
          expect(convertVibration(convertVibration(v, a, b, f), b, a, f) / v).toBeCloseTo(1, 10);
        },
      ),
    );
  });
});

describe('vibrationSeverity', () => {
  it('gives every unit, the zone and the shop acceptance', () => {
    const r = vibrationSeverity({
      value: 0.12,
      unit: 'in/s-pk',
      speedRpm: 2000,
      machineGroup: 2,
      foundation: 'rigid',
      acceptance: { value: 0.15, unit: 'in/s-pk' },
    });
    expect(Object.keys(r.conversions)).toHaveLength(10);
    expect(r.zone).toBe('B');
    expect(r.acceptable).toBe(true);
    expect(
      vibrationSeverity({ value: 0.2, unit: 'in/s-pk', acceptance: { value: 0.15, unit: 'in/s-pk' } })
        .acceptable,
    ).toBe(false);
    expect(
      vibrationSeverity({ value: 4.0, unit: 'mm/s-rms', acceptance: { value: 0.15, unit: 'in/s-pk' } })
        .acceptable,
    ).toBe(false);
  });

  it('places zone boundaries as stated', () => {
    expect(severityZone(2.3, 1, 'rigid')).toBe('A');
    expect(severityZone(2.31, 1, 'rigid')).toBe('B');
    expect(severityZone(11.01, 1, 'flexible')).toBe('D');
    expect(severityZone(3.0, 2, 'rigid')).toBe('C');
  });

  it('refuses unknown units and negative values', () => {
    expect(() => vibrationSeverity({ value: 1, unit: 'ips' as never })).toThrowError(EngineError);
    expect(() => vibrationSeverity({ value: -1, unit: 'mm/s-rms' })).toThrowError(/negative/);
    expect(() =>
      vibrationSeverity({ value: 1, unit: 'mm/s-rms', machineGroup: 3 as never, foundation: 'rigid' }),
    ).toThrowError(EngineError);
  });
});
