/**
 * Operations per second of each engine method on representative inputs (vitest bench prints hz = ops/s).
 * The API's batch route wants >= 100,000 calculations per second on a 2-core machine.
 */
import { bench, describe } from 'vitest';
import {
  averageReadings,
  balanceTolerance,
  combineWeights,
  convertAngle,
  fourRunBalance,
  moveToRadius,
  multiPlaneBalance,
  oneRunCorrection,
  preBalanceInspection,
  singlePlaneBalance,
  splitWeight,
  suggestStockWeights,
  trialWeightSize,
  trimRun,
  vibrationSeverity,
} from '@counterpoise/engine';

const twoPlane = {
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
const threeByFour = {
  planes: 3,
  initial: [1, 2, 3, 4].map((k) => ({ amplitude: k, phaseDeg: 40 * k })),
  runs: [1, 2, 3].map((p) => ({
    weights: [{ plane: p, mass: 5, angleDeg: 90 * p }],
    readings: [1, 2, 3, 4].map((k) => ({ amplitude: k + (p === k ? 2 : 0.5), phaseDeg: 40 * k + 25 * p })),
  })),
};

describe('engine', () => {
  bench('convertAngle', () => {
    convertAngle(
      123,
      { rotation: 'clockwise', counting: 'clockwise' },
      { rotation: 'counterClockwise', counting: 'againstRotation' },
    );
  });
  bench('averageReadings (5 readings)', () => {
    averageReadings({
      readings: [0, 1, 2, 3, 4].map((k) => ({ amplitude: 0.5 + 0.01 * k, phaseDeg: 120 + k })),
    });
  });
  bench('oneRunCorrection', () => {
    oneRunCorrection({ reading: { amplitude: 0.35, phaseDeg: 300 }, sensitivity: { massPerAmplitude: 200 } });
  });
  bench('singlePlaneBalance', () => {
    singlePlaneBalance({
      initial: { amplitude: 3.5, phaseDeg: 60 },
      trialWeight: { mass: 5, angleDeg: 0 },
      withTrial: { amplitude: 5, phaseDeg: 120 },
    });
  });
  bench('trimRun', () => {
    trimRun({
      before: { amplitude: 3.5, phaseDeg: 60 },
      added: [{ mass: 4, angleDeg: 283 }],
      after: { amplitude: 0.4, phaseDeg: 200 },
    });
  });
  bench('multiPlaneBalance (2 planes, 2 sensors)', () => {
    multiPlaneBalance(twoPlane);
  });
  bench('multiPlaneBalance (3 planes, 4 sensors)', () => {
    multiPlaneBalance(threeByFour);
  });
  bench('fourRunBalance', () => {
    fourRunBalance({
      initialAmplitude: 5,
      trialMass: 4,
      trialRuns: [
        { angleDeg: 0, amplitude: 6.8 },
        { angleDeg: 120, amplitude: 3.4 },
        { angleDeg: 240, amplitude: 5.4 },
      ],
    });
  });
  bench('splitWeight (8 positions)', () => {
    splitWeight({ weight: { mass: 100, angleDeg: 50 }, positions: { count: 8, firstDeg: 0 } });
  });
  bench('combineWeights (3 weights)', () => {
    combineWeights({
      weights: [
        { mass: 10, angleDeg: 0, radius: 200 },
        { mass: 20, angleDeg: 90, radius: 100 },
        { mass: 5, angleDeg: 200, radius: 150 },
      ],
    });
  });
  bench('moveToRadius', () => {
    moveToRadius({ mass: 30, fromRadius: 200, toRadius: 300 });
  });
  bench('suggestStockWeights (5 sizes, 3 pieces)', () => {
    suggestStockWeights({ weight: { mass: 73, angleDeg: 100 }, stockMasses: [5, 10, 25, 50, 100] });
  });
  bench('trialWeightSize', () => {
    trialWeightSize({ rotorMassKg: 300, speedRpm: 2200, radiusMm: 250 });
  });
  bench('balanceTolerance', () => {
    balanceTolerance({
      grade: 'G16',
      rotorMassKg: 400,
      speedRpm: 2000,
      radiusMm: 250,
      bearingDistancesMm: { a: 600, b: 900 },
    });
  });
  bench('vibrationSeverity', () => {
    vibrationSeverity({ value: 0.12, unit: 'in/s-pk', speedRpm: 2000, machineGroup: 2, foundation: 'rigid' });
  });
  bench('preBalanceInspection', () => {
    preBalanceInspection({ bearingEndPlayIn: 0.1, stubShaftRunoutIn: 0.01 });
  });
});
