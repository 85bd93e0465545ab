import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { aMachine } from '../records/testing';
import { MachinesApi } from './machines.api';

describe('MachinesApi', () => {
  let api: MachinesApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(MachinesApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('filters the list by customer and family', async () => {
    const answer = firstValueFrom(api.list({ q: 'TM225', customerId: 7, familyId: 4 }));
    const request = http.expectOne((r) => r.url === '/api/v1/machines');
    expect(request.request.method).toBe('GET');
    expect(request.request.urlWithParams).toBe('/api/v1/machines?q=TM225&customerId=7&familyId=4');
    request.flush({ items: [aMachine()], total: 1, page: 1, pageSize: 25 });
    expect((await answer).items[0]?.serialNumber).toBe('TM225-0419');
  });

  it('reads, creates, changes, archives and restores machines at their own addresses', async () => {
    const read = firstValueFrom(api.get(12));
    http
      .expectOne({ method: 'GET', url: '/api/v1/machines/12' })
      .flush(aMachine(), { headers: { ETag: '"5"' } });
    expect((await read).etag).toBe('"5"');

    const created = firstValueFrom(
      api.create({ customerId: 7, rotationSeenFromLeft: 'clockwise', planes: [{ correctionRadiusMm: 240 }] }),
    );
    const create = http.expectOne({ method: 'POST', url: '/api/v1/machines' });
    expect(create.request.body).toEqual({
      customerId: 7,
      rotationSeenFromLeft: 'clockwise',
      planes: [{ correctionRadiusMm: 240 }],
    });
    create.flush(aMachine({ id: 13, version: 1 }), {
      status: 201,
      statusText: 'Created',
      headers: { ETag: '"1"' },
    });
    expect((await created).record.id).toBe(13);

    void firstValueFrom(api.update(12, { hours: 1900 }, '"5"'));
    const update = http.expectOne({ method: 'PATCH', url: '/api/v1/machines/12' });
    expect(update.request.headers.get('If-Match')).toBe('"5"');
    expect(update.request.body).toEqual({ hours: 1900 });
    update.flush(aMachine({ version: 6 }));

    void firstValueFrom(api.archive(12, '"6"'));
    expect(
      http.expectOne({ method: 'POST', url: '/api/v1/machines/12/archive' }).request.headers.get('If-Match'),
    ).toBe('"6"');
    void firstValueFrom(api.restore(12, '"7"'));
    expect(
      http.expectOne({ method: 'POST', url: '/api/v1/machines/12/restore' }).request.headers.get('If-Match'),
    ).toBe('"7"');
    void firstValueFrom(api.history(12));
    http.expectOne({ method: 'GET', url: '/api/v1/machines/12/history' }).flush({ changes: [] });
  });
});
