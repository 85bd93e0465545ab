import { HttpClient, type HttpResponse } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { EmailReport, JobReports, ReportSending, SignReport } from '@counterpoise/api';
import { map, type Observable } from 'rxjs';

/*
 * The service report's routes; the shapes come from the shared schemas by type alone, so that the pages never
 * load zod. docs/reports.md describes the routes, the revisions and the e-mail.
 */
export type { EmailReport, JobReports, ReportRevision, ReportSending, SignReport } from '@counterpoise/api';

/** A downloaded file: its bytes and the name the server gave it. */
export interface DownloadedFile {
  readonly blob: Blob;
  readonly fileName: string;
}

/** The file name of a `Content-Disposition: attachment; filename="…"` header, or `fallback`. */
export function fileNameOf(disposition: string | null, fallback: string): string {
  const match = /filename="([^"]+)"/.exec(disposition ?? '');
  return match?.[1] ?? fallback;
}

/** A binary answer as a file, named by its Content-Disposition. */
export function asDownloadedFile(response: HttpResponse<Blob>, fallback: string): DownloadedFile {
  return {
    blob: response.body ?? new Blob([]),
    fileName: fileNameOf(response.headers.get('Content-Disposition'), fallback),
  };
}

/**
 * Hands a downloaded file to the browser as a download. The file is fetched by the data service with the
 * session's credentials (a plain link would carry none), then saved from an object URL.
 */
export function saveFile(document: Document, file: DownloadedFile): void {
  const url = URL.createObjectURL(file.blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = file.fileName;
  link.rel = 'noopener';
  link.style.display = 'none';
  document.body.appendChild(link);
  link.click();
  link.remove();
  // The browser has taken the file once click() returns; the URL is let go a moment later.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** The service report of a job on the server: its revisions and sendings, the PDF, signing and e-mail. */
@Injectable({ providedIn: 'root' })
export class ReportsApi {
  private readonly http = inject(HttpClient);
  private readonly url = (jobId: number) => `/api/v1/jobs/${jobId}`;

  /** The signed revisions (newest first) and the sendings of the job's report. */
  list(jobId: number): Observable<JobReports> {
    return this.http.get<JobReports>(`${this.url(jobId)}/reports`);
  }

  /** The report's PDF: the revision named, else the current signed one, else a draft. */
  download(jobId: number, revision?: number): Observable<DownloadedFile> {
    return this.http
      .get(`${this.url(jobId)}/report`, {
        observe: 'response',
        responseType: 'blob',
        ...(revision === undefined ? {} : { params: { revision } }),
      })
      .pipe(map((response) => asDownloadedFile(response, `report-${jobId}.pdf`)));
  }

  /** The customer signs, on the version of the job the screen shows (`etag`). */
  sign(jobId: number, etag: string, body: SignReport): Observable<JobReports> {
    return this.http.put<JobReports>(`${this.url(jobId)}/report/signature`, body, {
      headers: { 'If-Match': etag },
    });
  }

  /** Sends the signed report by e-mail, to `to` or the customer's address on record. */
  email(jobId: number, body: EmailReport): Observable<ReportSending> {
    return this.http.post<ReportSending>(`${this.url(jobId)}/report/email`, body);
  }
}
