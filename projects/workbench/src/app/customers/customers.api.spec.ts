import { HttpHeaders, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { aChange, aCustomer } from '../records/testing';
import { CustomersApi } from './customers.api';

describe('CustomersApi', () => {
  let api: CustomersApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(CustomersApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('asks for a page of the list with the query in the address, leaving out what is empty', async () => {
    const answer = firstValueFrom(
      api.list({ q: 'bramble', archived: 'all', sort: 'updatedAt', order: 'desc', page: 2, pageSize: 10 }),
    );
    const request = http.expectOne((r) => r.url === '/api/v1/customers');
    expect(request.request.method).toBe('GET');
    expect(request.request.params.keys()).toEqual(['q', 'archived', 'sort', 'order', 'page', 'pageSize']);
    expect(request.request.urlWithParams).toBe(
      '/api/v1/customers?q=bramble&archived=all&sort=updatedAt&order=desc&page=2&pageSize=10',
    );
    request.flush({ items: [aCustomer()], total: 11, page: 2, pageSize: 10 });
    expect((await answer).total).toBe(11);

    void firstValueFrom(api.list({ q: '', page: 1 }));
    expect(http.expectOne('/api/v1/customers?page=1').request.params.has('q')).toBe(false);
  });

  it('reads a customer with the ETag a change must send back', async () => {
    const answer = firstValueFrom(api.get(7));
    const request = http.expectOne('/api/v1/customers/7');
    expect(request.request.method).toBe('GET');
    request.flush(aCustomer(), { headers: { ETag: '"3"' } });
    expect(await answer).toEqual({ record: aCustomer(), etag: '"3"' });
  });

  it('builds the ETag from the version when a proxy dropped the header', async () => {
    const answer = firstValueFrom(api.get(7));
    http.expectOne('/api/v1/customers/7').flush(aCustomer({ version: 8 }));
    expect((await answer).etag).toBe('"8"');
  });

  it('creates a customer with a POST of its fields', async () => {
    const answer = firstValueFrom(
      api.create({ name: 'Wrenhollow Parish Council', email: 'clerk@example.com' }),
    );
    const request = http.expectOne('/api/v1/customers');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ name: 'Wrenhollow Parish Council', email: 'clerk@example.com' });
    request.flush(aCustomer({ id: 8, version: 1 }), {
      status: 201,
      statusText: 'Created',
      headers: { ETag: '"1"' },
    });
    expect(await answer).toMatchObject({ record: { id: 8 }, etag: '"1"' });
  });

  it('sends a change with If-Match and reads the new ETag', async () => {
    const answer = firstValueFrom(api.update(7, { phone: '+44 1632 960 999' }, '"3"'));
    const request = http.expectOne('/api/v1/customers/7');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.headers.get('If-Match')).toBe('"3"');
    expect(request.request.body).toEqual({ phone: '+44 1632 960 999' });
    request.flush(aCustomer({ version: 4, phone: '+44 1632 960 999' }), { headers: { ETag: '"4"' } });
    expect((await answer).etag).toBe('"4"');
  });

  it('archives and restores with a POST that carries If-Match and no body', async () => {
    const archived = firstValueFrom(api.archive(7, '"3"'));
    const archive = http.expectOne('/api/v1/customers/7/archive');
    expect(archive.request.method).toBe('POST');
    expect(archive.request.headers.get('If-Match')).toBe('"3"');
    expect(archive.request.body).toBeNull();
    archive.flush(aCustomer({ version: 4, archivedAt: '2026-12-04T09:00:00.000Z' }), {
      headers: { ETag: '"4"' },
    });
    expect((await archived).record.archivedAt).not.toBeNull();

    const restored = firstValueFrom(api.restore(7, '"4"'));
    const restore = http.expectOne('/api/v1/customers/7/restore');
    expect(restore.request.method).toBe('POST');
    expect(restore.request.headers.get('If-Match')).toBe('"4"');
    restore.flush(aCustomer({ version: 5 }), { headers: { ETag: '"5"' } });
    expect((await restored).etag).toBe('"5"');
  });

  it('fetches the history of a customer', async () => {
    const answer = firstValueFrom(api.history(7));
    const request = http.expectOne('/api/v1/customers/7/history');
    expect(request.request.method).toBe('GET');
    request.flush({ changes: [aChange()] });
    expect((await answer).changes[0]?.by.name).toBe('Dagny Fairbrook');
  });

  it('recognises a change refused because someone changed the customer meanwhile', async () => {
    const failed = firstValueFrom(api.update(7, { phone: '+44 1632 960 999' }, '"3"')).catch(
      (error: unknown) => error,
    );
    const theirs = aCustomer({ version: 4, notes: 'Gate code 4412' });
    http.expectOne('/api/v1/customers/7').flush(
      {
        type: 'about:blank',
        title: 'Precondition Failed',
        status: 412,
        code: 'CHANGED_MEANWHILE',
        detail: 'Someone changed this customer meanwhile.',
        current: theirs,
      },
      { status: 412, statusText: 'Precondition Failed', headers: new HttpHeaders({ ETag: '"4"' }) },
    );
    expect(api.changedMeanwhile(await failed)).toEqual({
      record: theirs,
      etag: '"4"',
      detail: 'Someone changed this customer meanwhile.',
    });
  });

  it('treats any other refusal as not a change made meanwhile', async () => {
    const failed = firstValueFrom(api.update(7, { email: 'nope' }, '"3"')).catch((error: unknown) => error);
    http.expectOne('/api/v1/customers/7').flush(
      {
        type: 'about:blank',
        title: 'Bad Request',
        status: 400,
        errors: [{ path: 'email', message: 'Enter an e-mail address.' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    expect(api.changedMeanwhile(await failed)).toBeNull();
  });
});
