import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { EngineError } from './errors';
import { fourRunBalance } from './four-run';
import { add, angleDifferenceDeg, magnitude, multiply, phasor } from './phasor';

const amp = fc.double({ min: 0.5, max: 20, noNaN: true });
const ang = fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true });

function runsFor(o: number, op: number, ha: number, hp: number, trialMass: number, angles: number[]) {
  const O = phasor(o, op);
  const H = phasor(ha, hp);
  return {
    O,
    H,
    runs: angles.map((a) => ({
      angleDeg: a,
      amplitude: magnitude(add(O, multiply(H, phasor(trialMass, a)))),
    })),
  };
}

describe('fourRunBalance', () => {
  it('recovers the correction that cancels the modelled vibration (property)', () => {
    fc.assert(
      fc.property(
        amp,
        ang,
        fc.double({ min: 0.05, max: 2, noNaN: true }),
        ang,
        ang,
        (o, op, ha, hp, start) => {
          const trialMass = (0.6 * o) / ha;
          const m = runsFor(o, op, ha, hp, trialMass, [start, start + 120, start + 240]);
          const r = fourRunBalance({ initialAmplitude: o, trialMass, trialRuns: m.runs });
          const left = add(m.O, multiply(m.H, phasor(r.correction.mass, r.correction.angleDeg)));
          expect(magnitude(left) / o).toBeLessThan(1e-7);
          expect(r.consistency).toBeLessThan(1e-7);
        },
      ),
    );
  });

  it('rotating the trial positions by t rotates the correction by t; scaling amplitudes keeps the mass', () => {
    const m = runsFor(5, 40, 0.5, 70, 4, [0, 120, 240]);
    const a = fourRunBalance({ initialAmplitude: 5, trialMass: 4, trialRuns: m.runs });
    const b = fourRunBalance({
      initialAmplitude: 5,
      trialMass: 4,
      trialRuns: m.runs.map((r) => ({ ...r, angleDeg: r.angleDeg + 33 })),
    });
    expect(Math.abs(angleDifferenceDeg(a.correction.angleDeg + 33, b.correction.angleDeg))).toBeLessThan(
      1e-6,
    );
    const c = fourRunBalance({
      initialAmplitude: 10,
      trialMass: 4,
      trialRuns: m.runs.map((r) => ({ ...r, amplitude: r.amplitude * 2 })),
    });
    expect(c.correction.mass).toBeCloseTo(a.correction.mass, 6);
    expect(a.correction.mass).toBeCloseTo(10, 6);
    expect(a.correction.angleDeg).toBeCloseTo(150, 6);
  });

  it('uses more than three runs by least squares and reports inconsistent data', () => {
    const m = runsFor(5, 40, 0.5, 70, 4, [0, 90, 180, 270]);
    const noisy = m.runs.map((r, i) => ({ ...r, amplitude: r.amplitude * (i % 2 === 0 ? 1.02 : 0.98) }));
    const r = fourRunBalance({ initialAmplitude: 5, trialMass: 4, trialRuns: noisy });
    expect(r.consistency).toBeGreaterThan(0.001);
    expect(r.correction.mass).toBeCloseTo(10, 0);
    const bad = fourRunBalance({
      initialAmplitude: 5,
      trialMass: 4,
      trialRuns: [
        { angleDeg: 0, amplitude: 1 },
        { angleDeg: 120, amplitude: 12 },
        { angleDeg: 240, amplitude: 2 },
      ],
    });
    expect(bad.warnings.join(' ')).toMatch(/do not agree/);
  });

  it('refuses fewer than three runs, repeated positions, no trial effect and NaN', () => {
    expect(() =>
      fourRunBalance({
        initialAmplitude: 5,
        trialMass: 4,
        trialRuns: [
          { angleDeg: 0, amplitude: 6 },
          { angleDeg: 120, amplitude: 4 },
        ],
      }),
    ).toThrowError(/three positions/);
    expect(() =>
      fourRunBalance({
        initialAmplitude: 5,
        trialMass: 4,
        trialRuns: [
          { angleDeg: 0, amplitude: 6 },
          { angleDeg: 0, amplitude: 4 },
          { angleDeg: 240, amplitude: 4 },
        ],
      }),
    ).toThrowError(EngineError);
    try {
      fourRunBalance({
        initialAmplitude: 5,
        trialMass: 4,
        trialRuns: [
          { angleDeg: 0, amplitude: 5 },
          { angleDeg: 120, amplitude: 5 },
          { angleDeg: 240, amplitude: 5 },
        ],
      });
      expect.unreachable();
    } catch (e) {
      expect((e as EngineError).code).toBe('ZERO_TRIAL_EFFECT');
    }
    try {
      fourRunBalance({
        initialAmplitude: 5,
        trialMass: 4,
        trialRuns: [
          { angleDeg: 0, amplitude: 6 },
          { angleDeg: 120, amplitude: Number.NaN },
          { angleDeg: 240, amplitude: 4 },
        ],
      });
    } catch (e) {
      expect((e as EngineError).field).toBe('trialRuns[1].amplitude');
    }
    expect(() => fourRunBalance({ initialAmplitude: 5, trialMass: -4, trialRuns: [] })).toThrowError(
      /negative/,
    );
  });
});
