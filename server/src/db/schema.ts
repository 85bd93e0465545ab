import { sql } from 'drizzle-orm';
import { check, index, integer, real, sqliteTable, text } from 'drizzle-orm/sqlite-core';

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
  },
  (table) => [check('api_keys_limit_per_minute_positive', sql`${table.limitPerMinute} > 0`)],
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
