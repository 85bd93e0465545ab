import { createHash } from 'node:crypto';
import fc from 'fast-check';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { API_KEY_PATTERN, API_KEY_PREFIX_LENGTH } from '@counterpoise/api';
import { apiKeys } from '../db/schema';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { ApiKeysRepo } from './keys.repo';
import { ApiKeyService, generateApiKey, hashApiKey, KEY_RECHECK_MS, toApiKeySummary } from './keys.service';

let temporary: TemporaryDatabase;
let clockMs: number;
let keys: ApiKeyService;
const now = new Date('2026-05-04T08:00:00Z');

beforeEach(() => {
  temporary = openTemporaryDatabase();
  clockMs = 0;
  keys = new ApiKeyService(new ApiKeysRepo(temporary.database.orm), () => clockMs);
});
afterEach(() => temporary.dispose());

describe('generateApiKey', () => {
  it('makes cpk_ keys of 32 random bytes in base64url, with their prefix and SHA-256 hash', () => {
    const { key, prefix, hash } = generateApiKey();
    expect(key).toMatch(API_KEY_PATTERN);
    expect(Buffer.from(key.slice(4), 'base64url')).toHaveLength(32);
    expect(prefix).toBe(key.slice(0, API_KEY_PREFIX_LENGTH));
    expect(hash).toBe(createHash('sha256').update(key).digest('hex'));
    expect(hashApiKey(key)).toBe(hash);
  });

  it('never makes the same key twice in a thousand', () => {
    const made = new Set(Array.from({ length: 1000 }, () => generateApiKey().key));
    expect(made.size).toBe(1000);
  });
});

describe('ApiKeyService', () => {
  it('stores only the hash and the prefix of a new key, with its limit', () => {
    const { key, record } = keys.create({ name: 'Dealer portal', limitPerMinute: 120 }, now);
    const [stored] = temporary.database.orm.select().from(apiKeys).all();
    expect(stored).toEqual({
      id: record.id,
      name: 'Dealer portal',
      prefix: key.slice(0, API_KEY_PREFIX_LENGTH),
      hash: hashApiKey(key),
      limitPerMinute: 120,
      createdAt: now,
      lastUsedAt: null,
      revokedAt: null,
      organisationId: null,
      allowedOrigins: [],
    });
    expect(JSON.stringify(stored)).not.toContain(key.slice(API_KEY_PREFIX_LENGTH));
    expect(toApiKeySummary(record)).toEqual({
      id: record.id,
      name: 'Dealer portal',
      prefix: stored?.prefix,
      limitPerMinute: 120,
      createdAt: now.toISOString(),
      lastUsedAt: null,
      revokedAt: null,
      allowedOrigins: [],
    });
  });

  it('finds a valid key, and refuses malformed and unknown ones', () => {
    const { key, record } = keys.create({ name: 'a', limitPerMinute: 5 }, now);
    expect(keys.check(key)).toMatchObject({ id: record.id, limitPerMinute: 5, revokedAt: null });
    expect(keys.check(generateApiKey().key)).toBe('unknown');
    expect(keys.check('')).toBe('malformed');
    expect(keys.check(`${key}x`)).toBe('malformed');
    expect(keys.check(key.replace('cpk_', 'cpx_'))).toBe('malformed');
  });

  it('calls anything that is not cpk_ and 43 base64url characters malformed', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 60 }), (text) => {
        fc.pre(!API_KEY_PATTERN.test(text));
        expect(keys.check(text)).toBe('malformed');
      }),
    );
  });

  it('revokes once and keeps the first date', () => {
    const { record } = keys.create({ name: 'a', limitPerMinute: 5 }, now);
    const later = new Date('2026-05-05T08:00:00Z');
    expect(keys.revoke(record.id, now)).toMatchObject({ outcome: 'revoked', key: { revokedAt: now } });
    expect(keys.revoke(record.id, later)).toMatchObject({
      outcome: 'already-revoked',
      key: { revokedAt: now },
    });
    expect(keys.revoke(999, now)).toEqual({ outcome: 'not-found' });
  });

  it('obeys a revocation made elsewhere within KEY_RECHECK_MS', () => {
    const { key, record } = keys.create({ name: 'a', limitPerMinute: 5 }, now);
    expect(keys.check(key)).toMatchObject({ revokedAt: null });
    // Another process (the CLI) revokes the key in the same database.
    new ApiKeyService(new ApiKeysRepo(temporary.database.orm)).revoke(record.id, now);
    clockMs += KEY_RECHECK_MS;
    expect(keys.check(key)).toMatchObject({ id: record.id, revokedAt: now });
    clockMs += 1;
    expect(keys.check(key)).toMatchObject({ revokedAt: now });
  });

  it('lists every key, oldest first', () => {
    keys.create({ name: 'first', limitPerMinute: 5 }, now);
    keys.create({ name: 'second', limitPerMinute: 6 }, now);
    expect(keys.list().map((key) => key.name)).toEqual(['first', 'second']);
  });
});
