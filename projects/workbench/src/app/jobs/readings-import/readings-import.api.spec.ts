import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { JobsApi, type ReadingsImportPreview } from '../jobs.api';
import { JOB_AFTER_LEFT_TRIAL } from '../steps/testing-jobs';

/*
 * The two calls of a readings import on JobsApi: the file goes as it is (the server reads it), as text/csv;
 * the preview carries no version, the import the preview's in If-Match and answers the job with its ETag.
 */
describe('JobsApi: readings from a file', () => {
  let api: JobsApi;
  let http: HttpTestingController;
  const file = new File(['run,kind,sensorSide\n'], 'readings.csv', { type: 'application/vnd.ms-excel' });

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(JobsApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('previews a file: POST of the file itself as text/csv, without If-Match', async () => {
    const answer: ReadingsImportPreview = {
      jobId: 8,
      jobVersion: 6,
      amplitudeUnit: 'in/s-pk',
      rowCount: 0,
      runs: [],
      errors: [{ path: 'file', row: null, column: null, value: null, message: 'The file has no readings.' }],
    };
    const seen = firstValueFrom(api.previewReadingsImport(8, file));
    const request = http.expectOne({ method: 'POST', url: '/api/v1/jobs/8/runs/import/preview' });
    expect(request.request.body).toBe(file);
    // Whatever type the system gave the file, it goes as CSV.
    expect(request.request.headers.get('Content-Type')).toBe('text/csv');
    expect(request.request.headers.has('If-Match')).toBe(false);
    request.flush(answer);
    expect(await seen).toEqual(answer);
  });

  it('imports a file on the previewed version and answers the job with its new ETag', async () => {
    const stored = firstValueFrom(api.importReadings(8, file, '"6"'));
    const request = http.expectOne({ method: 'POST', url: '/api/v1/jobs/8/runs/import' });
    expect(request.request.body).toBe(file);
    expect(request.request.headers.get('If-Match')).toBe('"6"');
    expect(request.request.headers.get('Content-Type')).toBe('text/csv');
    request.flush(
      { ...JOB_AFTER_LEFT_TRIAL, version: 7 },
      { status: 201, statusText: 'Created', headers: { ETag: '"7"' } },
    );
    expect(await stored).toMatchObject({ etag: '"7"', record: { id: 8, version: 7 } });
  });

  it('reads a refused import’s 412 as the job changed meanwhile', async () => {
    const stored = firstValueFrom(api.importReadings(8, file, '"6"'));
    http.expectOne('/api/v1/jobs/8/runs/import').flush(
      {
        type: 'about:blank',
        title: 'Precondition Failed',
        status: 412,
        current: { ...JOB_AFTER_LEFT_TRIAL, version: 9 },
      },
      { status: 412, statusText: 'Precondition Failed', headers: { ETag: '"9"' } },
    );
    const error = await stored.catch((caught: unknown) => caught);
    expect(api.changedMeanwhile(error)).toMatchObject({ etag: '"9"', record: { version: 9 } });
  });
});
