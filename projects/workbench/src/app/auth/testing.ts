import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { ActivatedRoute } from '@angular/router';
import { ROLE_PERMISSIONS, type Role, type Session, type User } from '@counterpoise/api';

/*
 * Invented people of an invented shop, for the specs of the accounts pages. Addresses are under
 * example.com, which is reserved for examples.
 */

/** The shop every test person belongs to. */
export const TEST_ORGANISATION = { id: 1, name: 'Alder Ridge Rotor Service' } as const;

/** A person in the test shop; the role decides the name unless one is given. */
export function aUser(role: Role = 'owner', overrides: Partial<User> = {}): User {
  const names: Record<Role, [number, string]> = {
    owner: [1, 'Marit Okafor'],
    manager: [2, 'Dario Lindqvist'],
    technician: [3, 'Suvi Achterberg'],
    developer: [4, 'Bram Oyelaran'],
    viewer: [5, 'Ines Kowalczyk'],
  };
  const [id, name] = names[role];
  return {
    id,
    name,
    email: `${name.split(' ')[0]?.toLowerCase()}@example.com`,
    role,
    status: 'active',
    organisation: TEST_ORGANISATION,
    createdAt: '2026-03-02T08:00:00.000Z',
    ...overrides,
  };
}

/** A session of a person in the given role, with that role's permissions as the server grants them. */
export function aSession(role: Role = 'owner', accessToken = `token-of-${role}`): Session {
  return {
    accessToken,
    expiresInSeconds: 900,
    user: aUser(role),
    permissions: [...ROLE_PERMISSIONS[role]],
  };
}

/** A page for routes a spec passes through: its heading is the route's `data.heading`. */
@Component({
  selector: 'app-route-stand-in',
  template: '<h1>{{ heading }}</h1>',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RouteStandIn {
  protected readonly heading: unknown = inject(ActivatedRoute).snapshot.data['heading'];
}
