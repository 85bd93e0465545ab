import {
  add,
  averageAmplitudes,
  averageReadings,
  balanceTolerance,
  convertReadingPhase,
  convertVibration,
  ISO_10816_3_ZONE_LIMITS_MM_S_RMS,
  magnitude,
  multiply,
  phasor,
  type Phasor,
  phasorToReading,
  type Reading,
  readingToPhasor,
  refineFamilySensitivity,
  speedDrift,
  subtract,
  trimRun,
  weightSign,
  weightToModel,
  modelToWeight,
  normalizeAngleDeg,
} from '@counterpoise/engine';
import { calculate, type CalcResponse } from './calc-routes';
import type { FieldError } from './problem';
import {
  type AddRun,
  type CorrectionMethod,
  type InstalledWeight,
  isAmplitudeOnly,
  type Job,
  type JobCorrection,
  type JobRun,
  JOBS_PROBLEM_CODES,
} from './jobs';
import type { AcceptanceLevel, AmplitudeUnit, MachineSide, StoredSensitivity } from './records';

/*
 * What a job's steps compute, from what is stored, the same on the server and on the device: averages of repeated readings, corrections
 * through the calculator's own routes (so that a stored correction is the calculator's answer for the
 * same readings), predictions for what was installed, the verdict against the acceptance level, and the
 * coefficients a completed job measured. The balancing itself is the engine's; this is the glue that
 * picks the runs and readings.
 */

/** Sides in the order the engine numbers sensors: left first. */
const SIDE_ORDER: readonly MachineSide[] = ['left', 'right'];

/**
 * A change of a job refused by its rules, with what the server answers as its problem (status, title,
 * detail, the field errors and the problem's code). The server turns it into its problem answer in one
 * place; the device shows it the same way.
 */
export class JobChangeRefusal extends Error {
  override readonly name = 'JobChangeRefusal';

  constructor(
    readonly status: number,
    readonly title: string,
    readonly detail: string,
    readonly errors?: readonly FieldError[],
    readonly code?: string,
  ) {
    super(detail);
  }
}

/** The set-up of a job's instrument, as stored. */
export type JobSetup = NonNullable<Job['setup']>;
/** What the calculations read of a run (a stored run and the API's run both have it). */
export type RunFacts = Pick<
  JobRun,
  'id' | 'sequence' | 'kind' | 'trialWeight' | 'weightsOnRotor' | 'readings'
>;
/** What the calculations read of a correction. */
export type CorrectionFacts = Pick<
  JobCorrection,
  'id' | 'sequence' | 'method' | 'basis' | 'runIds' | 'calc' | 'result' | 'plan' | 'installed'
>;
/** A weight in a plane, at the plane's correction radius. */
export type PlaneWeight = JobRun['weightsOnRotor'][number];
/** A sensor's reading of a run: its repeats, their average and spread. */
export type SensorReading = JobRun['readings'][number];

/** A 409 the technician can act on. */
function notPossible(detail: string): JobChangeRefusal {
  return new JobChangeRefusal(409, 'Conflict', detail, undefined, JOBS_PROBLEM_CODES.methodNotPossible);
}

/** A reading as the engine counts phase (a lag), from the instrument's. */
export function toLag(reading: Reading, setup: JobSetup): Reading {
  return setup.phaseSense === 'lead' ? convertReadingPhase(reading, 'lead', 'lag') : reading;
}

/** A reading back in the instrument's phase counting. */
export function fromLag(reading: Reading, setup: JobSetup): Reading {
  return setup.phaseSense === 'lead' ? convertReadingPhase(reading, 'lag', 'lead') : reading;
}

/**
 * The readings of a run as stored: each sensor's repeats averaged as vectors (`averageReadings`) with
 * their spread, or for a run read without phase the plain mean of the amplitudes (`averageAmplitudes`),
 * and the warnings of repeats that disagree or a speed that drifted from the first run's (`speedDrift`,
 * 2 % by default, a product default).
 */
