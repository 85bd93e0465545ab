import { asc, desc, getTableName, isNotNull, isNull, or, type SQL, sql } from 'drizzle-orm';
import type { SQLiteColumn } from 'drizzle-orm/sqlite-core';

/*
 * The parts of a list query that customers, machine families and machines share: the search, the
 * in-use/archived filter, the sort with its tie-break, and the page. Each repo joins what it needs and
 * puts these together; every list also filters by organisation, which the repo writes first.
 */

/** What the list routes' query holds once parsed (see `listQuerySchema` in shared/api/records.ts). */
export interface ListWindow {
  readonly archived: 'false' | 'true' | 'all';
  readonly order: 'asc' | 'desc';
  readonly page: number;
  readonly pageSize: number;
}

/**
 * Text as the search and sort keys store it and as `q` is compared with them: lower case by Unicode's
 * rules. SQLite's own `lower()` and `LIKE` fold ASCII letters only, so a key is folded here, once, when
 * the record is written, and "ÖSTBERG" finds "Östberg".
 */
export function foldCase(text: string): string {
  return text.toLowerCase();
}

/**
 * The search text of a record: its searchable values folded and joined by line breaks. A search term
 * cannot hold a line break (the query schema refuses control characters), so no match spans two values.
 */
export function searchTextOf(values: readonly (string | null | undefined)[]): string {
  return values
    .filter((value): value is string => typeof value === 'string' && value !== '')
    .map(foldCase)
    .join('\n');
}

/** `q` as a LIKE pattern that finds it anywhere, with `%`, `_` and the escape itself taken literally. */
export function containsPattern(q: string): string {
  return `%${foldCase(q).replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
}

/** Rows where any of the folded columns holds `q`; no condition when there is nothing to search for. */
export function searchCondition(
  columns: readonly (SQLiteColumn | SQL)[],
  q: string | undefined,
): SQL | undefined {
  if (q === undefined || q === '') return undefined;
  const pattern = containsPattern(q);
  return or(...columns.map((column) => sql`${column} LIKE ${pattern} ESCAPE '\\'`));
}

/** Records in use (`false`, the default), archived ones (`true`), or both (`all`). */
export function archivedCondition(
  archivedAt: SQLiteColumn,
  archived: ListWindow['archived'],
): SQL | undefined {
  if (archived === 'all') return undefined;
  return archived === 'true' ? isNotNull(archivedAt) : isNull(archivedAt);
}

/**
 * The ORDER BY of a list: the sort key in the order asked, records without a value last either way
 * (a machine without a serial number is not the first thing one looks for), and the id as the
 * tie-break, so that paging through equal keys neither repeats nor skips a record.
 */
export function sortOrder(
  key: SQLiteColumn | SQL,
  id: SQLiteColumn,
  order: ListWindow['order'],
  nullable = false,
): SQL[] {
  const direction = order === 'asc' ? asc : desc;
  return [...(nullable ? [sql`${key} IS NULL`] : []), direction(key), direction(id)];
}

/** The LIMIT and OFFSET of the page asked for. */
export function pageWindow(window: Pick<ListWindow, 'page' | 'pageSize'>): { limit: number; offset: number } {
  return { limit: window.pageSize, offset: (window.page - 1) * window.pageSize };
}

/** The COUNT(*) expression of a list's total. */
export const countAll = sql<number>`count(*)`.mapWith(Number);

/**
 * A column written with its table's name (`"customers"."id"`), for a correlated subquery: Drizzle writes
 * the columns of a query over one table without it, and inside a subquery over another table such a
 * bare name would be read as that table's column.
 */
export function qualified(column: SQLiteColumn): SQL {
  return sql`${sql.identifier(getTableName(column.table))}.${sql.identifier(column.name)}`;
}

/** The part of a select over a feature's rows that a page needs (a Drizzle select fits it). */
interface RowsQuery<Row> {
  where(where: SQL | undefined): {
    orderBy(...order: SQL[]): { limit(limit: number): { offset(offset: number): { all(): Row[] } } };
  };
}

/** The part of a `{ total: countAll }` select that a page needs. */
interface TotalQuery {
  where(where: SQL | undefined): { get(): { total: number } | undefined };
}

/**
 * One page of a list and how many match in all: `rows` and `total` select from the same tables (the
 * joins that `where` names included), so that the total counts what the pages show.
 */
export function listPage<Row>(
  rows: RowsQuery<Row>,
  total: TotalQuery,
  where: SQL | undefined,
  order: SQL[],
  window: Pick<ListWindow, 'page' | 'pageSize'>,
): { rows: Row[]; total: number } {
  const { limit, offset } = pageWindow(window);
  return {
    rows: rows
      .where(where)
      .orderBy(...order)
      .limit(limit)
      .offset(offset)
      .all(),
    total: total.where(where).get()?.total ?? 0,
  };
}

/**
 * How many rows in use of another table name a listed row: `reference` is that table's column naming
 * it, `owner` the listed row's id. A correlated subquery, so that a list with its counts is one query
 * whatever its length.
 */
export function inUseCount(
  reference: SQLiteColumn,
  archivedAt: SQLiteColumn,
  owner: SQLiteColumn,
): SQL<number> {
  return sql<number>`(SELECT count(*) FROM ${reference.table} WHERE ${qualified(reference)} = ${qualified(owner)} AND ${qualified(archivedAt)} IS NULL)`.mapWith(
    Number,
  );
}
