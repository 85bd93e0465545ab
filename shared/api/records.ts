import * as z from 'zod';
import { displayName, HIDDEN_CHARACTERS } from './display-name';
import { ProblemSchema } from './problem';

/*
 * The shop's records: customers, machine families and machines. One source for the server's validation,
 * the OpenAPI document and the workbench's types. Lengths and bounds are the rules both sides enforce.
 * The routes, permissions, versions (ETag / If-Match) and search rules: docs/records.md.
 */

// Common pieces

/** A stored record's id, as paths and bodies carry it. */
const RecordIdSchema = z.number().int().positive();

/** Free text of a few words (a make, a model, a serial number): trimmed, at most `maxLength` characters. */
function shortText(field: string, maxLength: number) {
  return displayName({ field, maxLength, missing: `Enter ${field}, or leave it out.` });
}

/** Longer free text (notes, an address): several lines allowed, at most `maxLength` characters. */
function longText(field: string, maxLength: number) {
  return z
    .string()
    .trim()
    .max(maxLength, { error: `Keep ${field} to ${maxLength} characters.` })
    .refine((text) => !HIDDEN_CHARACTERS.test(text.replace(/[\n\r\t]/g, '')), {
      error: `${field[0]!.toUpperCase()}${field.slice(1)} holds an invisible control or text-direction character.`,
    });
}

/** An e-mail address, stored in lower case. */
const ContactEmailSchema = z
  .email({ error: 'Enter an e-mail address such as name@example.com.' })
  .max(254)
  .transform((email) => email.toLowerCase());

/** A phone number as people write it: digits, spaces and + ( ) - . / only. */
const PhoneSchema = z
  .string()
  .trim()
  .regex(/^\+?[0-9 ()./-]{3,40}$/, {
    error: 'Write the phone number with digits, spaces and + ( ) - . / only.',
  });

/** What every stored record carries besides its own fields. */
const RecordMetaShape = {
  id: RecordIdSchema,
  /** Grows by one with every change; the `ETag` of the record is built from it. */
  version: z.number().int().positive(),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
  /** When the record was archived; null while it is in use. */
  archivedAt: z.iso.datetime().nullable(),
};

/**
 * A whole number in a query string, written in digits only: `1e3`, `0x10`, ` 7` or `7.0` are refused,
 * where a plain `Number()` would take them for another number than the one a person reads. A number is
 * accepted as well, for the client that builds a query from typed values. The OpenAPI document shows
 * it as the integer it is.
 */
function wholeNumberQuery(message: string, min: number, max: number) {
  return z
    .union(
      [
        z.number(),
        z
          .string()
          .regex(/^\d{1,16}$/)
          .transform(Number),
      ],
      { error: message },
    )
    .pipe(z.number().int({ error: message }).min(min, { error: message }).max(max, { error: message }))
    .meta({ type: 'integer', minimum: min, maximum: max });
}

/** The query of a list route: search, filter, sort and page, all on the server. */
export function listQuerySchema<const S extends readonly [string, ...string[]]>(sortFields: S, id: string) {
  return z
    .object({
      q: z
        .string()
        .trim()
        .max(100, { error: 'Keep the search to 100 characters.' })
        .refine((q) => !HIDDEN_CHARACTERS.test(q), {
          error: 'The search holds an invisible control or text-direction character.',
        })
        .optional()
        .meta({ description: 'Words to find in the names, e-mail addresses, serial numbers…' }),
      archived: z
        .enum(['false', 'true', 'all'], { error: 'archived is false, true or all.' })
        .default('false')
        .meta({ description: 'In use only (false, the default), archived only (true), or both (all).' }),
      sort: z.enum(sortFields, { error: `sort is one of ${sortFields.join(', ')}.` }).default(sortFields[0]),
      order: z.enum(['asc', 'desc'], { error: 'order is asc or desc.' }).default('asc'),
      page: wholeNumberQuery('page is a whole number from 1 to 100000.', 1, 100_000)
        .default(1)
        .meta({ type: 'integer', minimum: 1, maximum: 100_000, default: 1 }),
      pageSize: wholeNumberQuery('pageSize is a whole number from 1 to 100.', 1, 100)
        .default(25)
        .meta({ type: 'integer', minimum: 1, maximum: 100, default: 25 }),
    })
    .meta({ id });
}

