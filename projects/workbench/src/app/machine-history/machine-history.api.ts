import { HttpClient, HttpErrorResponse, type HttpResponse } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { JobsExportQuery, MachineHistory } from '@counterpoise/api';
import { catchError, from, map, type Observable, switchMap, throwError } from 'rxjs';

/*
 * The shapes of the history routes come from the shared schemas by type alone, so that the pages never
 * load zod. docs/machine-history.md describes the routes and the CSV file's columns.
 */
export type {
  JobsExportQuery,
  MachineHistory,
  MachineHistoryJob,
  MachineHistorySide,
  WeightOnRotor,
} from '@counterpoise/api';

/** An exported file: its bytes and the name the server gave it. */
export interface ExportedFile {
  readonly blob: Blob;
  readonly fileName: string;
}

/** The file name of a `Content-Disposition` header (`attachment; filename="a.csv"`), if it names one. */
export function fileNameOf(disposition: string | null): string | null {
  const match = /filename\*?=(?:UTF-8'')?"?([^";]+)"?/i.exec(disposition ?? '');
  return match ? decodeURIComponent(match[1]!) : null;
}

/**
 * An error whose body came as a Blob (a download that failed) with its problem+json read as JSON, so that
 * the forms place its `errors` on their fields as for any other request.
 */
function withJsonBody(error: unknown): Observable<never> {
  if (!(error instanceof HttpErrorResponse) || !(error.error instanceof Blob)) return throwError(() => error);
  return from(error.error.text()).pipe(
    switchMap((text) => {
      let body: unknown = text;
      try {
        body = JSON.parse(text);
      } catch {
        // Not JSON: the text as it came.
      }
      return throwError(
        () =>
          new HttpErrorResponse({
            error: body,
            headers: error.headers,
            status: error.status,
            statusText: error.statusText,
            url: error.url ?? undefined,
          }),
      );
    }),
  );
}

/**
 * A machine's job history, and the shop's jobs of a date range as a CSV file, from the server. Both go
 * through the app's HTTP client, so they carry the session's access token like every other request.
 */
@Injectable({ providedIn: 'root' })
export class MachineHistoryApi {
  private readonly http = inject(HttpClient);

  /** Every job on the machine, the weights on its rotor now, and its family's stored sensitivity. */
  history(machineId: number): Observable<MachineHistory> {
    return this.http.get<MachineHistory>(`/api/v1/machines/${machineId}/job-history`);
  }

  /** The shop's jobs scheduled or completed from `from` to `to` (both included), as a CSV file. */
  exportJobs(range: JobsExportQuery): Observable<ExportedFile> {
    return this.http
      .get('/api/v1/exports/jobs.csv', {
        params: { from: range.from, to: range.to },
        observe: 'response',
        responseType: 'blob',
      })
      .pipe(
        map((response: HttpResponse<Blob>) => ({
          blob: response.body ?? new Blob([], { type: 'text/csv' }),
          fileName:
            fileNameOf(response.headers.get('Content-Disposition')) ??
            `counterpoise-jobs-${range.from}-to-${range.to}.csv`,
        })),
        catchError(withJsonBody),
      );
  }
}
