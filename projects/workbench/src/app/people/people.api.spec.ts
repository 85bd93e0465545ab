import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ApplicationRef } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Invitation, People } from '../auth/api-types';
import { aUser } from '../auth/testing';
import { PeopleApi } from './people.api';

const INVITATION: Invitation = {
  id: 7,
  email: 'kaito@example.com',
  role: 'technician',
  invitedBy: 'Marit Okafor',
  expiresAt: '2099-01-01T00:00:00.000Z',
  acceptedAt: null,
};
const PEOPLE: People = { people: [aUser('owner'), aUser('technician')], invitations: [INVITATION] };

describe('PeopleApi', () => {
  let api: PeopleApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(PeopleApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('reads the people and invitations into a resource, and again on reload', async () => {
    const people = TestBed.runInInjectionContext(() => api.listResource());
    TestBed.tick();
    const request = http.expectOne('/api/v1/people');
    expect(request.request.method).toBe('GET');
    request.flush(PEOPLE);
    await TestBed.inject(ApplicationRef).whenStable();
    expect(people.value()).toEqual(PEOPLE);

    people.reload();
    TestBed.tick();
    http.expectOne({ method: 'GET', url: '/api/v1/people' }).flush({ ...PEOPLE, invitations: [] });
    await TestBed.inject(ApplicationRef).whenStable();
    expect(people.value()?.invitations).toEqual([]);
  });

  it('invites with a POST of the address, role and name', async () => {
    const answer = firstValueFrom(
      api.invite({ email: 'kaito@example.com', role: 'technician', name: 'Kaito Brandt' }),
    );
    const request = http.expectOne('/api/v1/people/invitations');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      email: 'kaito@example.com',
      role: 'technician',
      name: 'Kaito Brandt',
    });
    request.flush(INVITATION, { status: 201, statusText: 'Created' });
    expect(await answer).toEqual(INVITATION);
  });

  it('changes a role or a status with a PATCH of the person', async () => {
    const promoted = firstValueFrom(api.update(3, { role: 'manager' }));
    const role = http.expectOne('/api/v1/people/3');
    expect(role.request.method).toBe('PATCH');
    expect(role.request.body).toEqual({ role: 'manager' });
    role.flush(aUser('technician', { role: 'manager' }));
    expect((await promoted).role).toBe('manager');

    const deactivated = firstValueFrom(api.update(5, { status: 'deactivated' }));
    const status = http.expectOne('/api/v1/people/5');
    expect(status.request.method).toBe('PATCH');
    expect(status.request.body).toEqual({ status: 'deactivated' });
    status.flush(aUser('viewer', { status: 'deactivated' }));
    expect((await deactivated).status).toBe('deactivated');
  });
});
