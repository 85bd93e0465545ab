import { afterEach, describe, expect, it } from 'vitest';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { appliedMigrationCount, migrateDatabase, openDatabase } from './database';
import { appMeta } from './schema';
import { DEMO_SEEDED_KEY, type DemoSeeder, seedDemoData } from './seed';

let temporary: TemporaryDatabase;
afterEach(() => temporary.dispose());

describe('migrations', () => {
  it('create the schema on a new file and are not applied twice', () => {
    temporary = openTemporaryDatabase();
    const applied = appliedMigrationCount(temporary.database);
    expect(applied).toBeGreaterThanOrEqual(1);
    temporary.database.sqlite.close();

    const reopened = openDatabase(temporary.path);
    expect(migrateDatabase(reopened)).toBe(applied);
    reopened.sqlite.close();
  });
});

describe('seedDemoData', () => {
  const now = new Date('2026-03-02T08:00:00Z');
  const context = { dataDir: '/nowhere' };

  it('seeds once, runs every seeder, and records when', () => {
    temporary = openTemporaryDatabase();
    const calls: [Date, string][] = [];
    const seeder: DemoSeeder = (_database, at, { dataDir }) => calls.push([at, dataDir]);

    expect(seedDemoData(temporary.database, now, [seeder], context)).toEqual({ seeded: true });
    expect(seedDemoData(temporary.database, new Date(), [seeder], context)).toEqual({ seeded: false });

    expect(calls).toEqual([[now, '/nowhere']]);
    const rows = temporary.database.orm.select().from(appMeta).all();
    expect(rows).toEqual([{ key: DEMO_SEEDED_KEY, value: now.toISOString(), updatedAt: now }]);
  });

  it('leaves the database as it was when a seeder fails, so the next start tries again', () => {
    temporary = openTemporaryDatabase();
    const failing: DemoSeeder = (database) => {
      database.orm.insert(appMeta).values({ key: 'partial', value: 'x', updatedAt: now }).run();
      throw new Error('demo data could not be written');
    };

    expect(() => seedDemoData(temporary.database, now, [failing], context)).toThrow(
      'demo data could not be written',
    );
    expect(temporary.database.orm.select().from(appMeta).all()).toEqual([]);
    expect(seedDemoData(temporary.database, now, [], context)).toEqual({ seeded: true });
  });
});
