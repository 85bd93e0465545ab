import { EngineError, requireFinite, requireNonNegative, requirePositive } from './errors';

/** Standard gravity, m/s^2 (exact by definition, 3rd CGPM 1901; NIST SP 811, 2008). */
export const STANDARD_GRAVITY = 9.80665;

/** A balance quality grade of ISO 21940-11 with examples of rotors that usually get it. */
export interface BalanceGrade {
  grade: string;
  /** e_per * omega in mm/s. */
  mmPerS: number;
  typicalRotors: string;
}

/**
 * Balance quality grades G of ISO 21940-11:2016 (formerly ISO 1940-1:2003), Table 1, as the product
 * uses them. The numbers are the standard's series (each step a factor 2.5); the rotor examples are short
 * paraphrases from memory and are guidance only, the standard's table governs.
 */
export const BALANCE_GRADES: readonly BalanceGrade[] = Object.freeze([
  {
    grade: 'G4000',
    mmPerS: 4000,
    typicalRotors: 'Crankshaft drives of rigidly mounted slow marine diesel engines',
  },
  {
    grade: 'G1600',
    mmPerS: 1600,
    typicalRotors: 'Crankshaft drives of rigidly mounted large two-cycle engines',
  },
  {
    grade: 'G630',
    mmPerS: 630,
    typicalRotors: 'Crankshaft drives of rigidly mounted large four-cycle engines',
  },
  {
    grade: 'G250',
    mmPerS: 250,
    typicalRotors: 'Crankshaft drives of rigidly mounted fast four-cylinder diesel engines',
  },
  { grade: 'G100', mmPerS: 100, typicalRotors: 'Complete engines for cars, trucks and locomotives' },
  {
    grade: 'G40',
    mmPerS: 40,
    typicalRotors: 'Car wheels, wheel rims, drive shafts; crankshafts of fast engines',
  },
  {
    grade: 'G16',
    mmPerS: 16,
    typicalRotors: 'Parts of agricultural machinery; parts of crushing machines; drive shafts',
  },
  {
    grade: 'G6.3',
    mmPerS: 6.3,
    typicalRotors: 'Fans, flywheels, pump impellers, process plant machinery, general machinery',
  },
  {
    grade: 'G2.5',
    mmPerS: 2.5,
    typicalRotors: 'Gas and steam turbines, compressors, machine-tool drives, turbine-driven pumps',
  },
  { grade: 'G1', mmPerS: 1, typicalRotors: 'Grinding machine drives, small high-speed armatures' },
  { grade: 'G0.4', mmPerS: 0.4, typicalRotors: 'Spindles and drives of high-precision grinders, gyroscopes' },
]);

/** The grade named by "G6.3", "G 6.3" or "6.3"; an `UNKNOWN_GRADE` error otherwise. */
export function findBalanceGrade(grade: string, field = 'grade'): BalanceGrade {
  const text = typeof grade === 'string' ? grade.trim().toUpperCase().replace(/\s+/g, '') : '';
  const value = Number(text.startsWith('G') ? text.slice(1) : text);
  const found = BALANCE_GRADES.find((g) => g.mmPerS === value);
  if (!found) {
    throw new EngineError(
      'UNKNOWN_GRADE',
      `"${String(grade)}" is not a balance quality grade; use one of ${BALANCE_GRADES.map((g) => g.grade).join(', ')}.`,
      field,
    );
  }
  return found;
}

/** Input of {@link balanceTolerance}. */
export interface ToleranceInput {
  grade: string;
  rotorMassKg: number;
  speedRpm: number;
  /** Correction radius, to express the tolerance as a mass there. */
  radiusMm?: number;
  /** Distances from the rotor's centre of mass to bearing A (a) and bearing B (b). */
  bearingDistancesMm?: { a: number; b: number };
  /** A measured residual unbalance of the whole rotor, to judge pass or fail. */
  residualUnbalanceGmm?: number;
}

/** Permissible residual unbalance in one correction plane. */
export interface PlaneTolerance {
  plane: number;
  permissibleUnbalanceGmm: number;
  massAtRadiusGrams?: number;
}

/** Result of {@link balanceTolerance}. */
export interface ToleranceResult {
  grade: string;
  gradeMmPerS: number;
  permissibleUnbalanceGmm: number;
  specificUnbalanceUm: number;
  planes: PlaneTolerance[];
  massAtRadiusGrams?: number;
  pass?: boolean;
  warnings: string[];
}

