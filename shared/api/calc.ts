import * as z from 'zod';
import { BALANCE_GRADES, VIBRATION_UNITS } from '@counterpoise/engine';

/*
 * Requests and responses of the calculator routes, `POST /api/v1/calc/<route>`. The field names are the
 * public contract. Angles are degrees; masses, amplitudes and radii are in the caller's units unless a
 * field name fixes them (`rotorMassKg`, `radiusMm`, `massGrams`). Unknown fields are refused, so that a
 * typo (`phase` for `phaseDeg`) is an error and not a silently ignored value.
 */

/** Beyond this, a value is not a measurement but a typing slip, and the arithmetic would lose precision. */
const LARGEST = 1e9;
const LARGEST_ANGLE = 3600;

const angleDeg = (what: string) =>
  z
    .number({ error: `Enter the ${what} in degrees, as a number.` })
    .min(-LARGEST_ANGLE, { error: `The ${what} must lie within ±${LARGEST_ANGLE} degrees.` })
    .max(LARGEST_ANGLE, { error: `The ${what} must lie within ±${LARGEST_ANGLE} degrees.` })
    .meta({ description: `The ${what}, in degrees.` });

const nonNegative = (what: string) =>
  z
    .number({ error: `Enter the ${what} as a number.` })
    .nonnegative({ error: `The ${what} cannot be negative; give its size and its direction as an angle.` })
    .max(LARGEST, { error: `The ${what} is implausibly large (over ${LARGEST}).` });

const positive = (what: string) =>
  z
    .number({ error: `Enter the ${what} as a number.` })
    .positive({ error: `The ${what} must be greater than zero.` })
    .max(LARGEST, { error: `The ${what} is implausibly large (over ${LARGEST}).` });

/** How the answers count weight angles from the reference mark. */
export const WeightAnglesSchema = z.enum(['againstRotation', 'withRotation']).meta({
  id: 'WeightAngles',
  description:
    'How weight angles are counted from the reference mark: `againstRotation` (default; the same way ' +
    'as a phase lag) or `withRotation`. Readings are always phase lags.',
});

/** Amplitude and phase of one sensor at running speed. */
export const ReadingSchema = z
  .strictObject({
    amplitude: nonNegative('amplitude').meta({ description: 'Amplitude at 1x running speed.' }),
    phaseDeg: angleDeg('phase').meta({ description: 'Phase lag from the reference mark, in degrees.' }),
  })
  .meta({
    id: 'Reading',
    description: 'One sensor at running speed.',
    example: { amplitude: 0.42, phaseDeg: 118 },
  });

/** A weight: its mass and its angle from the reference mark. */
export const WeightSchema = z
  .strictObject({
    mass: nonNegative('mass'),
    angleDeg: angleDeg('weight angle'),
  })
  .meta({ id: 'Weight', description: 'A weight and its angle from the reference mark.' });

/** A reading in an answer: no bounds, since an answer may be as large as the inputs make it. */
export const ReadingResultSchema = z
  .object({ amplitude: z.number(), phaseDeg: z.number() })
  .meta({ id: 'ReadingResult', description: 'An amplitude and phase computed by the engine.' });

/** A weight in an answer. */
export const WeightResultSchema = z
  .object({ mass: z.number(), angleDeg: z.number() })
  .meta({ id: 'WeightResult', description: 'A weight and its angle from the reference mark.' });

/** A weight in a correction plane, in an answer. */
export const PlaneWeightResultSchema = z
  .object({ plane: z.number().int(), mass: z.number(), angleDeg: z.number() })
  .meta({ id: 'PlaneWeightResult' });

/** A weight in a numbered correction plane. */
export const PlaneWeightSchema = z
  .strictObject({
    plane: z
      .number({ error: 'Give the plane number.' })
      .int({ error: 'Planes are numbered 1, 2, …' })
      .min(1, { error: 'Planes are numbered from 1.' }),
    mass: nonNegative('mass'),
    angleDeg: angleDeg('weight angle'),
  })
  .meta({ id: 'PlaneWeight', description: 'A weight in a correction plane (planes numbered from 1).' });

const Warnings = z
  .array(z.string())
  .meta({ description: 'What the technician should know about this answer, in plain words.' });

// one-run ------------------------------------------------------------------------------------------------

