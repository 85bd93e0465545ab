import {
  add,
  multiply,
  phasor,
  phasorToReading,
  type Reading,
  readingToPhasor,
  weightToModel,
} from '@counterpoise/engine';

/*
 * A modelled rotor, for the demo jobs and the specs: what its sensors read with weights on, from an
 * initial unbalance response and influence coefficients. Readings r = r0 + sum_p H[sensor][plane] w_p,
 * weights in grams at the planes' correction radii, angles counted against rotation (phase lags).
 */

/** The response of a modelled rotor. */
export interface ModelRotor {
  /** What each sensor reads with no weight added, left sensor first. */
  readonly initial: readonly Reading[];
  /** H[sensor][plane]: amplitude per gram and phase. */
  readonly coefficients: readonly (readonly { amplitudePerMass: number; phaseDeg: number }[])[];
}

/** What the modelled rotor reads with these weights on. */
export function modelReadings(
  rotor: ModelRotor,
  weights: readonly { planeIndex: number; massGrams: number; angleDeg: number }[],
): Reading[] {
  return rotor.initial.map((initial, sensor) => {
    let z = readingToPhasor(initial);
    for (const weight of weights) {
      const h = rotor.coefficients[sensor]![weight.planeIndex]!;
      z = add(
        z,
        multiply(phasor(h.amplitudePerMass, h.phaseDeg), weightToModel(weight.massGrams, weight.angleDeg, 1)),
      );
    }
    return phasorToReading(z);
  });
}