export function averageRun(
  readings: AddRun['readings'],
  referenceSpeedRpm: number | undefined,
): { readings: SensorReading[]; warnings: string[] } {
  const warnings: string[] = [];
  const amplitudeOnly = isAmplitudeOnly(readings);
  const stored = readings.map((sensor) => {
    const average = amplitudeOnly
      ? amplitudeAverage(sensor.repeats.map((repeat) => repeat.amplitude))
      : averageReadings({
          readings: sensor.repeats.map(({ amplitude, phaseDeg }) => ({ amplitude, phaseDeg: phaseDeg! })),
        });
    for (const warning of average.warnings)
      warnings.push(`${capitalised(sensor.sensorSide)} sensor: ${warning}`);
    const speedRpm = sensor.repeats.reduce((sum, repeat) => sum + repeat.speedRpm, 0) / sensor.repeats.length;
    return {
      sensorSide: sensor.sensorSide,
      repeats: sensor.repeats.map(({ amplitude, phaseDeg, speedRpm }) =>
        phaseDeg === undefined ? { amplitude, speedRpm } : { amplitude, phaseDeg, speedRpm },
      ),
      average: average.mean,
      spread: average.spread,
      spreadRatio: Number.isFinite(average.spreadRatio) ? average.spreadRatio : null,
      trusted: average.trusted,
      speedRpm,
    };
  });
  const speeds = readings.flatMap((sensor) => sensor.repeats.map((repeat) => repeat.speedRpm));
  const drift = speedDrift({
    speedsRpm: speeds,
    ...(referenceSpeedRpm === undefined ? {} : { referenceSpeedRpm }),
  });
  warnings.push(...drift.warnings);
  return { readings: stored, warnings };
}

/** The plain mean of amplitudes read without phase (`averageAmplitudes`), shaped as a stored average. */
function amplitudeAverage(amplitudes: number[]) {
  const average = averageAmplitudes({ amplitudes });
  return { ...average, mean: { amplitude: average.mean, phaseDeg: null } };
}

function capitalised(text: string): string {
  return `${text[0]!.toUpperCase()}${text.slice(1)}`;
}

/** The mean speed of a stored run. */
export function runSpeedRpm(run: Pick<RunFacts, 'readings'>): number {
  return run.readings.reduce((sum, reading) => sum + reading.speedRpm, 0) / run.readings.length;
}

/**
 * An installed weight as the plane's model sees it: the same unbalance (mass x radius) as a mass at the
 * plane's correction radius, at the same angle.
 */
export function equivalentAtPlane(weight: InstalledWeight, planeRadiiMm: readonly number[]): PlaneWeight {
  const radius = planeRadiiMm[weight.planeIndex];
  if (radius === undefined) {
    throw new JobChangeRefusal(400, 'Bad Request', 'The machine has no such plane.', [
      { path: 'weights', message: `The machine has ${planeRadiiMm.length} plane(s).` },
    ]);
  }
  return {
    planeIndex: weight.planeIndex,
    massGrams: (weight.massGrams * weight.radiusMm) / radius,
    angleDeg: weight.angleDeg,
  };
}

/** Every weight of this job installed so far, at its plane's radius. */
export function installedSoFar(
  corrections: readonly CorrectionFacts[],
  planeRadiiMm: readonly number[],
): PlaneWeight[] {
  return corrections.flatMap((correction) =>
    (correction.installed ?? []).map((weight) => equivalentAtPlane(weight, planeRadiiMm)),
  );
}

/** The sum of the weights in one plane, as a model phasor. */
function planeSum(weights: readonly PlaneWeight[], planeIndex: number, sign: 1 | -1): Phasor {
  return weights
    .filter((weight) => weight.planeIndex === planeIndex)
    .reduce<Phasor>((sum, weight) => add(sum, weightToModel(weight.massGrams, weight.angleDeg, sign)), {
      re: 0,
      im: 0,
    });
}

/** Whether a stored run was read without phase. */
export function runIsAmplitudeOnly(run: Pick<RunFacts, 'readings'>): boolean {
  return run.readings.every((reading) => reading.average.phaseDeg === null);
}

/**
 * The reading of one side in a run, or undefined when that sensor was not read. The methods that work
 * with phase refuse a run read without it (409, naming the run and the method that fits).
 */
function sideReading(run: RunFacts, side: MachineSide, setup: JobSetup): Reading | undefined {
  const found = run.readings.find((reading) => reading.sensorSide === side);
  if (found === undefined) return undefined;
  const { amplitude, phaseDeg } = found.average;
  if (phaseDeg === null) {
    throw notPossible(
      `Run ${run.sequence} was read without phase: this method needs the phase of every run it uses. ` +
        'Use four-run (amplitude only), or take the run again with phase.',
    );
  }
  return toLag({ amplitude, phaseDeg }, setup);
}

/** The last run that is not a trial: the initial run, or the latest verification. */
export function baseRun(runs: readonly RunFacts[]): RunFacts | undefined {
  return [...runs].reverse().find((run) => run.kind !== 'trial');
}

/** The side with the higher amplitude in a run (the one worked first), of the sides read. */
function worseSide(run: RunFacts): MachineSide {
  return [...run.readings].sort((a, b) => b.average.amplitude - a.average.amplitude)[0]!.sensorSide;
}

