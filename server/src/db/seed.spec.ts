import { afterEach, describe, expect, it } from 'vitest';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { appliedMigrationCount, migrateDatabase, openDatabase } from './database';
import { appMeta } from './schema';
import { DEMO_SEEDED_KEY, type DemoSeeder, type PreparedDemoSeeder, seedDemoData } from './seed';

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

  it('seeds once, runs every seeder, and records when', async () => {
    temporary = openTemporaryDatabase();
    const calls: [Date, string][] = [];
    const seeder: DemoSeeder = (_database, at, { dataDir }) => calls.push([at, dataDir]);

    expect(await seedDemoData(temporary.database, now, [seeder], context)).toEqual({ seeded: true });
    expect(await seedDemoData(temporary.database, new Date(), [seeder], context)).toEqual({ seeded: false });

    expect(calls).toEqual([[now, '/nowhere']]);
    const rows = temporary.database.orm.select().from(appMeta).all();
    expect(rows).toEqual([{ key: DEMO_SEEDED_KEY, value: now.toISOString(), updatedAt: now }]);
  });

  it('leaves the database as it was when a seeder fails, so the next start tries again', async () => {
    temporary = openTemporaryDatabase();
    const failing: DemoSeeder = (database) => {
      database.orm.insert(appMeta).values({ key: 'partial', value: 'x', updatedAt: now }).run();
      throw new Error('demo data could not be written');
    };

    await expect(seedDemoData(temporary.database, now, [failing], context)).rejects.toThrow(
      'demo data could not be written',
    );
    expect(temporary.database.orm.select().from(appMeta).all()).toEqual([]);
    expect(await seedDemoData(temporary.database, now, [], context)).toEqual({ seeded: true });
  });

  it('prepares the seeders that need it before the transaction, and runs them in it in their order', async () => {
    temporary = openTemporaryDatabase();
    const order: string[] = [];
    const plain: DemoSeeder = () => order.push('plain');
    const prepared: PreparedDemoSeeder = {
      prepare: async ({ dataDir }) => {
        await new Promise((resolve) => setTimeout(resolve, 5));
        order.push(`prepared in ${dataDir}`);
        return () => order.push('prepared seeder');
      },
    };

    expect(await seedDemoData(temporary.database, now, [plain, prepared], context)).toEqual({ seeded: true });

    expect(order).toEqual(['prepared in /nowhere', 'plain', 'prepared seeder']);
  });
});
