import { HttpClient, type HttpResourceRef, httpResource } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { User } from '@counterpoise/api';
import type { Observable } from 'rxjs';
import type { Invitation, InviteRequest, People, UpdatePerson } from '../auth/api-types';

/** The people routes, named once: the service sends to them, and page specs expect them by name. */
export const PEOPLE_URLS = {
  list: '/api/v1/people',
  invitations: '/api/v1/people/invitations',
  person: (id: number) => `/api/v1/people/${encodeURIComponent(id)}`,
} as const;

/**
 * The organisation's people and invitations on the server, so that the People page and its dialogs hold
 * no addresses and every request and answer has the contract's type.
 */
@Injectable({ providedIn: 'root' })
export class PeopleApi {
  private readonly http = inject(HttpClient);

  /**
   * The people and the open invitations, as a resource of the caller's injection context (a page's field
   * initializer): it lives and dies with the page, which reloads it after each change.
   */
  listResource(): HttpResourceRef<People | undefined> {
    return httpResource<People>(() => PEOPLE_URLS.list);
  }

  /** Invites someone by e-mail; answers the invitation saved. */
  invite(request: InviteRequest): Observable<Invitation> {
    return this.http.post<Invitation>(PEOPLE_URLS.invitations, request);
  }

  /** Changes a person's role or status; answers the person as changed. */
  update(id: number, change: UpdatePerson): Observable<User> {
    return this.http.patch<User>(PEOPLE_URLS.person(id), change);
  }
}
