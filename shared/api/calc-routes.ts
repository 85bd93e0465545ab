import type * as z from 'zod';
import {
  balanceTolerance,
  combineWeights,
  EngineError,
  fourRunBalance,
  moveToRadius,
  multiPlaneBalance,
  oneRunCorrection,
  singlePlaneBalance,
  splitWeight,
  trialWeightSize,
  vibrationSeverity,
} from '@counterpoise/engine';
import {
  CombineRequestSchema,
  CombineResponseSchema,
  FourRunRequestSchema,
  FourRunResponseSchema,
  MultiPlaneRequestSchema,
  MultiPlaneResponseSchema,
  OneRunRequestSchema,
  OneRunResponseSchema,
  RadiusRequestSchema,
  RadiusResponseSchema,
  SeverityRequestSchema,
  SeverityResponseSchema,
  SinglePlaneRequestSchema,
  SinglePlaneResponseSchema,
  SplitRequestSchema,
  SplitResponseSchema,
  ToleranceRequestSchema,
  ToleranceResponseSchema,
  TrialWeightRequestSchema,
  TrialWeightResponseSchema,
} from './calc';
import { fieldErrorsOf, formatPath } from './field-errors';
import type { Problem } from './problem';

/** One calculator route: its schemas, what it computes, and the example its documentation shows. */
export interface CalcRoute<Request extends z.ZodType, Response extends z.ZodType> {
  readonly summary: string;
  readonly description: string;
  readonly request: Request;
  readonly response: Response;
  /** Computes the answer from a request that `request` has accepted; throws `EngineError`. */
  readonly compute: (body: z.output<Request>) => z.output<Response>;
  /** A realistic request, shown in the API reference; its answer is computed, never written by hand. */
  readonly example: z.input<Request>;
}

const route = <Request extends z.ZodType, Response extends z.ZodType>(
  definition: CalcRoute<Request, Response>,
) => definition;

/**
 * Every calculator route by name (`POST /api/v1/calc/<name>`). The server, the batch route and the widget
 * library's local engine all compute through this table, so an answer is the same online and offline.
 */
