import { computed, linkedSignal, type Signal } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import type { Observable } from 'rxjs';

/** A page of a list as the records routes answer it. */
export interface ListPage<T> {
  readonly items: readonly T[];
  readonly total: number;
  readonly page: number;
  readonly pageSize: number;
}

/** A list fetched page by page from the server, as a table shows it. */
export interface PagedList<T> {
  /** The page shown: the last one received, kept while the next is on its way so the table does not jump. */
  readonly page: Signal<ListPage<T> | null>;
  /** Whether a page is on its way. */
  readonly loading: Signal<boolean>;
  /** Why the last request failed, or undefined. */
  readonly error: Signal<unknown>;
  /** Asks for the same page again. */
  reload(): void;
}

/**
 * The rows of a server-paged table for a query signal (call it in an injection context): every change of
 * the query asks the server, an older answer never replaces a newer one, and the rows stay on screen while
 * the next page loads. After a failure the rows go, so that they are never taken for the answer to the new
 * query.
 */
export function pagedList<Q, T>(query: () => Q, load: (query: Q) => Observable<ListPage<T>>): PagedList<T> {
  const resource = rxResource({ params: query, stream: ({ params }) => load(params) });
  const page = linkedSignal<{ value: ListPage<T> | undefined; failed: boolean }, ListPage<T> | null>({
    source: () => ({ value: resource.hasValue() ? resource.value() : undefined, failed: !!resource.error() }),
    computation: ({ value, failed }, previous) => (failed ? null : (value ?? previous?.value ?? null)),
  });
  return {
    page,
    loading: computed(() => resource.isLoading()),
    error: computed(() => resource.error()),
    reload: () => resource.reload(),
  };
}
