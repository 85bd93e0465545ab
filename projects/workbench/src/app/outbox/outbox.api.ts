import { HttpClient, type HttpResourceRef, httpResource } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import type { Outbox } from '../auth/api-types';
import { asDownloadedFile, type DownloadedFile } from '../reports/reports.api';

/** The Outbox's route, named once: the service reads it, and page specs expect it by name. */
export const OUTBOX_URL = '/api/v1/outbox';

/** The e-mail the server has sent for the organisation, so that the Outbox page holds no address. */
@Injectable({ providedIn: 'root' })
export class OutboxApi {
  private readonly http = inject(HttpClient);

  /**
   * The captured messages, as a resource of the caller's injection context (a page's field initializer):
   * it lives and dies with the page.
   */
  listResource(): HttpResourceRef<Outbox | undefined> {
    return httpResource<Outbox>(() => OUTBOX_URL);
  }

  /** A file a message carried (a service report's PDF), fetched with the session's credentials. */
  attachment(messageId: number, attachmentId: number): Observable<DownloadedFile> {
    return this.http
      .get(`${OUTBOX_URL}/${messageId}/attachments/${attachmentId}`, {
        observe: 'response',
        responseType: 'blob',
      })
      .pipe(map((response) => asDownloadedFile(response, `attachment-${attachmentId}`)));
  }
}
