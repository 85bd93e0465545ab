import { can, type Permission, type Role } from '@counterpoise/api';
import { describe, expect, it } from 'vitest';
import { aUser } from '../auth/testing';
import { invitableRoles, mayChangeRole, mayChangeStatus, sortAndFilterPeople } from './people-rules';

const holds = (role: Role) => (permission: Permission) => can(role, permission);

describe('people rules', () => {
  it('lets owners invite any role, managers technicians and viewers, and others no one', () => {
    expect(invitableRoles(holds('owner'))).toEqual(['owner', 'manager', 'technician', 'developer', 'viewer']);
    expect(invitableRoles(holds('manager'))).toEqual(['technician', 'viewer']);
    expect(invitableRoles(holds('technician'))).toEqual([]);
    expect(invitableRoles(holds('developer'))).toEqual([]);
  });

  it('lets only owners change roles, and never their own', () => {
    const owner = aUser('owner');
    expect(mayChangeRole(owner, aUser('manager'), holds('owner'))).toBe(true);
    expect(mayChangeRole(owner, owner, holds('owner'))).toBe(false);
    expect(mayChangeRole(aUser('manager'), aUser('technician'), holds('manager'))).toBe(false);
  });

  it('lets managers deactivate technicians and viewers, owners anyone but themselves', () => {
    const manager = aUser('manager');
    expect(mayChangeStatus(manager, aUser('technician'), holds('manager'))).toBe(true);
    expect(mayChangeStatus(manager, aUser('viewer'), holds('manager'))).toBe(true);
    expect(mayChangeStatus(manager, aUser('developer'), holds('manager'))).toBe(false);
    expect(mayChangeStatus(manager, aUser('owner'), holds('manager'))).toBe(false);
    expect(mayChangeStatus(manager, manager, holds('manager'))).toBe(false);
    expect(mayChangeStatus(aUser('owner'), aUser('manager'), holds('owner'))).toBe(true);
    expect(mayChangeStatus(aUser('owner'), aUser('owner'), holds('owner'))).toBe(false);
    expect(mayChangeStatus(aUser('technician'), aUser('viewer'), holds('technician'))).toBe(false);
  });

  it('filters without regard to case and keeps the order asked for', () => {
    const people = [aUser('viewer'), aUser('owner'), aUser('technician', { name: 'ana Pereira' })];
    expect(sortAndFilterPeople(people, '', { active: 'name', direction: 'asc' }).map((p) => p.name)).toEqual([
      'ana Pereira',
      'Ines Kowalczyk',
      'Marit Okafor',
    ]);
    expect(
      sortAndFilterPeople(people, 'OWNER', { active: 'name', direction: 'asc' }).map((p) => p.name),
    ).toEqual(['Marit Okafor']);
    expect(
      sortAndFilterPeople(people, '', { active: 'email', direction: 'desc' }).map((p) => p.email),
    ).toEqual(['suvi@example.com', 'marit@example.com', 'ines@example.com']);
    // Without a direction, the server's order stands.
    expect(sortAndFilterPeople(people, '', { active: 'name', direction: '' })).toEqual(people);
  });
});