export const OneRunRequestSchema = z
  .strictObject({
    reading: ReadingSchema,
    sensitivity: z
      .strictObject({
        massPerAmplitude: positive('sensitivity').meta({
          description: 'Correction mass per unit of amplitude, stored for the machine family.',
        }),
        offsetDeg: angleDeg('phase offset').optional().meta({
          description: 'Phase offset of the machine family; 0 puts the weight opposite the heavy spot.',
        }),
      })
      .meta({ description: 'The stored sensitivity of the machine family.' }),
    weightAngles: WeightAnglesSchema.optional(),
  })
  .meta({ id: 'OneRunRequest' });

export const OneRunResponseSchema = z
  .object({
    correction: WeightResultSchema,
    heavySpotDeg: z.number().meta({ description: 'Where the unbalance is; the weight goes opposite.' }),
    warnings: Warnings,
  })
  .meta({ id: 'OneRunResponse' });

// single-plane -------------------------------------------------------------------------------------------

export const InfluenceCoefficientSchema = z
  .object({
    amplitudePerMass: z
      .number()
      .meta({ description: 'Amplitude per unit of mass at the correction radius.' }),
    phaseDeg: z.number(),
  })
  .meta({ id: 'InfluenceCoefficient', description: 'How the sensor answers a unit of mass at 0 degrees.' });

export const SinglePlaneRequestSchema = z
  .strictObject({
    initial: ReadingSchema.meta({ description: 'The reading without the trial weight.' }),
    trialWeight: WeightSchema,
    withTrial: ReadingSchema.meta({ description: 'The reading with the trial weight on.' }),
    trialWeightRemoved: z
      .boolean({ error: 'trialWeightRemoved is true or false.' })
      .optional()
      .meta({ description: 'Whether the trial weight comes off before the correction (default true).' }),
    installed: WeightSchema.optional().meta({
      description: 'The weight really installed, when it differs: the residual is predicted for it.',
    }),
    weightAngles: WeightAnglesSchema.optional(),
  })
  .meta({ id: 'SinglePlaneRequest' });

export const SinglePlaneResponseSchema = z
  .object({
    influenceCoefficient: InfluenceCoefficientSchema,
    correction: WeightResultSchema.meta({
      description: 'The weight to add now; with the trial weight left on, what to add to it.',
    }),
    totalCorrection: WeightResultSchema.meta({ description: 'The one weight that balances the bare rotor.' }),
    trialEffect: ReadingResultSchema.meta({ description: 'What the trial weight changed.' }),
    predictedResidual: ReadingResultSchema.meta({
      description: 'The reading expected after the correction.',
    }),
    warnings: Warnings,
  })
  .meta({ id: 'SinglePlaneResponse' });

// multi-plane --------------------------------------------------------------------------------------------

const MAX_SENSORS = 16;
const MAX_PLANES = 8;
const MAX_RUNS = 32;

export const MultiPlaneRequestSchema = z
  .strictObject({
    planes: z
      .number({ error: 'Give the number of correction planes.' })
      .int({ error: 'planes is a whole number.' })
      .min(1, { error: 'At least one correction plane.' })
      .max(MAX_PLANES, { error: `At most ${MAX_PLANES} correction planes.` }),
    initial: z
      .array(ReadingSchema)
      .min(1, { error: 'Give the initial reading of every sensor.' })
      .max(MAX_SENSORS, { error: `At most ${MAX_SENSORS} sensors.` })
      .meta({ description: 'The reading of every sensor with no weight added.' }),
    runs: z
      .array(
        z.strictObject({
          weights: z
            .array(PlaneWeightSchema)
            .max(MAX_PLANES * 4, { error: 'Too many weights in one run.' })
            .meta({ description: 'Every weight on the rotor during this run.' }),
          readings: z
            .array(ReadingSchema)
            .max(MAX_SENSORS, { error: `At most ${MAX_SENSORS} sensors.` })
            .meta({ description: 'The reading of every sensor, in the order of `initial`.' }),
        }),
      )
      .min(1, { error: 'Give at least one run per plane.' })
      .max(MAX_RUNS, { error: `At most ${MAX_RUNS} runs.` }),
    weightAngles: WeightAnglesSchema.optional(),
  })
  .meta({ id: 'MultiPlaneRequest' });