/** The plane a side's sensor answers most: its own plane on a two-plane rotor, the only one otherwise. */
function planeOfSide(side: MachineSide, planeCount: number): number {
  return planeCount === 2 && side === 'right' ? 1 : 0;
}

/** What a correction is computed from. */
export interface CorrectionContext {
  readonly method: CorrectionMethod;
  readonly setup: JobSetup;
  readonly planeRadiiMm: readonly number[];
  readonly runs: readonly RunFacts[];
  readonly corrections: readonly CorrectionFacts[];
  readonly familySensitivities: readonly StoredSensitivity[];
}

/** A correction as computed, ready to store. */
export type ComputedCorrection = Pick<
  JobCorrection,
  'method' | 'basis' | 'runIds' | 'calc' | 'result' | 'plan' | 'warnings'
>;

/** One calculator answer, or the engine's refusal as a 409 on the stored readings. */
function calc<Name extends CorrectionMethod>(name: Name, request: object): CalcResponse<Name> {
  const outcome = calculate(name, request);
  if (outcome.status === 200) return outcome.result as CalcResponse<Name>;
  throw new JobChangeRefusal(
    409,
    'Conflict',
    `The stored readings do not give a correction: ${outcome.problem.detail ?? outcome.problem.title}`,
    outcome.problem.errors,
    outcome.problem.code ?? JOBS_PROBLEM_CODES.methodNotPossible,
  );
}

/**
 * Computes a correction from the stored runs with the method asked for, through the calculator's routes:
 * - `one-run`: the latest reading of the worse side and the family's stored sensitivity for that sensor
 *   and plane (converted to the job's unit);
 * - `single-plane`: from the initial run and the latest trial run in the plane (`trial`), or, once a
 *   correction has been fitted and verified, from the run before it and the verification run with the
 *   weights added between them as the trial (`trim`: the engine's `trimRun` relation);
 * - `multi-plane`: both sensors, the initial run, every trial run and every verification run (with the
 *   job's weights on the rotor during each): more runs than planes are fitted by least squares.
 * The plan is what to add now, on top of the weights already fitted.
 */
