import { sql } from 'drizzle-orm';
import {
  type AnySQLiteColumn,
  blob,
  check,
  index,
  integer,
  real,
  sqliteTable,
  text,
  uniqueIndex,
} from 'drizzle-orm/sqlite-core';
import type {
  AcceptanceLevel,
  ContactPerson,
  MachineSide,
  PlaneLayout,
  StoredSensitivity,
} from '@counterpoise/api';
import type {
  InstalledWeight,
  StoredAbandonment,
  StoredCalc,
  StoredCompletion,
  StoredInspection,
  StoredPlaneWeight,
  StoredPrediction,
  StoredRunRetype,
  StoredSafety,
  StoredSensorReading,
  StoredSetup,
} from '../jobs/job-records';

/**
 * Facts about this installation that belong to no feature: when the demo data was seeded, and by which
 * version. A key-value table, so that a new fact needs no migration.
 */
export const appMeta = sqliteTable('app_meta', {
  key: text('key').primaryKey(),
  value: text('value').notNull(),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull(),
});

/**
 * The API keys integrators call the calculation API with. The key itself is never stored: only its
 * SHA-256 hash (enough for a random 256-bit key, which no dictionary can guess) and a short visible
 * prefix that lets a person tell keys apart. A key is revoked, never deleted, so that its usage keeps
 * its owner. AUTOINCREMENT keeps the id of a revoked key from ever naming another one.
 */
export const apiKeys = sqliteTable(
  'api_keys',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    name: text('name').notNull(),
    prefix: text('prefix').notNull(),
    hash: text('hash').notNull().unique(),
    limitPerMinute: integer('limit_per_minute').notNull(),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
    /** Written by the usage log's flush, never on the request path. */
    lastUsedAt: integer('last_used_at', { mode: 'timestamp_ms' }),
    revokedAt: integer('revoked_at', { mode: 'timestamp_ms' }),
    /** The organisation whose key it is; null for keys made before organisations existed. */
    organisationId: integer('organisation_id').references((): AnySQLiteColumn => organisations.id),
    /**
     * The web origins whose pages may use the key, as a JSON array of normalised origins; empty when the
     * key is not limited.
     */
    allowedOrigins: text('allowed_origins', { mode: 'json' }).$type<string[]>().notNull().default([]),
  },
  (table) => [
    check('api_keys_limit_per_minute_positive', sql`${table.limitPerMinute} > 0`),
    index('api_keys_organisation_id_idx').on(table.organisationId),
  ],
);

/**
 * One row per keyed request, and one more per item of a batch: what the usage report sums. Rows arrive in
 * batches from the usage log; the index serves the report, which always reads one key over a span.
 */
export const apiUsage = sqliteTable(
  'api_usage',
  {
    id: integer('id').primaryKey(),
    keyId: integer('key_id')
      .notNull()
      .references(() => apiKeys.id),
    route: text('route').notNull(),
    status: integer('status').notNull(),
    durationMs: real('duration_ms').notNull(),
    bytes: integer('bytes').notNull(),
    at: integer('at', { mode: 'timestamp_ms' }).notNull(),
    /**
     * True for a row of a batch's item, as the log wrote them before migration 0009 (one row per item
     * beside the batch's own): a calculation, not a request. Rows written since are all requests.
     */
    batchItem: integer('batch_item', { mode: 'boolean' }).notNull().default(false),
    /**
     * The calculations the row stands for, as the key's limit counts them: 1 for a call of a calculator
     * route, n for a batch of n items, 0 for any other request (and for a batch refused whole).
     */
    calculations: integer('calculations').notNull().default(0),
    /** A batch's items answered with an error, counted by status (`{"400":2}`); null when there were none. */
    itemErrors: text('item_errors', { mode: 'json' }).$type<Record<string, number>>(),
  },
  (table) => [index('api_usage_key_id_at_idx').on(table.keyId, table.at)],
);

/**
 * A dealer or service shop: everything a person sees is its organisation's. Names are unique so that
 * operators can name one on the command line.
 */
