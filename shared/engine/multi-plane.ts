import type { WeightAngles } from './conventions';
import { multiPlaneByLeastSquares } from './multi-plane-least-squares';
import { solveSquareTwoPlane } from './multi-plane-square';
import type { Reading } from './phasor';

/** A weight in a numbered correction plane (planes numbered from 1). */
export interface PlaneWeight {
  plane: number;
  mass: number;
  angleDeg: number;
}

/** One run: every weight on the rotor during it, and the reading of every sensor. */
export interface BalanceRun {
  weights: PlaneWeight[];
  readings: Reading[];
}

/** Input of {@link multiPlaneBalance}. */
export interface MultiPlaneInput {
  planes: number;
  /** Reading of every sensor with no weight added. */
  initial: Reading[];
  runs: BalanceRun[];
  weightAngles?: WeightAngles;
  /** Above this condition number the answer is refused; default 1000 (product default, see docs/methods.md). */
  maxConditionNumber?: number;
  /** Above this condition number a warning is given; default 10. */
  warnConditionNumber?: number;
}

/** An influence coefficient of one sensor for one plane (both numbered from 1). */
export interface PlaneInfluenceCoefficient {
  sensor: number;
  plane: number;
  amplitudePerMass: number;
  phaseDeg: number;
}

/** Result of {@link multiPlaneBalance}. */
export interface MultiPlaneResult {
  /** Total weight per plane on a rotor without trial weights. */
  corrections: PlaneWeight[];
  /** Weight to add per plane with the last run's weights left on. */
  toAdd: PlaneWeight[];
  influenceCoefficients: PlaneInfluenceCoefficient[];
  conditionNumber: number;
  predictedResidual: Reading[];
  warnings: string[];
}

/**
 * Several planes and sensors by influence coefficients with cross effects.
 * Model: r_k = r_0 + A w_k for run k, with r the m sensor phasors, w_k the n plane unbalances on the rotor
 * during run k (sum of its weights per plane) and A the m x n influence matrix.
 * Step 1, coefficients: W^T A^T = (R - r_0 1^T)^T, solved exactly for K = n runs and by least squares for K > n.
 * Step 2, correction: c minimises ||r_0 + A c|| (exact for m = n); residual r_0 + A c; to add: c - w_K.
 * The 2-norm condition number of A says how well the sensors separate the planes.
 * Sources: T. P. Goodman, "A least-squares method for computing balance corrections", J. Eng. Ind. 86 (1964)
 * 273-279 (from memory; its numerical example, as transcribed in a public repository, is checked in
 * tests/reference/goodman-1964.spec.ts); R. Tiwari, NPTEL course Rotor Dynamics, module 13, Example 13.5
 * (tests/reference/tiwari-nptel.spec.ts); R. B. McMillan, Rotating Machinery: Practical Solutions to
 * Unbalance and Misalignment (Fairmont Press, 2004), ch. 5, two-plane example 5-4; X. Yu, "General influence
 * coefficient algorithm in balancing of rotating machinery", Int. J. Rotating Machinery 10 (2004) 85-90
 * (weights left on, redundant runs).
 *
 * Two planes, two sensors and two runs (the square system of a two-plane field balance) are solved in closed
 * form, by Cramer's rule on 2 x 2 complex matrices (multi-plane-square.ts), to within rounding of the general
 * least-squares path; any other size, and any square system that is near a refusal (runs that hardly separate
 * the planes, a trial weight with hardly any effect, a condition number near a limit) or has bad input, takes
 * the general path, which gives every refusal.
 */
export function multiPlaneBalance(input: MultiPlaneInput): MultiPlaneResult {
  return solveSquareTwoPlane(input) ?? multiPlaneByLeastSquares(input);
}