/**
 * Balance tolerance by ISO 21940-11 (formerly ISO 1940-1).
 * Formulas: omega = 2 pi n / 60; e_per = 1000 G / omega (um, equal to g.mm/kg);
 * U_per = e_per m = 1000 G m / omega = 9549.3 G m / n (g.mm, m in kg, n in rpm, G in mm/s).
 * Planes: U_A = U_per b / (a + b), U_B = U_per a / (a + b), each kept within 30 % to 70 % of U_per
 * (ISO 1940-1:2003 section 7, from memory); equal halves without bearing distances (H. P. Bloch and
 * F. K. Geitner, Machinery Component Maintenance and Repair, Gulf, Fig. 6-33 note 1).
 * Mass at radius: U / r. Pass when the measured residual <= U_per.
 * Sources: ISO 1940-1:2003 section 5 (e_per omega = constant); US customary form U_per = 6.015 G W / N
 * (oz.in, W in lb) in Energy-Tech magazine, "balancing standards" article (checked in tests/reference).
 */
export function balanceTolerance(input: ToleranceInput): ToleranceResult {
  const g = findBalanceGrade(input?.grade);
  const m = requirePositive(input.rotorMassKg, 'rotorMassKg', 'rotor mass');
  const n = requirePositive(input.speedRpm, 'speedRpm', 'speed');
  const omega = (2 * Math.PI * n) / 60;
  const e = (1000 * g.mmPerS) / omega;
  const u = e * m;
  const radius =
    input.radiusMm === undefined ? undefined : requirePositive(input.radiusMm, 'radiusMm', 'radius');
  const warnings: string[] = [];
  let shareA = 0.5;
  if (input.bearingDistancesMm !== undefined) {
    const a = requireNonNegative(input.bearingDistancesMm?.a, 'bearingDistancesMm.a', 'distance');
    const b = requireNonNegative(input.bearingDistancesMm?.b, 'bearingDistancesMm.b', 'distance');
    if (a + b === 0) {
      throw new EngineError(
        'ZERO_VALUE',
        'The bearing distances are both zero; give the distance from the centre of mass to each bearing.',
        'bearingDistancesMm',
      );
    }
    const raw = b / (a + b);
    shareA = Math.min(0.7, Math.max(0.3, raw));
    if (shareA !== raw) {
      warnings.push(
        'The centre of mass is close to one bearing; each plane was kept within 30 % to 70 % of the total tolerance.',
      );
    }
  }
  const planes: PlaneTolerance[] = [shareA, 1 - shareA].map((share, i) => {
    const p: PlaneTolerance = { plane: i + 1, permissibleUnbalanceGmm: u * share };
    if (radius !== undefined) p.massAtRadiusGrams = (u * share) / radius;
    return p;
  });
  const result: ToleranceResult = {
    grade: g.grade,
    gradeMmPerS: g.mmPerS,
    permissibleUnbalanceGmm: u,
    specificUnbalanceUm: e,
    planes,
    warnings,
  };
  if (radius !== undefined) result.massAtRadiusGrams = u / radius;
  if (input.residualUnbalanceGmm !== undefined) {
    result.pass =
      requireNonNegative(input.residualUnbalanceGmm, 'residualUnbalanceGmm', 'residual unbalance') <= u;
  }
  return result;
}

/** Input of {@link trialWeightSize}. */
export interface TrialWeightInput {
  /** Rotor mass, or the share of it carried by the bearing (journal) next to the correction plane. */
  rotorMassKg: number;
  speedRpm: number;
  radiusMm: number;
  /** Centrifugal force of the trial weight as a fraction of the rotor's weight; default 0.1. */
  forceFraction?: number;
}

/** Result of {@link trialWeightSize}. */
export interface TrialWeightResult {
  massGrams: number;
  unbalanceGmm: number;
  forceN: number;
  warnings: string[];
}

/**
 * Trial-weight size: a weight whose centrifugal force is a fraction f of the rotor's weight.
 * Formulas: F = f M g; m = F / (r omega^2), omega = 2 pi n / 60; U = m r.
 * Physics: centrifugal force F = m r omega^2 (any mechanics text); the 10 % default is common practice.
 */
export function trialWeightSize(input: TrialWeightInput): TrialWeightResult {
  const mass = requirePositive(input?.rotorMassKg, 'rotorMassKg', 'rotor mass');
  const n = requirePositive(input.speedRpm, 'speedRpm', 'speed');
  const r = requirePositive(input.radiusMm, 'radiusMm', 'radius');
  const f =
    input.forceFraction === undefined
      ? 0.1
      : requirePositive(input.forceFraction, 'forceFraction', 'force fraction');
  requireFinite(f, 'forceFraction');
  const omega = (2 * Math.PI * n) / 60;
  const force = f * mass * STANDARD_GRAVITY;
  const massKg = force / ((r / 1000) * omega * omega);
  const warnings: string[] = [];
  if (f > 0.3)
    warnings.push(
      'A trial weight pulling more than 30 % of the rotor weight is unusually large; check the fraction.',
    );
  return { massGrams: massKg * 1000, unbalanceGmm: massKg * 1000 * r, forceN: force, warnings };
}
