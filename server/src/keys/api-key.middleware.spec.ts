import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ProblemSchema } from '@counterpoise/api';
import { createApp } from '../app';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from '../usage/usage-log';
import { generateApiKey, KEY_RECHECK_MS } from './keys.service';
import { createTestKey, revokeTestKey } from './testing/test-keys';

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
const USAGE = '/api/v1/usage';

/** Asserts a problem+json answer and returns it. */
function problemOf(response: request.Response, status: number) {
  expect(response.status).toBe(status);
  expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
  const problem = ProblemSchema.parse(response.body);
  expect(problem).toMatchObject({ status, instance: USAGE });
  return problem;
}

describe('the API-key check', () => {
  it('lets a valid key through in X-Api-Key, and as a bearer key in either case', async () => {
    const { key } = createTestKey(temporary.database);
    const server = app();
    await request(server).get(USAGE).set('X-Api-Key', key).expect(200);
    await request(server).get(USAGE).set('Authorization', `Bearer ${key}`).expect(200);
    await request(server).get(USAGE).set('Authorization', `bearer  ${key}`).expect(200);
    await request(server).get(USAGE).set('X-Api-Key', key).set('Authorization', `Bearer ${key}`).expect(200);
    await request(server)
      .get(USAGE)
      .set('X-Api-Key', key)
      .set('Authorization', 'Basic cHJveHk6bG9naW4=')
      .expect(200);
  });

  it('answers 401 with a challenge when there is no key', async () => {
    const response = await request(app()).get(USAGE);
    const problem = problemOf(response, 401);
    expect(problem.code).toBe('API_KEY_MISSING');
    expect(problem.detail).toMatch(/X-Api-Key/);
    expect(response.headers['www-authenticate']).toBe('Bearer realm="Counterpoise API"');
  });

  it('answers 401 for a malformed key, without looking it up', async () => {
    for (const key of ['letmein', 'cpk_short', `${generateApiKey().key}=`]) {
      const response = await request(app()).get(USAGE).set('X-Api-Key', key);
      expect(problemOf(response, 401)).toMatchObject({
        code: 'API_KEY_INVALID',
        detail: expect.stringMatching(/form of a Counterpoise key/),
      });
      expect(response.headers['www-authenticate']).toContain('error="invalid_token"');
    }
  });

  it('answers 401 for a well-formed key nobody created', async () => {
    const response = await request(app()).get(USAGE).set('Authorization', `Bearer ${generateApiKey().key}`);
    expect(problemOf(response, 401)).toMatchObject({
      code: 'API_KEY_INVALID',
      detail: expect.stringMatching(/not known/),
    });
  });

  it('answers 401 for an Authorization header of another scheme, and for two different keys', async () => {
    const { key } = createTestKey(temporary.database);
    const basic = await request(app()).get(USAGE).set('Authorization', 'Basic cHJveHk6bG9naW4=');
    expect(problemOf(basic, 401)).toMatchObject({
      code: 'API_KEY_MISSING',
      detail: expect.stringMatching(/bearer/),
    });
    expect(basic.headers['www-authenticate']).toBe('Bearer realm="Counterpoise API"');
    const two = await request(app())
      .get(USAGE)
      .set('X-Api-Key', key)
      .set('Authorization', `Bearer ${generateApiKey().key}`);
    expect(problemOf(two, 401)).toMatchObject({
      code: 'API_KEY_CONFLICT',
      detail: expect.stringMatching(/different keys/),
    });
  });

  it('answers 403 for a revoked key, naming its prefix', async () => {
    const { key, record } = createTestKey(temporary.database);
    revokeTestKey(temporary.database, record.id, new Date('2026-05-04T09:00:00Z'));
    const response = await request(app()).get(USAGE).set('X-Api-Key', key);
    const problem = problemOf(response, 403);
    expect(problem.code).toBe('API_KEY_REVOKED');
    expect(problem.detail).toContain(record.prefix);
    expect(problem.detail).toContain('2026-05-04T09:00:00.000Z');
  });

  it('refuses a key revoked by another process while the app runs, within KEY_RECHECK_MS', async () => {
    const { key, record } = createTestKey(temporary.database);
    const server = app();
    await request(server).get(USAGE).set('X-Api-Key', key).expect(200);
    revokeTestKey(temporary.database, record.id);
    await new Promise((resolve) => setTimeout(resolve, KEY_RECHECK_MS + 50));
    await request(server).get(USAGE).set('X-Api-Key', key).expect(403);
  });

  it('logs no usage for refused requests, and one row for each let through', async () => {
    const { key, record } = createTestKey(temporary.database);
    const server = app();
    await request(server).get(USAGE).expect(401);
    await request(server).get(USAGE).set('X-Api-Key', generateApiKey().key).expect(401);
    await request(server).get(USAGE).set('X-Api-Key', key).expect(200);
    await request(server).get(`${USAGE}?groupBy=month`).set('X-Api-Key', key).expect(400);
    await request(server).get('/api/v1/no-such-route').set('X-Api-Key', key).expect(404);
    usageLog.flush();
    const rows = temporary.database.sqlite
      .prepare('SELECT key_id AS keyId, route, status FROM api_usage ORDER BY id')
      .all();
    expect(rows).toEqual([
      { keyId: record.id, route: 'GET /api/v1/usage', status: 200 },
      { keyId: record.id, route: 'GET /api/v1/usage', status: 400 },
      { keyId: record.id, route: 'GET (unknown route)', status: 404 },
    ]);
  });
});
