import { integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';

/**
 * Facts about this installation that belong to no feature: when the demo data was seeded, and by which
 * version. A key-value table, so that a new fact needs no migration.
 */
export const appMeta = sqliteTable('app_meta', {
  key: text('key').primaryKey(),
  value: text('value').notNull(),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull(),
});
