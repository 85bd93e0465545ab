import { parseArgs } from 'node:util';
import { CreateApiKeySchema, escapeHiddenCharacters as shown } from '@counterpoise/api';
import type { ApiKeyRecord } from './keys.repo';
import type { ApiKeyService } from './keys.service';

/**
 * Where the command writes; the CLI passes the process's streams, tests collect the lines. Every name
 * and argument echoed goes through `escapeHiddenCharacters` first: a name stored before names were
 * checked, or a mistyped argument, must not drive the operator's terminal.
 */
export interface CommandOutput {
  out(line: string): void;
  err(line: string): void;
}

/** Exit codes: done, could not be done, not understood. */
export const EXIT = { ok: 0, failed: 1, usage: 2 } as const;

/** The help the CLI prints for `help` and for anything it does not understand. */
export const API_KEY_USAGE = [
  'Usage: npm run api-key -- <command>',
  '',
  '  create --name NAME [--limit PER_MINUTE] [--org ORGANISATION] [--origin ORIGIN]...',
  '                                           create a key and print it on the last line (shown only once);',
  '                                           --org is required once organisations exist; each --origin',
  '                                           limits the key to the pages of that web origin (https://…)',
  '  list                                     list every key, without secrets',
  '  revoke ID                                revoke a key; requests with it are refused from then on',
  '',
  'The database is DATABASE_URL (default data/counterpoise.sqlite); a key created without --limit',
  'may make API_KEY_DEFAULT_LIMIT calculations a minute (a batch of n counts n).',
].join('\n');

/**
 * Runs one `api-key` command against the key service: the logic of the CLI without its process,
 * so that it reads the same way in a test as in a terminal.
 */
export function runApiKeyCommand(
  args: readonly string[],
  context: {
    keys: ApiKeyService;
    defaultLimitPerMinute: number;
    now: Date;
    /** The organisations a key may belong to; without it, keys belong to none. */
    organisations?: OrganisationLookup;
  },
  output: CommandOutput,
): number {
  const { keys, now } = context;
  const [command, ...rest] = args;
  try {
    switch (command) {
      case 'create':
        return create(rest, keys, now, context.defaultLimitPerMinute, output, context.organisations);
      case 'list':
        return list(rest, keys, output);
      case 'revoke':
        return revoke(rest, keys, now, output);
      case 'help':
      case '--help':
      case '-h':
        output.out(API_KEY_USAGE);
        return EXIT.ok;
      default:
        output.err(command === undefined ? 'Name a command.' : `Unknown command "${shown(command)}".`);
        output.err(API_KEY_USAGE);
        return EXIT.usage;
    }
  } catch (error) {
    if (error instanceof UsageError) {
      output.err(error.message);
      output.err(API_KEY_USAGE);
      return EXIT.usage;
    }
    throw error;
  }
}

/** Finds organisations by name, for `--org`. */
export interface OrganisationLookup {
  findByName(name: string): { id: number; name: string } | undefined;
  count(): number;
}

class UsageError extends Error {}

