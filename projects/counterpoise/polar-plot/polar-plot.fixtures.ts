/**
 * Invented series of the polar plot, shared by its specs and its stories (not part of the public API).
 * Demo data only: a mulcher drum balanced in one plane with a trial weight, a fan read by two sensors.
 */
import type { PolarSeries } from './polar-plot-geometry';

/** The runs read by sensor A: Run 1 the initial reading, Run 2 with the trial weight, Run 3 the check. */
export const SENSOR_A_RUNS: PolarSeries = {
  id: 'sensor-a',
  label: 'Sensor A',
  kind: 'run',
  unit: 'in/s',
  points: [
    { amplitude: 0.42, angleDeg: 128, label: 'Run 1' },
    { amplitude: 0.29, angleDeg: 196, label: 'Run 2' },
    { amplitude: 0.04, angleDeg: 62, label: 'Run 3' },
  ],
};

/** The trial effect, drawn head to tail from Run 1 to Run 2. */
export const TRIAL_EFFECT: PolarSeries = {
  id: 'trial-effect',
  label: 'Trial effect',
  kind: 'trialEffect',
  unit: 'in/s',
  points: [{ amplitude: 0.411, angleDeg: 267.2, from: { amplitude: 0.42, angleDeg: 128 } }],
};

/** The residual predicted after the correction. */
export const RESIDUAL: PolarSeries = {
  id: 'residual',
  label: 'Predicted residual',
  kind: 'residual',
  unit: 'in/s',
  points: [{ amplitude: 0.032, angleDeg: 56 }],
};

/** The trial weight, the ideal correction and the weight installed, on a gram scale of their own. */
export const WEIGHTS: PolarSeries = {
  id: 'weights',
  label: 'Weights',
  kind: 'weight',
  unit: 'g',
  points: [
    { amplitude: 60, angleDeg: 0, label: 'Trial' },
    { amplitude: 61, angleDeg: 41, label: 'Ideal' },
    { amplitude: 60, angleDeg: 45, label: 'Installed' },
  ],
};

/** A whole single-plane job. */
export const JOB: readonly PolarSeries[] = [SENSOR_A_RUNS, TRIAL_EFFECT, RESIDUAL, WEIGHTS];

/** A fan read by two sensors in mm/s: one kind, two shades, a point each. */
export const TWO_SENSORS: readonly PolarSeries[] = [
  {
    id: 'sensor-a',
    label: 'Sensor A, drive end',
    kind: 'reading',
    unit: 'mm/s',
    points: [{ amplitude: 9.6, angleDeg: 74, label: 'A' }],
  },
  {
    id: 'sensor-b',
    label: 'Sensor B, free end',
    kind: 'reading',
    unit: 'mm/s',
    points: [{ amplitude: 6.1, angleDeg: 302, label: 'B' }],
  },
];

/**
 * The series of the workbench's Widgets page: every run read at the drive end, so each point carries the
 * same "Drive end" label, which tells no point from another.
 */
export const DRIVE_END_RUNS: readonly PolarSeries[] = [
  {
    id: 'initial',
    label: 'Initial run',
    kind: 'reading',
    unit: 'in/s',
    points: [{ amplitude: 0.52, angleDeg: 74, label: 'Drive end' }],
  },
  {
    id: 'trial',
    label: 'With trial weight',
    kind: 'run',
    unit: 'in/s',
    points: [{ amplitude: 0.31, angleDeg: 141, label: 'Drive end' }],
  },
  {
    id: 'effect',
    label: 'Trial effect',
    kind: 'trialEffect',
    unit: 'in/s',
    points: [{ amplitude: 0.31, angleDeg: 141, from: { amplitude: 0.52, angleDeg: 74 } }],
  },
  {
    id: 'after',
    label: 'After correction',
    kind: 'residual',
    unit: 'in/s',
    points: [{ amplitude: 0.06, angleDeg: 212, label: 'Drive end' }],
  },
];

/**
 * A long job on a flail mower: two sensors with eight runs each, bunched in two stretches of angle and
 * shrinking towards the centre, and the weights tried on their own scale.
 */
export const CROWDED_JOB: readonly PolarSeries[] = [
  {
    id: 'sensor-a',
    label: 'Sensor A',
    kind: 'run',
    unit: 'mm/s',
    points: Array.from({ length: 8 }, (_, i) => ({
      amplitude: 12 - i * 1.4,
      angleDeg: 40 + i * 7,
      label: `Run ${i + 1}`,
    })),
  },
  {
    id: 'sensor-b',
    label: 'Sensor B',
    kind: 'run',
    unit: 'mm/s',
    points: Array.from({ length: 8 }, (_, i) => ({
      amplitude: 9 - i * 1.1,
      angleDeg: 60 + i * 9,
      label: `Run ${i + 1}`,
    })),
  },
  {
    id: 'weights',
    label: 'Weights',
    kind: 'weight',
    unit: 'g',
    points: [
      { amplitude: 40, angleDeg: 0, label: 'Trial' },
      { amplitude: 55, angleDeg: 230, label: 'Ideal' },
      { amplitude: 50, angleDeg: 225, label: 'Installed' },
    ],
  },
];
