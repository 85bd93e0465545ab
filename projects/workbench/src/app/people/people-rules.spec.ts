import { describe, expect, it } from 'vitest';
import { aUser } from '../auth/testing';
import { sortAndFilterPeople } from './people-rules';

describe('sortAndFilterPeople', () => {
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