/** A page of a list: the items and how many there are in all. */
function pageSchema<T extends z.ZodType>(item: T, id: string) {
  return z
    .object({
      items: z.array(item),
      total: z.number().int().nonnegative(),
      page: z.number().int().positive(),
      pageSize: z.number().int().positive(),
    })
    .meta({ id });
}

/** A query parameter that names a record: a positive whole number. */
const IdQuerySchema = wholeNumberQuery(
  'Write the id as a positive whole number.',
  1,
  Number.MAX_SAFE_INTEGER,
);

// Acceptance levels

/** The units a vibration amplitude is read in on site: in/s peak (North America) or mm/s RMS. */
export const AMPLITUDE_UNITS = ['in/s-pk', 'mm/s-rms'] as const;
export type AmplitudeUnit = (typeof AMPLITUDE_UNITS)[number];
export const AmplitudeUnitSchema = z
  .enum(AMPLITUDE_UNITS, { error: 'The unit is in/s-pk or mm/s-rms.' })
  .meta({ id: 'AmplitudeUnit' });

/** ISO 21940-11 balance quality grades a field shop uses (G16 agricultural parts, G6.3 fans). */
export const FIELD_BALANCE_GRADES = ['G40', 'G16', 'G6.3', 'G2.5'] as const;

/**
 * When a rotor is balanced enough: a shop's own amplitude target, an ISO 21940-11 grade, or an
 * ISO 10816-3 / 20816-3 zone (guidance only for mobile machines, which those zones do not cover).
 */
export const AcceptanceLevelSchema = z
  .discriminatedUnion(
    'kind',
    [
      z.strictObject({
        kind: z.literal('shop-target'),
        amplitude: z
          .number({ error: 'Enter the target amplitude.' })
          .positive({ error: 'The target amplitude is above 0.' })
          .max(100, { error: 'The target amplitude is at most 100.' }),
        unit: AmplitudeUnitSchema,
      }),
      z.strictObject({
        kind: z.literal('balance-grade'),
        grade: z.enum(FIELD_BALANCE_GRADES, {
          error: `The grade is one of ${FIELD_BALANCE_GRADES.join(', ')}.`,
        }),
      }),
      z.strictObject({
        kind: z.literal('severity-zone'),
        /** The highest zone accepted: A (as new) or B (long-term use). */
        zone: z.enum(['A', 'B'], { error: 'The zone is A or B.' }),
        group: z.union([z.literal(1), z.literal(2)], { error: 'The machine group is 1 or 2.' }),
        foundation: z.enum(['rigid', 'flexible'], { error: 'The foundation is rigid or flexible.' }),
      }),
    ],
    { error: 'The acceptance level is a shop target, a balance grade or a severity zone.' },
  )
  .meta({ id: 'AcceptanceLevel' });
export type AcceptanceLevel = z.infer<typeof AcceptanceLevelSchema>;

// Customers

/** A further person to reach at a customer's. */
export const ContactPersonSchema = z
  .strictObject({
    name: displayName({ field: 'the contact’s name', maxLength: 100, missing: 'Enter the contact’s name.' }),
    role: shortText('the contact’s role', 60).optional(),
    email: ContactEmailSchema.optional(),
    phone: PhoneSchema.optional(),
  })
  .meta({ id: 'ContactPerson' });
export type ContactPerson = z.infer<typeof ContactPersonSchema>;

const CustomerFieldsShape = {
  name: displayName({ field: 'the customer’s name', maxLength: 120, missing: 'Enter the customer’s name.' }),
  /** The main e-mail address, where reports go. */
  email: ContactEmailSchema.nullable().optional(),
  phone: PhoneSchema.nullable().optional(),
  siteAddress: longText('the site address', 500).nullable().optional(),
  notes: longText('the notes', 4000).nullable().optional(),
  contacts: z.array(ContactPersonSchema).max(20, { error: 'Keep to 20 contact persons.' }).optional(),
};

/** A new customer: a name is enough; an e-mail address is usual. */
export const CreateCustomerSchema = z.strictObject(CustomerFieldsShape).meta({ id: 'CreateCustomer' });
/** The fields to change (those left out stay as they are). */
export const UpdateCustomerSchema = z
  .strictObject(CustomerFieldsShape)
  .partial()
  .refine((change) => Object.keys(change).length > 0, { error: 'Change at least one field.' })
  .meta({ id: 'UpdateCustomer' });

