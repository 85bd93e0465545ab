/**
 * Balance tolerance checks.
 * - ISO 1940-1:2003 (now ISO 21940-11:2016), section 5: e_per omega = G, U_per = e_per m. The formula is the
 *   standard's; the test recomputes it from the definition, independently of the engine's code path.
 * - US customary form U_per = 6.015 G W / N (oz.in, W in lb, N in rpm), printed in the article on balancing
 *   standards in Energy-Tech magazine (energy-tech.com, article 18389, page 3). The constant 6.015 is rounded to
 *   four figures, so agreement is to about 1e-4.
 * - H. P. Bloch and F. K. Geitner, "Machinery Component Maintenance and Repair", Gulf Publishing, Fig. 6-33,
 *   note (1): for rigid rotors with two correction planes, one half of the permissible residual unbalance per plane.
 */
import { describe, expect, it } from 'vitest';
import { balanceTolerance } from '@counterpoise/engine';

const OZ_G = 28.349523125;
const IN_MM = 25.4;
const LB_KG = 0.45359237;

describe('ISO 1940-1 / 21940-11 permissible residual unbalance', () => {
  it.each([
    ['G6.3', 100, 3000],
    ['G16', 450, 2200],
    ['G2.5', 1200, 3600],
    ['G1', 5, 12000],
  ])('%s, %s kg, %s rpm: U_per = 1000 G m / omega', (grade, m, n) => {
    const g = Number(grade.slice(1));
    const omega = (n * 2 * Math.PI) / 60;
    const r = balanceTolerance({ grade, rotorMassKg: m, speedRpm: n });
    expect(
      Math.abs(r.permissibleUnbalanceGmm - (1000 * g * m) / omega) / r.permissibleUnbalanceGmm,
    ).toBeLessThan(1e-12);
    expect(r.specificUnbalanceUm).toBeCloseTo((1000 * g) / omega, 9);
  });

  it.each([
    ['G6.3', 500, 1800],
    ['G16', 1000, 2000],
    ['G2.5', 2000, 3600],
  ])(
    '%s, %s lb, %s rpm agrees with U_per = 6.015 G W / N oz.in (Energy-Tech) within 1e-4',
    (grade, wLb, n) => {
      const g = Number(grade.slice(1));
      const r = balanceTolerance({ grade, rotorMassKg: wLb * LB_KG, speedRpm: n });
      const ozIn = r.permissibleUnbalanceGmm / (OZ_G * IN_MM);
      const published = (6.015 * g * wLb) / n;
      expect(Math.abs(ozIn - published) / published).toBeLessThan(1e-4);
    },
  );

  it('splits the tolerance in half between two planes of a rigid rotor (Bloch and Geitner, Fig. 6-33 note 1)', () => {
    const r = balanceTolerance({ grade: 'G6.3', rotorMassKg: 250, speedRpm: 1500 });
    expect(r.planes[0]!.permissibleUnbalanceGmm).toBeCloseTo(r.permissibleUnbalanceGmm / 2, 9);
    expect(r.planes[1]!.permissibleUnbalanceGmm).toBeCloseTo(r.permissibleUnbalanceGmm / 2, 9);
  });
});
