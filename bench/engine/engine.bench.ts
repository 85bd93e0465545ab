/**
 * Operations per second of each engine method on representative inputs (vitest bench prints hz = ops/s).
 * The influence-coefficient solves are a group of their own, so that the summary gives their ratios in one run:
 * the two-plane solve with two sensors (the square system, solved in closed form) is meant to keep up with
 * single-plane balancing (issue 17: >= 1,000,000 a second where single-plane makes about 1,000,000).
 * For a bare loop without the harness, per CPU second, and a CPU profile: bench/engine/solve-loop.ts.
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
import { singlePlane, threeByFour, twoPlane } from './engine-inputs';

describe('influence-coefficient solves', () => {
  // Both inputs are built once, outside the measured call, so that the ratio compares the solves alone.
  bench('singlePlaneBalance', () => {
    singlePlaneBalance(singlePlane);
  });
  bench('multiPlaneBalance (2 planes, 2 sensors)', () => {
    multiPlaneBalance(twoPlane);
  });
  bench('multiPlaneBalance (3 planes, 4 sensors)', () => {
    multiPlaneBalance(threeByFour);
  });
});

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
  bench('trimRun', () => {
    trimRun({
      before: { amplitude: 3.5, phaseDeg: 60 },
      added: [{ mass: 4, angleDeg: 283 }],
      after: { amplitude: 0.4, phaseDeg: 200 },
    });
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
