import { sql } from 'drizzle-orm';
import {
  type AnySQLiteColumn,
  check,
  index,
  integer,
  real,
  sqliteTable,
  text,
} from 'drizzle-orm/sqlite-core';

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
  },
  (table) => [
    check('api_keys_limit_per_minute_positive', sql`${table.limitPerMinute} > 0`),
    index('api_keys_organisation_id_idx').on(table.organisationId),
  ],
);

/**
 * One row per keyed request (or per item of a batch): what the usage report sums. Rows arrive in
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
