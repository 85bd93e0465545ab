import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import BetterSqlite3 from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import * as schema from './schema';

/** The folder of generated SQL migrations, committed under drizzle/. */
export const MIGRATIONS_FOLDER = fileURLToPath(new URL('../../../drizzle', import.meta.url));

export type Orm = BetterSQLite3Database<typeof schema>;

/** An open SQLite database: the Drizzle handle for queries and the raw handle for pragmas and closing. */
export interface Database {
  readonly orm: Orm;
  readonly sqlite: BetterSqlite3.Database;
}

/**
 * Opens (and creates when absent) the SQLite file at `path`, with the folder it lives in. WAL lets the
 * API read while the usage log writes; a busy timeout rides out the brief locks of a checkpoint.
 */
export function openDatabase(path: string): Database {
  if (path !== ':memory:') mkdirSync(dirname(path), { recursive: true });
  const sqlite = new BetterSqlite3(path);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  return { sqlite, orm: drizzle(sqlite, { schema }) };
}

/** Applies every migration not yet applied; returns how many are applied in all. */
export function migrateDatabase(database: Database): number {
  migrate(database.orm, { migrationsFolder: MIGRATIONS_FOLDER });
  return appliedMigrationCount(database);
}

/** How many migrations the database has applied, read from Drizzle's own bookkeeping table. */
export function appliedMigrationCount(database: Database): number {
  const table = database.sqlite
    .prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name = '__drizzle_migrations'")
    .get();
  if (!table) return 0;
  const row = database.sqlite.prepare('SELECT count(*) AS count FROM __drizzle_migrations').get() as {
    count: number;
  };
  return row.count;
}
