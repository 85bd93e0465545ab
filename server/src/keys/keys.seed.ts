import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { AccountsRepo } from '../accounts/accounts.repo';
import { DEMO_ORGANISATION } from '../auth/accounts.seed';
import type { DemoSeeder } from '../db/seed';
import { ApiKeysRepo } from './keys.repo';
import { ApiKeyService } from './keys.service';

/** The file, in the folder of the database, that holds the demo API key. */
export const DEMO_API_KEY_FILE = 'demo-api-key.txt';

/** The demo key's name and limit: enough for trying the API by hand, not for a load test. */
const DEMO_KEY = { name: 'Demo integration', limitPerMinute: 600 } as const;

/**
 * Creates the demo API key. A key is shown only once and stored as a hash, so the seeder writes the
 * plain key to `demo-api-key.txt` beside the database (readable by its owner only): the one place
 * a person trying the demo can find it. Written inside the seed's transaction, so a failed write
 * leaves no key behind. The key belongs to the demo organisation (seeded before it).
 */
export const seedDemoApiKey: DemoSeeder = (database, now, { dataDir }) => {
  const organisation = new AccountsRepo(database.orm).findOrganisationByName(DEMO_ORGANISATION);
  const { key } = new ApiKeyService(new ApiKeysRepo(database.orm)).create(
    DEMO_KEY,
    now,
    organisation?.id ?? null,
  );
  writeFileSync(join(dataDir, DEMO_API_KEY_FILE), `${key}\n`, { mode: 0o600 });
};
