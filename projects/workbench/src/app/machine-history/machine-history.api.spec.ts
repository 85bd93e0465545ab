import { HttpErrorResponse, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { problemOf } from '../shell/server-errors';
import { fileNameOf, MachineHistoryApi } from './machine-history.api';
import { aHistory } from './machine-history-testing';

describe('MachineHistoryApi', () => {
  let api: MachineHistoryApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(MachineHistoryApi);
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  it('reads a machine’s job history', async () => {
    const answer = firstValueFrom(api.history(12));
    const request = http.expectOne('/api/v1/machines/12/job-history');
    expect(request.request.method).toBe('GET');
    request.flush(aHistory());
    expect((await answer).jobs.map((job) => job.id)).toEqual([18, 42, 57]);
  });

  it('fetches the export of a range as a file, under the name the server gives', async () => {
    const answer = firstValueFrom(api.exportJobs({ from: '2026-01-01', to: '2026-03-31' }));
    const request = http.expectOne(
      (candidate) =>
        candidate.url === '/api/v1/exports/jobs.csv' &&
        candidate.params.get('from') === '2026-01-01' &&
        candidate.params.get('to') === '2026-03-31',
    );
    expect(request.request.responseType).toBe('blob');
    request.flush(new Blob(['\uFEFFJob no.\r\n'], { type: 'text/csv' }), {
      headers: {
        'Content-Disposition': 'attachment; filename="counterpoise-jobs-2026-01-01-to-2026-03-31.csv"',
      },
    });
    const file = await answer;
    expect(file.fileName).toBe('counterpoise-jobs-2026-01-01-to-2026-03-31.csv');
    const bytes = new Uint8Array(await file.blob.arrayBuffer());
    // The byte order mark the server wrote stays in the file (a text decoder would drop it).
    expect([...bytes.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    expect(new TextDecoder('utf-8', { ignoreBOM: true }).decode(bytes)).toBe('\uFEFFJob no.\r\n');
  });

  it('reads a refused range’s problem out of the failed download, for the form’s fields', async () => {
    const answer = firstValueFrom(api.exportJobs({ from: '2026-03-01', to: '2026-02-01' }));
    const problem = {
      type: 'about:blank',
      title: 'Bad Request',
      status: 400,
      errors: [{ path: 'to', message: 'The last day (to) is before the first (from).' }],
    };
    http
      .expectOne((candidate) => candidate.url === '/api/v1/exports/jobs.csv')
      .flush(new Blob([JSON.stringify(problem)], { type: 'application/problem+json' }), {
        status: 400,
        statusText: 'Bad Request',
      });
    const error = await answer.then(
      () => null,
      (failure: unknown) => failure,
    );
    expect(error).toBeInstanceOf(HttpErrorResponse);
    expect(problemOf(error)?.errors).toEqual(problem.errors);
  });

  it('reads the file name of a Content-Disposition, quoted or not', () => {
    expect(fileNameOf('attachment; filename="a b.csv"')).toBe('a b.csv');
    expect(fileNameOf('attachment; filename=jobs.csv')).toBe('jobs.csv');
    expect(fileNameOf(null)).toBeNull();
  });
});
