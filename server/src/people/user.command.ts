import { parseArgs } from 'node:util';
import * as z from 'zod';
import {
  EmailSchema,
  escapeHiddenCharacters as shown,
  OrganisationNameSchema,
  PasswordSchema,
  PersonNameSchema,
  RoleSchema,
} from '@counterpoise/api';
import type { AccountsRepo } from '../accounts/accounts.repo';
import { hashPasswordSync, passwordWeakness, type ScryptCost } from '../auth/passwords';
import { type CommandOutput, EXIT } from '../keys/api-key.command';

/** The help the CLI prints for `help` and for anything it does not understand. */
export const USER_USAGE = [
  'Usage: npm run user -- <command>',
  '',
  '  create --org NAME --email E --role ROLE [--name NAME] --password-stdin',
  '        create a person (and the organisation, when new); the password is read from standard input',
  '  list --org NAME                          list the people of an organisation',
  '',
  'Roles: owner, manager, technician, developer, viewer. A fresh installation needs its first owner:',
  '  printf %s "$PASSWORD" | npm run user -- create --org "Shop" --email owner@shop.example --role owner --password-stdin',
  'The database is DATABASE_URL (default data/counterpoise.sqlite).',
].join('\n');

class UsageError extends Error {}

/**
 * Runs one `user` command: the logic of the CLI without its process. The password comes from
 * `readPassword` (standard input in the CLI), never from the arguments, which other users of the
 * machine can read in the process list and which shells keep in their history. Names and arguments
 * echoed pass through `escapeHiddenCharacters`, so that none can drive the operator's terminal.
 */
export function runUserCommand(
  args: readonly string[],
  context: { repo: AccountsRepo; now: Date; cost: ScryptCost; readPassword: () => string },
  output: CommandOutput,
): number {
  const [command, ...rest] = args;
  try {
    switch (command) {
      case 'create':
        return create(rest, context, output);
      case 'list':
        return list(rest, context.repo, output);
      case 'help':
      case '--help':
      case '-h':
        output.out(USER_USAGE);
        return EXIT.ok;
      default:
        output.err(command === undefined ? 'Name a command.' : `Unknown command "${shown(command)}".`);
        output.err(USER_USAGE);
        return EXIT.usage;
    }
  } catch (error) {
    if (error instanceof UsageError) {
      output.err(error.message);
      output.err(USER_USAGE);
      return EXIT.usage;
    }
    throw error;
  }
}

function parse(args: string[], options: Record<string, { type: 'string' | 'boolean' }>) {
  try {
    return parseArgs({ args, options, allowPositionals: false, strict: true }).values as Record<
      string,
      string | boolean | undefined
    >;
  } catch (error) {
    throw new UsageError(shown(error instanceof Error ? error.message : String(error)));
  }
}

function create(
  args: string[],
  context: { repo: AccountsRepo; now: Date; cost: ScryptCost; readPassword: () => string },
  output: CommandOutput,
): number {
  const values = parse(args, {
    org: { type: 'string' },
    email: { type: 'string' },
    role: { type: 'string' },
    name: { type: 'string' },
    'password-stdin': { type: 'boolean' },
  });
  if (values['password-stdin'] !== true) {
    throw new UsageError('--password-stdin: Pass the password on standard input, never as an argument.');
  }
  const email = typeof values['email'] === 'string' ? values['email'] : '';
  const parsed = z
    .object({
      org: OrganisationNameSchema,
      email: EmailSchema,
      role: RoleSchema,
      name: PersonNameSchema,
    })
    .safeParse({
      org: values['org'] ?? '',
      email,
      role: values['role'] ?? '',
      name: values['name'] ?? email.split('@')[0] ?? '',
    });
  if (!parsed.success) {
    throw new UsageError(
      parsed.error.issues.map((issue) => `--${String(issue.path[0])}: ${issue.message}`).join('\n'),
    );
  }
  const { org, role, name } = parsed.data;
  const password = context.readPassword().replace(/\r?\n$/, '');
  const rule = PasswordSchema.safeParse(password);
  const weakness = rule.success
    ? passwordWeakness(password, { email: parsed.data.email })
    : { path: 'password', message: rule.error.issues[0]!.message };
  if (weakness) {
    output.err(`password: ${weakness.message}`);
    return EXIT.failed;
  }
  const { repo } = context;
  if (repo.emailTaken(parsed.data.email)) {
    output.err(`${shown(parsed.data.email)} already has an account.`);
    return EXIT.failed;
  }
  const passwordHash = hashPasswordSync(password, context.cost);
  const result = repo.transaction(() => {
    const existing = repo.findOrganisationByName(org);
    const organisation = existing ?? repo.insertOrganisation(org, context.now);
    const user = repo.insertUser({
      organisationId: organisation.id,
      email: parsed.data.email,
      name,
      role,
      passwordHash,
      createdAt: context.now,
    });
    return { created: existing === undefined, user };
  });
  const { user } = result;
  if (result.created) output.out(`Created the organisation "${shown(user.organisationName)}".`);
  output.out(
    `Created ${user.role} ${user.id} ${shown(user.email)} ("${shown(user.name)}") in "${shown(user.organisationName)}".`,
  );
  return EXIT.ok;
}

function list(args: string[], repo: AccountsRepo, output: CommandOutput): number {
  const values = parse(args, { org: { type: 'string' } });
  const name = typeof values['org'] === 'string' ? values['org'].trim() : '';
  if (name === '') throw new UsageError('--org: Name the organisation.');
  const organisation = repo.findOrganisationByName(name);
  if (!organisation) {
    output.err(`No organisation is named "${shown(name)}".`);
    return EXIT.failed;
  }
  for (const user of repo.listUsers(organisation.id)) {
    output.out(`${user.id}\t${user.role}\t${user.status}\t${shown(user.email)}\t${shown(user.name)}`);
  }
  return EXIT.ok;
}
