import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { CALC_ROUTES, ProblemSchema, UsageReportSchema } from '@counterpoise/api';
import { createApp } from '../app';
import { createTestOrganisation, signIn, TEST_HASH_COST } from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from '../usage/usage-log';
import { CalculationWindows } from './api-key.rate-limit';
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
const BATCH = '/api/v1/calc/batch';
const RADIUS_PATH = '/api/v1/calc/radius';

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
      detail: expect.stringMatching(/2 calculations a minute/),
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

describe('CalculationWindows', () => {
  const WINDOW = 60_000;
  let nowMs = 1_000_000;
  const windows = () => new CalculationWindows(() => nowMs, WINDOW);

  it('grants a request whole or refuses it whole, and opens a fresh window once the minute is over', () => {
    nowMs = 1_000_000;
    const counter = windows();
    expect(counter.take('key:1', 3, 5)).toMatchObject({ granted: true, used: 3, resetAtMs: 1_060_000 });
    expect(counter.take('key:1', 3, 5)).toMatchObject({ granted: false, used: 3 });
    expect(counter.take('key:1', 2, 5)).toMatchObject({ granted: true, used: 5 });
    expect(counter.take('key:2', 5, 5)).toMatchObject({ granted: true, used: 5 });
    nowMs = 1_060_000;
    expect(counter.take('key:1', 5, 5)).toMatchObject({ granted: true, used: 5, resetAtMs: 1_120_000 });
  });

  it('takes only the rest of a request counted before while that window lasts, and all of it after', () => {
    nowMs = 2_000_000;
    const counter = windows();
    const first = counter.take('key:1', 1, 10);
    const counted = { count: 1, resetAtMs: first.resetAtMs };
    expect(counter.take('key:1', 4, 10, counted)).toMatchObject({ granted: true, used: 4 });
    nowMs += WINDOW;
    expect(counter.take('key:1', 4, 10, counted)).toMatchObject({ granted: true, used: 4 });
  });

  it('starts afresh for a key that was quiet for longer than two windows', () => {
    nowMs = 3_000_000;
    const counter = windows();
    counter.take('key:1', 5, 5);
    nowMs += 2.5 * WINDOW;
    counter.take('key:2', 1, 5);
    expect(counter.take('key:1', 5, 5)).toMatchObject({ granted: true, used: 5 });
  });
});