export const MultiPlaneResponseSchema = z
  .object({
    corrections: z
      .array(PlaneWeightResultSchema)
      .meta({ description: 'The total weight per plane on a rotor without trial weights.' }),
    toAdd: z
      .array(PlaneWeightResultSchema)
      .meta({ description: "What to add per plane with the last run's weights left on." }),
    influenceCoefficients: z.array(
      z.object({
        sensor: z.number().int(),
        plane: z.number().int(),
        amplitudePerMass: z.number(),
        phaseDeg: z.number(),
      }),
    ),
    conditionNumber: z
      .number()
      .meta({ description: 'How well the sensors separate the planes: near 1 is good, large is poor.' }),
    predictedResidual: z.array(ReadingResultSchema).meta({ description: 'The reading expected per sensor.' }),
    warnings: Warnings,
  })
  .meta({ id: 'MultiPlaneResponse' });

// four-run -----------------------------------------------------------------------------------------------

export const FourRunRequestSchema = z
  .strictObject({
    initialAmplitude: nonNegative('initial amplitude'),
    trialMass: positive('trial mass'),
    trialRuns: z
      .array(
        z.strictObject({
          angleDeg: angleDeg('trial weight angle'),
          amplitude: nonNegative('amplitude'),
        }),
      )
      .min(3, { error: 'Run the trial weight at three positions at least.' })
      .max(72, { error: 'At most 72 trial runs.' }),
  })
  .meta({ id: 'FourRunRequest' });

export const FourRunResponseSchema = z
  .object({
    correction: WeightResultSchema,
    trialEffect: z
      .object({ amplitude: z.number(), angleDeg: z.number() })
      .meta({ description: 'The amplitude the trial weight alone causes, and where it adds straight on.' }),
    consistency: z.number().meta({
      description: 'How far the runs disagree, as a fraction of the initial amplitude: 0 is perfect.',
    }),
    fittedAmplitudes: z.array(z.number()),
    warnings: Warnings,
  })
  .meta({ id: 'FourRunResponse' });

// split, combine, radius ---------------------------------------------------------------------------------

export const SplitRequestSchema = z
  .strictObject({
    weight: WeightSchema,
    positionsDeg: z
      .array(angleDeg('position'))
      .min(2, { error: 'List two positions at least.' })
      .max(360, { error: 'At most 360 positions.' })
      .optional()
      .meta({ description: 'The angles where a weight can go.' }),
    positions: z
      .strictObject({
        count: z
          .number({ error: 'Give the number of positions.' })
          .int({ error: 'count is a whole number.' })
          .min(2, { error: 'Two positions at least.' })
          .max(360, { error: 'At most 360 positions.' }),
        firstDeg: angleDeg('first position'),
      })
      .optional()
      .meta({ description: 'N equally spaced positions (holes, teeth, holders) from `firstDeg`.' }),
    sectors: z
      .array(z.strictObject({ fromDeg: angleDeg('sector start'), toDeg: angleDeg('sector end') }))
      .min(1, { error: 'List one sector at least.' })
      .max(36, { error: 'At most 36 sectors.' })
      .optional()
      .meta({ description: 'Arcs where a weight can go anywhere, counted the way angles increase.' }),
  })
  .refine(
    (body) => [body.positionsDeg, body.positions, body.sectors].filter((x) => x !== undefined).length === 1,
    { error: 'Give exactly one of positionsDeg, positions or sectors.', path: ['positionsDeg'] },
  )
  .meta({ id: 'SplitRequest' });

export const SplitResponseSchema = z
  .object({
    weights: z.array(WeightResultSchema),
    massRatio: z.number().meta({ description: 'Mass placed over the mass of the ideal weight.' }),
    warnings: Warnings,
  })
  .meta({ id: 'SplitResponse' });

const RadialWeightSchema = z
  .strictObject({
    mass: nonNegative('mass'),
    angleDeg: angleDeg('weight angle'),
    radius: positive('radius').optional(),
  })
  .meta({ id: 'RadialWeight', description: 'A weight with its radius (all or none of them give one).' });

export const CombineRequestSchema = z
  .strictObject({
    weights: z
      .array(RadialWeightSchema)
      .min(1, { error: 'List at least one weight.' })
      .max(256, { error: 'At most 256 weights.' }),
    radius: positive('radius').optional().meta({ description: 'Where the single weight goes.' }),
  })
  .meta({ id: 'CombineRequest' });

const RadialWeightResultSchema = z
  .object({ mass: z.number(), angleDeg: z.number(), radius: z.number().optional() })
  .meta({ id: 'RadialWeightResult' });

export const CombineResponseSchema = z
  .object({ weight: RadialWeightResultSchema, warnings: Warnings })
  .meta({ id: 'CombineResponse' });

export const RadiusRequestSchema = z
  .strictObject({
    mass: nonNegative('mass'),
    fromRadius: positive('radius it sits at'),
    toRadius: positive('radius it moves to'),
  })
  .meta({ id: 'RadiusRequest' });