export const organisations = sqliteTable('organisations', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull().unique(),
  createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
});

/**
 * A person who signs in to the workbench. The e-mail address is unique across the installation (it is
 * what signs in), stored in lower case. The password is stored only as an scrypt hash with its salt and
 * parameters (`scrypt$N$r$p$salt$hash`). People are deactivated, never deleted, so that their work keeps
 * its author.
 */
export const users = sqliteTable(
  'users',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    email: text('email').notNull().unique(),
    name: text('name').notNull(),
    role: text('role', { enum: ['owner', 'manager', 'technician', 'developer', 'viewer'] }).notNull(),
    status: text('status', { enum: ['active', 'deactivated'] }).notNull(),
    passwordHash: text('password_hash').notNull(),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [index('users_organisation_id_idx').on(table.organisationId)],
);

/**
 * Failed sign-ins by e-mail address, whether or not a person has that address: the slow-down and the
 * lock then answer alike for known and unknown addresses, and so reveal nothing. A successful sign-in
 * deletes the row.
 */
export const signInFailures = sqliteTable('sign_in_failures', {
  email: text('email').primaryKey(),
  failures: integer('failures').notNull(),
  lastFailedAt: integer('last_failed_at', { mode: 'timestamp_ms' }).notNull(),
  /** No attempt is checked before this moment: the slow-down after 5 failures, the lock after 10. */
  blockedUntil: integer('blocked_until', { mode: 'timestamp_ms' }),
});

/**
 * Refresh tokens, stored as SHA-256 hashes (random 256-bit secrets, like API keys). Every refresh
 * replaces the token with a new one of the same family; presenting a replaced token again means it was
 * copied, and revokes the whole family.
 */
export const refreshTokens = sqliteTable(
  'refresh_tokens',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    familyId: text('family_id').notNull(),
    hash: text('hash').notNull().unique(),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    replacedAt: integer('replaced_at', { mode: 'timestamp_ms' }),
    revokedAt: integer('revoked_at', { mode: 'timestamp_ms' }),
  },
  (table) => [
    index('refresh_tokens_family_id_idx').on(table.familyId),
    index('refresh_tokens_user_id_idx').on(table.userId),
  ],
);

/**
 * Invitations to join an organisation with a role. The link's token is stored as a SHA-256 hash; it
 * works once, until `expires_at`. A newer invitation to the same address replaces the older one.
 */
export const invitations = sqliteTable(
  'invitations',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    email: text('email').notNull(),
    role: text('role', { enum: ['owner', 'manager', 'technician', 'developer', 'viewer'] }).notNull(),
    name: text('name'),
    invitedBy: integer('invited_by')
      .notNull()
      .references(() => users.id),
    tokenHash: text('token_hash').notNull().unique(),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    acceptedAt: integer('accepted_at', { mode: 'timestamp_ms' }),
    revokedAt: integer('revoked_at', { mode: 'timestamp_ms' }),
  },
  (table) => [index('invitations_organisation_id_idx').on(table.organisationId)],
);

/** Password-reset links: a hashed single-use token per request, valid for an hour. */
export const passwordResets = sqliteTable('password_resets', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  userId: integer('user_id')
    .notNull()
    .references(() => users.id),
  tokenHash: text('token_hash').notNull().unique(),
  createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
  expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
  usedAt: integer('used_at', { mode: 'timestamp_ms' }),
});

/**
 * Every e-mail the local SMTP server captured (development and tests), for the Outbox. The sender
 * names the organisation a message belongs to in a header, so that an owner sees their own only.
 */
