import { EngineError, requireFinite } from './errors';
import { normalizeAngleDeg, phasor, type Phasor, type Reading, type Weight } from './phasor';

/** Direction the rotor turns, as seen from the side where the technician stands. */
export type RotationDirection = 'clockwise' | 'counterClockwise';

/**
 * Which way angles on the rotor are counted from the reference mark: relative to the rotation
 * (`withRotation`, `againstRotation`) or as the technician sees them (`clockwise`, `counterClockwise`).
 */
export type AngleCounting = 'withRotation' | 'againstRotation' | 'clockwise' | 'counterClockwise';

/** A full angle convention: how the rotor turns and how angles are counted, both seen from one side. */
export interface AngleConvention {
  rotation: RotationDirection;
  counting: AngleCounting;
}

/**
 * How weight angles relate to the phase of the readings in the balancing methods. A phase lag counts,
 * in time, the part of a turn from the reference mark to the vibration peak; the rotor point that reaches
 * a sensor after the rotor has turned by phi lies phi behind the mark, i.e. phi counted against rotation.
 * So with weight angles counted `againstRotation`, weight and vibration phasors turn the same way
 * (V = H m e^(i theta)); with `withRotation` they turn opposite ways (V = H m e^(-i theta)).
 */
export type WeightAngles = 'againstRotation' | 'withRotation';

/** The default of every balancing method: weight angles counted against rotation, like the phase lag. */
export const DEFAULT_WEIGHT_ANGLES: WeightAngles = 'againstRotation';

/** +1 when angles in `convention` are counted against rotation, -1 when with it. */
export function countingSign(convention: AngleConvention): 1 | -1 {
  const { rotation, counting } = convention;
  if (counting === 'againstRotation') return 1;
  if (counting === 'withRotation') return -1;
  // An angle counted the way the rotor turns (as seen from the same side) is counted with rotation.
  return counting === rotation ? -1 : 1;
}

/**
 * Converts an angle on the rotor from one convention to another, both measured from the same reference mark.
 * Formula: theta_against = s_from * theta; theta_to = s_to * theta_against, s = +1 against rotation, -1 with it.
 * Source: plane geometry; the direction rule is stated in the trade's guidance that a rotor turning clockwise
 * seen from one end turns counter-clockwise seen from the other (common practice).
 */
export function convertAngle(angleDeg: number, from: AngleConvention, to: AngleConvention): number {
  const a = requireFinite(angleDeg, 'angleDeg');
  validateConvention(from, 'from');
  validateConvention(to, 'to');
  return normalizeAngleDeg(countingSign(from) * countingSign(to) * a);
}

/**
 * The same convention described from the other end of the rotor: the rotation seen from there is reversed,
 * and so is the sense of `clockwise` / `counterClockwise` counting; counting relative to rotation is unchanged.
 */
export function conventionFromOppositeEnd(convention: AngleConvention): AngleConvention {
  validateConvention(convention, 'convention');
  const flip = (d: RotationDirection): RotationDirection =>
    d === 'clockwise' ? 'counterClockwise' : 'clockwise';
  const counting: AngleCounting =
    convention.counting === 'clockwise' || convention.counting === 'counterClockwise'
      ? flip(convention.counting)
      : convention.counting;
  return { rotation: flip(convention.rotation), counting };
}

/** Converts a weight position (its angle) between conventions; the mass is unchanged. */
export function convertWeight(weight: Weight, from: AngleConvention, to: AngleConvention): Weight {
  return { mass: weight.mass, angleDeg: convertAngle(weight.angleDeg, from, to) };
}

/** How a meter reports phase: as a lag (degrees from the reference pulse to the peak) or as a lead (its negative). */
export type PhaseSense = 'lag' | 'lead';

/**
 * Converts a reading's phase between lag and lead: phi_lead = -phi_lag (mod 360). The amplitude is unchanged.
 * Phase is a time delay, so it does not depend on the end of the rotor the technician stands at.
 */
export function convertReadingPhase(reading: Reading, from: PhaseSense, to: PhaseSense): Reading {
  const phase = requireFinite(reading.phaseDeg, 'phaseDeg');
  return { amplitude: reading.amplitude, phaseDeg: normalizeAngleDeg(from === to ? phase : -phase) };
}

/** Which way the technician sees angles increase under `convention`. */
export function countingSeen(convention: AngleConvention): RotationDirection {
  const sign = countingSign(convention);
  if (sign === -1) return convention.rotation;
  return convention.rotation === 'clockwise' ? 'counterClockwise' : 'clockwise';
}

function validateConvention(convention: AngleConvention, field: string): void {
  const okRotation =
    convention && (convention.rotation === 'clockwise' || convention.rotation === 'counterClockwise');
  const okCounting =
    convention &&
    ['withRotation', 'againstRotation', 'clockwise', 'counterClockwise'].includes(
      convention.counting as string,
    );
  if (!okRotation || !okCounting) {
    throw new EngineError(
      'INVALID_INPUT',
      `${field} must give rotation (clockwise or counterClockwise, seen from where you stand) and how angles are counted.`,
      field,
    );
  }
}

/** Internal: the sign that turns a weight angle into the engine's model angle (counted against rotation). */
export function weightSign(weightAngles: WeightAngles | undefined, field = 'weightAngles'): 1 | -1 {
  if (weightAngles === undefined || weightAngles === 'againstRotation') return 1;
  if (weightAngles === 'withRotation') return -1;
  throw new EngineError('INVALID_INPUT', `${field} must be "againstRotation" or "withRotation".`, field);
}

/** Internal: a weight as a model phasor m e^(i s theta). */
export function weightToModel(mass: number, angleDeg: number, sign: 1 | -1): Phasor {
  return phasor(mass, sign * angleDeg);
}
