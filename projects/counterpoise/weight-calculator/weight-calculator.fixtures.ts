import { createCalculatorForm, draftOf } from './weight-calculator-form';
import type {
  CalcMethod,
  FourRunDraft,
  MultiPlaneDraft,
  OneRunDraft,
  SinglePlaneDraft,
  WeightCalculatorDraft,
} from './weight-calculator-model';

/*
 * Invented demo data for the calculator's specs and stories, kept once (not exported by the entry point):
 * the drum of a forestry mulcher on a carrier, worked from its left bearing. The readings are the
 * calculator API's own examples (`CALC_ROUTES[route].example` in `@counterpoise/api`); no real machine,
 * shop or person is named. Every function returns a fresh copy, so a test may change what it gets.
 */

/** One run with the machine family's stored sensitivity. */
export function oneRunJob(): OneRunDraft {
  return {
    reading: { amplitude: 0.38, phaseDeg: 212 },
    sensitivity: { massPerAmplitude: 200, offsetDeg: null },
  };
}

/** A run without and a run with a 60 g trial weight. */
export function trialWeightJob(): SinglePlaneDraft {
  return {
    initial: { amplitude: 0.52, phaseDeg: 74 },
    trialWeight: { mass: 60, angleDeg: 0 },
    withTrial: { amplitude: 0.31, phaseDeg: 141 },
    trialWeightRemoved: true,
  };
}

/** Two sensors, two planes, an 80 g trial weight in each plane in turn. */
export function twoPlaneJob(): MultiPlaneDraft {
  return {
    initial: [
      { amplitude: 0.46, phaseDeg: 38 },
      { amplitude: 0.29, phaseDeg: 301 },
    ],
    runs: [
      {
        trialWeight: { mass: 80, angleDeg: 0 },
        readings: [
          { amplitude: 0.27, phaseDeg: 84 },
          { amplitude: 0.33, phaseDeg: 280 },
        ],
      },
      {
        trialWeight: { mass: 80, angleDeg: 0 },
        readings: [
          { amplitude: 0.41, phaseDeg: 22 },
          { amplitude: 0.12, phaseDeg: 355 },
        ],
      },
    ],
    trialWeightsRemoved: true,
  };
}

/** No phase: the initial amplitude, then a 50 g trial weight at 0°, 120° and 240°. */
export function amplitudeOnlyJob(): FourRunDraft {
  return {
    initialAmplitude: 0.45,
    trialMass: 50,
    trialRuns: [
      { angleDeg: 0, amplitude: 0.62 },
      { angleDeg: 120, amplitude: 0.21 },
      { angleDeg: 240, amplitude: 0.55 },
    ],
  };
}

/** The draft of a calculator nobody has typed into yet. */
export function emptyDraft(method: CalcMethod = 'single-plane'): WeightCalculatorDraft {
  return draftOf(createCalculatorForm(method));
}

/** Every method filled in with the jobs above; the trial-weight method shown. */
export function filledDraft(): WeightCalculatorDraft {
  return {
    ...emptyDraft(),
    oneRun: oneRunJob(),
    singlePlane: trialWeightJob(),
    multiPlane: twoPlaneJob(),
    fourRun: amplitudeOnlyJob(),
  };
}

/** The filled draft with `method` shown. */
export function jobDraft(method: CalcMethod): WeightCalculatorDraft {
  return { ...filledDraft(), method };
}

/**
 * A method's draft as the harness types it, field by field in the order of the form:
 * `{ 'initial.amplitude': 0.52, 'initial.phaseDeg': 74, ... }`.
 */
export function harnessFields(group: object, path = ''): Record<string, number | boolean | null> {
  return Object.fromEntries(
    Object.entries(group).flatMap(([key, value]: [string, unknown]) => {
      const field = path === '' ? key : `${path}.${key}`;
      return value !== null && typeof value === 'object'
        ? Object.entries(harnessFields(value, field))
        : [[field, value as number | boolean | null]];
    }),
  );
}
