import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { EngineError } from './errors';
import { add, angleDifferenceDeg, magnitude, multiply, phasor, phasorToReading, subtract } from './phasor';
import {
  oneRunCorrection,
  sensitivityFromInfluenceCoefficient,
  singlePlaneBalance,
  trimRun,
} from './single-plane';

const amp = fc.double({ min: 0.05, max: 50, noNaN: true });
const ang = fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true });

/** A modelled rotor: initial vibration O, coefficient H; a weight U adds H U. */
function model(o: { a: number; p: number }, h: { a: number; p: number }) {
  const O = phasor(o.a, o.p);
  const H = phasor(h.a, h.p);
  const read = (mass: number, angleDeg: number) =>
    phasorToReading(add(O, multiply(H, phasor(mass, angleDeg))));
  return { O, H, read };
}

describe('oneRunCorrection', () => {
  it('puts the weight 180 degrees from the heavy spot when the offset is 0 (common practice)', () => {
    const r = oneRunCorrection({
      reading: { amplitude: 0.4, phaseDeg: 70 },
      sensitivity: { massPerAmplitude: 200 },
    });
    expect(r.heavySpotDeg).toBeCloseTo(70, 12);
    expect(r.correction.angleDeg).toBeCloseTo(250, 12);
  });

  it('applies a rule of thumb of 200 g per in/s as data (common practice)', () => {
    const r = oneRunCorrection({
      reading: { amplitude: 0.35, phaseDeg: 300 },
      sensitivity: { massPerAmplitude: 200 },
    });
    expect(r.correction.mass).toBeCloseTo(70, 12);
    expect(r.correction.angleDeg).toBeCloseTo(120, 12);
  });

  it('shifts by the offset and mirrors for angles counted with rotation', () => {
    const r = oneRunCorrection({
      reading: { amplitude: 1, phaseDeg: 100 },
      sensitivity: { massPerAmplitude: 10, offsetDeg: 30 },
    });
    expect(r.correction.angleDeg).toBeCloseTo(250, 12);
    const w = oneRunCorrection({
      reading: { amplitude: 1, phaseDeg: 100 },
      sensitivity: { massPerAmplitude: 10, offsetDeg: 30 },
      weightAngles: 'withRotation',
    });
    expect(w.correction.angleDeg).toBeCloseTo(110, 12);
  });

  it('agrees with the single-plane method given the stored coefficient (property)', () => {
    fc.assert(
      fc.property(amp, ang, amp, ang, ang, (oa, op, ha, hp, ta) => {
        const m = model({ a: oa, p: op }, { a: ha, p: hp });
        const sp = singlePlaneBalance({
          initial: phasorToReading(m.O),
          trialWeight: { mass: 3, angleDeg: ta },
          withTrial: m.read(3, ta),
        });
        const one = oneRunCorrection({
          reading: phasorToReading(m.O),
          sensitivity: sensitivityFromInfluenceCoefficient(sp.influenceCoefficient),
        });
        expect(Math.abs(one.correction.mass - sp.correction.mass)).toBeLessThan(1e-9 * sp.correction.mass);
        expect(Math.abs(angleDifferenceDeg(one.correction.angleDeg, sp.correction.angleDeg))).toBeLessThan(
          1e-6,
        );
      }),
    );
  });

  it('refuses a missing or zero sensitivity', () => {
    expect(() =>
      oneRunCorrection({ reading: { amplitude: 1, phaseDeg: 0 }, sensitivity: { massPerAmplitude: 0 } }),
    ).toThrowError(EngineError);
    expect(() =>
      oneRunCorrection({ reading: { amplitude: 1, phaseDeg: 0 }, sensitivity: { massPerAmplitude: -5 } }),
    ).toThrowError(/negative/);
  });
});