export const CustomerSchema = z
  .object({
    ...RecordMetaShape,
    name: z.string(),
    email: z.string().nullable(),
    phone: z.string().nullable(),
    siteAddress: z.string().nullable(),
    notes: z.string().nullable(),
    contacts: z.array(ContactPersonSchema),
    /** How many machines in use the customer has. */
    machineCount: z.number().int().nonnegative(),
  })
  .meta({ id: 'Customer' });
export type Customer = z.infer<typeof CustomerSchema>;
export type CreateCustomer = z.input<typeof CreateCustomerSchema>;
export type UpdateCustomer = z.input<typeof UpdateCustomerSchema>;

export const CUSTOMER_SORT_FIELDS = ['name', 'updatedAt', 'createdAt'] as const;
export const CustomerListQuerySchema = listQuerySchema(CUSTOMER_SORT_FIELDS, 'CustomerListQuery');
export type CustomerListQuery = z.input<typeof CustomerListQuerySchema>;
export const CustomerPageSchema = pageSchema(CustomerSchema, 'CustomerPage');
export type CustomerPage = z.infer<typeof CustomerPageSchema>;

// Machine families

/** The kinds of rotor a shop balances. */
export const ROTOR_TYPES = ['fixed-tooth-drum', 'flail', 'fan', 'pulley', 'other'] as const;
export type RotorType = (typeof ROTOR_TYPES)[number];

/** The sides of a machine, as a technician standing behind it in its working direction names them. */
export const MACHINE_SIDES = ['left', 'right'] as const;
export type MachineSide = (typeof MACHINE_SIDES)[number];
const SideSchema = z.enum(MACHINE_SIDES, { error: 'The side is left or right.' });

const SpeedRpmSchema = z
  .number({ error: 'Enter the speed in rpm.' })
  .positive({ error: 'The speed is above 0 rpm.' })
  .max(30_000, { error: 'The speed is at most 30000 rpm.' });

const RadiusMmSchema = z
  .number({ error: 'Enter the correction radius in mm.' })
  .positive({ error: 'The correction radius is above 0 mm.' })
  .max(5_000, { error: 'The correction radius is at most 5000 mm.' });

/** How many correction planes a rotor has: one (a disc, a pulley) or two (a drum). */
const PlaneCountSchema = z.union([z.literal(1), z.literal(2)], {
  error: 'A rotor has 1 or 2 correction planes.',
});

/** The limits of the pre-balance inspection, in mm. */
export const InspectionLimitsSchema = z
  .strictObject({
    bearingEndPlayMm: z
      .number({ error: 'Enter the end-play limit in mm.' })
      .positive({ error: 'The end-play limit is above 0 mm.' })
      .max(50, { error: 'The end-play limit is at most 50 mm.' }),
    shaftRunoutMm: z
      .number({ error: 'Enter the runout limit in mm.' })
      .positive({ error: 'The runout limit is above 0 mm.' })
      .max(10, { error: 'The runout limit is at most 10 mm.' }),
  })
  .meta({ id: 'InspectionLimits' });

/**
 * What the shop knows of how a family's rotors answer a weight: for one sensor and one plane, the mass
 * that moves the reading by one unit of amplitude and the phase lag between weight and reading. Typed in
 * as a rule of thumb, or refined by jobs (how many, and how far apart their results were).
 */
export const StoredSensitivitySchema = z
  .strictObject({
    sensorSide: SideSchema,
    /** 0 for the only or left plane, 1 for the right plane. */
    planeIndex: z
      .number()
      .int()
      .min(0, { error: 'The plane is 0 or 1.' })
      .max(1, { error: 'The plane is 0 or 1.' }),
    gramsPerUnit: z
      .number({ error: 'Enter the grams per unit of amplitude.' })
      .positive({ error: 'The grams per unit of amplitude are above 0.' })
      .max(1_000_000, { error: 'The grams per unit of amplitude are at most 1000000.' }),
    unit: AmplitudeUnitSchema,
    phaseLagDeg: z
      .number({ error: 'Enter the phase lag in degrees.' })
      .min(0, { error: 'The phase lag is from 0 to 359.9 degrees.' })
      .lt(360, { error: 'The phase lag is from 0 to 359.9 degrees.' }),
    /** How many jobs stand behind the figures; 0 for a rule of thumb typed in. */
    jobCount: z.number().int().nonnegative().default(0),
    /** How far apart the jobs' figures were (null until two jobs refine it). */
    spread: z
      .strictObject({
        massPercent: z.number().nonnegative(),
        phaseDeg: z.number().nonnegative().max(180),
      })
      .nullable()
      .default(null),
  })
  .meta({ id: 'StoredSensitivity' });
