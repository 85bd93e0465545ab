import type { Role } from '@counterpoise/api';
import type { DemoSeeder } from '../db/seed';
import { AccountsRepo } from '../accounts/accounts.repo';
import { hashPasswordSync } from './passwords';

/** The invented organisation of the demo scenario: a service shop for forestry and mowing machines. */
export const DEMO_ORGANISATION = 'Ridgeline Rotor Service';

/**
 * The demo sign-ins, one per role, all with `DEMO_PASSWORD`. Invented people on the reserved `.test`
 * domain; the README lists them.
 */
export const DEMO_PEOPLE: readonly { email: string; name: string; role: Role }[] = [
  { email: 'owner@ridgeline-rotor.test', name: 'Maren Oakhurst', role: 'owner' },
  { email: 'manager@ridgeline-rotor.test', name: 'Dagny Fairbrook', role: 'manager' },
  { email: 'technician@ridgeline-rotor.test', name: 'Tomasz Wrenfield', role: 'technician' },
  { email: 'developer@ridgeline-rotor.test', name: 'Priya Lanterman', role: 'developer' },
  { email: 'viewer@ridgeline-rotor.test', name: 'Odile Marchbank', role: 'viewer' },
];

/** The password of every demo sign-in: known to anyone who reads the README, so for the demo only. */
export const DEMO_PASSWORD = 'balance the drum before lunch';

/**
 * Creates the demo organisation and its people. The hashes use the default cost; the demo's password
 * is public, so the seed's only care is that sign-in works as it will for real people.
 */
export const seedDemoAccounts: DemoSeeder = (database, now) => {
  const repo = new AccountsRepo(database.orm);
  const organisation = repo.insertOrganisation(DEMO_ORGANISATION, now);
  for (const person of DEMO_PEOPLE) {
    repo.insertUser({
      organisationId: organisation.id,
      ...person,
      passwordHash: hashPasswordSync(DEMO_PASSWORD, { log2N: 15 }),
      createdAt: now,
    });
  }
};
