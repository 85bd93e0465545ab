import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createApp } from '../app';
import { openDatabase } from '../db/database';
import { UsageLog } from '../usage/usage-log';

const ROOT = fileURLToPath(new URL('../../..', import.meta.url));
const PASSWORD = 'the first owner of the shop';

let folder: string;
let databasePath: string;
beforeEach(() => {
  folder = mkdtempSync(join(tmpdir(), 'counterpoise-user-cli-'));
  databasePath = join(folder, 'shop.sqlite');
});
afterEach(() => rmSync(folder, { recursive: true, force: true }));

/** Runs `npm run user -- …` (or `npm run api-key -- …`) as an operator would, the password on stdin. */
function run(cli: 'people/user' | 'keys/api-key', args: string[], input = '') {
  const result = spawnSync(process.execPath, ['--import', 'tsx', `server/src/${cli}.cli.ts`, ...args], {
    cwd: ROOT,
    env: { ...process.env, DATABASE_URL: databasePath, PASSWORD_HASH_COST: '10' },
    input,
    encoding: 'utf8',
    timeout: 60_000,
  });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

const create = (...extra: string[]) => [
  'create',
  '--org',
  'Juniper Drum Balancing',
  '--email',
  'Owner@juniper-drum.test',
  '--role',
  'owner',
  ...extra,
];

describe('npm run user', { timeout: 120_000 }, () => {
  it('creates the first owner and the organisation on a new database, and they can sign in', async () => {
    const created = run('people/user', create('--password-stdin'), `${PASSWORD}\n`);
    expect(created.stderr).toBe('');
    expect(created.status).toBe(0);
    expect(created.stdout).toContain('Created the organisation "Juniper Drum Balancing".');
    expect(created.stdout).toContain('Created owner 1 owner@juniper-drum.test');
    expect(created.stdout).not.toContain(PASSWORD);

    const second = run(
      'people/user',
      [
        'create',
        '--org',
        'Juniper Drum Balancing',
        '--email',
        'dev@juniper-drum.test',
        '--role',
        'developer',
        '--name',
        'Kit Amberley',
        '--password-stdin',
      ],
      'another long enough passphrase',
    );
    expect(second.stdout).not.toContain('Created the organisation');
    expect(run('people/user', ['list', '--org', 'Juniper Drum Balancing']).stdout).toMatch(
      /2\tdeveloper\tactive\tdev@juniper-drum.test\tKit Amberley/,
    );

    // Keys need --org once an organisation exists, and then belong to it.
    expect(run('keys/api-key', ['create', '--name', 'Portal']).status).toBe(2);
    expect(run('keys/api-key', ['create', '--name', 'Portal', '--org', 'Nobody Inc']).status).toBe(1);
    const key = run('keys/api-key', ['create', '--name', 'Portal', '--org', 'Juniper Drum Balancing']);
    expect(key.stdout).toContain('for Juniper Drum Balancing');

    const database = openDatabase(databasePath);
    const usageLog = new UsageLog(database);
    try {
      const app = createApp({ database, usageLog, log: () => undefined });
      const signedIn = await request(app)
        .post('/api/v1/auth/sign-in')
        .send({ email: 'owner@juniper-drum.test', password: PASSWORD })
        .expect(200);
      const keys = await request(app)
        .get('/api/v1/keys')
        .set('Authorization', `Bearer ${signedIn.body.accessToken}`)
        .expect(200);
      expect(keys.body.keys.map((entry: { name: string }) => entry.name)).toEqual(['Portal']);
    } finally {
      usageLog.close();
      database.sqlite.close();
    }
  });

  it('never takes the password from the arguments, and refuses a weak one or a taken address', () => {
    const noStdin = run('people/user', create());
    expect(noStdin.status).toBe(2);
    expect(noStdin.stderr).toMatch(/--password-stdin/);
    const argv = run('people/user', create('--password', PASSWORD));
    expect(argv.status).toBe(2);
    expect(argv.stderr).toMatch(/Unknown option '--password'/);

    const short = run('people/user', create('--password-stdin'), 'short one');
    expect(short.status).toBe(1);
    expect(short.stderr).toMatch(/password: Use at least 15 characters/);
    const common = run('people/user', create('--password-stdin'), 'passwordpassword');
    expect(common.stderr).toMatch(/most common/);

    expect(run('people/user', create('--password-stdin'), PASSWORD).status).toBe(0);
    const taken = run('people/user', create('--password-stdin'), PASSWORD);
    expect(taken.status).toBe(1);
    expect(taken.stderr).toMatch(/already has an account/);
  });

  it('refuses an unknown role with the usage', () => {
    const result = run(
      'people/user',
      ['create', '--org', 'X', '--email', 'a@x.test', '--role', 'chief', '--password-stdin'],
      PASSWORD,
    );
    expect(result.status).toBe(2);
    expect(result.stderr).toMatch(/--role: role is one of owner, manager/);
    expect(result.stderr).toMatch(/Usage: npm run user/);
  });
});
