import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { EngineError } from './errors';
import { median, modifiedZScores, refineFamilySensitivity } from './family-sensitivity';
import { oneRunCorrection, singlePlaneBalance } from './single-plane';

describe('modifiedZScores (Iglewicz and Hoaglin 1993, section 3.3)', () => {
  it('scores by the median and the median absolute deviation', () => {
    // median 3, absolute deviations 2 1 0 1 7 -> MAD 1; M = 0.6745 (x - 3) / 1.
    const scores = modifiedZScores([1, 2, 3, 4, 10]);
    expect(scores.map((m) => Number(m.toFixed(4)))).toEqual([-1.349, -0.6745, 0, 0.6745, 4.7215]);
    expect(median([4, 1, 3, 2])).toBe(2.5);
  });

  it('gives Infinity to a value off a list whose MAD is zero', () => {
    expect(modifiedZScores([5, 5, 5, 9])).toEqual([0, 0, 0, Infinity]);
  });
});

describe('refineFamilySensitivity', () => {
  const similar = [
    { amplitudePerMass: 0.002, phaseDeg: 40 },
    { amplitudePerMass: 0.0021, phaseDeg: 43 },
    { amplitudePerMass: 0.0019, phaseDeg: 38 },
    { amplitudePerMass: 0.00205, phaseDeg: 41 },
    { amplitudePerMass: 0.00198, phaseDeg: 44 },
  ];

  it('is the coefficient itself when every job measured the same one, with no spread', () => {
    const one = { amplitudePerMass: 0.0025, phaseDeg: 300 };
    const result = refineFamilySensitivity({ coefficients: [one, one, one, one] });
    expect(result.coefficient.amplitudePerMass).toBeCloseTo(0.0025, 12);
    expect(result.coefficient.phaseDeg).toBeCloseTo(300, 9);
    expect(result.spreadRatio).toBeCloseTo(0, 12);
    expect(result.sensitivity.massPerAmplitude).toBeCloseTo(400, 6);
    expect(result.sensitivity.offsetDeg).toBeCloseTo(300, 9);
    expect(result.setAside).toEqual([]);
    expect(result.count).toBe(4);
  });

  it('sets aside a job that measured a very different rotor, and says which', () => {
    const loose = { amplitudePerMass: 0.006, phaseDeg: 200 };
    const result = refineFamilySensitivity({
      coefficients: [...similar.slice(0, 3), loose, ...similar.slice(3)],
    });
    expect(result.setAside.map((s) => s.index)).toEqual([3]);
    expect(result.setAside[0]!.score).toBeGreaterThan(3.5);
    expect(result.count).toBe(5);
    expect(result.coefficient.amplitudePerMass).toBeCloseTo(0.002, 3);
    expect(result.coefficient.phaseDeg).toBeGreaterThan(38);
    expect(result.coefficient.phaseDeg).toBeLessThan(44);
    expect(result.spreadRatio).toBeLessThan(0.1);
  });

  it('averages as vectors: phases either side of 0 give a mean near 0, not 180', () => {
    const result = refineFamilySensitivity({
      coefficients: [
        { amplitudePerMass: 1, phaseDeg: 350 },
        { amplitudePerMass: 1, phaseDeg: 10 },
      ],
    });
    expect(Math.min(result.coefficient.phaseDeg, 360 - result.coefficient.phaseDeg)).toBeCloseTo(0, 9);
    expect(result.warnings.join(' ')).toMatch(/Only 2 jobs/);
  });

  it('turns with the data: rotating every phase by t rotates the mean by t (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: -720, max: 720, noNaN: true }), (turnDeg) => {
        const turned = similar.map((c) => ({ ...c, phaseDeg: c.phaseDeg + turnDeg }));
        const a = refineFamilySensitivity({ coefficients: similar });
        const b = refineFamilySensitivity({ coefficients: turned });
        expect(b.coefficient.amplitudePerMass).toBeCloseTo(a.coefficient.amplitudePerMass, 12);
        const difference =
          ((((b.coefficient.phaseDeg - a.coefficient.phaseDeg - turnDeg) % 360) + 540) % 360) - 180;
        expect(Math.abs(difference)).toBeLessThan(1e-6);
      }),
    );
  });

  it('gives a sensitivity whose one-run correction equals the trial-weight correction of the same rotor', () => {
    // A rotor with H = 0.002 in/s per g at 40 degrees: the trial-weight method measures it, the family keeps
    // it, and a one-run correction of a new reading must then match the trial-weight answer (single-plane
    // relations of McMillan 2004, ch. 5, as in single-plane.ts).
    const initial = { amplitude: 0.42, phaseDeg: 130 };
    const trialWeight = { mass: 50, angleDeg: 0 };
    const h = { re: 0.002 * Math.cos((40 * Math.PI) / 180), im: 0.002 * Math.sin((40 * Math.PI) / 180) };
    const v0 = { re: 0.42 * Math.cos((130 * Math.PI) / 180), im: 0.42 * Math.sin((130 * Math.PI) / 180) };
    const v1 = { re: v0.re + h.re * 50, im: v0.im + h.im * 50 };
    const withTrial = {
      amplitude: Math.hypot(v1.re, v1.im),
      phaseDeg: (Math.atan2(v1.im, v1.re) * 180) / Math.PI,
    };
    const trial = singlePlaneBalance({ initial, trialWeight, withTrial });
    const family = refineFamilySensitivity({ coefficients: [trial.influenceCoefficient] });
    const oneRun = oneRunCorrection({ reading: initial, sensitivity: family.sensitivity });
    expect(oneRun.correction.mass).toBeCloseTo(trial.correction.mass, 9);
    expect(oneRun.correction.angleDeg).toBeCloseTo(trial.correction.angleDeg, 9);
  });

  it('refuses an empty list, a zero coefficient and a bad limit with the field at fault', () => {
    expect(() => refineFamilySensitivity({ coefficients: [] })).toThrowError(EngineError);
    expect(() =>
      refineFamilySensitivity({ coefficients: [{ amplitudePerMass: 0, phaseDeg: 0 }] }),
    ).toThrowError(/coefficients\[0\]\.amplitudePerMass/);
    expect(() => refineFamilySensitivity({ coefficients: similar, outlierScore: -1 })).toThrowError(
      /outlierScore/,
    );
  });
});
