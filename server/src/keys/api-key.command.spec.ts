import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { HIDDEN_CHARACTERS } from '@counterpoise/api';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { EXIT, runApiKeyCommand } from './api-key.command';
import { ApiKeysRepo } from './keys.repo';
import { ApiKeyService } from './keys.service';

let temporary: TemporaryDatabase;
let keys: ApiKeyService;
beforeEach(() => {
  temporary = openTemporaryDatabase();
  keys = new ApiKeyService(new ApiKeysRepo(temporary.database.orm));
});
afterEach(() => temporary.dispose());

function run(...args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const status = runApiKeyCommand(
    args,
    { keys, defaultLimitPerMinute: 600, now: new Date('2026-05-04T08:00:00Z') },
    { out: (line) => out.push(line), err: (line) => err.push(line) },
  );
  return { status, out: out.join('\n'), err: err.join('\n') };
}

describe('runApiKeyCommand', () => {
  it.each([
    [[], /Name a command/],
    [['rotate'], /Unknown command "rotate"/],
    [['create'], /--name: Give the key a name/],
    [['create', '--name', '   '], /--name: Give the key a name/],
    [['create', '--name', 'x'.repeat(101)], /--name: Keep the name of a key to 100 characters/],
    [['create', '--name', 'x', '--limit', '0'], /--limit: The limit is at least 1/],
    [['create', '--name', 'x', '--limit', '2.5'], /--limit: /],
    [['create', '--name', 'x', '--limit', 'many'], /--limit: /],
    [['create', '--name', 'x', '--limit', '1000001'], /--limit: The limit is at most 1000000/],
    [['create', '--name', 'x', '--colour', 'red'], /Unknown option '--colour'/],
    [['create', '--name', 'x', '--origin', 'http://portal.example.com'], /--origin: .*use https:/],
    [['create', '--name', 'x', '--origin', 'https://a.example.com/shop'], /--origin: .*has a path/],
    [['list', 'extra'], /Unexpected argument 'extra'/],
    [['revoke'], /Name the id of one key/],
    [['revoke', 'abc'], /Name the id of one key/],
    [['revoke', '1', '2'], /Name the id of one key/],
  ])('refuses %j with a reason, the usage and exit code 2, creating nothing', (args, reason) => {
    const result = run(...args);
    expect(result.status).toBe(EXIT.usage);
    expect(result.err).toMatch(reason);
    expect(result.err).toMatch(/Usage: npm run api-key/);
    expect(result.out).toBe('');
    expect(keys.list()).toEqual([]);
  });

  it('trims the name and prints the key alone on the last line', () => {
    const result = run('create', '--name', '  Dealer portal  ');
    expect(result.status).toBe(EXIT.ok);
    const lines = result.out.split('\n');
    expect(keys.check(lines[lines.length - 1]!)).toMatchObject({
      name: 'Dealer portal',
      limitPerMinute: 600,
    });
  });

  it('refuses a name with a text-direction override, storing nothing', () => {
    const result = run('create', '--name', 'Portal\u202Etxt.exe');
    expect(result.status).toBe(EXIT.usage);
    expect(result.err).toMatch(/--name: The name of a key holds U\+202E/);
    expect(result.err).not.toContain('\u202E');
    expect(keys.list()).toEqual([]);
  });

  it('prints a name stored before names were checked with its hidden characters escaped', () => {
    const repo = new ApiKeysRepo(temporary.database.orm);
    const stored = repo.insert({
      name: 'Portal\u202Etxt.exe\u001B[2J\n',
      prefix: 'cpk_AbCdEfGh',
      hash: 'a'.repeat(64),
      limitPerMinute: 60,
      createdAt: new Date('2026-05-01T00:00:00Z'),
    });
    const listed = run('list');
    expect(listed.out).toContain('Portal\\u202Etxt.exe\\u001B[2J\\n');
    expect(listed.out.split('\n')).toHaveLength(2);
    const revoked = run('revoke', String(stored.id));
    expect(revoked.out).toContain('"Portal\\u202Etxt.exe\\u001B[2J\\n"');
    for (const line of [...listed.out.split('\n'), revoked.out]) {
      expect(line).not.toMatch(HIDDEN_CHARACTERS);
    }
    expect(run('rot\u202Eate').err).toContain('Unknown command "rot\\u202Eate"');
  });

  it('limits a key to the web origins given, normalised, and lists them', () => {
    const result = run(
      'create',
      '--name',
      'Portal pages',
      '--limit',
      '60',
      '--origin',
      'https://Portal.example.com/',
      '--origin',
      'http://localhost:4200',
    );
    expect(result.status).toBe(EXIT.ok);
    expect(result.out).toContain('from https://portal.example.com, http://localhost:4200 only.');
    const key = result.out.split('\n').at(-1)!;
    expect(keys.check(key)).toMatchObject({
      allowedOrigins: ['https://portal.example.com', 'http://localhost:4200'],
    });
    run('create', '--name', 'Back office');
    const listed = run('list').out.split('\n');
    expect(listed[0]).toMatch(/state +origins$/);
    expect(listed[1]).toMatch(/active +https:\/\/portal\.example\.com http:\/\/localhost:4200$/);
    expect(listed[2]).toMatch(/active +any$/);
  });

  it('prints its usage on help', () => {
    expect(run('help')).toMatchObject({ status: EXIT.ok, out: expect.stringMatching(/create --name NAME/) });
  });
});
