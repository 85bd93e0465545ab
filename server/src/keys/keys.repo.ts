import { and, asc, eq, isNull, ne, sql } from 'drizzle-orm';
import type { Orm } from '../db/database';
import { apiKeys } from '../db/schema';

/** A stored API key: everything but its hash. */
export interface ApiKeyRecord {
  readonly id: number;
  readonly name: string;
  readonly prefix: string;
  readonly limitPerMinute: number;
  readonly createdAt: Date;
  readonly lastUsedAt: Date | null;
  readonly revokedAt: Date | null;
  /** Web origins whose pages may use the key; empty when it is not limited. */
  readonly allowedOrigins: readonly string[];
}

/** What the request path needs of a key, read in one indexed lookup. */
export interface ApiKeyCheckRow {
  readonly id: number;
  readonly name: string;
  readonly prefix: string;
  readonly limitPerMinute: number;
  readonly revokedAt: Date | null;
  /** Web origins whose pages may use the key; empty when it is not limited. */
  readonly allowedOrigins: readonly string[];
}

/** What a new key is stored with. */
export interface NewApiKeyRow {
  readonly name: string;
  readonly prefix: string;
  readonly hash: string;
  readonly limitPerMinute: number;
  readonly createdAt: Date;
  /** The organisation whose key it is; null for a key made without one. */
  readonly organisationId?: number | null;
  /** Web origins whose pages may use the key (normalised, no duplicates); none when absent. */
  readonly allowedOrigins?: readonly string[];
}

const RECORD_COLUMNS = {
  id: apiKeys.id,
  name: apiKeys.name,
  prefix: apiKeys.prefix,
  limitPerMinute: apiKeys.limitPerMinute,
  createdAt: apiKeys.createdAt,
  lastUsedAt: apiKeys.lastUsedAt,
  revokedAt: apiKeys.revokedAt,
  allowedOrigins: apiKeys.allowedOrigins,
};

const CHECK_COLUMNS = {
  id: apiKeys.id,
  name: apiKeys.name,
  prefix: apiKeys.prefix,
  limitPerMinute: apiKeys.limitPerMinute,
  revokedAt: apiKeys.revokedAt,
  allowedOrigins: apiKeys.allowedOrigins,
};

/** The Drizzle queries of the `api_keys` table. */
export class ApiKeysRepo {
  /**
   * Prepared once: every keyed request runs it, and re-building the SQL each time would cost more than
   * the lookup itself. It reads the row every time (no cache), so a revocation made by the CLI in
   * another process takes effect on the next request.
   */
  private readonly byHash;
  /** Prepared once, as `byHash`: every request with a visitor token reads its key by id. */
  private readonly byId;

  constructor(private readonly orm: Orm) {
    this.byId = orm
      .select(CHECK_COLUMNS)
      .from(apiKeys)
      .where(eq(apiKeys.id, sql.placeholder('id')))
      .prepare();
    this.byHash = orm
      .select(CHECK_COLUMNS)
      .from(apiKeys)
      .where(eq(apiKeys.hash, sql.placeholder('hash')))
      .prepare();
  }

  /** The key with this SHA-256 hash, if any. */
  findByHash(hash: string): ApiKeyCheckRow | undefined {
    return this.byHash.get({ hash });
  }

  /** The key with this id, as the request path needs it, if any. */
  findCheckRowById(id: number): ApiKeyCheckRow | undefined {
    return this.byId.get({ id });
  }

  /** Replaces the web origins a key may be used from; returns the key as stored, if it exists. */
  updateOrigins(id: number, allowedOrigins: readonly string[]): ApiKeyRecord | undefined {
    return this.orm
      .update(apiKeys)
      .set({ allowedOrigins: [...allowedOrigins] })
      .where(eq(apiKeys.id, id))
      .returning(RECORD_COLUMNS)
      .get();
  }

  /** Every web origin listed by a key that is not revoked, each once. */
  originsOfActiveKeys(): string[] {
    const lists = this.orm
      .select({ allowedOrigins: apiKeys.allowedOrigins })
      .from(apiKeys)
      .where(and(isNull(apiKeys.revokedAt), ne(apiKeys.allowedOrigins, [])))
      .all();
    return [...new Set(lists.flatMap((row) => row.allowedOrigins))];
  }

  /** Stores a new key and returns it as stored. */
  insert(row: NewApiKeyRow): ApiKeyRecord {
    const { allowedOrigins, ...rest } = row;
    return this.orm
      .insert(apiKeys)
      .values({ ...rest, allowedOrigins: [...(allowedOrigins ?? [])] })
      .returning(RECORD_COLUMNS)
      .get();
  }

  /** The key with this id, if any. */
  findById(id: number): ApiKeyRecord | undefined {
    return this.orm.select(RECORD_COLUMNS).from(apiKeys).where(eq(apiKeys.id, id)).get();
  }

  /** Every key, oldest first. */
  list(): ApiKeyRecord[] {
    return this.orm.select(RECORD_COLUMNS).from(apiKeys).orderBy(asc(apiKeys.id)).all();
  }

  /** The organisation's keys, oldest first. */
  listForOrganisation(organisationId: number): ApiKeyRecord[] {
    return this.orm
      .select(RECORD_COLUMNS)
      .from(apiKeys)
      .where(eq(apiKeys.organisationId, organisationId))
      .orderBy(asc(apiKeys.id))
      .all();
  }

  /** The key with this id if it belongs to the organisation. */
  findInOrganisation(organisationId: number, id: number): ApiKeyRecord | undefined {
    return this.orm
      .select(RECORD_COLUMNS)
      .from(apiKeys)
      .where(and(eq(apiKeys.id, id), eq(apiKeys.organisationId, organisationId)))
      .get();
  }

  /** Marks a key revoked unless it already is; returns whether this call revoked it. */
  revoke(id: number, at: Date): boolean {
    const result = this.orm
      .update(apiKeys)
      .set({ revokedAt: at })
      .where(and(eq(apiKeys.id, id), isNull(apiKeys.revokedAt)))
      .run();
    return result.changes === 1;
  }
}