export function computeCorrection(context: CorrectionContext): ComputedCorrection {
  const { setup, runs, planeRadiiMm } = context;
  const sign = weightSign(setup.weightAngles);
  const initial = runs.find((run) => run.kind === 'initial');
  if (initial === undefined) throw notPossible('Take the initial run first.');
  const base = baseRun(runs)!;
  const onRotor = installedSoFar(context.corrections, planeRadiiMm);
  if (onRotor.length !== base.weightsOnRotor.length) {
    throw notPossible('Weights were fitted since the last run: take a verification run with them on first.');
  }
  const weightAngles = setup.weightAngles;
  const planeCount = planeRadiiMm.length;

  if (context.method === 'four-run') return fourRunCorrection(base, runs, planeCount);

  if (context.method === 'one-run') {
    const side = worseSide(base);
    const planeIndex = planeOfSide(side, planeCount);
    const figure = context.familySensitivities.find(
      (stored) => stored.sensorSide === side && stored.planeIndex === planeIndex,
    );
    if (figure === undefined) {
      throw notPossible(
        `The machine's family has no stored sensitivity for the ${side} sensor and plane ${planeIndex}: ` +
          'use a trial weight.',
      );
    }
    const massPerAmplitude = figure.gramsPerUnit * convertVibration(1, setup.amplitudeUnit, figure.unit);
    const request = {
      reading: sideReading(base, side, setup)!,
      sensitivity: { massPerAmplitude, offsetDeg: figure.phaseLagDeg },
      weightAngles,
    };
    const result = calc('one-run', request);
    return {
      method: 'one-run',
      basis: 'sensitivity',
      runIds: [base.id],
      calc: { route: 'one-run', request, sensorSides: [side] },
      result,
      plan: [{ planeIndex, massGrams: result.correction.mass, angleDeg: result.correction.angleDeg }],
      warnings: [...result.warnings],
    };
  }

  if (context.method === 'single-plane') {
    const side = worseSide(base);
    const planeIndex = planeOfSide(side, planeCount);
    if (base.kind === 'verification') {
      const before = [...runs].reverse().find((run) => run.kind !== 'trial' && run.sequence < base.sequence)!;
      const added = subtract(
        planeSum(base.weightsOnRotor, planeIndex, sign),
        planeSum(before.weightsOnRotor, planeIndex, sign),
      );
      const beforeReading = sideReading(before, side, setup);
      const afterReading = sideReading(base, side, setup);
      if (magnitude(added) === 0 || beforeReading === undefined || afterReading === undefined) {
        throw notPossible(
          `No weight was added in plane ${planeIndex} between runs ${before.sequence} and ${base.sequence}, ` +
            `or the ${side} sensor was not read in both: the trim cannot be computed.`,
        );
      }
      const addedWeight = modelToWeight(added, sign);
      const request = {
        initial: beforeReading,
        trialWeight: { mass: addedWeight.mass, angleDeg: addedWeight.angleDeg },
        withTrial: afterReading,
        trialWeightRemoved: false,
        weightAngles,
      };
      const result = calc('single-plane', request);
      const previous = latestCoefficient(context.corrections, side, planeIndex);
      const trim = trimRun({
        before: beforeReading,
        added: [addedWeight],
        after: afterReading,
        weightAngles,
        ...(previous === undefined ? {} : { previous }),
      });
      return {
        method: 'single-plane',
        basis: 'trim',
        runIds: [before.id, base.id],
        calc: { route: 'single-plane', request, sensorSides: [side] },
        result,
        plan: [{ planeIndex, massGrams: result.correction.mass, angleDeg: result.correction.angleDeg }],
        warnings: [...new Set([...result.warnings, ...trim.warnings])],
      };
    }
    const trial = [...runs]
      .reverse()
      .find((run) => run.kind === 'trial' && run.trialWeight?.planeIndex === planeIndex);
    if (trial === undefined) {
      throw notPossible(`Take a trial run with a trial weight in plane ${planeIndex} first.`);
    }
    const withTrial = sideReading(trial, side, setup);
    if (withTrial === undefined) {
      throw notPossible(`The trial run ${trial.sequence} has no reading of the ${side} sensor.`);
    }
    const request = {
      initial: sideReading(initial, side, setup)!,
      trialWeight: { mass: trial.trialWeight!.massGrams, angleDeg: trial.trialWeight!.angleDeg },
      withTrial,
      weightAngles,
    };
    const result = calc('single-plane', request);
    return {
      method: 'single-plane',
      basis: 'trial',
      runIds: [initial.id, trial.id],
      calc: { route: 'single-plane', request, sensorSides: [side] },
      result,
      plan: [{ planeIndex, massGrams: result.correction.mass, angleDeg: result.correction.angleDeg }],
      warnings: [...result.warnings],
    };
  }

  // Two planes: every sensor, every trial and verification run.
  if (planeCount < 2) throw notPossible('The machine has one plane: use single-plane or one-run.');
  const sides = SIDE_ORDER.filter((side) => initial.readings.some((reading) => reading.sensorSide === side));
  if (sides.length < planeCount) {
    throw notPossible('Two planes need both sensors read in the initial run.');
  }
  const used = runs.filter((run) => run.kind !== 'initial');
  for (let plane = 0; plane < planeCount; plane++) {
    if (!used.some((run) => run.kind === 'trial' && run.trialWeight?.planeIndex === plane)) {
      throw notPossible(`Take a trial run with a trial weight in plane ${plane} first.`);
    }
  }
  const readingsOf = (run: RunFacts): Reading[] =>
    sides.map((side) => {
      const reading = sideReading(run, side, setup);
      if (reading === undefined)
        throw notPossible(`Run ${run.sequence} has no reading of the ${side} sensor.`);
      return reading;
    });
  const request = {
    planes: planeCount,
    initial: readingsOf(initial),
    runs: used.map((run) => ({
      weights: [...run.weightsOnRotor, ...(run.trialWeight ? [run.trialWeight] : [])].map((weight) => ({
        plane: weight.planeIndex + 1,
        mass: weight.massGrams,
        angleDeg: weight.angleDeg,
      })),
      readings: readingsOf(run),
    })),
    weightAngles,
  };
  const result = calc('multi-plane', request);
  const plan = result.corrections.map((correction) => {
    const planeIndex = correction.plane - 1;
    const toAdd = subtract(
      weightToModel(correction.mass, correction.angleDeg, sign),
      planeSum(onRotor, planeIndex, sign),
    );
    const weight = modelToWeight(toAdd, sign);
    return { planeIndex, massGrams: weight.mass, angleDeg: weight.angleDeg };
  });
  return {
    method: 'multi-plane',
    basis: used.some((run) => run.kind === 'verification') ? 'trim' : 'trial',
    runIds: [initial.id, ...used.map((run) => run.id)],
    calc: { route: 'multi-plane', request, sensorSides: sides },
    result,
    plan,
    warnings: [...result.warnings],
  };
}

/** Angles closer than this are one trial position (the typed angles have a tenth of a degree). */
const SAME_POSITION_DEG = 0.05;

function angleApartDeg(a: number, b: number): number {
  const apart = Math.abs(normalizeAngleDeg(a - b));
  return Math.min(apart, 360 - apart);
}

