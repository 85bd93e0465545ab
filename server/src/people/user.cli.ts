/*
 * `npm run user -- <command>`: create people (and their organisation) in the database of DATABASE_URL,
 * migrated first, so that a fresh installation gets its first owner without the demo data. The
 * password is read from standard input (`--password-stdin`), never from the command line.
 */
import { readFileSync } from 'node:fs';
import { AccountsRepo } from '../accounts/accounts.repo';
import { systemClock } from '../clock';
import { ConfigError, loadConfig } from '../config';
import { migrateDatabase, openDatabase } from '../db/database';
import { runUserCommand } from './user.command';

function main(): number {
  const config = loadConfig();
  const database = openDatabase(config.DATABASE_URL);
  try {
    migrateDatabase(database);
    return runUserCommand(
      process.argv.slice(2),
      {
        repo: new AccountsRepo(database.orm),
        now: systemClock.now(),
        cost: { log2N: config.PASSWORD_HASH_COST },
        // File descriptor 0: a pipe, a redirected file, or the terminal until Ctrl-D.
        readPassword: () => readFileSync(0, 'utf8'),
      },
      {
        out: (line) => process.stdout.write(`${line}\n`),
        err: (line) => process.stderr.write(`${line}\n`),
      },
    );
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