describe('singlePlaneBalance', () => {
  it('cancels the modelled vibration, trial weight removed or left on (property)', () => {
    fc.assert(
      fc.property(amp, ang, amp, ang, amp, ang, fc.boolean(), (oa, op, ha, hp, tm, ta, removed) => {
        const m = model({ a: oa, p: op }, { a: ha, p: hp });
        const r = singlePlaneBalance({
          initial: phasorToReading(m.O),
          trialWeight: { mass: tm, angleDeg: ta },
          withTrial: m.read(tm, ta),
          trialWeightRemoved: removed,
        });
        const onRotor = removed
          ? phasor(r.correction.mass, r.correction.angleDeg)
          : add(phasor(tm, ta), phasor(r.correction.mass, r.correction.angleDeg));
        const left = add(m.O, multiply(m.H, onRotor));
        expect(magnitude(left) / oa).toBeLessThan(1e-9);
        expect(r.influenceCoefficient.amplitudePerMass).toBeCloseTo(ha, 6);
      }),
    );
  });

  it('rotating every input angle by t rotates every output angle by t (property)', () => {
    fc.assert(
      fc.property(amp, ang, amp, ang, ang, ang, (oa, op, ha, hp, ta, t) => {
        const m = model({ a: oa, p: op }, { a: ha, p: hp });
        const base = {
          initial: phasorToReading(m.O),
          trialWeight: { mass: 2, angleDeg: ta },
          withTrial: m.read(2, ta),
        };
        const a = singlePlaneBalance(base);
        const b = singlePlaneBalance({
          initial: { ...base.initial, phaseDeg: base.initial.phaseDeg + t },
          trialWeight: { mass: 2, angleDeg: ta + t },
          withTrial: { ...base.withTrial, phaseDeg: base.withTrial.phaseDeg + t },
        });
        expect(Math.abs(angleDifferenceDeg(a.correction.angleDeg + t, b.correction.angleDeg))).toBeLessThan(
          1e-6,
        );
        expect(b.correction.mass / a.correction.mass).toBeCloseTo(1, 9);
      }),
    );
  });

  it('scaling amplitudes by k leaves the correction mass; scaling the trial mass by k scales it (property)', () => {
    fc.assert(
      fc.property(amp, ang, amp, ang, fc.double({ min: 0.1, max: 10, noNaN: true }), (oa, op, ha, hp, k) => {
        const m = model({ a: oa, p: op }, { a: ha, p: hp });
        const base = singlePlaneBalance({
          initial: phasorToReading(m.O),
          trialWeight: { mass: 1, angleDeg: 0 },
          withTrial: m.read(1, 0),
        });
        const scaled = singlePlaneBalance({
          initial: phasorToReading(m.O),
          trialWeight: { mass: k, angleDeg: 0 },
          withTrial: m.read(1, 0),
        });
        expect(scaled.correction.mass / base.correction.mass).toBeCloseTo(k, 9);
        const o = phasorToReading(m.O);
        const w = m.read(1, 0);
        const amps = singlePlaneBalance({
          initial: { ...o, amplitude: o.amplitude * k },
          trialWeight: { mass: 1, angleDeg: 0 },
          withTrial: { ...w, amplitude: w.amplitude * k },
        });
        expect(amps.correction.mass / base.correction.mass).toBeCloseTo(1, 9);
      }),
    );
  });

  it('counts weight angles with rotation as the mirror image', () => {
    const m = model({ a: 4, p: 50 }, { a: 0.5, p: 20 });
    const a = singlePlaneBalance({
      initial: phasorToReading(m.O),
      trialWeight: { mass: 2, angleDeg: 30 },
      withTrial: m.read(2, 30),
    });
    const b = singlePlaneBalance({
      initial: phasorToReading(m.O),
      trialWeight: { mass: 2, angleDeg: 330 },
      withTrial: m.read(2, 30),
      weightAngles: 'withRotation',
    });
    expect(b.correction.mass).toBeCloseTo(a.correction.mass, 9);
    expect(Math.abs(angleDifferenceDeg(360 - a.correction.angleDeg, b.correction.angleDeg))).toBeLessThan(
      1e-9,
    );
  });

  it('predicts the residual of a weight actually installed', () => {
    const m = model({ a: 4, p: 50 }, { a: 0.5, p: 20 });
    const r = singlePlaneBalance({
      initial: phasorToReading(m.O),
      trialWeight: { mass: 2, angleDeg: 30 },
      withTrial: m.read(2, 30),
      installed: { mass: 7, angleDeg: 210 },
    });
    const expected = m.read(7, 210);
    expect(r.predictedResidual.amplitude).toBeCloseTo(expected.amplitude, 9);
  });

  it('raises ZERO_TRIAL_EFFECT when the trial weight changed nothing', () => {
    const call = () =>
      singlePlaneBalance({
        initial: { amplitude: 3, phaseDeg: 40 },
        trialWeight: { mass: 10, angleDeg: 0 },
        withTrial: { amplitude: 3, phaseDeg: 40 },
      });
    expect(call).toThrowError(EngineError);
    try {
      call();
    } catch (e) {
      expect((e as EngineError).code).toBe('ZERO_TRIAL_EFFECT');
      expect((e as EngineError).message).toMatch(/larger trial weight/);
    }
  });

  it('refuses a zero or negative trial mass and NaN readings', () => {
    expect(() =>
      singlePlaneBalance({
        initial: { amplitude: 3, phaseDeg: 40 },
        trialWeight: { mass: 0, angleDeg: 0 },
        withTrial: { amplitude: 2, phaseDeg: 0 },
      }),
    ).toThrowError(/trialWeight.mass/);
    expect(() =>
      singlePlaneBalance({
        initial: { amplitude: 3, phaseDeg: 40 },
        trialWeight: { mass: -1, angleDeg: 0 },
        withTrial: { amplitude: 2, phaseDeg: 0 },
      }),
    ).toThrowError(EngineError);
    expect(() =>
      singlePlaneBalance({
        initial: { amplitude: Number.NaN, phaseDeg: 40 },
        trialWeight: { mass: 1, angleDeg: 0 },
        withTrial: { amplitude: 2, phaseDeg: 0 },
      }),
    ).toThrowError(/initial.amplitude/);
  });

  it('warns when the trial effect is small', () => {
    const r = singlePlaneBalance({
      initial: { amplitude: 3, phaseDeg: 40 },
      trialWeight: { mass: 1, angleDeg: 0 },
      withTrial: { amplitude: 3.05, phaseDeg: 40 },
    });
    expect(r.warnings.length).toBe(1);
  });
});

