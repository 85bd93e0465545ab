import { AccountsRepo } from '../accounts/accounts.repo';
import { DEMO_ORGANISATION } from '../auth/accounts.seed';
import type { Database } from '../db/database';
import type { Actor } from './change-log';

/**
 * Who the demo records are made by: the owner of the demo organisation, so that the history of every
 * seeded record starts with a "created" entry of a person one can sign in as.
 */
export function demoOwner(database: Database): Actor {
  const accounts = new AccountsRepo(database.orm);
  const organisation = accounts.findOrganisationByName(DEMO_ORGANISATION);
  const owner = organisation && accounts.listUsers(organisation.id).find((user) => user.role === 'owner');
  if (owner === undefined) {
    throw new Error(`The demo records need ${DEMO_ORGANISATION} and its owner, seeded before them.`);
  }
  return owner;
}
