import { createHash, randomBytes } from 'node:crypto';
import {
  API_KEY_PATTERN,
  API_KEY_PREFIX_LENGTH,
  type ApiKeySummary,
  type CreateApiKey,
} from '@counterpoise/api';
import type { ApiKeyCheckRow, ApiKeyRecord, ApiKeysRepo } from './keys.repo';

/** The start of every Counterpoise API key, so that a leaked one is recognisable in a scan. */
export const API_KEY_SCHEME_PREFIX = 'cpk_';

/** Random bytes in a key: 256 bits, far beyond guessing, which is why a fast hash is enough. */
const KEY_BYTES = 32;

/** A freshly generated key: the secret to show once, and what is stored of it. */
export interface GeneratedApiKey {
  readonly key: string;
  readonly prefix: string;
  readonly hash: string;
}

/** Generates a new key: `cpk_` and 32 random bytes in base64url (43 characters). */
export function generateApiKey(): GeneratedApiKey {
  const key = API_KEY_SCHEME_PREFIX + randomBytes(KEY_BYTES).toString('base64url');
  return { key, prefix: key.slice(0, API_KEY_PREFIX_LENGTH), hash: hashApiKey(key) };
}

/**
 * The stored form of a key: SHA-256 in hex. A slow password hash would add nothing against a
 * random 256-bit secret and would cost every request; equality of hashes is looked up by index, so
 * there is no secret-dependent comparison to time.
 */
export function hashApiKey(key: string): string {
  return createHash('sha256').update(key).digest('hex');
}

/**
 * How a presented key fared: the stored row when it exists (revoked or not; the caller tells them
 * apart by `revokedAt`), or why there is none. No object is built for a valid key: the row read is
 * the identity itself.
 */
export type ApiKeyCheck = ApiKeyCheckRow | 'malformed' | 'unknown';

/** What `revoke` did. */
export type RevokeOutcome =
  | { readonly outcome: 'revoked' | 'already-revoked'; readonly key: ApiKeyRecord }
  | { readonly outcome: 'not-found' };

/**
 * How long a valid key is trusted without reading its row again. Short enough that a revocation
 * made by the CLI, in another process, is obeyed within half a second; long enough that a busy key
 * costs one lookup per half second instead of one per request.
 */
export const KEY_RECHECK_MS = 500;

/** Keys remembered at once; past this the memory is simply cleared (a burst of keys, not a leak). */
const MAX_REMEMBERED_KEYS = 1000;

interface RememberedKey {
  readonly row: ApiKeyCheckRow;
  readonly until: number;
}

/** Creating, listing, revoking and checking API keys. */
export class ApiKeyService {
  /** Valid keys seen lately, by the key as presented: a hit skips the pattern, the hash and the lookup. */
  private readonly remembered = new Map<string, RememberedKey>();

  constructor(
    private readonly repo: ApiKeysRepo,
    private readonly monotonicMs: () => number = () => performance.now(),
  ) {}

  /** Creates a key; the returned `key` is the only time the secret exists outside the caller's hands. */
  create(
    input: Required<Omit<CreateApiKey, 'allowedOrigins'>> & Pick<CreateApiKey, 'allowedOrigins'>,
    now: Date,
    organisationId: number | null = null,
  ): { key: string; record: ApiKeyRecord } {
    const generated = generateApiKey();
    const record = this.repo.insert({
      name: input.name,
      prefix: generated.prefix,
      hash: generated.hash,
      limitPerMinute: input.limitPerMinute,
      createdAt: now,
      organisationId,
      allowedOrigins: input.allowedOrigins ?? [],
    });
    return { key: generated.key, record };
  }

  /** Every key, oldest first, without secrets. */
  list(): ApiKeyRecord[] {
    return this.repo.list();
  }

  /** The organisation's keys, oldest first, without secrets. */
  listForOrganisation(organisationId: number): ApiKeyRecord[] {
    return this.repo.listForOrganisation(organisationId);
  }

  /**
   * Revokes one of the organisation's keys; a key of another organisation is not found. The key stops
   * working at once in this process, and within `KEY_RECHECK_MS` in any other.
   */
  revokeInOrganisation(organisationId: number, id: number, now: Date): RevokeOutcome {
    if (!this.repo.findInOrganisation(organisationId, id)) return { outcome: 'not-found' };
    const outcome = this.revoke(id, now);
    for (const [presented, remembered] of this.remembered) {
      if (remembered.row.id === id) this.remembered.delete(presented);
    }
    return outcome;
  }

  /** Revokes a key; revoking twice is harmless and keeps the first date. */
  revoke(id: number, now: Date): RevokeOutcome {
    const revoked = this.repo.revoke(id, now);
    const key = this.repo.findById(id);
    if (!key) return { outcome: 'not-found' };
    return { outcome: revoked ? 'revoked' : 'already-revoked', key };
  }

  /**
   * Checks a presented key: a valid key seen in the last `KEY_RECHECK_MS` is taken as it was; any
   * other is checked for its form (no lookup for what cannot be a key), then looked up by its hash
   * in one indexed query. Unknown and revoked keys are never remembered.
   */
  check(presented: string): ApiKeyCheck {
    const now = this.monotonicMs();
    const remembered = this.remembered.get(presented);
    if (remembered !== undefined && remembered.until > now) return remembered.row;
    if (!API_KEY_PATTERN.test(presented)) return 'malformed';
    const row = this.repo.findByHash(hashApiKey(presented));
    if (row === undefined) return 'unknown';
    if (row.revokedAt === null) {
      if (this.remembered.size >= MAX_REMEMBERED_KEYS) this.remembered.clear();
      this.remembered.set(presented, { row, until: now + KEY_RECHECK_MS });
    } else {
      this.remembered.delete(presented);
    }
    return row;
  }
}

/** A stored key as the API and the CLI show it. */
export function toApiKeySummary(record: ApiKeyRecord): ApiKeySummary {
  return {
    id: record.id,
    name: record.name,
    prefix: record.prefix,
    limitPerMinute: record.limitPerMinute,
    createdAt: record.createdAt.toISOString(),
    lastUsedAt: record.lastUsedAt?.toISOString() ?? null,
    revokedAt: record.revokedAt?.toISOString() ?? null,
    allowedOrigins: [...record.allowedOrigins],
  };
}