/**
 * Amplitude only (`four-run`): the worse (or only) side of the base run (the initial run, or the latest
 * verification) and the three latest trial runs after it that were read without phase, in that side's
 * plane, with the latest trial run's mass at three distinct angles (a later run at an angle already taken
 * replaces the earlier one). Angles are as the trial weights were counted; the correction is counted the
 * same way. A 409 names what is missing.
 */
function fourRunCorrection(
  base: RunFacts,
  runs: readonly RunFacts[],
  planeCount: number,
): ComputedCorrection {
  const side = worseSide(base);
  const planeIndex = planeOfSide(side, planeCount);
  const baseName =
    base.kind === 'initial' ? `the initial run (run ${base.sequence})` : `run ${base.sequence}`;
  if (!runIsAmplitudeOnly(base)) {
    throw notPossible(
      `Amplitude only needs ${baseName} read without phase; it was read with phase. Take the run again ` +
        'as amplitude only, or use a method with phase.',
    );
  }
  const trials = runs.filter(
    (run) =>
      run.kind === 'trial' &&
      run.sequence > base.sequence &&
      run.trialWeight?.planeIndex === planeIndex &&
      runIsAmplitudeOnly(run) &&
      run.readings.some((reading) => reading.sensorSide === side),
  );
  const latestMass = trials.at(-1)?.trialWeight!.massGrams;
  const chosen: RunFacts[] = [];
  const replaced: RunFacts[] = [];
  for (const run of [...trials].reverse()) {
    if (run.trialWeight!.massGrams !== latestMass || chosen.length === 3) continue;
    const same = chosen.find(
      (other) => angleApartDeg(other.trialWeight!.angleDeg, run.trialWeight!.angleDeg) < SAME_POSITION_DEG,
    );
    if (same === undefined) chosen.push(run);
    else replaced.push(run);
  }
  chosen.reverse();
  if (chosen.length < 3) {
    const missing = 3 - chosen.length;
    const have =
      chosen.length === 0
        ? 'no amplitude-only trial run after it'
        : `${chosen.length === 1 ? 'a trial run' : 'trial runs'} with ${latestMass} g at ` +
          chosen.map((run) => `${run.trialWeight!.angleDeg}° (run ${run.sequence})`).join(' and ');
    const sameAngle =
      replaced.length === 0
        ? ''
        : ` Run ${replaced.map((run) => run.sequence).join(' and ')} had the trial weight at an angle ` +
          'already taken, so the later run at that angle counts.';
    throw notPossible(
      `Amplitude only needs ${baseName} and the same trial weight at three positions in plane ${planeIndex} ` +
        `(the ${side} sensor’s), each read without phase: this job has ${have}. Take ` +
        `${missing === 1 ? 'one more trial run' : `${missing} more trial runs`}` +
        `${latestMass === undefined ? '' : ` with ${latestMass} g`} at ${missing === 3 ? 'three positions' : 'another position'}` +
        ` (e.g. 0°, 120°, 240°).${sameAngle}`,
    );
  }
  const amplitudeOf = (run: RunFacts) =>
    run.readings.find((reading) => reading.sensorSide === side)!.average.amplitude;
  const request = {
    initialAmplitude: amplitudeOf(base),
    trialMass: latestMass!,
    trialRuns: chosen.map((run) => ({ angleDeg: run.trialWeight!.angleDeg, amplitude: amplitudeOf(run) })),
  };
  const result = calc('four-run', request);
  return {
    method: 'four-run',
    basis: base.kind === 'verification' ? 'trim' : 'trial',
    runIds: [base.id, ...chosen.map((run) => run.id)],
    calc: { route: 'four-run', request, sensorSides: [side] },
    result,
    plan: [{ planeIndex, massGrams: result.correction.mass, angleDeg: result.correction.angleDeg }],
    warnings: [...result.warnings],
  };
}

/**
 * The amplitude a four-run correction's model predicts with `weights` on its plane: the weights summed as
 * vectors (mass M at angle phi) act as the trial weight scaled by M / m_trial, so
 * A^2 = O^2 + (T M / m_trial)^2 + 2 O (T M / m_trial) cos(phi - delta), the law of cosines of the four-run
 * model (`fourRunBalance`), with O the base amplitude and T, delta the trial's effect.
 */
