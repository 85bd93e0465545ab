import type { CalcRequest, CalcResponse } from '@counterpoise/ng/api';
import type { BalanceSolverKind } from '@counterpoise/ng/solver';

/**
 * The balancing methods the calculator offers, simplest first. Each is named as the calculator API's route
 * that computes it (`@counterpoise/ng/api`), so a method has one name from the screen's code to the server.
 * `multi-plane` is offered in its two-plane case: two sensors, two correction planes.
 */
export const CALC_METHODS = ['one-run', 'single-plane', 'multi-plane', 'four-run'] as const;

/** A balancing method of the calculator, named as the calculator route that computes it. */
export type CalcMethod = (typeof CALC_METHODS)[number];

/** The request a method sends. */
export type MethodRequest<M extends CalcMethod> = CalcRequest<M>;

/** The answer a method gets. */
export type MethodResult<M extends CalcMethod> = CalcResponse<M>;

/** How the calculator names and explains a method. */
export interface MethodInfo {
  /** A few words for the method switch. */
  readonly label: string;
  /** One sentence: when to use it. */
  readonly description: string;
}

/**
 * The names and explanations of the methods, in the technician's words. The calculator offers the
 * `multi-plane` route in its two-plane case, so the technician reads "Two planes".
 */
export const METHOD_INFO: Readonly<Record<CalcMethod, MethodInfo>> = {
  'one-run': {
    label: 'Stored sensitivity',
    description: "One run, no trial weight: the machine family's stored sensitivity gives the correction.",
  },
  'single-plane': {
    label: 'Trial weight',
    description: 'One plane: a run without, then a run with a trial weight of known mass and angle.',
  },
  'multi-plane': {
    label: 'Two planes',
    description:
      'Two sensors and two correction planes: one trial weight per plane, both sensors read each run.',
  },
  'four-run': {
    label: 'Amplitude only',
    description: 'No phase reading: the initial amplitude, then the same trial weight at three positions.',
  },
};

/** The unit of every mass in one calculation. */
export type MassUnit = 'g' | 'oz';

/** The unit of every amplitude in one calculation. */
export type AmplitudeUnit = 'in/s' | 'mm/s';

/** A stored sensitivity of a machine family, in the calculator's units (mass per amplitude). */
export interface SensitivityPreset {
  /** Correction mass per unit of amplitude. */
  readonly massPerAmplitude: number;
  /** The family's phase offset in degrees; 0 puts the weight opposite the heavy spot. */
  readonly offsetDeg?: number;
}

/** A reading as typed: amplitude and phase, empty until entered. */
export interface ReadingDraft {
  /** Amplitude at 1x running speed, in the calculator's amplitude unit. */
  amplitude: number | null;
  /** Phase lag from the reference mark, in degrees. */
  phaseDeg: number | null;
}

/** A weight as typed: mass and angle. */
export interface WeightDraft {
  /** The mass, in the calculator's mass unit. */
  mass: number | null;
  /** The angle from the reference mark, in degrees. */
  angleDeg: number | null;
}

/** What the one-run form holds. */
export interface OneRunDraft {
  /** The reading of the run. */
  reading: ReadingDraft;
  /** The stored sensitivity of the machine family. */
  sensitivity: { massPerAmplitude: number | null; offsetDeg: number | null };
}

/** What the single-plane form holds. */
export interface SinglePlaneDraft {
  /** The reading without the trial weight. */
  initial: ReadingDraft;
  /** The trial weight. */
  trialWeight: WeightDraft;
  /** The reading with the trial weight on. */
  withTrial: ReadingDraft;
  /** Whether the trial weight comes off before the correction goes on. */
  trialWeightRemoved: boolean;
}

/**
 * One trial run of the multi-plane method as the calculator offers it (two planes): the trial weight in
 * its plane, and both sensors' readings.
 */
export interface MultiPlaneRunDraft {
  /** The trial weight of this run, in the run's plane (run 1 in plane 1, run 2 in plane 2). */
  trialWeight: WeightDraft;
  /** Sensor 1 and sensor 2. */
  readings: ReadingDraft[];
}

/** What the multi-plane form holds, in its two-plane case: two sensors, two correction planes. */
export interface MultiPlaneDraft {
  /** Sensor 1 and sensor 2 without weights. */
  initial: ReadingDraft[];
  /** The trial run of plane 1, then of plane 2. */
  runs: MultiPlaneRunDraft[];
  /** Whether each trial weight comes off before the next run. */
  trialWeightsRemoved: boolean;
}

/** One run of the amplitude-only method: where the trial weight sat, and the amplitude read. */
export interface AmplitudeRunDraft {
  /** The trial weight's angle, in degrees. */
  angleDeg: number | null;
  /** The amplitude read. */
  amplitude: number | null;
}

