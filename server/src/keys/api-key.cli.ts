/*
 * `npm run api-key -- <command>`: create, list and revoke API keys in the database of DATABASE_URL
 * (migrated first, so it works on a new installation). A created key is printed on the last line of
 * the output, and only then: scripts take it with `tail -n 1`.
 */
import { systemClock } from '../clock';
import { ConfigError, loadConfig } from '../config';
import { migrateDatabase, openDatabase } from '../db/database';
import { AccountsRepo } from '../accounts/accounts.repo';
import { ApiKeysRepo } from './keys.repo';
import { ApiKeyService } from './keys.service';
import { runApiKeyCommand } from './api-key.command';

function main(): number {
  const config = loadConfig();
  const database = openDatabase(config.DATABASE_URL);
  try {
    migrateDatabase(database);
    const keys = new ApiKeyService(new ApiKeysRepo(database.orm));
    const accounts = new AccountsRepo(database.orm);
    const context = {
      keys,
      defaultLimitPerMinute: config.API_KEY_DEFAULT_LIMIT,
      now: systemClock.now(),
      organisations: {
        findByName: (name: string) => accounts.findOrganisationByName(name),
        count: () => accounts.organisationCount(),
      },
    };
    return runApiKeyCommand(process.argv.slice(2), context, {
      out: (line) => process.stdout.write(`${line}\n`),
      err: (line) => process.stderr.write(`${line}\n`),
    });
  } finally {
    database.sqlite.close();
  }
}

try {
  process.exitCode = main();
} catch (error) {
  if (error instanceof ConfigError) {
    console.error(error.message);
    process.exitCode = 1;
  } else {
    throw error;
  }
}