export type StoredSensitivity = z.infer<typeof StoredSensitivitySchema>;

const FamilyFieldsShape = {
  name: displayName({ field: 'the family’s name', maxLength: 120, missing: 'Name the machine family.' }),
  rotorType: z.enum(ROTOR_TYPES, { error: `The rotor type is one of ${ROTOR_TYPES.join(', ')}.` }),
  nominalSpeedRpm: SpeedRpmSchema,
  planeCount: PlaneCountSchema,
  /** The correction radius of each plane, in plane order. */
  correctionRadiiMm: z
    .array(RadiusMmSchema)
    .min(1, { error: 'Give one correction radius per plane.' })
    .max(2, { error: 'Give one correction radius per plane.' }),
  inspectionLimits: InspectionLimitsSchema,
  acceptance: AcceptanceLevelSchema,
  sensitivities: z
    .array(StoredSensitivitySchema)
    .max(4, { error: 'At most one figure per sensor and plane.' }),
  notes: longText('the notes', 4000).nullable().optional(),
};

/** The rules a family's fields must keep together. */
function familyRules(
  family: {
    planeCount?: 1 | 2;
    correctionRadiiMm?: number[];
    sensitivities?: { sensorSide: string; planeIndex: number }[];
  },
  context: z.core.$RefinementCtx,
) {
  if (family.planeCount !== undefined && family.correctionRadiiMm !== undefined) {
    if (family.correctionRadiiMm.length !== family.planeCount) {
      context.addIssue({
        code: 'custom',
        path: ['correctionRadiiMm'],
        message: `Give one correction radius per plane (${family.planeCount}).`,
      });
    }
  }
  const seen = new Set<string>();
  for (const [index, figure] of (family.sensitivities ?? []).entries()) {
    const key = `${figure.sensorSide}/${figure.planeIndex}`;
    if (seen.has(key)) {
      context.addIssue({
        code: 'custom',
        path: ['sensitivities', index],
        message: 'There is already a figure for this sensor and plane.',
      });
    }
    seen.add(key);
    if (family.planeCount !== undefined && figure.planeIndex >= family.planeCount) {
      context.addIssue({
        code: 'custom',
        path: ['sensitivities', index, 'planeIndex'],
        message: `The family has ${family.planeCount} plane${family.planeCount === 1 ? '' : 's'}.`,
      });
    }
  }
}

export const CreateMachineFamilySchema = z
  .strictObject(FamilyFieldsShape)
  .superRefine(familyRules)
  .meta({ id: 'CreateMachineFamily' });
/**
 * The fields to change. The rules are checked here on what the change itself holds, and by the server
 * again on the family as it would be after the change (a new planeCount against the stored radii).
 */
export const UpdateMachineFamilySchema = z
  .strictObject(FamilyFieldsShape)
  .partial()
  .refine((change) => Object.keys(change).length > 0, { error: 'Change at least one field.' })
  .superRefine(familyRules)
  .meta({ id: 'UpdateMachineFamily' });

export const MachineFamilySchema = z
  .object({
    ...RecordMetaShape,
    name: z.string(),
    rotorType: z.enum(ROTOR_TYPES),
    nominalSpeedRpm: z.number(),
    planeCount: z.union([z.literal(1), z.literal(2)]),
    correctionRadiiMm: z.array(z.number()),
    inspectionLimits: InspectionLimitsSchema,
    acceptance: AcceptanceLevelSchema,
    sensitivities: z.array(StoredSensitivitySchema),
    notes: z.string().nullable(),
    machineCount: z.number().int().nonnegative(),
  })
  .meta({ id: 'MachineFamily' });
export type MachineFamily = z.infer<typeof MachineFamilySchema>;
export type CreateMachineFamily = z.input<typeof CreateMachineFamilySchema>;
export type UpdateMachineFamily = z.input<typeof UpdateMachineFamilySchema>;