/** What the amplitude-only form holds. */
export interface FourRunDraft {
  /** The amplitude without a weight. */
  initialAmplitude: number | null;
  /** The mass of the trial weight. */
  trialMass: number | null;
  /** The trial weight at three positions. */
  trialRuns: AmplitudeRunDraft[];
}

/** Everything typed into the calculator, for every method: switching method loses nothing. */
export interface WeightCalculatorDraft {
  /** The method shown. */
  method: CalcMethod;
  /** The unit of the masses. */
  massUnit: MassUnit;
  /** The unit of the amplitudes. */
  amplitudeUnit: AmplitudeUnit;
  /** The stored-sensitivity form. */
  oneRun: OneRunDraft;
  /** The trial-weight form. */
  singlePlane: SinglePlaneDraft;
  /** The multi-plane form ("Two planes"). */
  multiPlane: MultiPlaneDraft;
  /** The amplitude-only form. */
  fourRun: FourRunDraft;
}

/** The key of each method's group in the draft. */
export const METHOD_GROUPS = {
  'one-run': 'oneRun',
  'single-plane': 'singlePlane',
  'multi-plane': 'multiPlane',
  'four-run': 'fourRun',
} as const satisfies Record<CalcMethod, keyof WeightCalculatorDraft>;

/** A weight where it can really go: a correction split onto allowed positions or outside blocked sectors. */
export interface CorrectionPlacement {
  /** The plane of the correction (1 for single-plane methods). */
  readonly plane: number;
  /** The weights that together make the correction, whole when it already sits on an allowed place. */
  readonly weights: readonly { readonly mass: number; readonly angleDeg: number }[];
  /** Mass placed over the mass of the ideal weight. */
  readonly massRatio: number;
  /** What the technician should know about the split. */
  readonly warnings: readonly string[];
}

/** A method's request and the engine's answer to it, before the corrections are placed. */
export type MethodAnswer = {
  [M in CalcMethod]: {
    /** The method used. */
    readonly method: M;
    /** The request sent to the engine. */
    readonly request: MethodRequest<M>;
    /** The engine's answer. */
    readonly result: MethodResult<M>;
  };
}[CalcMethod];

/** A finished calculation, as the `calculated` output reports it. */
export type WeightCalculation = {
  [M in CalcMethod]: {
    /** The method used. */
    readonly method: M;
    /** The request sent to the engine. */
    readonly request: MethodRequest<M>;
    /** The engine's answer. */
    readonly result: MethodResult<M>;
    /** The corrections split onto allowed places, when places were given. */
    readonly placements: readonly CorrectionPlacement[];
    /** Where it was computed. */
    readonly solver: BalanceSolverKind;
    /** The unit of the masses. */
    readonly massUnit: MassUnit;
    /** The unit of the amplitudes. */
    readonly amplitudeUnit: AmplitudeUnit;
  };
}[CalcMethod];

/**
 * The calculator's value as a form control (`[formControl]`, `formControlName`): what was typed, and the
 * calculation that matches it. A page keeps it with the job and hands it back through the form
 * (`setValue`, `reset`) to restore both.
 */
export interface WeightCalculatorValue {
  /** Everything typed, for every method, with the method and units it was typed in. */
  readonly draft: WeightCalculatorDraft;
  /**
   * The calculation of the draft's method for exactly these values, units and angle counting; null
   * while there is none or when a value changed since (the result is stale).
   */
  readonly calculation: WeightCalculation | null;
}

/** One field of the method shown that holds no usable value, as the `calculatorFields` error lists it. */
export interface WeightCalculatorFieldError {
  /** The field's path in the method's form, as the harness names it: `withTrial.phaseDeg`. */
  readonly field: string;
  /** The field's label: "Trial run phase". */
  readonly label: string;
  /** The part of the form it is in: "Run 2: trial weight on". */
  readonly section: string;
  /** What is wrong, in words a technician can act on: "Enter the trial run phase." */
  readonly message: string;
}

/**
 * The errors the calculator reports to its form control. `calculatorFields`: fields of the method shown
 * are empty or wrong. `calculatorNotComputed`: there is no calculation for the values typed (never
 * computed, or a value changed since).
 */
export interface WeightCalculatorErrors {
  /** The fields of the method shown that hold no usable value, in the order of the form. */
  readonly calculatorFields?: {
    readonly count: number;
    readonly fields: readonly WeightCalculatorFieldError[];
  };
  /** Set while there is no calculation for the values typed. */
  readonly calculatorNotComputed?: true;
}
