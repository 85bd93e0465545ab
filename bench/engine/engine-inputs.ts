/** Representative inputs of the engine's benchmarks, shared by `engine.bench.ts` and the profiling script. */
import type { MultiPlaneInput, SinglePlaneInput } from '@counterpoise/engine';

/** One plane, one sensor, one trial run. */
export const singlePlane: SinglePlaneInput = {
  initial: { amplitude: 3.5, phaseDeg: 60 },
  trialWeight: { mass: 5, angleDeg: 0 },
  withTrial: { amplitude: 5, phaseDeg: 120 },
};

/** Two planes, two sensors, one trial run per plane: the square system of a two-plane field balance. */
export const twoPlane: MultiPlaneInput = {
  planes: 2,
  initial: [
    { amplitude: 7.1, phaseDeg: 60 },
    { amplitude: 5.4, phaseDeg: 215 },
  ],
  runs: [
    {
      weights: [{ plane: 1, mass: 8, angleDeg: 270 }],
      readings: [
        { amplitude: 9.1, phaseDeg: 110 },
        { amplitude: 4.2, phaseDeg: 225 },
      ],
    },
    {
      weights: [{ plane: 2, mass: 10, angleDeg: 180 }],
      readings: [
        { amplitude: 6.0, phaseDeg: 35 },
        { amplitude: 2.2, phaseDeg: 160 },
      ],
    },
  ],
};

/** Three planes, four sensors: more sensors than planes, solved by least squares. */
export const threeByFour: MultiPlaneInput = {
  planes: 3,
  initial: [1, 2, 3, 4].map((k) => ({ amplitude: k, phaseDeg: 40 * k })),
  runs: [1, 2, 3].map((p) => ({
    weights: [{ plane: p, mass: 5, angleDeg: 90 * p }],
    readings: [1, 2, 3, 4].map((k) => ({ amplitude: k + (p === k ? 2 : 0.5), phaseDeg: 40 * k + 25 * p })),
  })),
};
