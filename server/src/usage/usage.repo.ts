import { and, asc, desc, eq, gte, inArray, isNotNull, lt, type SQL, sql } from 'drizzle-orm';
import type { UsageGrouping } from '@counterpoise/api';
import type { Orm } from '../db/database';
import { apiKeys, apiUsage } from '../db/schema';
import type { UsageRow } from '../http/keyed-request';

/** The sums of one group of usage rows, as SQLite returns them. */
export interface UsageGroupRow {
  readonly group: string;
  readonly keyName: string | null;
  readonly requests: number;
  readonly calculations: number;
  readonly clientErrors: number;
  readonly serverErrors: number;
  readonly rateLimited: number;
  readonly bytes: number;
  readonly totalDurationMs: number;
  readonly maxDurationMs: number;
}

/** How many answers of a group had one error status (400 or more). */
export interface UsageStatusRow {
  readonly group: string;
  readonly status: number;
  readonly answers: number;
}

/**
 * A row that stands for a request of its own: every row written since migration 0009, and of the rows
 * written before it those that were not a batch's item.
 */
const IS_REQUEST = sql`(${apiUsage.batchItem} = 0)`;

/** How many of a row's batch items were answered with a status in `[low, high]`. */
const itemErrorsBetween = (low: number, high: number) =>
  sql`(select total(value) from json_each(${apiUsage.itemErrors}) where cast(key as integer) between ${low} and ${high})`;

/**
 * Requests and their bytes and durations are summed over the rows of requests: a batch is one request,
 * answered and timed whole. Calculations are what each row carried, as a key's limit counts them (a call
 * of a calculator route one, a batch of n items n). Errors are counted over answers: a request's, and
 * each batch item's own (its row's `item_errors`).
 */
const FIGURES = {
  requests: sql<number>`total(${IS_REQUEST})`.mapWith(Number),
  calculations: sql<number>`total(${apiUsage.calculations})`.mapWith(Number),
  clientErrors:
    sql<number>`total(${apiUsage.status} between 400 and 499) + total(${itemErrorsBetween(400, 499)})`.mapWith(
      Number,
    ),
  serverErrors: sql<number>`total(${apiUsage.status} >= 500) + total(${itemErrorsBetween(500, 599)})`.mapWith(
    Number,
  ),
  rateLimited: sql<number>`total(${apiUsage.status} = 429)`.mapWith(Number),
  bytes: sql<number>`total(case when ${IS_REQUEST} then ${apiUsage.bytes} end)`.mapWith(Number),
  totalDurationMs: sql<number>`total(case when ${IS_REQUEST} then ${apiUsage.durationMs} end)`.mapWith(
    Number,
  ),
  maxDurationMs:
    sql<number>`coalesce(max(case when ${IS_REQUEST} then ${apiUsage.durationMs} end), 0)`.mapWith(Number),
};

/**
 * A batch of usage rows in the form the insert takes: one JSON array of [keyId, route, status, durationMs,
 * bytes, atMs, calculations, itemErrors (an object, or null)], and each key's latest use. Plain data, so
 * that it can travel to the writer's thread.
 */
export interface PackedUsageRows {
  readonly count: number;
  readonly json: string;
  readonly lastUsedMs: readonly (readonly [keyId: number, atMs: number])[];
}

/** Packs rows for `insertPacked`. */
export function packUsageRows(rows: readonly UsageRow[]): PackedUsageRows {
  const lastUsedMs = new Map<number, number>();
  const packed: unknown[][] = new Array(rows.length);
  for (let index = 0; index < rows.length; index++) {
    const row = rows[index]!;
    const atMs = row.at.getTime();
    if ((lastUsedMs.get(row.keyId) ?? -1) < atMs) lastUsedMs.set(row.keyId, atMs);
    packed[index] = [
      row.keyId,
      row.route,
      row.status,
      row.durationMs,
      row.bytes,
      atMs,
      row.calculations,
      row.itemErrors ?? null,
    ];
  }
  return { count: rows.length, json: JSON.stringify(packed), lastUsedMs: [...lastUsedMs] };
}

/** The UTC day of a row, from its millisecond timestamp. */
const DAY = sql<string>`strftime('%Y-%m-%d', ${apiUsage.at} / 1000, 'unixepoch')`;

/** What a day's or a route's group is named after. */
function groupOf(groupBy: Exclude<UsageGrouping, 'key'>): SQL<string> {
  return groupBy === 'day' ? DAY : sql<string>`${apiUsage.route}`;
}

