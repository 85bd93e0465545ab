import { and, asc, desc, eq, gte, inArray, lt, type SQL, sql } from 'drizzle-orm';
import type { UsageGrouping } from '@counterpoise/api';
import type { Orm } from '../db/database';
import { apiKeys, apiUsage } from '../db/schema';
import type { UsageRow } from '../http/keyed-request';

/** The sums of one group of usage rows, as SQLite returns them. */
export interface UsageGroupRow {
  readonly group: string;
  readonly keyName: string | null;
  readonly requests: number;
  readonly clientErrors: number;
  readonly serverErrors: number;
  readonly rateLimited: number;
  readonly bytes: number;
  readonly totalDurationMs: number;
  readonly maxDurationMs: number;
}

const FIGURES = {
  requests: sql<number>`count(*)`.mapWith(Number),
  clientErrors: sql<number>`total(${apiUsage.status} between 400 and 499)`.mapWith(Number),
  serverErrors: sql<number>`total(${apiUsage.status} >= 500)`.mapWith(Number),
  rateLimited: sql<number>`total(${apiUsage.status} = 429)`.mapWith(Number),
  bytes: sql<number>`total(${apiUsage.bytes})`.mapWith(Number),
  totalDurationMs: sql<number>`total(${apiUsage.durationMs})`.mapWith(Number),
  maxDurationMs: sql<number>`coalesce(max(${apiUsage.durationMs}), 0)`.mapWith(Number),
};

/**
 * A batch of usage rows in the form the insert takes: one JSON array of [keyId, route, status, durationMs,
 * bytes, atMs], and each key's latest use. Plain data, so that it can travel to the writer's thread.
 */
export interface PackedUsageRows {
  readonly count: number;
  readonly json: string;
  readonly lastUsedMs: readonly (readonly [keyId: number, atMs: number])[];
}

/** Packs rows for `insertPacked`. */
export function packUsageRows(rows: readonly UsageRow[]): PackedUsageRows {
  const lastUsedMs = new Map<number, number>();
  const packed: (number | string)[][] = new Array(rows.length);
  for (let index = 0; index < rows.length; index++) {
    const row = rows[index]!;
    const atMs = row.at.getTime();
    if ((lastUsedMs.get(row.keyId) ?? -1) < atMs) lastUsedMs.set(row.keyId, atMs);
    packed[index] = [row.keyId, row.route, row.status, row.durationMs, row.bytes, atMs];
  }
  return { count: rows.length, json: JSON.stringify(packed), lastUsedMs: [...lastUsedMs] };
}

/** The UTC day of a row, from its millisecond timestamp. */
const DAY = sql<string>`strftime('%Y-%m-%d', ${apiUsage.at} / 1000, 'unixepoch')`;

/** The Drizzle queries of the `api_usage` table. */
export class UsageRepo {
  private readonly insertRows;
  private readonly touchKey;

  constructor(private readonly orm: Orm) {
    // Prepared once. A flush writes all its rows with one statement: they travel as one JSON array of
    // [keyId, route, status, durationMs, bytes, atMs] and SQLite's json_each unpacks them, which costs
    // far less per row than running an INSERT for each (the usage log writes one row per batch item).
    // The id column is left for SQLite to assign.
    this.insertRows = orm
      .insert(apiUsage)
      .select(
        sql`select null, value ->> 0, value ->> 1, value ->> 2, value ->> 3, value ->> 4, value ->> 5
            from json_each(${sql.placeholder('rows')})`,
      )
      .prepare();
    this.touchKey = orm
      .update(apiKeys)
      .set({ lastUsedAt: sql`max(coalesce(${apiKeys.lastUsedAt}, 0), ${sql.placeholder('atMs')})` })
      .where(eq(apiKeys.id, sql.placeholder('id')))
      .prepare();
  }

  /**
   * Writes a batch packed by `packUsageRows` and moves each key's `last_used_at` forward, in one
   * transaction: either the whole batch is stored or none of it, so a failed write can be retried
   * without duplicating rows.
   */
  insertPacked(batch: PackedUsageRows): void {
    if (batch.count === 0) return;
    this.orm.transaction(() => {
      this.insertRows.run({ rows: batch.json });
      for (const [id, atMs] of batch.lastUsedMs) this.touchKey.run({ id, atMs });
    });
  }

  /**
   * Sums of the rows in `[from, to)` of one key, or of every key of an organisation, one entry per day,
   * route or key.
   */
  groups(
    scope: number | { readonly organisationId: number },
    from: Date,
    to: Date,
    groupBy: UsageGrouping,
  ): UsageGroupRow[] {
    const keys =
      typeof scope === 'number'
        ? eq(apiUsage.keyId, scope)
        : inArray(
            apiUsage.keyId,
            this.orm
              .select({ id: apiKeys.id })
              .from(apiKeys)
              .where(eq(apiKeys.organisationId, scope.organisationId)),
          );
    const where = and(keys, gte(apiUsage.at, from), lt(apiUsage.at, to));
    if (groupBy === 'key') {
      return this.orm
        .select({ group: apiKeys.prefix, keyName: apiKeys.name, ...FIGURES })
        .from(apiUsage)
        .innerJoin(apiKeys, eq(apiKeys.id, apiUsage.keyId))
        .where(where)
        .groupBy(apiUsage.keyId)
        .orderBy(desc(sql`count(*)`), asc(apiKeys.prefix))
        .all();
    }
    const group: SQL<string> = groupBy === 'day' ? DAY : sql<string>`${apiUsage.route}`;
    const order = groupBy === 'day' ? [asc(group)] : [desc(sql`count(*)`), asc(group)];
    return this.orm
      .select({ group, keyName: sql<null>`null`, ...FIGURES })
      .from(apiUsage)
      .where(where)
      .groupBy(group)
      .orderBy(...order)
      .all();
  }

  /** How many usage rows are stored in all (for tests and checks). */
  count(): number {
    return (
      this.orm
        .select({ count: sql<number>`count(*)` })
        .from(apiUsage)
        .get()?.count ?? 0
    );
  }
}