export const CALC_ROUTES = {
  'one-run': route({
    summary: 'Correction from a stored sensitivity',
    description:
      'One run, no trial weight: mass = sensitivity × amplitude, placed opposite the heavy spot (offset 0) ' +
      'or turned by the stored offset. The sensitivity is data of one machine family.',
    request: OneRunRequestSchema,
    response: OneRunResponseSchema,
    compute: (body) => {
      const { correction, heavySpotDeg, warnings } = oneRunCorrection(body);
      return { correction, heavySpotDeg, warnings };
    },
    example: { reading: { amplitude: 0.38, phaseDeg: 212 }, sensitivity: { massPerAmplitude: 200 } },
  }),
  'single-plane': route({
    summary: 'Single plane with a trial weight',
    description:
      'Influence coefficient from the readings without and with a trial weight; the correction, and the ' +
      'residual it should leave. With `trialWeightRemoved: false`, `correction` is what to add to the ' +
      'trial weight left on.',
    request: SinglePlaneRequestSchema,
    response: SinglePlaneResponseSchema,
    compute: (body) => {
      const result = singlePlaneBalance(body);
      return {
        influenceCoefficient: result.influenceCoefficient,
        correction: result.correction,
        totalCorrection: result.totalCorrection,
        trialEffect: result.trialEffect,
        predictedResidual: result.predictedResidual,
        warnings: result.warnings,
      };
    },
    example: {
      initial: { amplitude: 0.52, phaseDeg: 74 },
      trialWeight: { mass: 60, angleDeg: 0 },
      withTrial: { amplitude: 0.31, phaseDeg: 141 },
    },
  }),
  'multi-plane': route({
    summary: 'Several planes and sensors',
    description:
      'Influence coefficients with cross effects. Each run lists every weight on the rotor during it, so ' +
      'trial weights left on are handled. Exact when sensors equal planes, least squares with more ' +
      'sensors; the condition number says how well the runs separate the planes.',
    request: MultiPlaneRequestSchema,
    response: MultiPlaneResponseSchema,
    compute: (body) => {
      const result = multiPlaneBalance(body);
      return {
        corrections: result.corrections,
        toAdd: result.toAdd,
        influenceCoefficients: result.influenceCoefficients,
        conditionNumber: result.conditionNumber,
        predictedResidual: result.predictedResidual,
        warnings: result.warnings,
      };
    },
    example: {
      planes: 2,
      initial: [
        { amplitude: 0.46, phaseDeg: 38 },
        { amplitude: 0.29, phaseDeg: 301 },
      ],
      runs: [
        {
          weights: [{ plane: 1, mass: 80, angleDeg: 0 }],
          readings: [
            { amplitude: 0.27, phaseDeg: 84 },
            { amplitude: 0.33, phaseDeg: 280 },
          ],
        },
        {
          weights: [{ plane: 2, mass: 80, angleDeg: 0 }],
          readings: [
            { amplitude: 0.41, phaseDeg: 22 },
            { amplitude: 0.12, phaseDeg: 355 },
          ],
        },
      ],
    },
  }),
  'four-run': route({
    summary: 'Amplitude only: trial weight at three positions',
    description:
      'For readings without phase: the initial amplitude, then the same trial weight at three or more ' +
      'angles. Least squares over the runs; `consistency` shows how well they agree (0 is perfect).',
    request: FourRunRequestSchema,
    response: FourRunResponseSchema,
    compute: (body) => {
      const result = fourRunBalance(body);
      return {
        correction: result.correction,
        trialEffect: result.trialEffect,
        consistency: result.consistency,
        fittedAmplitudes: result.fittedAmplitudes,
        warnings: result.warnings,
      };
    },
    example: {
      initialAmplitude: 0.45,
      trialMass: 50,
      trialRuns: [
        { angleDeg: 0, amplitude: 0.62 },
        { angleDeg: 120, amplitude: 0.21 },
        { angleDeg: 240, amplitude: 0.55 },
      ],
    },
  }),
  split: route({
    summary: 'Split a weight onto the positions where it fits',
    description:
      'Splits a weight between the two allowed positions either side of it: explicit angles, N equally ' +
      'spaced positions, or allowed sectors. A weight already on an allowed place is kept whole.',
    request: SplitRequestSchema,
    response: SplitResponseSchema,
    compute: (body) => {
      const { weights, massRatio, warnings } = splitWeight(body);
      return { weights, massRatio, warnings };
    },
    example: { weight: { mass: 84, angleDeg: 100 }, positions: { count: 12, firstDeg: 0 } },
  }),
  combine: route({
    summary: 'Combine several weights into one',
    description:
      'The single weight with the same unbalance as several, at their radii (all or none give one). ' +
      'Useful to replace a pile of old weights.',
    request: CombineRequestSchema,
    response: CombineResponseSchema,
    compute: (body) => {
      const { weight, warnings } = combineWeights(body);
      return { weight, warnings };
    },
    example: {
      weights: [
        { mass: 40, angleDeg: 30, radius: 250 },
        { mass: 25, angleDeg: 95, radius: 200 },
      ],
      radius: 250,
    },
  }),
  radius: route({
    summary: 'Move a weight to another radius',
    description: 'The mass with the same unbalance at another radius: m₂ = m₁ r₁ / r₂.',
    request: RadiusRequestSchema,
    response: RadiusResponseSchema,
    compute: (body) => ({ ...moveToRadius(body), warnings: [] }),
    example: { mass: 120, fromRadius: 180, toRadius: 240 },
  }),
  'trial-weight': route({
    summary: 'Size a trial weight',
    description:
      'A trial weight whose centrifugal force at the running speed is a fraction (default 10 %) of the ' +
      'weight of the rotor, or of the share of it on the bearing next to the plane.',
    request: TrialWeightRequestSchema,
    response: TrialWeightResponseSchema,
    compute: (body) => trialWeightSize(body),
    example: { rotorMassKg: 320, speedRpm: 2100, radiusMm: 260 },
  }),
  tolerance: route({
    summary: 'Balance tolerance by ISO 21940-11',
    description:
      'Permissible residual unbalance and specific unbalance for a balance quality grade, mass and speed; ' +
      'its allocation to two planes from the bearing distances, and as a mass at the correction radius.',
    request: ToleranceRequestSchema,
    response: ToleranceResponseSchema,
    compute: (body) => {
      const result = balanceTolerance(body);
      return {
        grade: result.grade,
        permissibleUnbalanceGmm: result.permissibleUnbalanceGmm,
        specificUnbalanceUm: result.specificUnbalanceUm,
        planes: result.planes,
        ...(result.massAtRadiusGrams === undefined ? {} : { massAtRadiusGrams: result.massAtRadiusGrams }),
        ...(result.pass === undefined ? {} : { pass: result.pass }),
        warnings: result.warnings,
      };
    },
    example: {
      grade: 'G16',
      rotorMassKg: 320,
      speedRpm: 2100,
      radiusMm: 260,
      bearingDistancesMm: { a: 900, b: 1100 },
    },
  }),
  severity: route({
    summary: 'Vibration units and severity',
    description:
      'A vibration value in every unit (velocity, displacement, acceleration; peak, RMS, peak-to-peak) at ' +
      'a frequency or speed; its ISO 10816-3 zone when the machine group and foundation are given (guidance ' +
      "only for mobile machinery); and pass or fail against the shop's own acceptance level.",
    request: SeverityRequestSchema,
    response: SeverityResponseSchema,
    compute: (body) => vibrationSeverity(body),
    example: {
      value: 0.18,
      unit: 'in/s-pk',
      speedRpm: 2100,
      machineGroup: 2,
      foundation: 'flexible',
      acceptance: { value: 0.15, unit: 'in/s-pk' },
    },
  }),
} as const;

