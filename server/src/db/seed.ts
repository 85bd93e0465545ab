import { eq } from 'drizzle-orm';
import type { Database } from './database';
import { appMeta } from './schema';

/** The `app_meta` key that records when the demo data went in. */
export const DEMO_SEEDED_KEY = 'demo-seeded-at';

/** Where the demo data may leave files for a person to read, beside the SQLite file. */
export interface DemoSeedContext {
  /** The folder of the SQLite file (`data/` by default, which git ignores). */
  readonly dataDir: string;
  /** The photos' folder (`UPLOADS_DIR`); `uploads` in `dataDir` when absent. */
  readonly uploadsDir?: string;
}

/** What one feature adds to the demo data; runs inside the seed's transaction. */
export type DemoSeeder = (database: Database, now: Date, context: DemoSeedContext) => void;

/**
 * A seeder whose data needs asynchronous work first (rendering images with sharp): `prepare` runs before
 * the transaction opens, since a SQLite transaction cannot wait for a promise, and answers the seeder that
 * writes the rows.
 */
export interface PreparedDemoSeeder {
  prepare(context: DemoSeedContext): Promise<DemoSeeder>;
}

/**
 * Seeds the demo scenario once: when `app_meta` already records a seed, nothing happens, so restarting
 * the server never duplicates or overwrites what a user changed. The seeders that need it prepare first;
 * then every seeder runs in one transaction: a failure leaves the database as it was and the next start
 * tries again.
 */
export async function seedDemoData(
  database: Database,
  now: Date,
  seeders: readonly (DemoSeeder | PreparedDemoSeeder)[],
  context: DemoSeedContext,
): Promise<{ seeded: boolean }> {
  const seeded = () =>
    database.orm.select().from(appMeta).where(eq(appMeta.key, DEMO_SEEDED_KEY)).get() !== undefined;
  if (seeded()) return { seeded: false };
  const ready = await Promise.all(
    seeders.map((seeder) => (typeof seeder === 'function' ? seeder : seeder.prepare(context))),
  );
  // Another start may have seeded while this one prepared.
  if (seeded()) return { seeded: false };
  database.orm.transaction(() => {
    for (const seeder of ready) seeder(database, now, context);
    database.orm
      .insert(appMeta)
      .values({ key: DEMO_SEEDED_KEY, value: now.toISOString(), updatedAt: now })
      .run();
  });
  return { seeded: true };
}
