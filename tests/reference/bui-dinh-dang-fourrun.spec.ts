/**
 * Four-run (amplitude-only) balancing and the G6.3 tolerance checked against the three application cases of
 * M.-H. Bui, D.-H. Dinh, P.-V. Dang (The University of Danang - University of Science and Technology),
 * "Uncertainty and Data Consistency Assessment for Phase-Free Single-Plane Rigid Rotor Balancing: Monte Carlo
 * Analysis and Three Application Case Studies", reproducibility package v3.0 (MIT licence), public repository
 * buimhien/FourRun-Method-v2: inputs from data/cases.json (mean 1x r.m.s. velocity amplitudes in mm/s, each the
 * mean of three readings, "published mean amplitudes"), answers from results/cases.json (computed by the
 * authors' scripts/01_cases.py). The package says the paper is a revised manuscript: its printed tables could
 * not be read here, so the answers compared are the package's own results, rounded below as stated.
 * Convention (fourrun/core.py): trial positions 0, 120, 240 deg counted the way the weight is moved; correction
 * angle = phi + 180 deg, the same convention as fourRunBalance. The authors' "analytical" answer uses the
 * closed form T = hypot(x, y); the engine fits the amplitudes by least squares, so the two differ by the
 * (small) misfit of each data set.
 */
import { describe, expect, it } from 'vitest';
import { angleDifferenceDeg, balanceTolerance, fourRunBalance } from '@counterpoise/engine';

interface Case {
  name: string;
  massKg: number;
  rpm: number;
  trialG: number;
  /** V0, V1 (0 deg), V2 (120 deg), V3 (240 deg), mm/s r.m.s. */
  v: [number, number, number, number];
  /** Authors' analytical correction (results/cases.json m_xy, theta), rounded. */
  mass: number;
  angle: number;
  /** Authors' U_per for G6.3 (results/cases.json uper_G63), g.mm, rounded. */
  uper: number;
  /** Largest relative mass difference and angle difference found, for the test title. */
  found: string;
}

const CASES: Case[] = [
  {
    name: 'BRT, dynamic balancing test rig (2 kg, 2950 rpm, 0.5 g trial at 90 mm)',
    massKg: 2,
    rpm: 2950,
    trialG: 0.5,
    v: [6.8, 8.7, 9.6, 3.2],
    mass: 0.9241,
    angle: 250.96,
    uper: 40.787,
    found: 'engine 0.922 g at 250.7 deg against 0.924 g at 251.0 deg (0.2 %, 0.2 deg)',
  },
  {
    name: 'IBR, inertia brake test rig (200 kg, 1000 rpm, 40 g trial at 300 mm)',
    massKg: 200,
    rpm: 1000,
    trialG: 40,
    v: [2.9, 3.65, 4.58, 1.4],
    mass: 60.895,
    angle: 263.58,
    uper: 12032.1,
    found: 'engine 60.79 g at 263.8 deg against 60.90 g at 263.6 deg (0.2 %, 0.3 deg)',
  },
  {
    name: 'ICC, industrial cassava chopper (1200 kg, 1050 rpm, 378 g trial at 250 mm)',
    massKg: 1200,
    rpm: 1050,
    trialG: 378,
    v: [10.4, 8.7, 9.8, 12.9],
    mass: 1487.6,
    angle: 47.66,
    uper: 68754.9,
    found: 'engine 1496.5 g at 47.5 deg against 1487.6 g at 47.7 deg (0.6 %, 0.2 deg)',
  },
];

describe('Bui, Dinh and Dang, four-run application cases (reproducibility package v3.0)', () => {
  describe.each(CASES)('$name', (c) => {
    const r = fourRunBalance({
      initialAmplitude: c.v[0],
      trialMass: c.trialG,
      trialRuns: [
        { angleDeg: 0, amplitude: c.v[1] },
        { angleDeg: 120, amplitude: c.v[2] },
        { angleDeg: 240, amplitude: c.v[3] },
      ],
    });

    it(`correction: ${c.found}`, () => {
      expect(Math.abs(r.correction.mass - c.mass) / c.mass).toBeLessThan(0.01);
      expect(Math.abs(angleDifferenceDeg(r.correction.angleDeg, c.angle))).toBeLessThan(0.5);
      expect(r.warnings).toEqual([]);
    });

    it("G6.3 permissible unbalance equals the authors' U_per (rounded to 5-6 figures)", () => {
      const t = balanceTolerance({ grade: 'G6.3', rotorMassKg: c.massKg, speedRpm: c.rpm });
      expect(Math.abs(t.permissibleUnbalanceGmm - c.uper) / c.uper).toBeLessThan(1e-5);
    });
  });

  // ICC: the weight the authors installed in the field was 1428 g at 49.1 deg (data/cases.json), after which the
  // amplitude fell from 10.4 to 0.26 mm/s. Their graphical construction gave 1429.6 g at 48.0 deg. The engine's
  // 1496.5 g at 47.5 deg is 4.8 % and 1.6 deg from the installed weight, within the spread of the estimators on
  // this data set (the authors' two analytical estimates differ by 24 % here).
  it('ICC: engine within 5 % and 2 deg of the weight installed in the field (1428 g at 49.1 deg)', () => {
    const c = CASES[2]!;
    const r = fourRunBalance({
      initialAmplitude: c.v[0],
      trialMass: c.trialG,
      trialRuns: [
        { angleDeg: 0, amplitude: c.v[1] },
        { angleDeg: 120, amplitude: c.v[2] },
        { angleDeg: 240, amplitude: c.v[3] },
      ],
    });
    expect(Math.abs(r.correction.mass - 1428) / 1428).toBeLessThan(0.05);
    expect(Math.abs(angleDifferenceDeg(r.correction.angleDeg, 49.1))).toBeLessThan(2);
  });
});