export const mailMessages = sqliteTable(
  'mail_messages',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id').references(() => organisations.id),
    from: text('from').notNull(),
    /** A JSON array of addresses. */
    to: text('to').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    html: text('html'),
    receivedAt: integer('received_at', { mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [index('mail_messages_organisation_id_idx').on(table.organisationId)],
);

/**
 * What every record of the shop (customer, machine family, machine) carries: its version, which grows
 * with every change so that a change made on an older version is refused (the API's ETag), and when it
 * was made, last changed and archived. Records are archived, never deleted, so that a job years later
 * still names its machine.
 */
const recordLifecycle = () => ({
  version: integer('version').notNull(),
  createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull(),
  archivedAt: integer('archived_at', { mode: 'timestamp_ms' }),
});

/**
 * The shop's customers. The contact persons are a JSON column rather than a table of their own: they
 * are only ever read and written with their customer, so one row keeps one version per customer.
 * `name_key` (the name in lower case) is the sort order people expect; `search_text` holds the lower-cased
 * name, e-mail, phone, site address and contact names that a search looks in.
 */
export const customers = sqliteTable(
  'customers',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    name: text('name').notNull(),
    email: text('email'),
    phone: text('phone'),
    siteAddress: text('site_address'),
    notes: text('notes'),
    contacts: text('contacts', { mode: 'json' }).$type<ContactPerson[]>().notNull(),
    nameKey: text('name_key').notNull(),
    searchText: text('search_text').notNull(),
    ...recordLifecycle(),
  },
  (table) => [
    index('customers_organisation_name_idx').on(table.organisationId, table.nameKey),
    index('customers_organisation_updated_idx').on(table.organisationId, table.updatedAt),
    index('customers_organisation_created_idx').on(table.organisationId, table.createdAt),
    check('customers_version_positive', sql`${table.version} > 0`),
  ],
);

/**
 * Kinds of machine the shop balances often (a model of mulcher drum, a flail mower rotor), with what
 * holds for all of them: speed, planes, correction radii, inspection limits, acceptance and the stored
 * sensitivities. The structured parts are JSON columns: they are read and written whole, and their
 * shape is the zod schema's.
 */
export const machineFamilies = sqliteTable(
  'machine_families',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    name: text('name').notNull(),
    rotorType: text('rotor_type', {
      enum: ['fixed-tooth-drum', 'flail', 'fan', 'pulley', 'other'],
    }).notNull(),
    nominalSpeedRpm: real('nominal_speed_rpm').notNull(),
    planeCount: integer('plane_count').notNull(),
    correctionRadiiMm: text('correction_radii_mm', { mode: 'json' }).$type<number[]>().notNull(),
    inspectionLimits: text('inspection_limits', { mode: 'json' })
      .$type<{ bearingEndPlayMm: number; shaftRunoutMm: number }>()
      .notNull(),
    acceptance: text('acceptance', { mode: 'json' }).$type<AcceptanceLevel>().notNull(),
    sensitivities: text('sensitivities', { mode: 'json' }).$type<StoredSensitivity[]>().notNull(),
    notes: text('notes'),
    nameKey: text('name_key').notNull(),
    ...recordLifecycle(),
  },
  (table) => [
    index('machine_families_organisation_name_idx').on(table.organisationId, table.nameKey),
    index('machine_families_organisation_rotor_type_idx').on(table.organisationId, table.rotorType),
    index('machine_families_organisation_updated_idx').on(table.organisationId, table.updatedAt),
    check('machine_families_plane_count', sql`${table.planeCount} IN (1, 2)`),
    check('machine_families_version_positive', sql`${table.version} > 0`),
  ],
);

/**
 * One machine of a customer: what identifies it on site (make, model, serial number, hours) and what a
 * balancing job needs of it (planes with their allowed positions and blocked sectors, sensor sides,
 * rotation, stock weights, its own acceptance). `make_key` and `serial_key` are the lower-cased sort
 * orders; `search_text` holds the lower-cased serial number, make and model (the customer's name is
 * searched in its own table, so that a renamed customer is found at once).
 */