export const RadiusResponseSchema = z
  .object({ mass: z.number(), warnings: Warnings })
  .meta({ id: 'RadiusResponse' });

// trial-weight, tolerance --------------------------------------------------------------------------------

export const TrialWeightRequestSchema = z
  .strictObject({
    rotorMassKg: positive('rotor mass').meta({
      description: 'Rotor mass, or the share of it on the bearing next to the plane, in kg.',
    }),
    speedRpm: positive('speed'),
    radiusMm: positive('radius'),
    forceFraction: z
      .number({ error: 'Enter the force fraction as a number.' })
      .positive({ error: 'The force fraction must be greater than zero.' })
      .max(1, { error: 'The force fraction is a fraction of the rotor weight: at most 1.' })
      .optional()
      .meta({ description: 'Centrifugal force of the trial weight over the rotor weight (default 0.1).' }),
  })
  .meta({ id: 'TrialWeightRequest' });

export const TrialWeightResponseSchema = z
  .object({
    massGrams: z.number(),
    unbalanceGmm: z.number(),
    forceN: z.number(),
    warnings: Warnings,
  })
  .meta({ id: 'TrialWeightResponse' });

const GRADES = BALANCE_GRADES.map((grade) => grade.grade) as [string, ...string[]];

export const ToleranceRequestSchema = z
  .strictObject({
    grade: z.enum(GRADES, { error: `grade is one of ${GRADES.join(', ')}.` }).meta({
      description: 'Balance quality grade of ISO 21940-11.',
    }),
    rotorMassKg: positive('rotor mass'),
    speedRpm: positive('speed'),
    radiusMm: positive('correction radius').optional(),
    bearingDistancesMm: z
      .strictObject({ a: nonNegative('distance to bearing A'), b: nonNegative('distance to bearing B') })
      .optional()
      .meta({ description: 'Distances from the centre of mass to bearing A and to bearing B.' }),
    residualUnbalanceGmm: nonNegative('residual unbalance')
      .optional()
      .meta({ description: 'A measured residual unbalance to judge against the tolerance.' }),
  })
  .meta({ id: 'ToleranceRequest' });

export const ToleranceResponseSchema = z
  .object({
    grade: z.string(),
    permissibleUnbalanceGmm: z.number(),
    specificUnbalanceUm: z.number(),
    planes: z.array(
      z.object({
        plane: z.number().int(),
        permissibleUnbalanceGmm: z.number(),
        massAtRadiusGrams: z.number().optional(),
      }),
    ),
    massAtRadiusGrams: z.number().optional(),
    pass: z.boolean().optional(),
    warnings: Warnings,
  })
  .meta({ id: 'ToleranceResponse' });

// severity -----------------------------------------------------------------------------------------------

export const VibrationUnitSchema = z
  .enum(VIBRATION_UNITS, { error: `unit is one of ${VIBRATION_UNITS.join(', ')}.` })
  .meta({ id: 'VibrationUnit' });

export const SeverityRequestSchema = z
  .strictObject({
    value: nonNegative('vibration value'),
    unit: VibrationUnitSchema,
    frequencyHz: positive('frequency').optional(),
    speedRpm: positive('speed').optional(),
    machineGroup: z
      .union([z.literal(1), z.literal(2)], { error: 'machineGroup is 1 (large) or 2 (medium machines).' })
      .optional(),
    foundation: z.enum(['rigid', 'flexible'], { error: 'foundation is rigid or flexible.' }).optional(),
    acceptance: z
      .strictObject({ value: nonNegative('acceptance level'), unit: VibrationUnitSchema })
      .optional()
      .meta({ description: "The shop's own acceptance level." }),
  })
  .refine((body) => body.frequencyHz === undefined || body.speedRpm === undefined, {
    error: 'Give frequencyHz or speedRpm, not both.',
    path: ['speedRpm'],
  })
  .refine((body) => (body.machineGroup === undefined) === (body.foundation === undefined), {
    error: 'A zone needs both machineGroup and foundation.',
    path: ['foundation'],
  })
  .meta({ id: 'SeverityRequest' });

export const SeverityResponseSchema = z
  .object({
    conversions: z.partialRecord(VibrationUnitSchema, z.number()),
    zone: z.enum(['A', 'B', 'C', 'D']).optional(),
    acceptable: z.boolean().optional(),
    warnings: Warnings,
  })
  .meta({ id: 'SeverityResponse' });
