/**
 * Least-squares multi-plane balancing (more sensors than planes) checked against the numerical example of
 * T. P. Goodman, "A Least-Squares Method for Computing Balance Corrections", J. Eng. Ind. 86 (1964) 273-279,
 * AS TRANSCRIBED in the public repository MagedMohamedTurk/Turbomachinery-Rotors-Balancing, test/config.yaml,
 * case 'Goodman64' (the paper itself is stored there only as a PDF that could not be read here, so this is a
 * secondary source: the transcription's numbers are used, not the paper's page).
 * Transcribed inputs: three sensors, two planes, influence coefficients (real, per unit weight)
 *   A = [[3, -2], [5, -2], [5, -3]]  (written 3@0, 2@180, ...), initial readings r0 = [1@0, 1@180, 0@0].
 * Transcribed answer: corrections 0.81@0 and 1.48@0 (two figures).
 * Expected values below are recomputed from the normal equations A^T A c = -A^T r0 (exact: 34/42 and 62/42).
 */
import { describe, expect, it } from 'vitest';
import { multiPlaneBalance } from '@counterpoise/engine';

describe('Goodman 1964 least-squares example (3 sensors, 2 planes), as transcribed', () => {
  // The coefficients are entered as two trial runs of 1 unit at 0 deg, one per plane: readings r0 + A[:, k].
  const r = multiPlaneBalance({
    planes: 2,
    initial: [
      { amplitude: 1, phaseDeg: 0 },
      { amplitude: 1, phaseDeg: 180 },
      { amplitude: 0, phaseDeg: 0 },
    ],
    runs: [
      {
        weights: [{ plane: 1, mass: 1, angleDeg: 0 }],
        readings: [
          { amplitude: 4, phaseDeg: 0 },
          { amplitude: 4, phaseDeg: 0 },
          { amplitude: 5, phaseDeg: 0 },
        ],
      },
      {
        weights: [{ plane: 2, mass: 1, angleDeg: 0 }],
        readings: [
          { amplitude: 1, phaseDeg: 180 },
          { amplitude: 3, phaseDeg: 180 },
          { amplitude: 3, phaseDeg: 180 },
        ],
      },
    ],
  });

  // Normal equations: [[59, -31], [-31, 17]] c = [2, 0], det 42.
  const c1 = (2 * 17) / 42;
  const c2 = (31 * 2) / 42;

  it('corrections 0.8095 and 1.4762 at 0 deg equal the normal-equation solution (1e-12) and the transcribed 0.81 and 1.48 (0.3 %)', () => {
    expect(Math.abs(r.corrections[0]!.mass - c1)).toBeLessThan(1e-12);
    expect(Math.abs(r.corrections[1]!.mass - c2)).toBeLessThan(1e-12);
    expect(r.corrections[0]!.angleDeg).toBeCloseTo(0, 9);
    expect(r.corrections[1]!.angleDeg).toBeCloseTo(0, 9);
    expect(Math.abs(r.corrections[0]!.mass - 0.81) / 0.81).toBeLessThan(0.003);
    expect(Math.abs(r.corrections[1]!.mass - 1.48) / 1.48).toBeLessThan(0.003);
  });

  it('residuals r0 + A c = [10/21, 2/21, -8/21]: least squares, not an exact cancellation', () => {
    const res = r.predictedResidual.map((p) => p.amplitude * Math.cos((p.phaseDeg * Math.PI) / 180));
    expect(res[0]).toBeCloseTo(10 / 21, 12);
    expect(res[1]).toBeCloseTo(2 / 21, 12);
    expect(res[2]).toBeCloseTo(-8 / 21, 12);
  });
});