export const machines = sqliteTable(
  'machines',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    customerId: integer('customer_id')
      .notNull()
      .references(() => customers.id),
    familyId: integer('family_id').references(() => machineFamilies.id),
    make: text('make'),
    model: text('model'),
    serialNumber: text('serial_number'),
    hours: real('hours'),
    rotorMassKg: real('rotor_mass_kg'),
    operatingSpeedRpm: real('operating_speed_rpm'),
    sensorSides: text('sensor_sides', { mode: 'json' }).$type<MachineSide[]>().notNull(),
    rotationSeenFromLeft: text('rotation_seen_from_left', {
      enum: ['clockwise', 'counterClockwise'],
    }).notNull(),
    planes: text('planes', { mode: 'json' }).$type<PlaneLayout[]>().notNull(),
    stockWeightsGrams: text('stock_weights_grams', { mode: 'json' }).$type<number[]>().notNull(),
    acceptance: text('acceptance', { mode: 'json' }).$type<AcceptanceLevel>(),
    notes: text('notes'),
    makeKey: text('make_key'),
    serialKey: text('serial_key'),
    searchText: text('search_text').notNull(),
    ...recordLifecycle(),
  },
  (table) => [
    index('machines_organisation_serial_idx').on(table.organisationId, table.serialKey),
    index('machines_organisation_make_idx').on(table.organisationId, table.makeKey),
    index('machines_organisation_updated_idx').on(table.organisationId, table.updatedAt),
    index('machines_customer_id_idx').on(table.customerId),
    index('machines_family_id_idx').on(table.familyId),
    check('machines_version_positive', sql`${table.version} > 0`),
  ],
);

/**
 * The change log of the shop's records: one row per version of a record, saying who made it, when, what
 * kind of change it was, and each field's value before and after (a JSON array). A warranty question
 * months later is answered from here. The unique index makes two rows for one version impossible.
 */
export const recordChanges = sqliteTable(
  'record_changes',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    entityKind: text('entity_kind', { enum: ['customer', 'machine-family', 'machine'] }).notNull(),
    entityId: integer('entity_id').notNull(),
    version: integer('version').notNull(),
    action: text('action', { enum: ['created', 'updated', 'archived', 'restored'] }).notNull(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    at: integer('at', { mode: 'timestamp_ms' }).notNull(),
    fields: text('fields', { mode: 'json' })
      .$type<{ field: string; before: unknown; after: unknown }[]>()
      .notNull(),
  },
  (table) => [
    uniqueIndex('record_changes_entity_version_idx').on(
      table.organisationId,
      table.entityKind,
      table.entityId,
      table.version,
    ),
  ],
);

/**
 * Balancing jobs: a machine, a technician and a date, and the steps done so far. The steps that are
 * written whole (safety, inspection, set-up, completion, abandonment) are JSON columns of the job; runs
 * and corrections are rows of their own, numbered within the job. Every change of a job, a run or a
 * correction included, adds one to the job's `version` in the same transaction, so that a change made on
 * an older version is refused (the API's ETag), and two writes sent at once cannot both land.
 */
export const jobs = sqliteTable(
  'jobs',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    machineId: integer('machine_id')
      .notNull()
      .references(() => machines.id),
    technicianId: integer('technician_id')
      .notNull()
      .references(() => users.id),
    /** The day the job is planned for, `YYYY-MM-DD`. */
    scheduledFor: text('scheduled_for').notNull(),
    status: text('status', { enum: ['open', 'on-hold', 'completed', 'abandoned'] }).notNull(),
    safety: text('safety', { mode: 'json' }).$type<StoredSafety>(),
    inspection: text('inspection', { mode: 'json' }).$type<StoredInspection>(),
    setup: text('setup', { mode: 'json' }).$type<StoredSetup>(),
    completion: text('completion', { mode: 'json' }).$type<StoredCompletion>(),
    abandonment: text('abandonment', { mode: 'json' }).$type<StoredAbandonment>(),
    version: integer('version').notNull(),
    createdById: integer('created_by_id')
      .notNull()
      .references(() => users.id),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
    updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [
    index('jobs_organisation_scheduled_idx').on(table.organisationId, table.scheduledFor),
    index('jobs_organisation_technician_idx').on(table.organisationId, table.technicianId),
    index('jobs_machine_id_idx').on(table.machineId),
    check('jobs_version_positive', sql`${table.version} > 0`),
  ],
);

