import { HttpClient, HttpErrorResponse, HttpParams, type HttpResponse } from '@angular/common/http';
import { inject } from '@angular/core';
import type { Problem, RecordHistory } from '@counterpoise/api';
import { map, type Observable } from 'rxjs';
import { problemOf } from '../shell/server-errors';

/** A record as read or written, with the ETag that a later change must send back in `If-Match`. */
export interface Versioned<T> {
  /** The record as the server stores it now. */
  readonly record: T;
  /** Its version as a quoted strong ETag, `"4"`. */
  readonly etag: string;
}

/** What a change made on an old version answers (412): the record as stored now, and its ETag. */
export interface ChangedMeanwhile<T> extends Versioned<T> {
  /** The server's own sentence about it. */
  readonly detail: string | null;
}

/** The list filter on archiving: in use only (the server's default), archived only, or both. */
export type ArchivedFilter = 'false' | 'true' | 'all';

/** The fields every stored record carries. */
export interface StoredRecord {
  readonly id: number;
  readonly version: number;
  readonly updatedAt: string;
  readonly archivedAt: string | null;
}

/** The ETag the server gives a version (`"<version>"`), for an answer whose header a proxy dropped. */
export function etagOfVersion(version: number): string {
  return `"${version}"`;
}

/**
 * A list query as URL parameters: empty, undefined and null values are left out, so that the server
 * applies its defaults and the request reads as what the person asked.
 */
export function queryParams(query: object): HttpParams {
  let params = new HttpParams();
  for (const [name, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === '') continue;
    params = params.set(name, String(value));
  }
  return params;
}

/**
 * The record as stored now when a change was refused because someone changed it meanwhile (412 with the
 * record in the problem's `current`); null for any other failure.
 */
export function changedMeanwhileOf<T extends { readonly version: number }>(
  error: unknown,
): ChangedMeanwhile<T> | null {
  if (!(error instanceof HttpErrorResponse) || error.status !== 412) return null;
  const problem = problemOf(error) as (Problem & { current?: T }) | null;
  const current = problem?.current;
  if (typeof current !== 'object' || current === null) return null;
  return {
    record: current,
    etag: error.headers.get('ETag') ?? etagOfVersion(current.version),
    detail: problem?.detail ?? null,
  };
}

/**
 * The six routes every kind of shop record has (list, read, create, change, archive, restore) and its change
 * history, so that each feature's data service is its base address and its types, and the pages hold no
 * URLs. Reads and writes carry the ETag; every change sends it back in `If-Match`, so that the server can
 * refuse a change made on a version someone else has changed since (412, see `changedMeanwhile`).
 */
export abstract class RecordsApi<
  TRecord extends StoredRecord,
  TPage,
  TQuery extends object,
  TCreate,
  TUpdate,
> {
  protected readonly http = inject(HttpClient);
  /** The collection's address, `/api/v1/customers`. */
  protected abstract readonly url: string;

  /** One page of the list, searched, filtered and sorted by the server. */
  list(query: TQuery): Observable<TPage> {
    return this.http.get<TPage>(this.url, { params: queryParams(query) });
  }

  /** One record and its ETag. */
  get(id: number): Observable<Versioned<TRecord>> {
    return this.http
      .get<TRecord>(this.itemUrl(id), { observe: 'response' })
      .pipe(map((response) => this.versioned(response)));
  }

  /** Stores a new record; answers it with its first ETag. */
  create(record: TCreate): Observable<Versioned<TRecord>> {
    return this.http
      .post<TRecord>(this.url, record, { observe: 'response' })
      .pipe(map((response) => this.versioned(response)));
  }

  /** Changes the given fields of the version `etag` names; the others stay as stored. */
  update(id: number, change: TUpdate, etag: string): Observable<Versioned<TRecord>> {
    return this.http
      .patch<TRecord>(this.itemUrl(id), change, { observe: 'response', headers: { 'If-Match': etag } })
      .pipe(map((response) => this.versioned(response)));
  }

  /** Takes the record out of use; nothing is deleted, and `restore` brings it back. */
  archive(id: number, etag: string): Observable<Versioned<TRecord>> {
    return this.action(id, 'archive', etag);
  }

  /** Brings an archived record back into use. */
  restore(id: number, etag: string): Observable<Versioned<TRecord>> {
    return this.action(id, 'restore', etag);
  }

  /** Who changed what and when, newest first. */
  history(id: number): Observable<RecordHistory> {
    return this.http.get<RecordHistory>(`${this.itemUrl(id)}/history`);
  }

  /**
   * The record as stored now when a change was refused because someone changed it meanwhile (412 with the
   * record in the problem's `current`); null for any other failure.
   */
  changedMeanwhile(error: unknown): ChangedMeanwhile<TRecord> | null {
    return changedMeanwhileOf<TRecord>(error);
  }

  private action(id: number, action: 'archive' | 'restore', etag: string): Observable<Versioned<TRecord>> {
    return this.http
      .post<TRecord>(`${this.itemUrl(id)}/${action}`, null, {
        observe: 'response',
        headers: { 'If-Match': etag },
      })
      .pipe(map((response) => this.versioned(response)));
  }

  private itemUrl(id: number): string {
    return `${this.url}/${encodeURIComponent(id)}`;
  }

  private versioned(response: HttpResponse<TRecord>): Versioned<TRecord> {
    const record = response.body as TRecord;
    return { record, etag: response.headers.get('ETag') ?? etagOfVersion(record.version) };
  }
}
