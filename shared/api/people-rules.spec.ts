import { describe, expect, it } from 'vitest';
import { type Role, ROLES } from './accounts';
import { invitableRoles, mayChangeRole, mayChangeStatus } from './people-rules';

/*
 * The server's rule, written out as tables rather than derived from the permissions, so that a change of
 * ROLE_PERMISSIONS that moves who may change people shows here (DEVELOPERS.md, "Roles", notes ¹ and ²;
 * PeopleService.invite and .update): owners change anyone's role and status but their own; managers
 * only the status of technicians and viewers, and invite technicians and viewers only.
 */
const INVITES: Readonly<Record<Role, readonly Role[]>> = {
  owner: ['owner', 'manager', 'technician', 'developer', 'viewer'],
  manager: ['technician', 'viewer'],
  technician: [],
  developer: [],
  viewer: [],
};
const ROLE_CHANGES: Readonly<Record<Role, readonly Role[]>> = {
  owner: ['owner', 'manager', 'technician', 'developer', 'viewer'],
  manager: [],
  technician: [],
  developer: [],
  viewer: [],
};
const STATUS_CHANGES: Readonly<Record<Role, readonly Role[]>> = {
  owner: ['owner', 'manager', 'technician', 'developer', 'viewer'],
  manager: ['technician', 'viewer'],
  technician: [],
  developer: [],
  viewer: [],
};

const PAIRS = ROLES.flatMap((actor) => ROLES.map((person) => ({ actor, person })));
const ACTOR_ID = 1;
const OTHER_ID = 2;

describe('people rules', () => {
  it.each(ROLES)('lets a %s invite the roles the server accepts, in the order of ROLES', (role) => {
    expect(invitableRoles(role)).toEqual(INVITES[role]);
  });

  it.each(PAIRS)(
    'lets a $actor change the role of a $person only as the server does',
    ({ actor, person }) => {
      expect(mayChangeRole({ id: ACTOR_ID, role: actor }, { id: OTHER_ID, role: person })).toBe(
        ROLE_CHANGES[actor].includes(person),
      );
    },
  );

  it.each(PAIRS)(
    'lets a $actor change the status of a $person only as the server does',
    ({ actor, person }) => {
      expect(mayChangeStatus({ id: ACTOR_ID, role: actor }, { id: OTHER_ID, role: person })).toBe(
        STATUS_CHANGES[actor].includes(person),
      );
    },
  );

  it.each(ROLES)('never lets a %s change their own role or status', (role) => {
    const self = { id: ACTOR_ID, role };
    expect(mayChangeRole(self, self)).toBe(false);
    expect(mayChangeStatus(self, self)).toBe(false);
    // The id decides who is who: the same person, however the caller found them.
    expect(mayChangeRole(self, { ...self })).toBe(false);
    expect(mayChangeStatus(self, { ...self })).toBe(false);
  });
});
