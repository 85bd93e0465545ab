import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { degreesText, formatAngle } from './angle-format';

describe('formatAngle', () => {
  it('rounds to the decimals asked for and drops trailing zeros', () => {
    expect(formatAngle(123.456)).toBe('123.5');
    expect(formatAngle(123.456, 0)).toBe('123');
    expect(formatAngle(123.456, 2)).toBe('123.46');
    expect(formatAngle(90)).toBe('90');
    expect(formatAngle(12.5, 0)).toBe('13');
  });

  it('brings every angle into [0, 360) after rounding, so 359.96 is 0 and never 360', () => {
    expect(formatAngle(359.96)).toBe('0');
    expect(formatAngle(359.6, 0)).toBe('0');
    expect(formatAngle(360)).toBe('0');
    expect(formatAngle(-90)).toBe('270');
    expect(formatAngle(-0.04)).toBe('0');
    expect(formatAngle(725.25, 1)).toBe('5.3');
  });

  it('writes a dash for a value that is not a finite number', () => {
    expect(formatAngle(Number.NaN)).toBe('–');
    expect(degreesText(Number.POSITIVE_INFINITY)).toBe('–');
  });

  it('always gives a number in [0, 360) with at most the decimals asked for', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.constantFrom(0 as const, 1 as const, 2 as const),
        (angle, decimals) => {
          const text = formatAngle(angle, decimals);
          const value = Number(text);
          expect(value).toBeGreaterThanOrEqual(0);
          expect(value).toBeLessThan(360);
          expect(text.split('.')[1]?.length ?? 0).toBeLessThanOrEqual(decimals);
        },
      ),
    );
  });

  it('adds the degree sign', () => {
    expect(degreesText(45)).toBe('45°');
    expect(degreesText(44.96, 0)).toBe('45°');
  });
});
