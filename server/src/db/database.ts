import { chmodSync, closeSync, mkdirSync, openSync, statSync } from 'node:fs';
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
 * The mode of the database and of SQLite's side files: its owner's alone. They hold password hashes,
 * refresh and reset token hashes and the mail log, so no other user of the machine may read them.
 */
export const DATABASE_FILE_MODE = 0o600;

/** The mode of a folder created for the database: only its owner may list or enter it. */
export const DATABASE_FOLDER_MODE = 0o700;

/** The files SQLite keeps beside the database: the write-ahead log, its index, a rollback journal. */
export const DATABASE_SIDE_FILES = ['-wal', '-shm', '-journal'] as const;

/**
 * Sets the mode of those of `files` that exist and let anyone but their owner in to `DATABASE_FILE_MODE`;
 * returns the ones it changed, with the mode they had.
 */
function tighten(files: readonly string[]): string[] {
  const changed: string[] = [];
  for (const file of files) {
    let mode: number;
    try {
      mode = statSync(file).mode & 0o777;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'ENOENT') continue;
      throw error;
    }
    if ((mode & 0o077) === 0) continue;
    chmodSync(file, DATABASE_FILE_MODE);
    changed.push(`${file} (was ${mode.toString(8).padStart(4, '0')})`);
  }
  return changed;
}

/**
 * Opens (and creates when absent) the SQLite file at `path`, with the folder it lives in. WAL lets the
 * API read while the usage log writes; a busy timeout rides out the brief locks of a checkpoint.
 *
 * The file is created `DATABASE_FILE_MODE` before SQLite opens it, and SQLite gives the -wal, -shm and
 * journal files it creates later the mode of the database file; a folder it creates is
 * `DATABASE_FOLDER_MODE`. A file (or side file) left readable by others, by an older version or a copy,
 * is tightened, and `warn` (stderr by default) says so once.
 */
export function openDatabase(path: string, options: { warn?: (message: string) => void } = {}): Database {
  const onDisk = path !== ':memory:' && path !== '';
  const sideFiles = DATABASE_SIDE_FILES.map((suffix) => `${path}${suffix}`);
  const tightened: string[] = [];
  if (onDisk) {
    mkdirSync(dirname(path), { recursive: true, mode: DATABASE_FOLDER_MODE });
    try {
      closeSync(openSync(path, 'wx', DATABASE_FILE_MODE));
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
    }
    tightened.push(...tighten([path, ...sideFiles]));
  }
  const sqlite = new BetterSqlite3(path);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  // SQLite copies the database's mode, but a side file another process created meanwhile is checked too.
  if (onDisk) tightened.push(...tighten(sideFiles));
  if (tightened.length > 0) {
    const warn = options.warn ?? ((message: string) => process.stderr.write(`${message}\n`));
    warn(
      `Other users of this machine could read the database: ${tightened.join(', ')}. ` +
        'It is now readable and writable by its owner only (0600).',
    );
  }
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