function create(
  args: string[],
  keys: ApiKeyService,
  now: Date,
  defaultLimitPerMinute: number,
  output: CommandOutput,
  organisations?: OrganisationLookup,
): number {
  const { values } = parse(
    args,
    {
      name: { type: 'string' },
      limit: { type: 'string' },
      org: { type: 'string' },
      origin: { type: 'string', multiple: true },
    },
    false,
  );
  const orgName = values['org']?.trim();
  let organisation: { id: number; name: string } | undefined;
  if (orgName !== undefined) {
    organisation = organisations?.findByName(orgName);
    if (!organisation) {
      output.err(
        `No organisation is named "${shown(orgName)}". Create it with: npm run user -- create --org …`,
      );
      return EXIT.failed;
    }
  } else if ((organisations?.count() ?? 0) > 0) {
    throw new UsageError('--org: Name the organisation the key belongs to.');
  }
  const limit = values['limit'];
  const origins = values['origin'];
  const parsed = CreateApiKeySchema.safeParse({
    name: values['name'] ?? '',
    ...(limit === undefined ? {} : { limitPerMinute: /^\d+$/.test(limit) ? Number(limit) : Number.NaN }),
    ...(origins === undefined ? {} : { allowedOrigins: origins }),
  });
  if (!parsed.success) {
    const option = { limitPerMinute: 'limit', allowedOrigins: 'origin' } as Record<string, string>;
    const messages = parsed.error.issues.map(
      (issue) => `--${option[String(issue.path[0])] ?? 'name'}: ${shown(issue.message)}`,
    );
    throw new UsageError(messages.join('\n'));
  }
  const { key, record } = keys.create(
    {
      name: parsed.data.name,
      limitPerMinute: parsed.data.limitPerMinute ?? defaultLimitPerMinute,
      allowedOrigins: parsed.data.allowedOrigins ?? [],
    },
    now,
    organisation?.id ?? null,
  );
  output.out(
    `Created API key ${record.id} "${shown(record.name)}" (${record.prefix}…), ` +
      `${record.limitPerMinute} calculations a minute${organisation ? `, for ${shown(organisation.name)}` : ''}` +
      (record.allowedOrigins.length > 0 ? `, from ${record.allowedOrigins.join(', ')} only.` : '.'),
  );
  output.out('Keep it now: it is shown only this once, and only its hash is stored.');
  output.out(key);
  return EXIT.ok;
}

function list(args: string[], keys: ApiKeyService, output: CommandOutput): number {
  parse(args, {}, false);
  const records = keys.list();
  if (records.length === 0) {
    output.out('No API keys yet. Create one with: npm run api-key -- create --name NAME');
    return EXIT.ok;
  }
  const rows = [
    ['id', 'name', 'prefix', 'limit/min', 'created', 'last used', 'state', 'origins'],
    ...records.map((record) => [
      String(record.id),
      shown(record.name),
      `${record.prefix}…`,
      String(record.limitPerMinute),
      record.createdAt.toISOString(),
      record.lastUsedAt?.toISOString() ?? 'never',
      stateOf(record),
      record.allowedOrigins.length > 0 ? record.allowedOrigins.join(' ') : 'any',
    ]),
  ];
  const widths = rows[0]!.map((_, column) => Math.max(...rows.map((row) => row[column]!.length)));
  for (const row of rows)
    output.out(
      row
        .map((cell, column) => cell.padEnd(widths[column]!))
        .join('  ')
        .trimEnd(),
    );
  return EXIT.ok;
}

function revoke(args: string[], keys: ApiKeyService, now: Date, output: CommandOutput): number {
  const { positionals } = parse(args, {}, true);
  const [id, extra] = positionals;
  if (id === undefined || extra !== undefined || !/^[1-9]\d{0,15}$/.test(id)) {
    throw new UsageError('Name the id of one key to revoke, as `list` shows it.');
  }
  const result = keys.revoke(Number(id), now);
  if (result.outcome === 'not-found') {
    output.err(`No API key has the id ${id}.`);
    return EXIT.failed;
  }
  const { key } = result;
  output.out(
    result.outcome === 'revoked'
      ? `Revoked API key ${key.id} "${shown(key.name)}" (${key.prefix}…); requests with it are refused from now on.`
      : `API key ${key.id} "${shown(key.name)}" (${key.prefix}…) was already revoked on ${key.revokedAt?.toISOString()}.`,
  );
  return EXIT.ok;
}

function stateOf(record: ApiKeyRecord): string {
  return record.revokedAt ? `revoked ${record.revokedAt.toISOString()}` : 'active';
}

function parse<O extends Record<string, { type: 'string'; multiple?: boolean }>>(
  args: string[],
  options: O,
  allowPositionals: boolean,
): {
  values: { [K in keyof O]?: O[K]['multiple'] extends true ? string[] : string };
  positionals: string[];
} {
  try {
    const { values, positionals } = parseArgs({ args, options, allowPositionals, strict: true });
    return {
      values: values as { [K in keyof O]?: O[K]['multiple'] extends true ? string[] : string },
      positionals,
    };
  } catch (error) {
    throw new UsageError(shown(error instanceof Error ? error.message : String(error)));
  }
}
