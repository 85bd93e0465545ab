import { readFileSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { API_KEY_PATTERN } from '@counterpoise/api';
import { DEMO_SEEDERS } from '../db/demo-seeders';
import { seedDemoData } from '../db/seed';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { ApiKeysRepo } from './keys.repo';
import { ApiKeyService } from './keys.service';
import { DEMO_API_KEY_FILE } from './keys.seed';

let temporary: TemporaryDatabase;
beforeEach(() => (temporary = openTemporaryDatabase()));
afterEach(() => temporary.dispose());

describe('the demo API key', () => {
  it('is created by the demo seed and left, readable by its owner only, beside the database', async () => {
    const dataDir = dirname(temporary.path);
    await seedDemoData(temporary.database, new Date('2026-05-04T08:00:00Z'), DEMO_SEEDERS, { dataDir });

    const file = join(dataDir, DEMO_API_KEY_FILE);
    const key = readFileSync(file, 'utf8').trim();
    expect(key).toMatch(API_KEY_PATTERN);
    expect(statSync(file).mode & 0o777).toBe(0o600);
    const checked = new ApiKeyService(new ApiKeysRepo(temporary.database.orm)).check(key);
    expect(checked).toMatchObject({ name: 'Demo integration', limitPerMinute: 600, revokedAt: null });
  });
});
