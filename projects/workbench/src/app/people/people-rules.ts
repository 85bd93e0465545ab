import type { Sort } from '@angular/material/sort';
import { MANAGER_INVITABLE_ROLES, type Permission, type Role, ROLES, type User } from '@counterpoise/api';
import { ROLE_LABELS } from '../auth/roles';

/*
 * Who may do what to whom on the People page. The server decides every request; these rules only keep
 * the page from offering what it would refuse (the contract: PATCH /api/v1/people/{id} is for owners, and
 * for managers only to change the status of technicians and viewers).
 */

/** The roles the signed-in person may give in an invitation. */
export function invitableRoles(can: (permission: Permission) => boolean): readonly Role[] {
  if (!can('people:invite')) return [];
  return can('people:manage') ? ROLES : MANAGER_INVITABLE_ROLES;
}

/** Whether the signed-in person may give someone another role; never their own, so an owner stays one. */
export function mayChangeRole(me: User, person: User, can: (permission: Permission) => boolean): boolean {
  return person.id !== me.id && can('people:manage');
}

/** Whether the signed-in person may deactivate or reactivate someone; never themselves. */
export function mayChangeStatus(me: User, person: User, can: (permission: Permission) => boolean): boolean {
  if (person.id === me.id) return false;
  if (can('people:manage')) return true;
  return me.role === 'manager' && MANAGER_INVITABLE_ROLES.includes(person.role);
}

/** How a person's status is named on screen. */
export const STATUS_LABELS: Readonly<Record<User['status'], string>> = {
  active: 'Active',
  deactivated: 'Deactivated',
};

/** The people whose name, e-mail, role or status contains `filter`, in the order of `sort`. */
export function sortAndFilterPeople(people: readonly User[], filter: string, sort: Sort): User[] {
  const needle = filter.trim().toLowerCase();
  const matching = needle
    ? people.filter((person) =>
        [person.name, person.email, ROLE_LABELS[person.role], STATUS_LABELS[person.status]].some((text) =>
          text.toLowerCase().includes(needle),
        ),
      )
    : [...people];
  if (!sort.direction) return matching;
  const direction = sort.direction === 'asc' ? 1 : -1;
  return matching.sort((a, b) => direction * compareBy(sort.active, a, b) || a.name.localeCompare(b.name));
}

/** Roles sort by their power, as ROLES lists them; texts in the reader's alphabetical order. */
function compareBy(column: string, a: User, b: User): number {
  switch (column) {
    case 'role':
      return ROLES.indexOf(a.role) - ROLES.indexOf(b.role);
    case 'status':
      return a.status.localeCompare(b.status);
    case 'email':
      return a.email.localeCompare(b.email);
    default:
      return a.name.localeCompare(b.name, undefined, { sensitivity: 'base' });
  }
}
