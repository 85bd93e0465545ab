import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { aFamily } from '../records/testing';
import { MachineFamiliesApi } from './machine-families.api';

describe('MachineFamiliesApi', () => {
  let api: MachineFamiliesApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(MachineFamiliesApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('lists, reads, creates, changes, archives and restores families at /api/v1/machine-families', async () => {
    const listed = firstValueFrom(api.list({ sort: 'rotorType', order: 'desc' }));
    http
      .expectOne({ method: 'GET', url: '/api/v1/machine-families?sort=rotorType&order=desc' })
      .flush({ items: [aFamily()], total: 1, page: 1, pageSize: 25 });
    expect((await listed).items[0]?.name).toBe('Thornmill FM-225 mulcher heads');

    const read = firstValueFrom(api.get(4));
    http
      .expectOne({ method: 'GET', url: '/api/v1/machine-families/4' })
      .flush(aFamily(), { headers: { ETag: '"2"' } });
    expect((await read).etag).toBe('"2"');

    const family = aFamily();
    void firstValueFrom(
      api.create({
        name: family.name,
        rotorType: family.rotorType,
        nominalSpeedRpm: family.nominalSpeedRpm,
        planeCount: family.planeCount,
        correctionRadiiMm: family.correctionRadiiMm,
        inspectionLimits: family.inspectionLimits,
        acceptance: family.acceptance,
        sensitivities: [],
      }),
    );
    const create = http.expectOne({ method: 'POST', url: '/api/v1/machine-families' });
    expect(create.request.body).toMatchObject({ name: family.name, planeCount: 2, sensitivities: [] });
    create.flush(aFamily({ id: 5, version: 1 }));

    void firstValueFrom(api.update(4, { nominalSpeedRpm: 2100 }, '"2"'));
    const update = http.expectOne({ method: 'PATCH', url: '/api/v1/machine-families/4' });
    expect(update.request.headers.get('If-Match')).toBe('"2"');
    expect(update.request.body).toEqual({ nominalSpeedRpm: 2100 });
    update.flush(aFamily({ version: 3 }));

    void firstValueFrom(api.archive(4, '"3"'));
    http
      .expectOne({ method: 'POST', url: '/api/v1/machine-families/4/archive' })
      .flush(aFamily({ version: 4 }));
    void firstValueFrom(api.restore(4, '"4"'));
    http
      .expectOne({ method: 'POST', url: '/api/v1/machine-families/4/restore' })
      .flush(aFamily({ version: 5 }));
    void firstValueFrom(api.history(4));
    http.expectOne({ method: 'GET', url: '/api/v1/machine-families/4/history' }).flush({ changes: [] });
  });
});