describe('the limit counts calculations: a batch of n counts n', () => {
  const RADIUS = CALC_ROUTES.radius.example;
  const batchOf = (count: number) => ({
    items: Array.from({ length: count }, (_, index) => ({ id: `r${index}`, route: 'radius', body: RADIUS })),
  });
  const rows = () => {
    usageLog.flush();
    return temporary.database.sqlite
      .prepare(
        'SELECT route, status, count(*) AS count, sum(calculations) AS calculations FROM api_usage ' +
          'GROUP BY route, status ORDER BY route',
      )
      .all();
  };

  it('refuses a batch larger than what remains, whole, before computing any item', async () => {
    const { key } = createTestKey(temporary.database, { limitPerMinute: 5 });
    const server = createApp({ database: temporary.database, usageLog, log: () => undefined });
    const response = await request(server).post(BATCH).set('X-Api-Key', key).send(batchOf(6)).expect(429);

    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(ProblemSchema.parse(response.body)).toMatchObject({
      status: 429,
      code: 'RATE_LIMITED',
      detail: expect.stringMatching(/asks for 6 calculations, and 4 remain .*5 calculations a minute/),
    });
    expect(Number(response.headers['retry-after'])).toBeGreaterThan(0);
    expect(response.headers['ratelimit-remaining']).toBe('4');
    // One row, of a request that asked for no calculation.
    expect(rows()).toEqual([{ route: 'POST /api/v1/calc/batch', status: 429, count: 1, calculations: 0 }]);
  });

  it('lets a batch of 5 use up a limit of 5, so that the next single request is refused', async () => {
    const { key } = createTestKey(temporary.database, { limitPerMinute: 5 });
    const server = createApp({ database: temporary.database, usageLog, log: () => undefined });
    const batch = await request(server).post(BATCH).set('X-Api-Key', key).send(batchOf(5)).expect(200);
    expect(batch.body.items).toHaveLength(5);
    expect(batch.headers['ratelimit-limit']).toBe('5');
    expect(batch.headers['ratelimit-remaining']).toBe('0');
    const single = await request(server).post(RADIUS_PATH).set('X-Api-Key', key).send(RADIUS).expect(429);
    expect(single.body.detail).toMatch(/5 calculations a minute/);
    // The batch is one row carrying its five calculations; the refused call is one more.
    expect(rows()).toEqual([
      { route: 'POST /api/v1/calc/batch', status: 200, count: 1, calculations: 5 },
      { route: 'POST /api/v1/calc/radius', status: 429, count: 1, calculations: 1 },
    ]);
  });

  it('reports calculations in the RateLimit headers, and the usage report counts the same', async () => {
    const { key } = createTestKey(temporary.database, { limitPerMinute: 20 });
    const server = createApp({ database: temporary.database, usageLog, log: () => undefined });
    const batch = await request(server).post(BATCH).set('X-Api-Key', key).send(batchOf(4)).expect(200);
    expect(batch.headers['ratelimit-remaining']).toBe('16');
    const single = await request(server).post(RADIUS_PATH).set('X-Api-Key', key).send(RADIUS).expect(200);
    expect(single.headers['ratelimit-remaining']).toBe('15');
    usageLog.flush();

    const usage = await request(server).get(USAGE).set('X-Api-Key', key).expect(200);
    const report = UsageReportSchema.parse(usage.body);
    // The report holds what was counted before it; the call itself is counted, and logged after it.
    expect(report.total).toMatchObject({ requests: 2, calculations: 5 });
    expect(Number(usage.headers['ratelimit-remaining'])).toBe(20 - report.total.calculations - 1);
  });

  it('never computes more items than the limit, however many batches arrive at once', async () => {
    const { key } = createTestKey(temporary.database, { limitPerMinute: 10 });
    const server = createApp({ database: temporary.database, usageLog, log: () => undefined });
    const answers = await Promise.all([
      ...Array.from({ length: 8 }, () => request(server).post(BATCH).set('X-Api-Key', key).send(batchOf(3))),
      ...Array.from({ length: 4 }, () =>
        request(server).post(RADIUS_PATH).set('X-Api-Key', key).send(RADIUS),
      ),
    ]);
    const computed = answers
      .filter((answer) => answer.status === 200)
      .reduce((sum, answer) => sum + (answer.body.items?.length ?? 1), 0);
    expect(answers.every((answer) => answer.status === 200 || answer.status === 429)).toBe(true);
    expect(answers.some((answer) => answer.status === 429)).toBe(true);
    expect(computed).toBeGreaterThan(0);
    expect(computed).toBeLessThanOrEqual(10);
    usageLog.flush();
    // The calculations the log holds for the answered requests are exactly those computed.
    const stored = temporary.database.sqlite
      .prepare('SELECT sum(calculations) FROM api_usage WHERE status = 200')
      .pluck()
      .get();
    expect(stored).toBe(computed);
  });

  it('counts a signed-in person’s batch item by item too', async () => {
    const shop = createTestOrganisation(temporary.database, 'Tamsin Gearbox Repairs');
    const server = createApp({
      database: temporary.database,
      usageLog,
      log: () => undefined,
      accounts: { passwordHashCost: TEST_HASH_COST, userCalcLimitPerMinute: 3 },
    });
    const { accessToken } = await signIn(server, shop.people.technician.email);
    const bearer = `Bearer ${accessToken}`;
    const refused = await request(server)
      .post(BATCH)
      .set('Authorization', bearer)
      .send(batchOf(4))
      .expect(429);
    expect(refused.body.detail).toMatch(
      /asks for 4 calculations, and 2 remain .*You may make 3 calculations/,
    );
    const batch = await request(server).post(BATCH).set('Authorization', bearer).send(batchOf(2)).expect(200);
    expect(batch.headers['ratelimit-remaining']).toBe('0');
    await request(server).post(RADIUS_PATH).set('Authorization', bearer).send(RADIUS).expect(429);
  });
});