describe('trimRun', () => {
  it('refines the coefficient from a correction run and gives the trim weight', () => {
    const m = model({ a: 4, p: 50 }, { a: 0.5, p: 20 });
    const after = m.read(7, 210);
    const r = trimRun({
      before: phasorToReading(m.O),
      added: [{ mass: 7, angleDeg: 210 }],
      after,
      previous: { amplitudePerMass: 0.45, phaseDeg: 25 },
    });
    expect(r.influenceCoefficient.amplitudePerMass).toBeCloseTo(0.5, 9);
    expect(r.influenceCoefficient.phaseDeg).toBeCloseTo(20, 9);
    const total = add(phasor(7, 210), phasor(r.correction.mass, r.correction.angleDeg));
    expect(magnitude(add(m.O, multiply(m.H, total)))).toBeLessThan(1e-9);
    expect(r.coefficientChange).toBeGreaterThan(0);
    expect(magnitude(subtract(phasor(1, 0), phasor(1, 0)))).toBe(0);
  });

  it('refuses weights that cancel', () => {
    expect(() =>
      trimRun({
        before: { amplitude: 1, phaseDeg: 0 },
        added: [
          { mass: 1, angleDeg: 0 },
          { mass: 1, angleDeg: 180 },
        ],
        after: { amplitude: 1, phaseDeg: 0 },
      }),
    ).toThrowError(EngineError);
  });
});