export const MACHINE_FAMILY_SORT_FIELDS = ['name', 'rotorType', 'updatedAt'] as const;
export const MachineFamilyListQuerySchema = listQuerySchema(
  MACHINE_FAMILY_SORT_FIELDS,
  'MachineFamilyListQuery',
);
export type MachineFamilyListQuery = z.input<typeof MachineFamilyListQuerySchema>;
export const MachineFamilyPageSchema = pageSchema(MachineFamilySchema, 'MachineFamilyPage');
export type MachineFamilyPage = z.infer<typeof MachineFamilyPageSchema>;

// Machines

/** Where weights may go on one plane: fixed positions (holes, holders) or anywhere but blocked sectors. */
export const PlaneLayoutSchema = z
  .strictObject({
    correctionRadiusMm: RadiusMmSchema,
    /** Equally spaced positions (teeth, holders, holes); null when a weight may go anywhere on the rim. */
    positions: z
      .strictObject({
        count: z
          .number()
          .int()
          .min(2, { error: 'Give at least 2 positions.' })
          .max(360, { error: 'At most 360 positions.' }),
        firstDeg: z
          .number()
          .min(0, { error: 'The first position is from 0 to 359.9°.' })
          .lt(360, { error: 'The first position is from 0 to 359.9°.' }),
      })
      .nullable()
      .default(null),
    /** Stretches of the rim where no weight can go, `fromDeg` to `toDeg` the way angles increase. */
    blockedSectors: z
      .array(
        z.strictObject({
          fromDeg: z
            .number({ error: 'Enter the angle in degrees.' })
            .min(0, { error: 'An angle is from 0 to 359.9°.' })
            .lt(360, { error: 'An angle is from 0 to 359.9°.' }),
          toDeg: z
            .number({ error: 'Enter the angle in degrees.' })
            .min(0, { error: 'An angle is from 0 to 359.9°.' })
            .lt(360, { error: 'An angle is from 0 to 359.9°.' }),
          label: shortText('what blocks the sector', 40),
        }),
      )
      .max(24, { error: 'Keep to 24 blocked sectors a plane.' })
      .default([]),
  })
  .meta({ id: 'PlaneLayout' });
export type PlaneLayout = z.infer<typeof PlaneLayoutSchema>;

const MachineFieldsShape = {
  customerId: RecordIdSchema,
  familyId: RecordIdSchema.nullable().optional(),
  make: shortText('the make', 80).nullable().optional(),
  model: shortText('the model', 80).nullable().optional(),
  serialNumber: shortText('the serial number', 60).nullable().optional(),
  hours: z
    .number({ error: 'Enter the hours as a number.' })
    .nonnegative({ error: 'The hours are 0 or more.' })
    .max(1_000_000, { error: 'The hours are at most 1000000.' })
    .nullable()
    .optional(),
  rotorMassKg: z
    .number({ error: 'Enter the rotor mass in kg.' })
    .positive({ error: 'The rotor mass is above 0 kg.' })
    .max(100_000, { error: 'The rotor mass is at most 100000 kg.' })
    .nullable()
    .optional(),
  operatingSpeedRpm: SpeedRpmSchema.nullable().optional(),
  /** The sides that carry a sensor. */
  sensorSides: z
    .array(SideSchema)
    .min(1, { error: 'At least one side carries a sensor.' })
    .max(2)
    .refine((sides) => new Set(sides).size === sides.length, { error: 'Name each side once.' })
    .optional(),
  /** How the rotor turns seen from the left end; seen from the right it turns the other way. */
  rotationSeenFromLeft: z.enum(['clockwise', 'counterClockwise'], {
    error: 'The rotation is clockwise or counterClockwise.',
  }),
  /** One layout per correction plane, in plane order (left first). */
  planes: z
    .array(PlaneLayoutSchema)
    .min(1, { error: 'A machine has 1 or 2 planes.' })
    .max(2, { error: 'A machine has 1 or 2 planes.' }),
  /** The stock weights the shop uses on this machine, in grams. */
  stockWeightsGrams: z
    .array(
      z
        .number({ error: 'Enter a stock weight in grams.' })
        .positive({ error: 'A stock weight is above 0 g.' })
        .max(50_000, { error: 'A stock weight is at most 50000 g.' }),
    )
    .max(20, { error: 'Keep to 20 stock sizes.' })
    .optional(),
  /** The machine's own acceptance level; null to use its family's. */
  acceptance: AcceptanceLevelSchema.nullable().optional(),
  notes: longText('the notes', 4000).nullable().optional(),
};

