import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { HealthSchema, ProblemSchema } from '@counterpoise/api';
import { createApp } from './app';
import type { Clock } from './clock';
import { openTemporaryDatabase, type TemporaryDatabase } from './testing/temporary-database';

let temporary: TemporaryDatabase;
let staticDir: string;
let now: Date;
const clock: Clock = { now: () => now };

beforeEach(() => {
  temporary = openTemporaryDatabase();
  staticDir = mkdtempSync(join(tmpdir(), 'counterpoise-static-'));
  writeFileSync(
    join(staticDir, 'index.html'),
    '<!doctype html><title>Counterpoise</title><app-root></app-root>',
  );
  writeFileSync(join(staticDir, 'main-ABCDEFGH.js'), 'console.log(1)');
  now = new Date('2026-05-04T10:00:00Z');
});

afterEach(() => {
  temporary.dispose();
  rmSync(staticDir, { recursive: true, force: true });
});

const app = () =>
  createApp({ database: temporary.database, clock, version: '9.8.7', staticDir, log: () => undefined });

describe('GET /api/health', () => {
  it('answers 200 JSON with the version and the state of the database', async () => {
    const server = app();
    now = new Date('2026-05-04T10:01:30Z');
    const response = await request(server).get('/api/health').expect(200);

    expect(response.headers['content-type']).toMatch(/^application\/json/);
    expect(response.headers['cache-control']).toBe('no-store');
    const health = HealthSchema.parse(response.body);
    expect(health).toEqual({
      status: 'ok',
      version: '9.8.7',
      uptimeSeconds: 90,
      database: { status: 'ok', migrations: expect.any(Number) },
    });
    expect(health.database.migrations).toBeGreaterThanOrEqual(1);
  });

  it('answers 503 with the reason when the database is gone', async () => {
    const server = app();
    temporary.database.sqlite.close();
    const response = await request(server).get('/api/health').expect(503);
    const health = HealthSchema.parse(response.body);
    expect(health.status).toBe('degraded');
    expect(health.database).toMatchObject({ status: 'error', detail: expect.stringMatching(/not open/) });
  });
});

describe('errors', () => {
  it('answers an unknown API path with a 404 problem', async () => {
    const response = await request(app()).get('/api/no-such-thing?x=1').expect(404);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(ProblemSchema.parse(response.body)).toEqual({
      type: 'about:blank',
      title: 'Not Found',
      status: 404,
      detail: 'No route GET /api/no-such-thing.',
      instance: '/api/no-such-thing',
    });
  });

  it('sends the API set of security headers with every JSON answer', async () => {
    const response = await request(app()).get('/api/health');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['content-security-policy']).toBe("default-src 'none';frame-ancestors 'none'");
    expect(response.headers['x-frame-options']).toBe('DENY');
    expect(response.headers['cache-control']).toBe('no-store');
    // Plain HTTP here: HSTS only goes out over HTTPS (see security-headers.spec.ts).
    expect(response.headers['strict-transport-security']).toBeUndefined();
    expect(response.headers['x-dns-prefetch-control']).toBeUndefined();
    expect(response.headers['x-powered-by']).toBeUndefined();
    expect(response.headers['etag']).toBeUndefined();
  });

  it('sends the pages their own security headers, without upgrading to HTTPS', async () => {
    for (const path of ['/', '/api/docs/']) {
      const response = await request(app()).get(path).set('Accept', 'text/html');
      expect(response.headers['x-content-type-options']).toBe('nosniff');
      expect(response.headers['content-security-policy']).toContain("default-src 'self'");
      expect(response.headers['content-security-policy']).not.toContain('upgrade-insecure-requests');
      expect(response.headers['x-powered-by']).toBeUndefined();
    }
  });
});

describe('the workbench', () => {
  it('serves index.html at / and at deep links, never cached', async () => {
    for (const path of ['/', '/jobs/42']) {
      const response = await request(app()).get(path).set('Accept', 'text/html').expect(200);
      expect(response.text).toContain('<app-root>');
      expect(response.headers['cache-control']).toBe('no-cache');
    }
  });

  it('serves hashed bundles for a year', async () => {
    const response = await request(app()).get('/main-ABCDEFGH.js').expect(200);
    expect(response.headers['cache-control']).toContain('immutable');
  });

  it('says how to build the app when it has not been built', async () => {
    rmSync(join(staticDir, 'index.html'));
    const response = await request(app()).get('/').set('Accept', 'text/html').expect(503);
    expect(response.text).toContain('npm run build');
  });
});
