import express, { Router } from 'express';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createApp } from '../app';
import type { Clock } from '../clock';
import { ApiKeysRepo } from '../keys/keys.repo';
import { ApiKeyService } from '../keys/keys.service';
import { createTestKey } from '../keys/testing/test-keys';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from '../usage/usage-log';
import type { UsageSink } from './keyed-request';
import { problemHandler } from './problem';
import { keyedV1Router } from './v1';

let temporary: TemporaryDatabase;
let usageLog: UsageLog;
let key: string;
const PORTAL = 'https://portal.example';
const clock: Clock = { now: () => new Date('2026-05-04T12:00:00Z') };

beforeEach(() => {
  temporary = openTemporaryDatabase();
  usageLog = new UsageLog(temporary.database);
  key = createTestKey(temporary.database).key;
});
afterEach(() => {
  usageLog.close();
  temporary.dispose();
});

const app = (corsOrigins: string[] = [PORTAL]) =>
  createApp({ database: temporary.database, usageLog, corsOrigins, log: () => undefined });

describe('CORS on /api/v1', () => {
  it('lets a configured origin read answers and their rate-limit headers', async () => {
    const response = await request(app()).get('/api/v1/usage').set('Origin', PORTAL).set('X-Api-Key', key);
    expect(response.status).toBe(200);
    expect(response.headers['access-control-allow-origin']).toBe(PORTAL);
    expect(response.headers['access-control-expose-headers']).toContain('RateLimit-Remaining');
    expect(response.headers['access-control-expose-headers']).toContain('Retry-After');
    expect(response.headers['vary']).toContain('Origin');
  });

  it('answers a configured origin’s preflight without a key', async () => {
    const response = await request(app())
      .options('/api/v1/calc/single-plane')
      .set('Origin', PORTAL)
      .set('Access-Control-Request-Method', 'POST')
      .set('Access-Control-Request-Headers', 'x-api-key, content-type');
    expect(response.status).toBe(204);
    expect(response.headers['access-control-allow-origin']).toBe(PORTAL);
    expect(response.headers['access-control-allow-headers']).toMatch(/X-Api-Key/i);
    expect(response.headers['access-control-allow-methods']).toContain('POST');
  });

  it('lets the page read a refusal too, so that it can show why', async () => {
    const response = await request(app()).get('/api/v1/usage').set('Origin', PORTAL);
    expect(response.status).toBe(401);
    expect(response.headers['access-control-allow-origin']).toBe(PORTAL);
  });

  it('grants nothing to an origin that is not configured', async () => {
    const answer = await request(app())
      .get('/api/v1/usage')
      .set('Origin', 'https://elsewhere.example')
      .set('X-Api-Key', key);
    expect(answer.headers['access-control-allow-origin']).toBeUndefined();
    const preflight = await request(app())
      .options('/api/v1/usage')
      .set('Origin', 'https://elsewhere.example')
      .set('Access-Control-Request-Method', 'GET');
    expect(preflight.headers['access-control-allow-origin']).toBeUndefined();
  });

  it('grants nothing to any origin when none is configured', async () => {
    const answer = await request(app([])).get('/api/v1/usage').set('Origin', PORTAL).set('X-Api-Key', key);
    expect(answer.status).toBe(200);
    expect(answer.headers['access-control-allow-origin']).toBeUndefined();
  });

  it('leaves the routes outside /api/v1 without CORS', async () => {
    const response = await request(app()).get('/api/health').set('Origin', PORTAL);
    expect(response.headers['access-control-allow-origin']).toBeUndefined();
  });
});

describe('routes mounted on the keyed chain', () => {
  /** An app like createApp's, with stand-ins for the calculator's routes on the chain. */
  function appWithRoutes(sink: UsageSink) {
    const v1 = keyedV1Router({
      keys: new ApiKeyService(new ApiKeysRepo(temporary.database.orm)),
      clock,
      usage: sink,
      corsOrigins: [],
      documentedPaths: new Set(['/api/v1/calc/single-plane', '/api/v1/calc/batch']),
    });
    const calc = Router();
    calc.post('/single-plane', express.json(), (_req, res) => {
      res.json({ keyName: res.locals.apiKey?.name });
    });
    calc.post('/batch', express.json(), (req, res) => {
      const items = req.body as unknown[];
      for (const [index] of items.entries()) {
        sink.record({
          keyId: res.locals.apiKey!.id,
          route: `POST /api/v1/calc/batch#${index}`,
          status: 200,
          durationMs: 0.1,
          calculations: 1,
          bytes: 10,
          at: clock.now(),
        });
      }
      res.locals.usageRecorded = true;
      res.json({ items: items.length });
    });
    v1.use('/calc', calc);
    const server = express();
    server.use('/api/v1', v1);
    server.use(problemHandler(() => undefined));
    return server;
  }

  const routes = () =>
    temporary.database.sqlite.prepare('SELECT route FROM api_usage ORDER BY id').pluck().all();

  it('find the key on res.locals and are logged, one row a request', async () => {
    const response = await request(appWithRoutes(usageLog))
      .post('/api/v1/calc/single-plane?units=metric')
      .set('X-Api-Key', key)
      .send({})
      .expect(200);
    expect(response.body).toEqual({ keyName: 'Test integration' });
    usageLog.flush();
    expect(routes()).toEqual(['POST /api/v1/calc/single-plane']);
    const bytes = temporary.database.sqlite.prepare('SELECT bytes FROM api_usage').pluck().get();
    expect(bytes).toBe(Buffer.byteLength(JSON.stringify(response.body)));
  });

  it('log their own rows instead when they set usageRecorded', async () => {
    await request(appWithRoutes(usageLog))
      .post('/api/v1/calc/batch')
      .set('X-Api-Key', key)
      .send([1, 2, 3])
      .expect(200);
    usageLog.flush();
    expect(routes()).toEqual([
      'POST /api/v1/calc/batch#0',
      'POST /api/v1/calc/batch#1',
      'POST /api/v1/calc/batch#2',
    ]);
  });

  it('are refused without a key before they run', async () => {
    await request(appWithRoutes(usageLog)).post('/api/v1/calc/single-plane').send({}).expect(401);
    usageLog.flush();
    expect(routes()).toEqual([]);
  });
});
