import type { Sort } from '@angular/material/sort';
import { ROLES, type User } from '@counterpoise/api';
import { ROLE_LABELS } from '../auth/roles';

/*
 * How the People page shows people: the names of their statuses, and the table's filter and order. Who may
 * do what to whom is the contract's (`invitableRoles`, `mayChangeRole`, `mayChangeStatus` in
 * `@counterpoise/api`), shared with the server that enforces it.
 */

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