/** The name of a calculator route. */
export type CalcRouteName = keyof typeof CALC_ROUTES;

/** Every calculator route's name, in the order of the API reference. */
export const CALC_ROUTE_NAMES = Object.keys(CALC_ROUTES) as CalcRouteName[];

/** Whether `name` is a calculator route. */
export function isCalcRouteName(name: string): name is CalcRouteName {
  return Object.hasOwn(CALC_ROUTES, name);
}

/** The request a route accepts, as the caller sends it. */
export type CalcRequest<Name extends CalcRouteName> = z.input<(typeof CALC_ROUTES)[Name]['request']>;
/** The answer of a route. */
export type CalcResponse<Name extends CalcRouteName> = z.output<(typeof CALC_ROUTES)[Name]['response']>;

/** The answer of one calculation: 200 with the result, or 400 with a problem that names the field. */
export type CalcOutcome<Name extends CalcRouteName = CalcRouteName> =
  | { readonly status: 200; readonly result: CalcResponse<Name> }
  | { readonly status: 400; readonly problem: Problem };

/** The problem for a request that does not fit the route's schema. */
export function invalidRequestProblem(error: z.core.$ZodError): Problem {
  const errors = fieldErrorsOf(error);
  return {
    type: 'about:blank',
    title: 'Bad Request',
    status: 400,
    code: 'INVALID_REQUEST',
    detail:
      errors.length === 1
        ? `${errors[0]?.path || 'The body'}: ${errors[0]?.message}`
        : `${errors.length} fields are not valid.`,
    errors,
  };
}

/** The problem for a calculation the engine refused, with the field it blamed. */
export function engineProblem(error: EngineError): Problem {
  return {
    type: 'about:blank',
    title: 'Bad Request',
    status: 400,
    code: error.code,
    detail: error.message,
    ...(error.field === undefined ? {} : { errors: [{ path: error.field, message: error.message }] }),
  };
}

/**
 * The path of the first number in `value` that is not finite, or undefined when all are. It walks the
 * answer of every calculation, so it allocates nothing until it finds one: `path` is one stack of keys,
 * pushed and popped on the way.
 */
export function firstNonFinitePath(value: unknown, path: PropertyKey[] = []): string | undefined {
  if (typeof value === 'number') return Number.isFinite(value) ? undefined : formatPath(path);
  if (value === null || typeof value !== 'object') return undefined;
  if (Array.isArray(value)) {
    for (let index = 0; index < value.length; index++) {
      path.push(index);
      const found = firstNonFinitePath(value[index], path);
      path.pop();
      if (found !== undefined) return found;
    }
    return undefined;
  }
  for (const key in value) {
    path.push(key);
    const found = firstNonFinitePath((value as Record<string, unknown>)[key], path);
    path.pop();
    if (found !== undefined) return found;
  }
  return undefined;
}

/**
 * Computes a request already accepted by the route's schema; the engine's refusals become a problem.
 * An answer that overflows (a radius of 1e-300 mm, say) is refused too: a NaN or an infinity must never
 * reach a technician as a mass. Anything else the engine throws is a bug and is thrown on.
 */
export function computeCalc<Name extends CalcRouteName>(
  name: Name,
  body: z.output<(typeof CALC_ROUTES)[Name]['request']>,
): CalcOutcome<Name> {
  const definition = CALC_ROUTES[name] as unknown as CalcRoute<z.ZodType, z.ZodType>;
  let result: unknown;
  try {
    result = definition.compute(body);
  } catch (error) {
    if (error instanceof EngineError) return { status: 400, problem: engineProblem(error) };
    throw error;
  }
  const overflow = firstNonFinitePath(result);
  if (overflow !== undefined) {
    return {
      status: 400,
      problem: {
        type: 'about:blank',
        title: 'Bad Request',
        status: 400,
        code: 'RESULT_OUT_OF_RANGE',
        detail:
          `These values give a result too large to use (${overflow}); check for a value typed ` +
          'far too small or too large.',
      },
    };
  }
  return { status: 200, result: result as CalcResponse<Name> };
}

/** Validates and computes one request of the named route, as the API does. */
export function calculate<Name extends CalcRouteName>(name: Name, body: unknown): CalcOutcome<Name> {
  const parsed = CALC_ROUTES[name].request.safeParse(body);
  if (!parsed.success) return { status: 400, problem: invalidRequestProblem(parsed.error) };
  return computeCalc(name, parsed.data as z.output<(typeof CALC_ROUTES)[Name]['request']>);
}
