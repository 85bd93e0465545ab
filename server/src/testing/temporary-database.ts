import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type Database, migrateDatabase, openDatabase } from '../db/database';

/** A migrated SQLite file in a folder of its own, for tests; `dispose()` closes and deletes it. */
export interface TemporaryDatabase {
  readonly database: Database;
  readonly path: string;
  dispose(): void;
}

/** Opens a fresh, fully migrated SQLite file under the system's temporary folder. */
export function openTemporaryDatabase(): TemporaryDatabase {
  const folder = mkdtempSync(join(tmpdir(), 'counterpoise-db-'));
  const path = join(folder, 'counterpoise.sqlite');
  const database = openDatabase(path);
  migrateDatabase(database);
  return {
    database,
    path,
    dispose: () => {
      if (database.sqlite.open) database.sqlite.close();
      rmSync(folder, { recursive: true, force: true });
    },
  };
}
