import { HttpErrorResponse, HttpHeaders, type HttpInterceptorFn, HttpResponse } from '@angular/common/http';
import { inject, Injectable, InjectionToken } from '@angular/core';
import { catchError, from, type Observable, of, switchMap, tap, throwError } from 'rxjs';
import { AuthSession } from '../auth/auth-session';
import { Connection, isNoAnswer } from './connection';
import { IdbOfflineStorage } from './idb-offline-storage';
import { MemoryOfflineStorage, type OfflineStorage } from './offline-storage';

/** Where the device keeps what it needs offline: IndexedDB in a browser, memory where there is none. */
export const OFFLINE_STORAGE = new InjectionToken<OfflineStorage>('OFFLINE_STORAGE', {
  providedIn: 'root',
  factory: () => (typeof indexedDB === 'undefined' ? new MemoryOfflineStorage() : new IdbOfflineStorage()),
});

/**
 * The reads a technician's day needs with no connection: their day (`/jobs/home`), each job, and each job's
 * machine and machine family (what the job page and the local rules read). Nothing else is kept.
 */
const KEPT_READS: readonly RegExp[] = [
  /^\/api\/v1\/jobs\/home$/,
  /^\/api\/v1\/jobs\/\d+$/,
  /^\/api\/v1\/machines\/\d+$/,
  /^\/api\/v1\/machine-families\/\d+$/,
];

/** Whether a GET of this address is kept on the device. */
export function isKeptRead(url: string): boolean {
  return KEPT_READS.some((pattern) => pattern.test(url));
}

/** The answers of the kept reads, per person, as last read from the server. */
@Injectable({ providedIn: 'root' })
export class OfflineRecords {
  private readonly storage = inject(OFFLINE_STORAGE);

  /** The answer last read at this address for the person, with its ETag; null when none is kept. */
  async read<T>(userId: number, url: string): Promise<{ body: T; etag: string | null } | null> {
    try {
      const record = await this.storage.readRecord(userId, url);
      return record ? { body: record.body as T, etag: record.etag } : null;
    } catch {
      return null;
    }
  }

  /** Keeps an answer read from the server (or sent back by it after a change). */
  async write(userId: number, url: string, body: unknown, etag: string | null): Promise<void> {
    try {
      await this.storage.writeRecord({ userId, url, body, etag, storedAt: new Date().toISOString() });
    } catch {
      // A full or refused storage costs the offline copy, never the answer itself.
    }
  }

  /** Forgets what was kept for the person (at sign-out). */
  async clear(userId: number): Promise<void> {
    try {
      await this.storage.clearRecords(userId);
    } catch {
      // Nothing was kept.
    }
  }
}

/**
 * Keeps the technician's day on the device and answers from it when the network fails: a kept read (see
 * `isKeptRead`) that gets no answer at all (`isNoAnswer`) is answered with the copy kept for the signed-in person,
 * with its ETag, as if from the server. Every answer tells `Connection` the server is reachable; every request
 * with no answer (`isNoAnswer`) tells it it is not.
 */
export const offlineRecordsInterceptor: HttpInterceptorFn = (request, next) => {
  const path = request.url.split('?')[0] ?? '';
  if (!path.startsWith('/api/')) return next(request);
  const connection = inject(Connection);
  const records = inject(OfflineRecords);
  const session = inject(AuthSession);
  const userId = session.user()?.id ?? null;
  const kept = request.method === 'GET' && request.url === path && isKeptRead(path) && userId !== null;

  return next(request).pipe(
    tap((event) => {
      if (!(event instanceof HttpResponse)) return;
      connection.reportAnswer();
      if (kept) void records.write(userId, path, event.body, event.headers.get('ETag'));
    }),
    catchError((error: unknown): Observable<never | HttpResponse<unknown>> => {
      if (!(error instanceof HttpErrorResponse)) return throwError(() => error);
      if (!isNoAnswer(error)) {
        connection.reportAnswer();
        return throwError(() => error);
      }
      connection.reportNoAnswer();
      if (!kept) return throwError(() => error);
      return from(records.read(userId, path)).pipe(
        switchMap((copy) =>
          copy === null
            ? throwError(() => error)
            : of(
                new HttpResponse({
                  body: copy.body,
                  status: 200,
                  url: path,
                  headers: copy.etag ? new HttpHeaders({ ETag: copy.etag }) : new HttpHeaders(),
                }),
              ),
        ),
      );
    }),
  );
};
