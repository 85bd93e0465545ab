import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { HIDDEN_CHARACTERS } from '@counterpoise/api';
import { AccountsRepo } from '../accounts/accounts.repo';
import { hashPasswordSync } from '../auth/passwords';
import { EXIT } from '../keys/api-key.command';
import { TEST_HASH_COST } from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { runUserCommand } from './user.command';

const PASSWORD = 'a quiet bearing at full speed';

let temporary: TemporaryDatabase;
let repo: AccountsRepo;
beforeEach(() => {
  temporary = openTemporaryDatabase();
  repo = new AccountsRepo(temporary.database.orm);
});
afterEach(() => temporary.dispose());

function run(...args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const status = runUserCommand(
    args,
    {
      repo,
      now: new Date('2026-05-04T08:00:00Z'),
      cost: { log2N: TEST_HASH_COST },
      readPassword: () => `${PASSWORD}\n`,
    },
    { out: (line) => out.push(line), err: (line) => err.push(line) },
  );
  return { status, out: out.join('\n'), err: err.join('\n') };
}

const create = (org: string, name: string) =>
  run(
    'create',
    '--org',
    org,
    '--email',
    'owner@alder-shop.test',
    '--role',
    'owner',
    '--name',
    name,
    '--password-stdin',
  );

describe('runUserCommand', () => {
  it.each([
    ['--name', 'Alder Shop', 'Ada\u202Eevil', /--name: The name holds U\+202E/],
    ['--org', 'Alder\u2066 Shop', 'Ada Reyes', /--org: The name of an organisation holds U\+2066/],
    ['--name', 'Alder Shop', 'Ada\u001B[31m', /--name: The name holds U\+001B/],
  ])('refuses a hidden character in %s, creating nothing', (_, org, name, reason) => {
    const result = create(org, name);
    expect(result.status).toBe(EXIT.usage);
    expect(result.err).toMatch(reason);
    for (const line of result.err.split('\n')) expect(line).not.toMatch(HIDDEN_CHARACTERS);
    expect(repo.organisationCount()).toBe(0);
    expect(repo.emailTaken('owner@alder-shop.test')).toBe(false);
  });

  it('creates a person whose name is clean, and says so', () => {
    const result = create('Alder Shop', 'Ada Reyes');
    expect(result).toMatchObject({ status: EXIT.ok, err: '' });
    expect(result.out).toContain('Created owner 1 owner@alder-shop.test ("Ada Reyes") in "Alder Shop".');
  });

  it('lists people stored before names were checked with their hidden characters escaped', () => {
    const organisation = repo.insertOrganisation('Alder\u202E Shop', new Date());
    repo.insertUser({
      organisationId: organisation.id,
      email: 'tech@alder-shop.test',
      name: 'Kit\u202Egnirts\u0007\tAmberley',
      role: 'technician',
      passwordHash: hashPasswordSync(PASSWORD, { log2N: TEST_HASH_COST }),
      createdAt: new Date(),
    });
    const listed = run('list', '--org', 'Alder\u202E Shop');
    expect(listed.status).toBe(EXIT.ok);
    expect(listed.out).toBe(
      '1\ttechnician\tactive\ttech@alder-shop.test\tKit\\u202Egnirts\\u0007\\tAmberley',
    );

    const missing = run('list', '--org', 'Birch\u202E Shop');
    expect(missing.status).toBe(EXIT.failed);
    expect(missing.err).toBe('No organisation is named "Birch\\u202E Shop".');
  });
});