export function fourRunPredictedAmplitude(
  request: { initialAmplitude: number; trialMass: number },
  trialEffect: { amplitude: number; angleDeg: number },
  weights: readonly { massGrams: number; angleDeg: number }[],
): number {
  const sum = weights.reduce((total, weight) => add(total, phasor(weight.massGrams, weight.angleDeg)), {
    re: 0,
    im: 0,
  } as Phasor);
  const effect = (trialEffect.amplitude * magnitude(sum)) / request.trialMass;
  const angleRad = Math.atan2(sum.im, sum.re) - (trialEffect.angleDeg * Math.PI) / 180;
  const o = request.initialAmplitude;
  return Math.sqrt(Math.max(0, o * o + effect * effect + 2 * o * effect * Math.cos(angleRad)));
}

/** An influence coefficient of one sensor for one plane, in the engine's model (per gram). */
export interface SideCoefficient {
  readonly sensorSide: MachineSide;
  readonly planeIndex: number;
  readonly amplitudePerMass: number;
  readonly phaseDeg: number;
}

/** The influence coefficients a stored correction stands on. */
export function coefficientsOf(
  correction: Pick<CorrectionFacts, 'calc' | 'result' | 'plan'>,
): SideCoefficient[] {
  const { route, request, sensorSides } = correction.calc;
  // Amplitudes alone measure the trial's effect but no phase: no influence coefficient to keep.
  if (route === 'four-run') return [];
  if (route === 'one-run') {
    const sensitivity = (request as { sensitivity: { massPerAmplitude: number; offsetDeg: number } })
      .sensitivity;
    return [
      {
        sensorSide: sensorSides[0]!,
        planeIndex: correction.plan[0]!.planeIndex,
        amplitudePerMass: 1 / sensitivity.massPerAmplitude,
        phaseDeg: sensitivity.offsetDeg,
      },
    ];
  }
  if (route === 'single-plane') {
    const coefficient = (correction.result as CalcResponse<'single-plane'>).influenceCoefficient;
    return [{ sensorSide: sensorSides[0]!, planeIndex: correction.plan[0]!.planeIndex, ...coefficient }];
  }
  return (correction.result as CalcResponse<'multi-plane'>).influenceCoefficients.map((coefficient) => ({
    sensorSide: sensorSides[coefficient.sensor - 1]!,
    planeIndex: coefficient.plane - 1,
    amplitudePerMass: coefficient.amplitudePerMass,
    phaseDeg: coefficient.phaseDeg,
  }));
}

/**
 * What a four-run correction measured of the rotor's response: the size of the influence coefficient
 * alone, |H| = T / m_trial (the trial's effect per gram), without its phase. Enough to read a balance
 * grade as an amplitude; never kept as a coefficient (no phase to refine a family's figure with).
 */
export function fourRunSensitivity(
  correction: Pick<CorrectionFacts, 'calc' | 'result' | 'plan'>,
): Omit<SideCoefficient, 'phaseDeg'>[] {
  const request = correction.calc.request as { trialMass: number };
  const effect = (correction.result as CalcResponse<'four-run'>).trialEffect;
  return [
    {
      sensorSide: correction.calc.sensorSides[0]!,
      planeIndex: correction.plan[0]!.planeIndex,
      amplitudePerMass: effect.amplitude / request.trialMass,
    },
  ];
}

/** The coefficient of a side and plane in the latest correction that measured it, if any. */
function latestCoefficient(corrections: readonly CorrectionFacts[], side: MachineSide, planeIndex: number) {
  for (const correction of [...corrections].reverse()) {
    if (correction.basis === 'sensitivity') continue;
    const found = coefficientsOf(correction).find(
      (coefficient) => coefficient.sensorSide === side && coefficient.planeIndex === planeIndex,
    );
    if (found) return { amplitudePerMass: found.amplitudePerMass, phaseDeg: found.phaseDeg };
  }
  return undefined;
}

/**
 * The reading each sensor of a correction should show once `installed` is on: the base run's reading
 * (the last run without a trial weight that the correction used) plus the model's effect of the installed
 * weights, V + sum_p H_p w_p, in the instrument's phase counting.
 */
