import { CALC_ROUTE_NAMES, CALC_ROUTES } from '@counterpoise/api';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createApp } from '../app';
import type { OpenApiDocument } from '../openapi/openapi';
import { createTestKey, revokeTestKey } from '../keys/testing/test-keys';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from '../usage/usage-log';

/* The calculator routes in the whole app: behind the real key check, rate limit and usage log. */

let temporary: TemporaryDatabase;
let usageLog: UsageLog;

beforeEach(() => {
  temporary = openTemporaryDatabase();
  usageLog = new UsageLog(temporary.database);
});
afterEach(() => {
  usageLog.close();
  temporary.dispose();
});

const app = () => createApp({ database: temporary.database, usageLog, log: () => undefined });

function usageRows() {
  usageLog.flush();
  return temporary.database.sqlite
    .prepare('SELECT key_id AS keyId, route, status FROM api_usage ORDER BY id')
    .all() as { keyId: number; route: string; status: number }[];
}

describe('the calculator behind API keys', () => {
  it('answers a keyed request and logs it', async () => {
    const { key, record } = createTestKey(temporary.database);
    await request(app())
      .post('/api/v1/calc/single-plane')
      .set('X-Api-Key', key)
      .send(CALC_ROUTES['single-plane'].example)
      .expect(200);
    await request(app())
      .post('/api/v1/calc/radius')
      .set('Authorization', `Bearer ${key}`)
      .send({ mass: -1, fromRadius: 1, toRadius: 2 })
      .expect(400);
    expect(usageRows()).toEqual([
      { keyId: record.id, route: 'POST /api/v1/calc/single-plane', status: 200 },
      { keyId: record.id, route: 'POST /api/v1/calc/radius', status: 400 },
    ]);
  });

  it('logs exactly one row for a path under the calculator that names no route, or the wrong method', async () => {
    const { key, record } = createTestKey(temporary.database);
    const server = app();
    await request(server).post('/api/v1/calc/three-plane').set('X-Api-Key', key).send({}).expect(404);
    await request(server).get('/api/v1/calc/radius').set('X-Api-Key', key).expect(405);
    await request(server).post('/api/v1/calc').set('X-Api-Key', key).send({}).expect(404);
    expect(usageRows()).toEqual([
      { keyId: record.id, route: 'POST (unknown route)', status: 404 },
      { keyId: record.id, route: 'GET /api/v1/calc/radius', status: 405 },
      { keyId: record.id, route: 'POST (unknown route)', status: 404 },
    ]);
  });

  it('refuses a request without a key (401) or with a revoked one (403), as problems', async () => {
    const { key, record } = createTestKey(temporary.database);
    const missing = await request(app()).post('/api/v1/calc/radius').send(CALC_ROUTES.radius.example);
    expect(missing.status).toBe(401);
    expect(missing.headers['content-type']).toMatch(/^application\/problem\+json/);
    revokeTestKey(temporary.database, record.id);
    await new Promise((resolve) => setTimeout(resolve, 600));
    const revoked = await request(app())
      .post('/api/v1/calc/radius')
      .set('X-Api-Key', key)
      .send(CALC_ROUTES.radius.example);
    expect(revoked.status).toBe(403);
  });

  it('logs one row for a batch’s request, with its calculations and its items’ errors by status', async () => {
    const { key, record } = createTestKey(temporary.database);
    const items = [
      { route: 'radius', body: CALC_ROUTES.radius.example },
      { route: 'tolerance', body: { grade: 'G16' } },
      { route: 'severity', body: CALC_ROUTES.severity.example },
    ];
    const response = await request(app())
      .post('/api/v1/calc/batch')
      .set('X-Api-Key', key)
      .send({ items })
      .expect(200);
    expect(response.body.items.map((item: { status: number }) => item.status)).toEqual([200, 400, 200]);
    usageLog.flush();
    const rows = temporary.database.sqlite
      .prepare(
        'SELECT key_id AS keyId, route, status, batch_item AS batchItem, calculations, item_errors AS itemErrors, ' +
          'bytes FROM api_usage ORDER BY id',
      )
      .all() as { keyId: number; route: string; status: number; batchItem: number; bytes: number }[];
    // One row for the request, with its three calculations and the refused item by status.
    expect(rows.map(({ bytes: _bytes, ...row }) => row)).toEqual([
      {
        keyId: record.id,
        route: 'POST /api/v1/calc/batch',
        status: 200,
        batchItem: 0,
        calculations: 3,
        itemErrors: '{"400":1}',
      },
    ]);
    // The batch's row carries the whole answer's size.
    expect(rows[0]?.bytes).toBe(Number(response.headers['content-length']));
  });

  it('answers 429 with Retry-After past the limit stored with the key', async () => {
    const { key } = createTestKey(temporary.database, { limitPerMinute: 2 });
    const server = app();
    const call = () =>
      request(server).post('/api/v1/calc/radius').set('X-Api-Key', key).send(CALC_ROUTES.radius.example);
    expect((await call()).status).toBe(200);
    expect((await call()).status).toBe(200);
    const limited = await call();
    expect(limited.status).toBe(429);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    expect(limited.headers['ratelimit-limit']).toBe('2');
  });
});

describe('the OpenAPI document of the calculator', () => {
  let document: OpenApiDocument;
  beforeEach(() => {
    document = createApp({ database: temporary.database }).locals.openApiDocument!;
  });

  it('documents every calculator route and the batch, keyed, with an example request and answer', () => {
    for (const name of [...CALC_ROUTE_NAMES, 'batch']) {
      const path = document.paths?.[`/api/v1/calc/${name}`]?.post;
      expect(path, name).toBeDefined();
      expect(path?.security).toEqual([{ ApiKeyHeader: [] }, { ApiKeyBearer: [] }]);
      const body = path?.requestBody as { content: Record<string, { example?: unknown }> };
      expect(body.content['application/json']?.example, name).toBeDefined();
      for (const status of ['200', '400', '401', '403', '413', '415', '429']) {
        expect(path?.responses?.[status], `${name} ${status}`).toBeDefined();
      }
    }
  });

  it('shows examples that the route schemas accept and answers that the response schemas accept', () => {
    for (const name of CALC_ROUTE_NAMES) {
      const route = CALC_ROUTES[name];
      const post = document.paths?.[`/api/v1/calc/${name}`]?.post;
      const request = (post?.requestBody as { content: Record<string, { example?: unknown }> }).content[
        'application/json'
      ]?.example;
      const answer = (post?.responses?.['200'] as { content: Record<string, { example?: unknown }> }).content[
        'application/json'
      ]?.example;
      expect(route.request.safeParse(request).success, name).toBe(true);
      expect(route.response.safeParse(answer).success, name).toBe(true);
    }
  });

  it('documents every path the API serves', async () => {
    const served = ['/api/health', '/api/v1/usage', ...CALC_ROUTE_NAMES.map((n) => `/api/v1/calc/${n}`)];
    for (const path of served) expect(Object.keys(document.paths ?? {})).toContain(path);
  });
});
