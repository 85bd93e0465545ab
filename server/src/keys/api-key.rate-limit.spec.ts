import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ProblemSchema } from '@counterpoise/api';
import { createApp } from '../app';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from '../usage/usage-log';
import { createTestKey } from './testing/test-keys';

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

const USAGE = '/api/v1/usage';

describe('the per-key rate limit', () => {
  it('takes the limit stored with the key and counts down in RateLimit-* headers', async () => {
    const { key } = createTestKey(temporary.database, { limitPerMinute: 3 });
    const server = createApp({ database: temporary.database, usageLog });
    for (const remaining of [2, 1, 0]) {
      const response = await request(server).get(USAGE).set('X-Api-Key', key).expect(200);
      expect(response.headers['ratelimit-limit']).toBe('3');
      expect(response.headers['ratelimit-remaining']).toBe(String(remaining));
      expect(response.headers['ratelimit-policy']).toBe('3;w=60');
      const reset = Number(response.headers['ratelimit-reset']);
      expect(reset).toBeGreaterThan(0);
      expect(reset).toBeLessThanOrEqual(60);
    }
  });

  it('answers 429 problem+json with Retry-After once the key is over its limit', async () => {
    const { key } = createTestKey(temporary.database, { limitPerMinute: 2 });
    const server = createApp({ database: temporary.database, usageLog });
    await request(server).get(USAGE).set('X-Api-Key', key).expect(200);
    await request(server).get(USAGE).set('X-Api-Key', key).expect(200);
    const response = await request(server).get(USAGE).set('X-Api-Key', key).expect(429);

    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(ProblemSchema.parse(response.body)).toMatchObject({
      title: 'Too Many Requests',
      status: 429,
      code: 'RATE_LIMITED',
      detail: expect.stringMatching(/2 requests a minute/),
    });
    const retryAfter = Number(response.headers['retry-after']);
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(60);
    expect(response.headers['ratelimit-limit']).toBe('2');
    expect(response.headers['ratelimit-remaining']).toBe('0');
    expect(response.headers['ratelimit-reset']).toBeDefined();
  });

  it('counts each key on its own', async () => {
    const busy = createTestKey(temporary.database, { name: 'busy', limitPerMinute: 1 });
    const quiet = createTestKey(temporary.database, { name: 'quiet', limitPerMinute: 5 });
    const server = createApp({ database: temporary.database, usageLog });
    await request(server).get(USAGE).set('X-Api-Key', busy.key).expect(200);
    await request(server).get(USAGE).set('X-Api-Key', busy.key).expect(429);
    const response = await request(server).get(USAGE).set('Authorization', `Bearer ${quiet.key}`).expect(200);
    expect(response.headers['ratelimit-limit']).toBe('5');
    expect(response.headers['ratelimit-remaining']).toBe('4');
  });

  it('logs the refused requests of a key too, as 429', async () => {
    const { key } = createTestKey(temporary.database, { limitPerMinute: 1 });
    const server = createApp({ database: temporary.database, usageLog });
    await request(server).get(USAGE).set('X-Api-Key', key).expect(200);
    await request(server).get(USAGE).set('X-Api-Key', key).expect(429);
    usageLog.flush();
    const statuses = temporary.database.sqlite
      .prepare('SELECT status FROM api_usage ORDER BY id')
      .pluck()
      .all();
    expect(statuses).toEqual([200, 429]);
  });
});