export function predictInstalled(
  correction: Pick<CorrectionFacts, 'calc' | 'result' | 'plan' | 'runIds'>,
  installed: readonly InstalledWeight[],
  runs: readonly RunFacts[],
  setup: JobSetup,
  planeRadiiMm: readonly number[],
): { sensorSide: MachineSide; reading: { amplitude: number; phaseDeg: number | null } }[] {
  const sign = weightSign(setup.weightAngles);
  const used = runs.filter((run) => correction.runIds.includes(run.id));
  const base = baseRun(used);
  if (base === undefined) throw new Error('A correction always uses a run without a trial weight.');
  const weights = installed.map((weight) => equivalentAtPlane(weight, planeRadiiMm));
  if (correction.calc.route === 'four-run') {
    const planeIndex = correction.plan[0]!.planeIndex;
    const amplitude = fourRunPredictedAmplitude(
      correction.calc.request as { initialAmplitude: number; trialMass: number },
      (correction.result as CalcResponse<'four-run'>).trialEffect,
      weights.filter((weight) => weight.planeIndex === planeIndex),
    );
    return correction.calc.sensorSides.map((side) => ({
      sensorSide: side,
      reading: { amplitude, phaseDeg: null },
    }));
  }
  const coefficients = coefficientsOf(correction);
  return correction.calc.sensorSides.map((side) => {
    let predicted = readingToPhasor(sideReading(base, side, setup)!);
    for (const coefficient of coefficients.filter((c) => c.sensorSide === side)) {
      const effect = multiply(
        phasor(coefficient.amplitudePerMass, coefficient.phaseDeg),
        planeSum(weights, coefficient.planeIndex, sign),
      );
      predicted = add(predicted, effect);
    }
    return { sensorSide: side, reading: fromLag(phasorToReading(predicted), setup) };
  });
}

/** The acceptance level as an amplitude limit in the job's unit, or null when it cannot be read so. */
function amplitudeLimit(
  level: AcceptanceLevel,
  unit: AmplitudeUnit,
  side: MachineSide,
  grade: { rotorMassKg: number | null; speedRpm: number; planeRadiiMm: readonly number[] },
  coefficients: readonly Omit<SideCoefficient, 'phaseDeg'>[],
): number | null {
  if (level.kind === 'shop-target') return convertVibration(level.amplitude, level.unit, unit);
  if (level.kind === 'severity-zone') {
    const [ab, bc] = ISO_10816_3_ZONE_LIMITS_MM_S_RMS[level.group][level.foundation];
    return convertVibration(level.zone === 'A' ? ab : bc, 'mm/s-rms', unit);
  }
  // A balance grade is a permissible unbalance per plane: as an amplitude, U_per / r x |H| of the side.
  const planeIndex = planeOfSide(side, grade.planeRadiiMm.length);
  const coefficient = coefficients.find((c) => c.sensorSide === side && c.planeIndex === planeIndex);
  if (grade.rotorMassKg === null || coefficient === undefined) return null;
  const radiusMm = grade.planeRadiiMm[planeIndex]!;
  const tolerance = balanceTolerance({
    grade: level.grade,
    rotorMassKg: grade.rotorMassKg,
    speedRpm: grade.speedRpm,
  });
  const perPlaneGmm =
    grade.planeRadiiMm.length === 1
      ? tolerance.permissibleUnbalanceGmm
      : (tolerance.planes[planeIndex]?.permissibleUnbalanceGmm ?? tolerance.permissibleUnbalanceGmm / 2);
  return (perPlaneGmm / radiusMm) * coefficient.amplitudePerMass;
}

/** The verdict on a run against the acceptance level, with the side to work next and why. */
export function verdictOf(
  run: RunFacts,
  level: AcceptanceLevel,
  setup: JobSetup,
  grade: { rotorMassKg: number | null; speedRpm: number; planeRadiiMm: readonly number[] },
  corrections: readonly CorrectionFacts[],
) {
  const measured = corrections
    .filter((c) => c.basis !== 'sensitivity')
    .flatMap((c) => (c.calc.route === 'four-run' ? fourRunSensitivity(c) : coefficientsOf(c)));
  const unit = setup.amplitudeUnit;
  const sides = SIDE_ORDER.flatMap((side) => {
    const reading = run.readings.find((r) => r.sensorSide === side);
    if (reading === undefined) return [];
    const limit = amplitudeLimit(level, unit, side, grade, measured);
    const amplitude = reading.average.amplitude;
    return [{ sensorSide: side, amplitude, limit, accepted: limit !== null && amplitude <= limit }];
  });
  const open = sides.filter((side) => !side.accepted).sort((a, b) => b.amplitude - a.amplitude);
  const format = (value: number) => `${Number(value.toPrecision(3))} ${unit}`;
  let why: string;
  const next = open[0];
  if (next === undefined) {
    why = `Every side is within the acceptance level (${sides
      .map((side) => `${side.sensorSide} ${format(side.amplitude)} ≤ ${format(side.limit!)}`)
      .join(', ')}).`;
  } else if (next.limit === null) {
    why =
      `The ${next.sensorSide} side cannot be judged against the balance grade yet: it needs the rotor's mass ` +
      'and an influence coefficient measured with a trial weight.';
  } else {
    const other = sides.find((side) => side.sensorSide !== next.sensorSide);
    why =
      `The ${next.sensorSide} side reads ${format(next.amplitude)}, above its limit of ${format(next.limit)}` +
      (other === undefined
        ? '.'
        : other.accepted
          ? `; the ${other.sensorSide} side is within its limit.`
          : `, and above the ${other.sensorSide} side (${format(other.amplitude)}): work the worse side first.`);
  }
  return {
    runId: run.id,
    acceptance: level,
    sides,
    accepted: open.length === 0 && sides.length > 0,
    nextSide: next?.sensorSide ?? null,
    why,
  };
}

