import { computed, inject, type Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRoute, type ParamMap, type Params, Router } from '@angular/router';
import type { ArchivedFilter } from './records-api';

/** The page sizes a list offers; the server accepts 1 to 100. */
export const PAGE_SIZES: readonly number[] = [10, 25, 50, 100];
/** The server's default page size. */
export const DEFAULT_PAGE_SIZE = 25;
/** How long the search waits after the last key before it asks the server. */
export const SEARCH_DEBOUNCE_MS = 300;

/** How a list page reads its query from the address. */
export interface ListQueryOptions<S extends string> {
  /** The fields the server sorts this list by; the first is the default. */
  readonly sortFields: readonly [S, ...S[]];
  /** Further filters that name a record by id (`customerId`, `familyId`). */
  readonly idFilters?: readonly string[];
}

/** What a list shows: search, archived filter, sort, page and the id filters. */
export interface ListQueryState<S extends string> {
  readonly q: string;
  readonly archived: ArchivedFilter;
  readonly sort: S;
  readonly order: 'asc' | 'desc';
  /** From 1, as the server counts. */
  readonly page: number;
  readonly pageSize: number;
  /** The id filters that are set. */
  readonly filters: Readonly<Record<string, number>>;
}

const ARCHIVED: readonly ArchivedFilter[] = ['false', 'true', 'all'];

/** How a list's count names the records its archived filter shows. */
export const ARCHIVED_NOUNS: Readonly<Record<ArchivedFilter, string>> = {
  false: 'in use',
  true: 'archived',
  all: 'in all',
};

/**
 * The sentence above a list: how many records the query found, "12 customers in use.", "1 machine in use
 * matches “TM225” and the filters."
 */
export function listCount(
  total: number,
  nouns: readonly [singular: string, plural: string],
  state: Pick<ListQueryState<string>, 'archived' | 'q' | 'filters'>,
): string {
  const counted = `${total} ${total === 1 ? nouns[0] : nouns[1]} ${ARCHIVED_NOUNS[state.archived]}`;
  const verb = total === 1 ? 'matches' : 'match';
  const filtered = Object.keys(state.filters).length > 0;
  if (state.q) return `${counted} ${verb} “${state.q}”${filtered ? ' and the filters' : ''}.`;
  if (filtered) return `${counted} ${verb} the filters.`;
  return `${counted}.`;
}

function positiveWhole(text: string | null, max: number): number | null {
  if (text === null || !/^\d+$/.test(text)) return null;
  const value = Number(text);
  return value >= 1 && value <= max ? value : null;
}

/**
 * The list's query as the address's query string holds it, so that a reload, the back button or a shared
 * link shows the same page. A value the server would refuse (a typed-over `page=abc`) falls back to its
 * default rather than breaking the page.
 */
export function readListQuery<S extends string>(
  params: ParamMap,
  options: ListQueryOptions<S>,
): ListQueryState<S> {
  const archived = params.get('archived') as ArchivedFilter | null;
  const sort = params.get('sort') as S | null;
  const filters: Record<string, number> = {};
  for (const name of options.idFilters ?? []) {
    const id = positiveWhole(params.get(name), Number.MAX_SAFE_INTEGER);
    if (id !== null) filters[name] = id;
  }
  const pageSize = positiveWhole(params.get('pageSize'), 100);
  return {
    q: (params.get('q') ?? '').slice(0, 100),
    archived: archived !== null && ARCHIVED.includes(archived) ? archived : 'false',
    sort: sort !== null && options.sortFields.includes(sort) ? sort : options.sortFields[0],
    order: params.get('order') === 'desc' ? 'desc' : 'asc',
    page: positiveWhole(params.get('page'), 100_000) ?? 1,
    pageSize: pageSize !== null && PAGE_SIZES.includes(pageSize) ? pageSize : DEFAULT_PAGE_SIZE,
    filters,
  };
}

/** The address's query string for a list query: defaults are left out, so that links stay short. */
export function listQueryParams<S extends string>(
  state: ListQueryState<S>,
  options: ListQueryOptions<S>,
): Params {
  const params: Params = {
    q: state.q.trim() || null,
    archived: state.archived === 'false' ? null : state.archived,
    sort: state.sort === options.sortFields[0] ? null : state.sort,
    order: state.order === 'asc' ? null : state.order,
    page: state.page === 1 ? null : state.page,
    pageSize: state.pageSize === DEFAULT_PAGE_SIZE ? null : state.pageSize,
  };
  for (const name of options.idFilters ?? []) params[name] = state.filters[name] ?? null;
  return params;
}

/** The list query as the API takes it: the search trimmed (left out when empty), the id filters flattened. */
export function apiListQuery<S extends string>(state: ListQueryState<S>) {
  const { filters, q, ...rest } = state;
  return { ...rest, ...(q.trim() ? { q: q.trim() } : {}), ...filters };
}

/** A list's query, read from the address and written back to it. */
export interface ListQuery<S extends string> {
  /** What the list shows now. */
  readonly state: Signal<ListQueryState<S>>;
  /**
   * Shows another part of the list by changing the address. A new search, filter or sort starts again at
   * the first page. `replaceUrl` for search typing, so that the back button skips the keystrokes.
   */
  change(change: Partial<ListQueryState<S>>, options?: { replaceUrl?: boolean }): void;
}

/** The query of the list page it is called in (an injection context), kept in the address's query string. */
export function listQuery<S extends string>(options: ListQueryOptions<S>): ListQuery<S> {
  const route = inject(ActivatedRoute);
  const router = inject(Router);
  const params = toSignal(route.queryParamMap, { requireSync: true });
  const state = computed(() => readListQuery(params(), options), {
    equal: (a, b) => JSON.stringify(a) === JSON.stringify(b),
  });
  return {
    state,
    change(change, { replaceUrl = false } = {}) {
      const current = state();
      const startAgain = Object.keys(change).some((key) => key !== 'page' && key !== 'pageSize');
      const next: ListQueryState<S> = {
        ...current,
        ...change,
        page: change.page ?? (startAgain || change.pageSize !== undefined ? 1 : current.page),
      };
      void router.navigate([], {
        relativeTo: route,
        queryParams: listQueryParams(next, options),
        replaceUrl,
      });
    },
  };
}