/** The Drizzle queries of the `api_usage` table. */
export class UsageRepo {
  private readonly insertRows;
  private readonly touchKey;

  constructor(private readonly orm: Orm) {
    // Prepared once. A flush writes all its rows with one statement: they travel as one JSON array of
    // [keyId, route, status, durationMs, bytes, atMs, calculations, itemErrors] and SQLite's json_each
    // unpacks them, which costs far less per row than running an INSERT for each. The id column is left
    // for SQLite to assign; batch_item is 0, as every row is a request's (see the schema).
    this.insertRows = orm
      .insert(apiUsage)
      .select(
        sql`select null, value ->> 0, value ->> 1, value ->> 2, value ->> 3, value ->> 4, value ->> 5, 0,
              value ->> 6, value ->> 7
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
    const where = this.span(scope, from, to);
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
    const group = groupOf(groupBy);
    const order = groupBy === 'day' ? [asc(group)] : [desc(sql`count(*)`), asc(group)];
    return this.orm
      .select({ group, keyName: sql<null>`null`, ...FIGURES })
      .from(apiUsage)
      .where(where)
      .groupBy(group)
      .orderBy(...order)
      .all();
  }

  /**
   * The answers with an error status (400 or more) in `[from, to)`, counted per group (named as in
   * `groups`) and status, statuses in order: requests' answers, and each batch item's by its own status.
   */
  errorStatuses(
    scope: number | { readonly organisationId: number },
    from: Date,
    to: Date,
    groupBy: UsageGrouping,
  ): UsageStatusRow[] {
    const span = this.span(scope, from, to);
    const where = and(span, gte(apiUsage.status, 400));
    const answers = sql<number>`count(*)`.mapWith(Number);
    // The items of batches, by the status each was answered with: one row of json_each per status.
    const itemStatus = sql<number>`cast(item.key as integer)`.mapWith(Number);
    const itemAnswers = sql<number>`total(item.value)`.mapWith(Number);
    const items = sql`json_each(${apiUsage.itemErrors}) as item`;
    let requests: UsageStatusRow[];
    let itemRows: UsageStatusRow[];
    if (groupBy === 'key') {
      requests = this.orm
        .select({ group: apiKeys.prefix, status: apiUsage.status, answers })
        .from(apiUsage)
        .innerJoin(apiKeys, eq(apiKeys.id, apiUsage.keyId))
        .where(where)
        .groupBy(apiUsage.keyId, apiUsage.status)
        .all();
      itemRows = this.orm.all<UsageStatusRow>(
        sql`select ${apiKeys.prefix} as "group", ${itemStatus} as status, ${itemAnswers} as answers
            from ${apiUsage} inner join ${apiKeys} on ${eq(apiKeys.id, apiUsage.keyId)}, ${items}
            where ${and(span, isNotNull(apiUsage.itemErrors))}
            group by ${apiUsage.keyId}, status`,
      );
    } else {
      const group = groupOf(groupBy);
      requests = this.orm
        .select({ group, status: apiUsage.status, answers })
        .from(apiUsage)
        .where(where)
        .groupBy(group, apiUsage.status)
        .all();
      itemRows = this.orm.all<UsageStatusRow>(
        sql`select ${group} as "group", ${itemStatus} as status, ${itemAnswers} as answers
            from ${apiUsage}, ${items}
            where ${and(span, isNotNull(apiUsage.itemErrors))}
            group by 1, 2`,
      );
    }
    const merged = new Map<string, UsageStatusRow>();
    for (const row of [...requests, ...itemRows]) {
      const at = `${row.status} ${row.group}`;
      const found = merged.get(at);
      const answered = Number(row.answers);
      merged.set(at, {
        group: row.group,
        status: Number(row.status),
        answers: (found?.answers ?? 0) + answered,
      });
    }
    return [...merged.values()].sort((a, b) => a.status - b.status);
  }

  /** The rows of one key, or of every key of an organisation, in `[from, to)`. */
  private span(scope: number | { readonly organisationId: number }, from: Date, to: Date): SQL | undefined {
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
    return and(keys, gte(apiUsage.at, from), lt(apiUsage.at, to));
  }

  /** Runs reads in one transaction, so that they see the same rows. */
  read<T>(reads: () => T): T {
    return this.orm.transaction(reads, { behavior: 'deferred' });
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