/**
 * The influence coefficients a job measured, in its unit per gram: from the latest two-plane correction,
 * else from the latest verification against the run before it (the last fitted weights as a trim run,
 * `trimRun`), else from the latest trial-weight correction. A job balanced by a stored sensitivity
 * alone, never verified, measured nothing.
 */
export function measuredCoefficients(
  runs: readonly RunFacts[],
  corrections: readonly CorrectionFacts[],
  setup: JobSetup,
  planeRadiiMm: readonly number[],
): SideCoefficient[] {
  const latest = [...corrections].reverse().find((correction) => correction.basis !== 'sensitivity');
  if (latest?.method === 'multi-plane') return coefficientsOf(latest);
  const sign = weightSign(setup.weightAngles);
  const base = baseRun(runs);
  if (base?.kind === 'verification' && latest?.method !== 'four-run' && !runIsAmplitudeOnly(base)) {
    const before = [...runs].reverse().find((run) => run.kind !== 'trial' && run.sequence < base.sequence);
    const side = corrections.at(-1)?.calc.sensorSides[0] ?? worseSide(base);
    const planeIndex = planeOfSide(side, planeRadiiMm.length);
    const added = before
      ? subtract(
          planeSum(base.weightsOnRotor, planeIndex, sign),
          planeSum(before.weightsOnRotor, planeIndex, sign),
        )
      : { re: 0, im: 0 };
    const beforeReading =
      before && !runIsAmplitudeOnly(before) ? sideReading(before, side, setup) : undefined;
    const afterReading = sideReading(base, side, setup);
    if (magnitude(added) > 0 && beforeReading && afterReading) {
      try {
        const trim = trimRun({
          before: beforeReading,
          added: [modelToWeight(added, sign)],
          after: afterReading,
          weightAngles: setup.weightAngles,
        });
        return [{ sensorSide: side, planeIndex, ...trim.influenceCoefficient }];
      } catch {
        // A verification that did not move the reading measured nothing; fall back to the trial.
      }
    }
  }
  return latest === undefined ? [] : coefficientsOf(latest);
}

/**
 * A family's stored sensitivities refined with every completed job's coefficients (this one's included):
 * `refineFamilySensitivity` per sensor and plane (vector mean, count, spread, outliers set aside), in the
 * unit of the figure already stored (the job's unit for a new one). The spread's phase is the angle a
 * vector of that relative size subtends, asin(spread), capped at 180 degrees.
 */
export function refinedSensitivities(
  stored: readonly StoredSensitivity[],
  jobCoefficients: readonly {
    sensorSide: MachineSide;
    planeIndex: number;
    amplitudePerGram: number;
    phaseDeg: number;
    unit: AmplitudeUnit;
  }[],
  fallbackUnit: AmplitudeUnit,
): StoredSensitivity[] {
  const keys = new Set(jobCoefficients.map((c) => `${c.sensorSide}/${c.planeIndex}`));
  const next = stored.filter((figure) => !keys.has(`${figure.sensorSide}/${figure.planeIndex}`));
  for (const key of [...keys].sort()) {
    const [side, plane] = key.split('/') as [MachineSide, string];
    const planeIndex = Number(plane);
    const unit =
      stored.find((f) => f.sensorSide === side && f.planeIndex === planeIndex)?.unit ?? fallbackUnit;
    const coefficients = jobCoefficients
      .filter((c) => c.sensorSide === side && c.planeIndex === planeIndex)
      .map((c) => ({
        amplitudePerMass: convertVibration(c.amplitudePerGram, c.unit, unit),
        phaseDeg: c.phaseDeg,
      }));
    const refined = refineFamilySensitivity({ coefficients });
    next.push({
      sensorSide: side,
      planeIndex,
      gramsPerUnit: refined.sensitivity.massPerAmplitude,
      unit,
      phaseLagDeg: normalizeAngleDeg(refined.sensitivity.offsetDeg),
      jobCount: refined.count,
      spread:
        refined.count < 2
          ? null
          : {
              massPercent: refined.spreadRatio * 100,
              phaseDeg: Math.min(180, (Math.asin(Math.min(1, refined.spreadRatio)) * 180) / Math.PI),
            },
    });
  }
  return next.sort((a, b) => a.planeIndex - b.planeIndex || a.sensorSide.localeCompare(b.sensorSide));
}
