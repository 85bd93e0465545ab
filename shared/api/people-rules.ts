import { can, MANAGER_INVITABLE_ROLES, type Role, ROLES } from './accounts';

/*
 * Who may invite whom, and who may change whose role or status, in one place: the server refuses what
 * these rules forbid, and the workbench offers only what they allow, so the two cannot drift apart. Pure
 * functions of ids and roles; the server reads both people again inside the change's transaction and
 * passes them as they are then.
 */

/** Someone in an organisation, as far as the people rules need to know them. */
export interface RoleHolder {
  /** The person's id, to tell someone from themselves. */
  readonly id: number;
  /** Their role now. */
  readonly role: Role;
}

/** The roles someone in `role` may give in an invitation: owners any, managers technicians and viewers. */
export function invitableRoles(role: Role): readonly Role[] {
  if (!can(role, 'people:invite')) return [];
  return can(role, 'people:manage') ? ROLES : MANAGER_INVITABLE_ROLES;
}

/**
 * Whether `actor` may give `person` another role: owners may, to anyone but themselves, so that an
 * organisation always keeps an owner.
 */
export function mayChangeRole(actor: RoleHolder, person: RoleHolder): boolean {
  return person.id !== actor.id && can(actor.role, 'people:manage');
}

/**
 * Whether `actor` may deactivate or reactivate `person`: owners anyone but themselves, managers the
 * technicians and viewers (the roles they may invite), nobody themselves.
 */
export function mayChangeStatus(actor: RoleHolder, person: RoleHolder): boolean {
  if (person.id === actor.id) return false;
  if (can(actor.role, 'people:manage')) return true;
  return can(actor.role, 'people:invite') && MANAGER_INVITABLE_ROLES.includes(person.role);
}
