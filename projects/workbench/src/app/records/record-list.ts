import { computed, type Signal } from '@angular/core';
import type { FormControl } from '@angular/forms';
import type { PageEvent } from '@angular/material/paginator';
import type { Sort } from '@angular/material/sort';
import type { Observable } from 'rxjs';
import {
  apiListQuery,
  ARCHIVED_NOUNS,
  listCount,
  listQuery,
  type ListQuery,
  type ListQueryOptions,
  type ListQueryState,
  PAGE_SIZES,
} from './list-query';
import type { ListPaging, ListSource } from '../shell/list-page';
import { type ListPage, pagedList, type PagedList } from './paged-list';
import type { ArchivedFilter } from './records-api';
import { searchBox } from './search-box';

/** What a records list page is about, besides its columns. */
export interface RecordListOptions<T, S extends string> extends ListQueryOptions<S> {
  /** Asks the server for one page of the list. */
  readonly load: (query: ReturnType<typeof apiListQuery<S>>) => Observable<ListPage<T>>;
  /** How the count above the list names one record and several. */
  readonly nouns: readonly [singular: string, plural: string];
}

/**
 * A records list page's query and rows: the query kept in the address, the page fetched from the server,
 * the search field, and what the table's sort, the archived filter and the paginator change. The customers,
 * machine families and machines lists differ only in their columns and filters, so this is theirs alike.
 */
export interface RecordList<T, S extends string = string> {
  readonly query: ListQuery<S>;
  readonly state: Signal<ListQueryState<S>>;
  readonly list: PagedList<T>;
  readonly search: FormControl<string>;
  /** The list as ListPage frames it: shown while a page is there, and why not. */
  readonly source: ListSource;
  /** The count sentence above the table, once a page is there. */
  readonly count: Signal<string | null>;
  /** The paginator's state and its turning, once a page is there. */
  readonly paging: Signal<ListPaging | null>;
  /** The rows of the page shown, none while the first page is on its way. */
  readonly rows: Signal<readonly T[]>;
  /** "in use", "archived" or "in all", as the empty table's sentence names the archived filter. */
  readonly archivedNoun: Signal<string>;
  sortBy(sort: Sort): void;
  showArchived(archived: ArchivedFilter): void;
  /** The table's trackBy: a record is the same row while its id is. */
  trackById(index: number, record: T): number;
}

/** The list of the page it is called in (an injection context). */
export function recordList<T extends { readonly id: number }, S extends string>(
  options: RecordListOptions<T, S>,
): RecordList<T, S> {
  const query = listQuery<S>(options);
  const state = query.state;
  const list = pagedList(() => apiListQuery(state()), options.load);
  return {
    query,
    state,
    list,
    search: searchBox(
      computed(() => state().q),
      (q) => query.change({ q }, { replaceUrl: true }),
    ),
    source: {
      error: list.error,
      loading: list.loading,
      ready: computed(() => list.page() !== null),
      reload: () => list.reload(),
    },
    count: computed(() => {
      const page = list.page();
      return page ? listCount(page.total, options.nouns, state()) : null;
    }),
    paging: computed(() => {
      const page = list.page();
      return page
        ? {
            length: page.total,
            pageIndex: state().page - 1,
            pageSize: state().pageSize,
            pageSizes: PAGE_SIZES,
            turnPage: (event: PageEvent) =>
              query.change({ page: event.pageIndex + 1, pageSize: event.pageSize }),
          }
        : null;
    }),
    rows: computed<readonly T[]>(() => list.page()?.items ?? []),
    archivedNoun: computed(() => ARCHIVED_NOUNS[state().archived]),
    sortBy: (sort) =>
      query.change({ sort: sort.active as S, order: sort.direction === 'desc' ? 'desc' : 'asc' }),
    showArchived: (archived) => query.change({ archived }),
    trackById: (_index, record) => record.id,
  };
}
