import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  conventionFromOppositeEnd,
  convertAngle,
  convertReadingPhase,
  convertWeight,
  countingSeen,
  type AngleConvention,
} from './conventions';
import { EngineError } from './errors';

const against: AngleConvention = { rotation: 'clockwise', counting: 'againstRotation' };
const withRot: AngleConvention = { rotation: 'clockwise', counting: 'withRotation' };

describe('angle conventions', () => {
  it('counting with rotation is the mirror of counting against it', () => {
    expect(convertAngle(30, against, withRot)).toBeCloseTo(330, 12);
    expect(convertAngle(0, against, withRot)).toBe(0);
  });

  it('clockwise counting on a clockwise rotor is counting with rotation', () => {
    expect(convertAngle(40, { rotation: 'clockwise', counting: 'clockwise' }, withRot)).toBeCloseTo(40, 12);
    expect(countingSeen({ rotation: 'clockwise', counting: 'againstRotation' })).toBe('counterClockwise');
  });

  it('a rotor turning clockwise from one end turns counter-clockwise from the other (common practice)', () => {
    const left: AngleConvention = { rotation: 'clockwise', counting: 'clockwise' };
    const right = conventionFromOppositeEnd(left);
    expect(right).toEqual({ rotation: 'counterClockwise', counting: 'counterClockwise' });
    // The same physical position keeps its number when both sides count with rotation.
    expect(convertAngle(75, left, right)).toBeCloseTo(75, 12);
    expect(convertAngle(75, left, { rotation: 'counterClockwise', counting: 'clockwise' })).toBeCloseTo(
      285,
      12,
    );
  });

  it('round-trips between any two conventions (property)', () => {
    const conv = fc.record({
      rotation: fc.constantFrom('clockwise' as const, 'counterClockwise' as const),
      counting: fc.constantFrom(
        'withRotation' as const,
        'againstRotation' as const,
        'clockwise' as const,
        'counterClockwise' as const,
      ),
    });
    fc.assert(
      fc.property(fc.double({ min: 0, max: 359.999, noNaN: true }), conv, conv, (a, c1, c2) => {
        const back = convertAngle(convertAngle(a, c1, c2), c2, c1);
        expect(Math.abs(((back - a + 540) % 360) - 180)).toBeLessThan(1e-9);
      }),
    );
  });

  it('converts weights and reading phases', () => {
    expect(convertWeight({ mass: 5, angleDeg: 10 }, against, withRot)).toEqual({ mass: 5, angleDeg: 350 });
    expect(convertReadingPhase({ amplitude: 2, phaseDeg: 30 }, 'lag', 'lead').phaseDeg).toBeCloseTo(330, 12);
    expect(convertReadingPhase({ amplitude: 2, phaseDeg: 30 }, 'lag', 'lag').phaseDeg).toBeCloseTo(30, 12);
  });

  it('refuses an incomplete convention', () => {
    expect(() => convertAngle(1, { rotation: 'up' } as unknown as AngleConvention, against)).toThrowError(
      EngineError,
    );
    expect(() => convertAngle(Number.NaN, against, against)).toThrowError(EngineError);
  });
});
