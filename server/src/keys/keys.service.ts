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

/**
 * How long the web origins of the active keys (which preflights are answered for) are trusted without
 * reading them again: changes made here count at once; a change made by the CLI, in another process,
 * within this.
 */
export const ORIGINS_RECHECK_MS = 5_000;

/** What changing a key's origins did. */
export type UpdateOriginsOutcome =
  { readonly outcome: 'updated'; readonly key: ApiKeyRecord } | { readonly outcome: 'not-found' };

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
  /** Valid keys read lately by id, for visitor tokens, which name their key by id. */
  private readonly rememberedById = new Map<number, RememberedKey>();
  /** The origins listed by active keys, until `until` (monotonic ms). */
  private originsInUseCache: { readonly origins: ReadonlySet<string>; readonly until: number } | undefined;

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
    if (record.allowedOrigins.length > 0) this.originsInUseCache = undefined;
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
    return this.revoke(id, now);
  }

  /**
   * Replaces the web origins one of the organisation's keys may be used from (an empty list lifts the
   * limit); a key of another organisation is not found. Counts at once in this process, for requests
   * and preflights alike.
   */
  updateOriginsInOrganisation(
    organisationId: number,
    id: number,
    allowedOrigins: readonly string[],
  ): UpdateOriginsOutcome {
    if (!this.repo.findInOrganisation(organisationId, id)) return { outcome: 'not-found' };
    const key = this.repo.updateOrigins(id, allowedOrigins);
    this.forget(id);
    if (!key) return { outcome: 'not-found' };
    return { outcome: 'updated', key };
  }

  /** Revokes a key; revoking twice is harmless and keeps the first date. It stops working at once here. */
  revoke(id: number, now: Date): RevokeOutcome {
    const revoked = this.repo.revoke(id, now);
    this.forget(id);
    const key = this.repo.findById(id);
    if (!key) return { outcome: 'not-found' };
    return { outcome: revoked ? 'revoked' : 'already-revoked', key };
  }

  /**
   * The key a visitor token names, as `check` answers for a presented key: read again at most every
   * `KEY_RECHECK_MS`, so that revoking the key stops its tokens too.
   */
  checkById(id: number): ApiKeyCheckRow | 'unknown' {
    const now = this.monotonicMs();
    const remembered = this.rememberedById.get(id);
    if (remembered !== undefined && remembered.until > now) return remembered.row;
    const row = this.repo.findCheckRowById(id);
    if (row === undefined) return 'unknown';
    if (row.revokedAt === null) {
      if (this.rememberedById.size >= MAX_REMEMBERED_KEYS) this.rememberedById.clear();
      this.rememberedById.set(id, { row, until: now + KEY_RECHECK_MS });
    } else {
      this.rememberedById.delete(id);
    }
    return row;
  }

  /**
   * The web origins listed by keys that are not revoked: the origins whose preflights are answered
   * (a preflight carries no key, so it cannot be answered for one key alone). Read again after a
   * change made here, and at least every `ORIGINS_RECHECK_MS`.
   */
  originsInUse(): ReadonlySet<string> {
    const now = this.monotonicMs();
    if (this.originsInUseCache !== undefined && this.originsInUseCache.until > now) {
      return this.originsInUseCache.origins;
    }
    const origins = new Set(this.repo.originsOfActiveKeys());
    this.originsInUseCache = { origins, until: now + ORIGINS_RECHECK_MS };
    return origins;
  }

  /** Drops what is remembered of a key that changed, and the origins in use. */
  private forget(id: number): void {
    for (const [presented, remembered] of this.remembered) {
      if (remembered.row.id === id) this.remembered.delete(presented);
    }
    this.rememberedById.delete(id);
    this.originsInUseCache = undefined;
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
