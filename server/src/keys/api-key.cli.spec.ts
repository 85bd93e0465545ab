import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { API_KEY_PATTERN } from '@counterpoise/api';
import { createApp } from '../app';
import { openDatabase } from '../db/database';
import { UsageLog } from '../usage/usage-log';

const ROOT = fileURLToPath(new URL('../../..', import.meta.url));
const CLI = 'server/src/keys/api-key.cli.ts';

let folder: string;
let databasePath: string;
beforeEach(() => {
  folder = mkdtempSync(join(tmpdir(), 'counterpoise-cli-'));
  databasePath = join(folder, 'keys.sqlite');
});
afterEach(() => rmSync(folder, { recursive: true, force: true }));

/** Runs `npm run api-key -- …` as a user would, against the temporary database. */
function apiKey(...args: string[]) {
  const run = spawnSync(process.execPath, ['--import', 'tsx', CLI, ...args], {
    cwd: ROOT,
    env: { ...process.env, DATABASE_URL: databasePath, API_KEY_DEFAULT_LIMIT: '250' },
    encoding: 'utf8',
    timeout: 60_000,
  });
  const lines = run.stdout.trimEnd().split('\n');
  return {
    status: run.status,
    stdout: run.stdout,
    stderr: run.stderr,
    lastLine: lines[lines.length - 1] ?? '',
  };
}

// Each run starts a Node process with tsx (about a second); the bound is for slow machines.
describe('npm run api-key', { timeout: 60_000 }, () => {
  it('creates a key on a new database, prints it on the last line, and the key works', async () => {
    const created = apiKey('create', '--name', 'Dealer portal', '--limit', '42');
    expect(created.status).toBe(0);
    expect(created.lastLine).toMatch(API_KEY_PATTERN);
    expect(created.stdout).toMatch(/42 calculations a minute/);
    expect(created.stdout).toMatch(/shown only this once/);

    const database = openDatabase(databasePath);
    const usageLog = new UsageLog(database);
    try {
      const response = await request(createApp({ database, usageLog }))
        .get('/api/v1/usage')
        .set('X-Api-Key', created.lastLine)
        .expect(200);
      expect(response.body.key.name).toBe('Dealer portal');
      expect(response.headers['ratelimit-limit']).toBe('42');
    } finally {
      usageLog.close();
      database.sqlite.close();
    }
  });

  it('gives a key without --limit the configured default', () => {
    const created = apiKey('create', '--name', 'Workshop tablet');
    expect(created.status).toBe(0);
    expect(created.stdout).toMatch(/250 calculations a minute/);
  });

  it('lists keys by prefix, never with their secret, and marks the revoked', () => {
    const first = apiKey('create', '--name', 'First').lastLine;
    const second = apiKey('create', '--name', 'Second').lastLine;
    expect(apiKey('revoke', '1').stdout).toMatch(/Revoked API key 1 "First"/);

    const listed = apiKey('list');
    expect(listed.status).toBe(0);
    const lines = listed.stdout.trimEnd().split('\n');
    expect(lines[0]).toMatch(/^id\s+name\s+prefix\s+limit\/min\s+created\s+last used\s+state\s+origins$/);
    expect(lines[1]).toMatch(new RegExp(`^1\\s+First\\s+${first.slice(0, 12)}….*revoked 20.*\\s+any$`));
    expect(lines[2]).toMatch(new RegExp(`^2\\s+Second\\s+${second.slice(0, 12)}….*never\\s+active\\s+any$`));
    expect(listed.stdout).not.toContain(first);
    expect(listed.stdout).not.toContain(second);
  });

  it('revokes once, says so the second time, and fails for an unknown id', () => {
    apiKey('create', '--name', 'Old');
    expect(apiKey('revoke', '1').status).toBe(0);
    const again = apiKey('revoke', '1');
    expect(again.status).toBe(0);
    expect(again.stdout).toMatch(/already revoked/);
    const unknown = apiKey('revoke', '7');
    expect(unknown.status).toBe(1);
    expect(unknown.stderr).toMatch(/No API key has the id 7/);
  });

  it('refuses what it does not understand with the usage and exit code 2', () => {
    const run = apiKey('create', '--name', 'x', '--limit', '0');
    expect(run.status).toBe(2);
    expect(run.stderr).toMatch(/--limit: The limit is at least 1/);
    expect(run.stderr).toMatch(/Usage: npm run api-key/);
    expect(run.stdout).toBe('');
    expect(apiKey('list').stdout).toMatch(/No API keys yet/);
  });
});