/**
 * The runs of a job: the readings of every sensor (each repeat as typed, and their vector average), the
 * trial weight of a trial run, and the job's weights on the rotor while it turned. Numbered within the
 * job; the unique index makes two runs with one number impossible. `retyped` keeps what was typed before
 * each retyping of the readings (oldest first), so the run as first typed is never lost.
 */
export const jobRuns = sqliteTable(
  'job_runs',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    jobId: integer('job_id')
      .notNull()
      .references(() => jobs.id),
    sequence: integer('sequence').notNull(),
    kind: text('kind', { enum: ['initial', 'trial', 'verification'] }).notNull(),
    trialWeight: text('trial_weight', { mode: 'json' }).$type<StoredPlaneWeight>(),
    weightsOnRotor: text('weights_on_rotor', { mode: 'json' }).$type<StoredPlaneWeight[]>().notNull(),
    readings: text('readings', { mode: 'json' }).$type<StoredSensorReading[]>().notNull(),
    warnings: text('warnings', { mode: 'json' }).$type<string[]>().notNull(),
    createdById: integer('created_by_id')
      .notNull()
      .references(() => users.id),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
    retyped: text('retyped', { mode: 'json' }).$type<StoredRunRetype[]>().notNull().default([]),
  },
  (table) => [uniqueIndex('job_runs_job_sequence_idx').on(table.jobId, table.sequence)],
);

/**
 * The corrections of a job: the method, the runs and the calculator request they were computed from,
 * the answer, the plan, and what was really installed with the reading it predicts. Computed by the
 * server from the stored runs, never taken from the client.
 */
export const jobCorrections = sqliteTable(
  'job_corrections',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    jobId: integer('job_id')
      .notNull()
      .references(() => jobs.id),
    sequence: integer('sequence').notNull(),
    method: text('method', { enum: ['one-run', 'single-plane', 'multi-plane', 'four-run'] }).notNull(),
    basis: text('basis', { enum: ['sensitivity', 'trial', 'trim'] }).notNull(),
    runIds: text('run_ids', { mode: 'json' }).$type<number[]>().notNull(),
    calc: text('calc', { mode: 'json' }).$type<StoredCalc>().notNull(),
    result: text('result', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    plan: text('plan', { mode: 'json' }).$type<StoredPlaneWeight[]>().notNull(),
    installed: text('installed', { mode: 'json' }).$type<InstalledWeight[]>(),
    predicted: text('predicted', { mode: 'json' }).$type<StoredPrediction>(),
    installedAt: integer('installed_at', { mode: 'timestamp_ms' }),
    warnings: text('warnings', { mode: 'json' }).$type<string[]>().notNull(),
    createdById: integer('created_by_id')
      .notNull()
      .references(() => users.id),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [uniqueIndex('job_corrections_job_sequence_idx').on(table.jobId, table.sequence)],
);

/** A point on a photo, as fractions of its width (`x`) and height (`y`) from the top-left corner. */
export interface StoredPhotoPoint {
  readonly x: number;
  readonly y: number;
}

/** Where a rotor sits on a photo: its centre, a point on the weight circle, and the reference mark. */
export interface StoredPhotoCalibration {
  readonly centre: StoredPhotoPoint;
  readonly rim: StoredPhotoPoint;
  readonly referenceMark: StoredPhotoPoint;
}

/**
 * Photos of a rotor, on a machine or on a job (never both, never neither). The image as uploaded is never
 * kept: it is re-encoded (which drops location and camera data) and the re-encoded image and its thumbnail
 * are stored as files under `data/uploads`, named by the SHA-256 of their content; a row names them. A
 * removed photo keeps its row (`removed_at`). One photo of a machine may be the correction overlay's
 * background, with where the rotor sits on it (`calibration`): the partial unique index allows one per
 * machine.
 */
export const photos = sqliteTable(
  'photos',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    machineId: integer('machine_id').references(() => machines.id),
    jobId: integer('job_id').references(() => jobs.id),
    /** The SHA-256 (hex) of the stored, re-encoded image: its file name under `data/uploads`. */
    sha256: text('sha256').notNull(),
    /** The SHA-256 (hex) of the stored thumbnail. */
    thumbnailSha256: text('thumbnail_sha256').notNull(),
    mediaType: text('media_type', { enum: ['image/jpeg', 'image/png', 'image/webp'] }).notNull(),
    widthPx: integer('width_px').notNull(),
    heightPx: integer('height_px').notNull(),
    byteSize: integer('byte_size').notNull(),
    caption: text('caption'),
    calibration: text('calibration', { mode: 'json' }).$type<StoredPhotoCalibration>(),
    overlayBackground: integer('overlay_background', { mode: 'boolean' }).notNull().default(false),
    createdById: integer('created_by_id')
      .notNull()
      .references(() => users.id),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
    removedAt: integer('removed_at', { mode: 'timestamp_ms' }),
  },
  (table) => [
    index('photos_machine_id_idx').on(table.machineId),
    index('photos_job_id_idx').on(table.jobId),
    uniqueIndex('photos_machine_overlay_idx')
      .on(table.machineId)
      .where(sql`${table.overlayBackground} = 1 and ${table.removedAt} is null`),
    check('photos_machine_or_job', sql`(${table.machineId} is null) <> (${table.jobId} is null)`),
  ],
);