export const CreateMachineSchema = z.strictObject(MachineFieldsShape).meta({ id: 'CreateMachine' });
export const UpdateMachineSchema = z
  .strictObject(MachineFieldsShape)
  .partial()
  .refine((change) => Object.keys(change).length > 0, { error: 'Change at least one field.' })
  .meta({ id: 'UpdateMachine' });

export const MachineSchema = z
  .object({
    ...RecordMetaShape,
    customerId: RecordIdSchema,
    customerName: z.string(),
    familyId: RecordIdSchema.nullable(),
    familyName: z.string().nullable(),
    make: z.string().nullable(),
    model: z.string().nullable(),
    serialNumber: z.string().nullable(),
    hours: z.number().nullable(),
    rotorMassKg: z.number().nullable(),
    operatingSpeedRpm: z.number().nullable(),
    sensorSides: z.array(z.enum(MACHINE_SIDES)),
    rotationSeenFromLeft: z.enum(['clockwise', 'counterClockwise']),
    planes: z.array(PlaneLayoutSchema),
    stockWeightsGrams: z.array(z.number()),
    acceptance: AcceptanceLevelSchema.nullable(),
    notes: z.string().nullable(),
  })
  .meta({ id: 'Machine' });
export type Machine = z.infer<typeof MachineSchema>;
export type CreateMachine = z.input<typeof CreateMachineSchema>;
export type UpdateMachine = z.input<typeof UpdateMachineSchema>;

export const MACHINE_SORT_FIELDS = ['serialNumber', 'customerName', 'make', 'updatedAt'] as const;
export const MachineListQuerySchema = listQuerySchema(MACHINE_SORT_FIELDS, 'MachineListQuery').extend({
  customerId: IdQuerySchema.optional(),
  familyId: IdQuerySchema.optional(),
});
export type MachineListQuery = z.input<typeof MachineListQuerySchema>;
export const MachinePageSchema = pageSchema(MachineSchema, 'MachinePage');
export type MachinePage = z.infer<typeof MachinePageSchema>;

// The change log

/** One change to a record: who, when, what (each field's value before and after). */
export const RecordChangeSchema = z
  .object({
    id: RecordIdSchema,
    version: z.number().int().positive(),
    action: z.enum(['created', 'updated', 'archived', 'restored']),
    at: z.iso.datetime(),
    by: z.object({ id: RecordIdSchema, name: z.string() }),
    fields: z.array(z.object({ field: z.string(), before: z.unknown(), after: z.unknown() })),
  })
  .meta({ id: 'RecordChange' });
export type RecordChange = z.infer<typeof RecordChangeSchema>;
export const RecordHistorySchema = z
  .object({ changes: z.array(RecordChangeSchema) })
  .meta({ id: 'RecordHistory' });
export type RecordHistory = z.infer<typeof RecordHistorySchema>;

/**
 * The answer to a change made on a version that is no longer the stored one (412): the problem, and the
 * record as it is now, so that the screen can offer to merge the two edits or reload.
 */
export function changedMeanwhileProblemSchema<T extends z.ZodType>(record: T, id: string) {
  return ProblemSchema.extend({ current: record }).meta({ id });
}

/** Stable `code`s of the records' problems. */
export const RECORDS_PROBLEM_CODES = {
  /** The record changed since the client read it (412, with the current record in `current`). */
  changedMeanwhile: 'CHANGED_MEANWHILE',
  /** A change without `If-Match` (428). */
  versionRequired: 'VERSION_REQUIRED',
  /** The machine names a customer or family that is not the organisation's, or archived (400 on the field). */
  unknownReference: 'UNKNOWN_REFERENCE',
  /**
   * A machine's planes do not match its family's planeCount (400 on `planes`), or a family's new
   * planeCount does not match the planes of its machines (400 on `planeCount`).
   */
  planesDoNotMatch: 'PLANES_DO_NOT_MATCH',
} as const;
