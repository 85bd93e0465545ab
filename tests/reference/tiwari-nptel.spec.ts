/**
 * Two-plane influence-coefficient balancing checked against R. Tiwari (IIT Guwahati), NPTEL course "Rotor
 * Dynamics" (course 112103024), module 13, lecture 2, Example 13.5 (archive.nptel.ac.in, module13/lec2/7.html).
 * Published inputs: a rigid rotor symmetric about its centre-line; a trial mass of 0.3 kg at 30 deg at end 1
 * changes the vibration by 50 um at 61 deg at end 1 and by 42 um at 130 deg at end 2; the initial vibration is
 * -30 um at 230 deg at end 1 and -70 um at 330 deg at end 2. (In the stored page the degree signs are rendered
 * as a trailing 0 - "300", "610", "1300", "2300", "3300" - read here as 30, 61, 130, 230 and 330 deg, the only
 * reading that gives angles below 360 for 610 and 1300.) By the symmetry the example states, alpha22 = alpha11
 * and alpha12 = alpha21, so the second trial run (0.3 kg at 30 deg at end 2) is built from the same changes.
 * The page's solution (influence coefficients and balance masses) is typeset as images that could not be read:
 * no printed answer is compared. The expected correction is recomputed below from the published inputs by
 * Cramer's rule on the 2 x 2 complex system A c = -V0, independently of the engine; masses and vibration use
 * the same angle sense, the engine's default `againstRotation`.
 */
import { describe, expect, it } from 'vitest';
import { add, angleDifferenceDeg, multiPlaneBalance, phasor, phasorToReading } from '@counterpoise/engine';

type C = [number, number];
const pol = (a: number, deg: number): C => [
  a * Math.cos((deg * Math.PI) / 180),
  a * Math.sin((deg * Math.PI) / 180),
];
const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const sub = (a: C, b: C): C => [a[0] - b[0], a[1] - b[1]];
const div = (a: C, b: C): C => {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
};

describe('Tiwari, NPTEL Rotor Dynamics, Example 13.5 (symmetric rigid rotor, two planes)', () => {
  const v1 = pol(-30, 230);
  const v2 = pol(-70, 330);
  const trial = pol(0.3, 30);
  const a11 = div(pol(50, 61), trial);
  const a21 = div(pol(42, 130), trial);
  const det = sub(mul(a11, a11), mul(a21, a21));
  const rhs1: C = [-v1[0], -v1[1]];
  const rhs2: C = [-v2[0], -v2[1]];
  const c1 = div(sub(mul(rhs1, a11), mul(a21, rhs2)), det);
  const c2 = div(sub(mul(a11, rhs2), mul(a21, rhs1)), det);
  const expected = [c1, c2].map((z) => ({
    mass: Math.hypot(z[0], z[1]),
    angleDeg: (Math.atan2(z[1], z[0]) * 180) / Math.PI,
  }));

  const n0 = phasor(-30, 230);
  const f0 = phasor(-70, 330);
  const r = multiPlaneBalance({
    planes: 2,
    initial: [phasorToReading(n0), phasorToReading(f0)],
    runs: [
      {
        weights: [{ plane: 1, mass: 0.3, angleDeg: 30 }],
        readings: [phasorToReading(add(n0, phasor(50, 61))), phasorToReading(add(f0, phasor(42, 130)))],
      },
      {
        weights: [{ plane: 2, mass: 0.3, angleDeg: 30 }],
        readings: [phasorToReading(add(n0, phasor(42, 130))), phasorToReading(add(f0, phasor(50, 61)))],
      },
    ],
  });

  it('end 1: 0.3325 kg at 208.9 deg, equal to the Cramer solution (1e-9)', () => {
    expect(Math.abs(r.corrections[0]!.mass - expected[0]!.mass)).toBeLessThan(1e-9);
    expect(Math.abs(angleDifferenceDeg(r.corrections[0]!.angleDeg, expected[0]!.angleDeg))).toBeLessThan(
      1e-7,
    );
    expect(r.corrections[0]!.mass).toBeCloseTo(0.3325, 4);
  });

  it('end 2: 0.1884 kg at 331.2 deg, equal to the Cramer solution (1e-9)', () => {
    expect(Math.abs(r.corrections[1]!.mass - expected[1]!.mass)).toBeLessThan(1e-9);
    expect(Math.abs(angleDifferenceDeg(r.corrections[1]!.angleDeg, expected[1]!.angleDeg))).toBeLessThan(
      1e-7,
    );
    expect(r.corrections[1]!.mass).toBeCloseTo(0.1884, 4);
  });

  it('influence coefficients: alpha11 = 166.7 um/kg at 31 deg and alpha21 = 140 um/kg at 100 deg', () => {
    const c = r.influenceCoefficients;
    const h11 = c.find((x) => x.sensor === 1 && x.plane === 1)!;
    const h21 = c.find((x) => x.sensor === 2 && x.plane === 1)!;
    expect(h11.amplitudePerMass).toBeCloseTo(50 / 0.3, 9);
    expect(Math.abs(angleDifferenceDeg(h11.phaseDeg, 31))).toBeLessThan(1e-9);
    expect(h21.amplitudePerMass).toBeCloseTo(42 / 0.3, 9);
    expect(Math.abs(angleDifferenceDeg(h21.phaseDeg, 100))).toBeLessThan(1e-9);
  });
});