/**
 * The service reports of a job that were signed: each signing freezes one revision, the PDF exactly as the
 * customer signed it and the signature itself (a PNG), so that a later change of the job makes a new
 * revision and never alters a signed one. `source_sha256` is the hash of what the report was built from,
 * to tell whether the job has changed since. Numbered within the job.
 */
export const jobReports = sqliteTable(
  'job_reports',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    jobId: integer('job_id')
      .notNull()
      .references(() => jobs.id),
    revision: integer('revision').notNull(),
    /** The job's version the report was built from. */
    jobVersion: integer('job_version').notNull(),
    sourceSha256: text('source_sha256').notNull(),
    signerName: text('signer_name').notNull(),
    signaturePng: blob('signature_png', { mode: 'buffer' }).notNull(),
    pdf: blob('pdf', { mode: 'buffer' }).notNull(),
    pdfSha256: text('pdf_sha256').notNull(),
    signedById: integer('signed_by_id')
      .notNull()
      .references(() => users.id),
    signedAt: integer('signed_at', { mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [uniqueIndex('job_reports_job_revision_idx').on(table.jobId, table.revision)],
);

/** Every sending of a job's report by e-mail: to whom, which revision, who sent it and when. */
export const jobReportSendings = sqliteTable(
  'job_report_sendings',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    organisationId: integer('organisation_id')
      .notNull()
      .references(() => organisations.id),
    jobId: integer('job_id')
      .notNull()
      .references(() => jobs.id),
    /** The signed revision sent, or null when an unsigned report was sent. */
    reportId: integer('report_id').references(() => jobReports.id),
    to: text('to').notNull(),
    /** The message id the mail server was given. */
    messageId: text('message_id'),
    sentById: integer('sent_by_id')
      .notNull()
      .references(() => users.id),
    sentAt: integer('sent_at', { mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [index('job_report_sendings_job_id_idx').on(table.jobId)],
);

/**
 * The attachments of the e-mails the local mail server captured (development and tests), so that an
 * owner can open a report that went out from the Outbox.
 */
export const mailAttachments = sqliteTable(
  'mail_attachments',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    messageId: integer('message_id')
      .notNull()
      .references(() => mailMessages.id),
    filename: text('filename').notNull(),
    contentType: text('content_type').notNull(),
    byteSize: integer('byte_size').notNull(),
    content: blob('content', { mode: 'buffer' }).notNull(),
  },
  (table) => [index('mail_attachments_message_id_idx').on(table.messageId)],
);
