import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { fileNameOf, ReportsApi } from './reports.api';
import { signedReports } from './reports-testing';

describe('ReportsApi', () => {
  let http: HttpTestingController;
  let api: ReportsApi;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    api = TestBed.inject(ReportsApi);
  });

  afterEach(() => http.verify());

  it('reads the revisions and sendings of a job’s report', async () => {
    const answer = firstValueFrom(api.list(6));
    http.expectOne('/api/v1/jobs/6/reports').flush(signedReports(6));
    expect((await answer).revisions[0]?.revision).toBe(1);
  });

  it('downloads the current report as a named file, or a revision by its number', async () => {
    const current = firstValueFrom(api.download(6));
    const request = http.expectOne('/api/v1/jobs/6/report');
    expect(request.request.responseType).toBe('blob');
    request.flush(new Blob(['%PDF']), {
      headers: { 'Content-Disposition': 'attachment; filename="report-J-000006-draft.pdf"' },
    });
    expect((await current).fileName).toBe('report-J-000006-draft.pdf');
    const old = firstValueFrom(api.download(6, 2));
    http.expectOne('/api/v1/jobs/6/report?revision=2').flush(new Blob(['%PDF']));
    expect((await old).fileName).toBe('report-6.pdf');
  });

  it('signs on the ETag given and sends the report by e-mail', async () => {
    const signed = firstValueFrom(
      api.sign(6, '"11"', { signerName: 'Juno Hartwell', signaturePng: 'data:image/png;base64,AA==' }),
    );
    const signing = http.expectOne('/api/v1/jobs/6/report/signature');
    expect(signing.request.method).toBe('PUT');
    expect(signing.request.headers.get('If-Match')).toBe('"11"');
    signing.flush(signedReports(6));
    await signed;
    const sent = firstValueFrom(api.email(6, { revision: 1 }));
    const sending = http.expectOne('/api/v1/jobs/6/report/email');
    expect(sending.request.method).toBe('POST');
    expect(sending.request.body).toEqual({ revision: 1 });
    sending.flush(signedReports(6).sendings[0]!);
    expect((await sent).to).toBe('office@aldercreek-clearing.test');
  });

  it('reads the file name of a Content-Disposition header', () => {
    expect(fileNameOf('attachment; filename="report-J-000001-r3.pdf"', 'x.pdf')).toBe(
      'report-J-000001-r3.pdf',
    );
    expect(fileNameOf(null, 'x.pdf')).toBe('x.pdf');
  });
});
