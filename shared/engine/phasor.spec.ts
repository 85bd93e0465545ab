import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  add,
  angleDegOf,
  angleDifferenceDeg,
  divide,
  magnitude,
  multiply,
  normalizeAngleDeg,
  phasor,
  phasorToReading,
  rotate,
  rotateReading,
  scale,
  subtract,
  subtractReadings,
  validateReading,
} from './phasor';
import { EngineError } from './errors';

describe('phasor arithmetic', () => {
  it('normalises angles into [0, 360)', () => {
    expect(normalizeAngleDeg(-90)).toBe(270);
    expect(normalizeAngleDeg(720)).toBe(0);
    expect(normalizeAngleDeg(359.9999999999999)).toBe(0);
    expect(angleDifferenceDeg(350, 10)).toBeCloseTo(20, 12);
    expect(angleDifferenceDeg(10, 350)).toBeCloseTo(-20, 12);
  });

  it('adds, subtracts, scales and rotates', () => {
    const a = phasor(2, 90);
    const b = phasor(2, 0);
    expect(magnitude(add(a, b))).toBeCloseTo(2 * Math.SQRT2, 12);
    expect(angleDegOf(add(a, b))).toBeCloseTo(45, 12);
    expect(phasorToReading(subtract(a, b)).phaseDeg).toBeCloseTo(135, 12);
    expect(magnitude(scale(a, 3))).toBeCloseTo(6, 12);
    expect(angleDegOf(rotate(b, 30))).toBeCloseTo(30, 12);
    expect(rotateReading({ amplitude: 1, phaseDeg: 350 }, 20).phaseDeg).toBeCloseTo(10, 12);
    expect(subtractReadings({ amplitude: 1, phaseDeg: 0 }, { amplitude: 1, phaseDeg: 0 }).amplitude).toBe(0);
  });

  it('division undoes multiplication (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 1e3, noNaN: true }),
        fc.double({ min: -720, max: 720, noNaN: true }),
        fc.double({ min: 0.01, max: 1e3, noNaN: true }),
        fc.double({ min: -720, max: 720, noNaN: true }),
        (a1, p1, a2, p2) => {
          const x = phasor(a1, p1);
          const y = phasor(a2, p2);
          const back = divide(multiply(x, y), y);
          expect(magnitude(subtract(back, x))).toBeLessThan(1e-9 * a1);
        },
      ),
    );
  });

  it('rejects NaN, infinity and negative amplitudes with the field named', () => {
    expect(() => validateReading({ amplitude: Number.NaN, phaseDeg: 0 }, 'initial')).toThrowError(
      EngineError,
    );
    try {
      validateReading({ amplitude: -1, phaseDeg: 0 }, 'initial');
    } catch (e) {
      expect((e as EngineError).code).toBe('NEGATIVE_VALUE');
      expect((e as EngineError).field).toBe('initial.amplitude');
    }
    expect(() => validateReading({ amplitude: 1, phaseDeg: Infinity }, 'x')).toThrowError(/finite/);
    expect(() => divide(phasor(1, 0), phasor(0, 0))).toThrowError(EngineError);
  });
});
