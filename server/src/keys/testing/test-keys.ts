import type { Database } from '../../db/database';
import { type ApiKeyRecord, ApiKeysRepo } from '../keys.repo';
import { ApiKeyService } from '../keys.service';

/** Creates a key for a test and returns the secret with its record. */
export function createTestKey(
  database: Database,
  options: { name?: string; limitPerMinute?: number; now?: Date } = {},
): { key: string; record: ApiKeyRecord } {
  return new ApiKeyService(new ApiKeysRepo(database.orm)).create(
    { name: options.name ?? 'Test integration', limitPerMinute: options.limitPerMinute ?? 1_000_000 },
    options.now ?? new Date(),
  );
}

/** Revokes a key as the CLI would, from outside the app under test. */
export function revokeTestKey(database: Database, id: number, now = new Date()): void {
  new ApiKeyService(new ApiKeysRepo(database.orm)).revoke(id, now);
}
