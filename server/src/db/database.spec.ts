import { chmodSync, existsSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import BetterSqlite3 from 'better-sqlite3';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AccountsRepo } from '../accounts/accounts.repo';
import { type Database, migrateDatabase, openDatabase } from './database';

const modeOf = (path: string) => statSync(path).mode & 0o777;

let folder: string;
const open: (Database | BetterSqlite3.Database)[] = [];
beforeEach(() => {
  folder = mkdtempSync(join(tmpdir(), 'counterpoise-modes-'));
});
afterEach(() => {
  for (const database of open.splice(0)) {
    const sqlite = 'sqlite' in database ? database.sqlite : database;
    if (sqlite.open) sqlite.close();
  }
  rmSync(folder, { recursive: true, force: true });
});

describe('openDatabase', () => {
  it.each([0o022, 0o002, 0o000])(
    'creates the file, its -wal and -shm 0600 and its folder 0700, under umask %o',
    (umask) => {
      const path = join(folder, 'data', 'shop', 'counterpoise.sqlite');
      const previous = process.umask(umask);
      const warnings: string[] = [];
      try {
        const database = openDatabase(path, { warn: (message) => warnings.push(message) });
        open.push(database);
        migrateDatabase(database);
        new AccountsRepo(database.orm).insertOrganisation('Alder Shop', new Date());
        // A second connection writes as the usage log's thread does.
        const second = openDatabase(path, { warn: (message) => warnings.push(message) });
        open.push(second);
        new AccountsRepo(second.orm).insertOrganisation('Birch Shop', new Date());
      } finally {
        process.umask(previous);
      }
      for (const suffix of ['', '-wal', '-shm']) {
        expect(existsSync(`${path}${suffix}`), suffix).toBe(true);
        expect(modeOf(`${path}${suffix}`).toString(8), `counterpoise.sqlite${suffix}`).toBe('600');
      }
      expect(modeOf(join(folder, 'data')).toString(8)).toBe('700');
      expect(modeOf(join(folder, 'data', 'shop')).toString(8)).toBe('700');
      expect(warnings).toEqual([]);
    },
  );

  it('tightens a database and side files left readable by others, and says so once', () => {
    const path = join(folder, 'counterpoise.sqlite');
    // A database as an older version left it, still open in another process, so its -wal and -shm exist.
    const older = new BetterSqlite3(path);
    open.push(older);
    older.pragma('journal_mode = WAL');
    older.exec('CREATE TABLE notes (text TEXT); INSERT INTO notes VALUES (1);');
    for (const suffix of ['', '-wal', '-shm']) chmodSync(`${path}${suffix}`, 0o644);

    const warnings: string[] = [];
    open.push(openDatabase(path, { warn: (message) => warnings.push(message) }));
    for (const suffix of ['', '-wal', '-shm']) {
      expect(modeOf(`${path}${suffix}`).toString(8), `counterpoise.sqlite${suffix}`).toBe('600');
    }
    expect(warnings).toHaveLength(1);
    expect(warnings[0]).toMatch(/^Other users of this machine could read the database: /);
    expect(warnings[0]).toContain(`${path} (was 0644), ${path}-wal (was 0644), ${path}-shm (was 0644)`);

    open.push(openDatabase(path, { warn: (message) => warnings.push(message) }));
    expect(warnings).toHaveLength(1);
  });

  it('leaves a folder it did not create as it is', () => {
    chmodSync(folder, 0o755);
    open.push(openDatabase(join(folder, 'counterpoise.sqlite'), { warn: () => undefined }));
    expect(modeOf(folder).toString(8)).toBe('755');
    expect(modeOf(join(folder, 'counterpoise.sqlite')).toString(8)).toBe('600');
  });
});
