import { randomBytes } from 'node:crypto';
import type { Express } from 'express';
import { SignJWT } from 'jose';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ApiKeySummarySchema, MAX_VISITOR_TOKEN_SECONDS, VisitorTokenSchema } from '@counterpoise/api';
import { createApp } from '../app';
import type { Clock } from '../clock';
import { createTestOrganisation, signIn, TEST_HASH_COST, type TestOrganisation } from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from '../usage/usage-log';
import { createTestKey } from './testing/test-keys';

const PORTAL = 'https://portal.example.com';
const STAGING = 'https://staging.portal.example.com';
const ELSEWHERE = 'https://elsewhere.example.net';
const CONFIGURED = 'https://configured.example.org';
const RADIUS = { mass: 120, fromRadius: 180, toRadius: 240 };
const CALC = '/api/v1/calc/radius';

let temporary: TemporaryDatabase;
let usageLog: UsageLog;
let shop: TestOrganisation;
let app: Express;
let nowMs: number;
const clock: Clock = { now: () => new Date(nowMs) };
let owner: string;

beforeEach(async () => {
  nowMs = Date.parse('2026-05-04T09:00:00.000Z');
  temporary = openTemporaryDatabase();
  usageLog = new UsageLog(temporary.database, { log: () => undefined });
  shop = createTestOrganisation(temporary.database, 'Linden Pulley Works');
  app = createApp({
    database: temporary.database,
    clock,
    usageLog,
    corsOrigins: [CONFIGURED],
    log: () => undefined,
    accounts: { signingKey: randomBytes(48), passwordHashCost: TEST_HASH_COST },
  });
  owner = (await signIn(app, shop.people.owner.email)).accessToken;
});
afterEach(() => {
  usageLog.close();
  temporary.dispose();
});

/** Creates a key in the shop as its owner would in the developer portal. */
async function createKey(body: { allowedOrigins?: string[]; limitPerMinute?: number; name?: string }) {
  const answer = await request(app)
    .post('/api/v1/keys')
    .set('Authorization', `Bearer ${owner}`)
    .send({ name: 'Dealer portal', ...body })
    .expect(201);
  return { key: answer.body.key as string, summary: ApiKeySummarySchema.parse(answer.body.summary) };
}

const calc = (credential: { key?: string; token?: string }, origin?: string) => {
  const call = request(app).post(CALC);
  if (credential.key) call.set('X-Api-Key', credential.key);
  if (credential.token) call.set('Authorization', `Bearer ${credential.token}`);
  if (origin !== undefined) call.set('Origin', origin);
  return call.send(RADIUS);
};

const preflight = (origin: string, path = CALC) =>
  request(app)
    .options(path)
    .set('Origin', origin)
    .set('Access-Control-Request-Method', 'POST')
    .set('Access-Control-Request-Headers', 'authorization, content-type');

function exchange(key: string, body: object = {}) {
  return request(app).post('/api/v1/tokens').set('X-Api-Key', key).send(body);
}

const usageRows = () => {
  usageLog.flush();
  return temporary.database.sqlite
    .prepare('SELECT key_id AS keyId, route, status FROM api_usage ORDER BY id')
    .all() as { keyId: number; route: string; status: number }[];
};

describe('a key limited to web origins', () => {
  it('is created with its origins normalised, and the 400 names the entry at fault', async () => {
    const { summary } = await createKey({ allowedOrigins: ['https://Portal.Example.com/', STAGING, PORTAL] });
    expect(summary.allowedOrigins).toEqual([PORTAL, STAGING]);
    const bad = await request(app)
      .post('/api/v1/keys')
      .set('Authorization', `Bearer ${owner}`)
      .send({ name: 'Bad', allowedOrigins: [PORTAL, 'http://portal.example.com'] })
      .expect(400);
    expect(bad.type).toBe('application/problem+json');
    expect(bad.body.errors).toEqual([
      { path: 'allowedOrigins[1]', message: expect.stringContaining('use https:') },
    ]);
    const list = await request(app).get('/api/v1/keys').set('Authorization', `Bearer ${owner}`).expect(200);
    expect(list.body.keys.map((key: { name: string }) => key.name)).toEqual(['Dealer portal']);
  });

  it('works from a listed origin, whose page reads the answer and its rate-limit headers', async () => {
    const { key } = await createKey({ allowedOrigins: [PORTAL, STAGING] });
    const answer = await calc({ key }, STAGING).expect(200);
    expect(answer.body.mass).toBe(90);
    expect(answer.headers['access-control-allow-origin']).toBe(STAGING);
    expect(answer.headers['access-control-expose-headers']).toContain('RateLimit-Remaining');
    expect(answer.headers['vary']).toContain('Origin');
  });

  it('is refused from any other origin, and without an Origin header, naming the origin and what to do', async () => {
    const { key, summary } = await createKey({ allowedOrigins: [PORTAL] });
    const other = await calc({ key }, ELSEWHERE).expect(403);
    expect(other.type).toBe('application/problem+json');
    expect(other.body.code).toBe('API_KEY_ORIGIN_REFUSED');
    expect(other.body.detail).toContain(ELSEWHERE);
    expect(other.body.detail).toContain(PORTAL);
    expect(other.body.detail).toMatch(/add this origin to the key/);
    expect(other.headers['access-control-allow-origin']).toBeUndefined();
    const none = await calc({ key }).expect(403);
    expect(none.body.detail).toMatch(/no Origin header/);
    // Forged headers: another case, a path, the opaque origin and two origins are not the listed one.
    for (const forged of ['https://PORTAL.example.com', `${PORTAL}/`, 'null', `${PORTAL}, ${ELSEWHERE}`]) {
      expect((await calc({ key }, forged)).status, forged).toBe(403);
    }
    expect(usageRows().filter((row) => row.keyId === summary.id && row.status === 200)).toEqual([]);
  });

  it('lets a page of an origin that passed the preflight read why its key was refused', async () => {
    await createKey({ allowedOrigins: [STAGING] });
    const { key } = await createKey({ allowedOrigins: [PORTAL] });
    const refused = await calc({ key }, STAGING).expect(403);
    expect(refused.headers['access-control-allow-origin']).toBe(STAGING);
  });

  it('answers preflights for origins of active keys and configured ones only', async () => {
    await createKey({ allowedOrigins: [PORTAL] });
    const listed = await preflight(PORTAL).expect(204);
    expect(listed.headers['access-control-allow-origin']).toBe(PORTAL);
    expect(listed.headers['access-control-allow-headers']).toMatch(/Authorization/);
    expect(listed.headers['access-control-allow-methods']).toContain('POST');
    const configured = await preflight(CONFIGURED).expect(204);
    expect(configured.headers['access-control-allow-origin']).toBe(CONFIGURED);
    const unknown = await preflight(ELSEWHERE).expect(204);
    expect(unknown.headers['access-control-allow-origin']).toBeUndefined();
    expect(unknown.headers['vary']).toContain('Origin');
  });

  it('leaves a key without origins as before: any origin may call, only configured ones read', async () => {
    await createKey({ allowedOrigins: [PORTAL] });
    const { key } = await createKey({ name: 'Back office' });
    const fromListed = await calc({ key }, PORTAL).expect(200);
    expect(fromListed.headers['access-control-allow-origin']).toBeUndefined();
    const fromConfigured = await calc({ key }, CONFIGURED).expect(200);
    expect(fromConfigured.headers['access-control-allow-origin']).toBe(CONFIGURED);
    await calc({ key }).expect(200);
  });
});

describe('changing a key’s origins', () => {
  const putOrigins = (id: number, allowedOrigins: unknown, token = owner) =>
    request(app)
      .put(`/api/v1/keys/${id}/origins`)
      .set('Authorization', `Bearer ${token}`)
      .send({ allowedOrigins });

  it('counts at once for requests and preflights, and an empty list lifts the limit', async () => {
    const { key, summary } = await createKey({ allowedOrigins: [PORTAL] });
    await calc({ key }, PORTAL).expect(200);
    expect((await preflight(PORTAL)).headers['access-control-allow-origin']).toBe(PORTAL);

    const changed = await putOrigins(summary.id, [STAGING]).expect(200);
    expect(ApiKeySummarySchema.parse(changed.body).allowedOrigins).toEqual([STAGING]);
    await calc({ key }, PORTAL).expect(403);
    await calc({ key }, STAGING).expect(200);
    expect((await preflight(PORTAL)).headers['access-control-allow-origin']).toBeUndefined();
    expect((await preflight(STAGING)).headers['access-control-allow-origin']).toBe(STAGING);

    await putOrigins(summary.id, []).expect(200);
    await calc({ key }).expect(200);
    expect((await preflight(STAGING)).headers['access-control-allow-origin']).toBeUndefined();
  });

  it('refuses a bad list whole, keeping the stored one, and keys of other shops or roles', async () => {
    const { key, summary } = await createKey({ allowedOrigins: [PORTAL] });
    const bad = await putOrigins(summary.id, [STAGING, 'https://*.example.com']).expect(400);
    expect(bad.body.errors[0].path).toBe('allowedOrigins[1]');
    await calc({ key }, PORTAL).expect(200);
    const other = createTestOrganisation(temporary.database, 'Harrow Fan Repair');
    const theirs = (await signIn(app, other.people.owner.email)).accessToken;
    await putOrigins(summary.id, [ELSEWHERE], theirs).expect(404);
    const technician = (await signIn(app, shop.people.technician.email)).accessToken;
    await putOrigins(summary.id, [ELSEWHERE], technician).expect(403);
    await calc({ key }, PORTAL).expect(200);
    await calc({ key }, ELSEWHERE).expect(403);
  });

  it('stops a revoked key’s origins from being answered in preflights', async () => {
    const { summary } = await createKey({ allowedOrigins: [PORTAL] });
    await request(app)
      .delete(`/api/v1/keys/${summary.id}`)
      .set('Authorization', `Bearer ${owner}`)
      .expect(204);
    expect((await preflight(PORTAL)).headers['access-control-allow-origin']).toBeUndefined();
  });

  it('never lets a request through from an origin off the list, while changes and requests race', async () => {
    const THIRD = 'https://third.portal.example.com';
    const { key, summary } = await createKey({ allowedOrigins: [PORTAL], limitPerMinute: 10_000 });
    const cycle = [PORTAL, STAGING, THIRD];
    let listed = [PORTAL];
    const outcomes: { origin: string; status: number; mayPass: boolean }[] = [];
    for (let round = 0; round < 9; round++) {
      const next = [cycle[(round + 1) % cycle.length]!];
      // Calls from every origin and the change of the list, all in flight at once: a call may pass
      // only from an origin listed before the change or after it, never from the third one.
      const calls = [...cycle, ELSEWHERE].map((origin) =>
        calc({ key }, origin).then((answer) => ({
          origin,
          status: answer.status,
          mayPass: listed.includes(origin) || next.includes(origin),
        })),
      );
      const change = putOrigins(summary.id, next).then((answer) => answer.status);
      outcomes.push(...(await Promise.all(calls)));
      expect(await change).toBe(200);
      listed = next;
    }
    expect(outcomes).toHaveLength(36);
    for (const outcome of outcomes) {
      expect([200, 403]).toContain(outcome.status);
      if (!outcome.mayPass) expect(outcome, JSON.stringify(outcome)).toMatchObject({ status: 403 });
    }
    expect(outcomes.filter((outcome) => outcome.status === 200).length).toBeGreaterThan(0);
    // After the race, the stored list holds, and only it.
    await calc({ key }, PORTAL).expect(200);
    await calc({ key }, STAGING).expect(403);
    const stored = temporary.database.sqlite
      .prepare('SELECT allowed_origins FROM api_keys WHERE id = ?')
      .pluck()
      .get(summary.id);
    expect(JSON.parse(stored as string)).toEqual([PORTAL]);
  });
});

describe('visitor tokens', () => {
  it('are exchanged for a secret key and call the calculator as the key, counted in its usage', async () => {
    const { key, summary } = await createKey({ name: 'Portal back end' });
    const answer = await exchange(key, { origin: PORTAL, visitor: 'visitor-2231', ttlSeconds: 600 }).expect(
      201,
    );
    const { token, expiresAt } = VisitorTokenSchema.parse(answer.body);
    expect(Date.parse(expiresAt) - nowMs).toBe(600_000);
    expect(answer.headers['cache-control']).toBe('no-store');

    const used = await calc({ token }, PORTAL).expect(200);
    expect(used.body.mass).toBe(90);
    expect(used.headers['access-control-allow-origin']).toBe(PORTAL);
    expect(used.headers['ratelimit-limit']).toBe('600');
    // A preflight from the token's origin is answered while the token lives.
    expect((await preflight(PORTAL)).headers['access-control-allow-origin']).toBe(PORTAL);
    expect(usageRows()).toEqual([
      { keyId: summary.id, route: 'POST /api/v1/tokens', status: 201 },
      { keyId: summary.id, route: `POST ${CALC}`, status: 200 },
    ]);
  });

  it('live 5 minutes unless asked, at most 15, and are refused once expired', async () => {
    const { key } = await createKey({});
    const short = VisitorTokenSchema.parse((await exchange(key).expect(201)).body);
    expect(Date.parse(short.expiresAt) - nowMs).toBe(300_000);
    const long = await exchange(key, { ttlSeconds: MAX_VISITOR_TOKEN_SECONDS + 1 }).expect(400);
    expect(long.body.errors[0].path).toBe('ttlSeconds');
    await calc({ token: short.token }).expect(200);
    nowMs += 299_000;
    await calc({ token: short.token }).expect(200);
    nowMs += 1_000;
    const expired = await calc({ token: short.token }).expect(401);
    expect(expired.body.code).toBe('TOKEN_EXPIRED');
    expect(expired.headers['www-authenticate']).toContain('invalid_token');
  });

  it('stop working when their key is revoked', async () => {
    const { key, summary } = await createKey({});
    const { token } = (await exchange(key).expect(201)).body;
    await calc({ token }).expect(200);
    await request(app)
      .delete(`/api/v1/keys/${summary.id}`)
      .set('Authorization', `Bearer ${owner}`)
      .expect(204);
    const refused = await calc({ token }).expect(403);
    expect(refused.body.code).toBe('API_KEY_REVOKED');
    expect(refused.body.detail).toMatch(/its tokens no longer work/);
  });

  it('bound to an origin are refused from any other, and without one', async () => {
    const { key } = await createKey({});
    const { token } = (await exchange(key, { origin: PORTAL }).expect(201)).body;
    const other = await calc({ token }, ELSEWHERE).expect(403);
    expect(other.body.code).toBe('API_KEY_ORIGIN_REFUSED');
    expect(other.body.detail).toContain(ELSEWHERE);
    await calc({ token }).expect(403);
    // A token bound to no origin serves a program, which sends none.
    const free = (await exchange(key).expect(201)).body.token;
    await calc({ token: free }).expect(200);
  });

  it('call the calculation routes only', async () => {
    const { key } = await createKey({});
    const { token } = (await exchange(key).expect(201)).body;
    const usage = await request(app).get('/api/v1/usage').set('Authorization', `Bearer ${token}`).expect(403);
    expect(usage.body.code).toBe('TOKEN_SCOPE');
    // Express matches paths regardless of case, and so does the token's scope.
    await request(app).get('/API/V1/Usage').set('Authorization', `Bearer ${token}`).expect(403);
    await request(app)
      .post('/API/v1/CALC/radius')
      .set('Authorization', `Bearer ${token}`)
      .send(RADIUS)
      .expect(200);
    const again = await request(app).post('/api/v1/tokens').set('Authorization', `Bearer ${token}`).send({});
    expect(again.status).toBe(403);
    expect(again.body.code).toBe('TOKEN_SCOPE');
    // The workbench's routes take a person's access token, which a visitor token is not.
    await request(app).get('/api/v1/keys').set('Authorization', `Bearer ${token}`).expect(401);
    await request(app).get('/api/v1/customers').set('Authorization', `Bearer ${token}`).expect(401);
  });

  it('are refused when altered, signed by another server, or made as a person’s token', async () => {
    const { key } = await createKey({});
    const { token } = (await exchange(key).expect(201)).body as { token: string };
    const [header, payload, signature] = token.split('.') as [string, string, string];
    const claims = JSON.parse(Buffer.from(payload, 'base64url').toString());
    const raised = Buffer.from(JSON.stringify({ ...claims, key: claims.key + 1 })).toString('base64url');
    const altered = await calc({ token: `${header}.${raised}.${signature}` }).expect(401);
    expect(altered.body.code).toBe('TOKEN_INVALID');
    const foreign = await new SignJWT(claims)
      .setProtectedHeader({ alg: 'HS256', typ: 'cp-visitor+jwt' })
      .sign(randomBytes(32));
    expect((await calc({ token: foreign })).body.code).toBe('TOKEN_INVALID');
    const unsigned = `${Buffer.from('{"alg":"none","typ":"cp-visitor+jwt"}').toString('base64url')}.${payload}.`;
    expect((await calc({ token: unsigned })).body.code).toBe('TOKEN_INVALID');
    // A person's access token is not exchanged, and a visitor token is not taken for one.
    const person = await request(app).post('/api/v1/tokens').set('Authorization', `Bearer ${owner}`).send({});
    expect(person.status).toBe(403);
    expect(person.body.code).toBe('TOKEN_EXCHANGE_REFUSED');
  });

  it('are not made from a key limited to web origins, which is no secret', async () => {
    const { key } = await createKey({ allowedOrigins: [PORTAL] });
    const refused = await request(app)
      .post('/api/v1/tokens')
      .set('X-Api-Key', key)
      .set('Origin', PORTAL)
      .send({})
      .expect(403);
    expect(refused.body.code).toBe('TOKEN_EXCHANGE_REFUSED');
  });

  it('share their key’s limit: many exchanges and calls at once never pass it', async () => {
    const { key, summary } = await createKey({ limitPerMinute: 20 });
    const exchanges = await Promise.all(Array.from({ length: 12 }, () => exchange(key, { origin: PORTAL })));
    const tokens = exchanges
      .filter((answer) => answer.status === 201)
      .map((answer) => answer.body.token as string);
    expect(tokens).toHaveLength(12);
    const calls = await Promise.all(
      Array.from({ length: 16 }, (_, i) => calc({ token: tokens[i % tokens.length]! }, PORTAL)),
    );
    const statuses = calls.map((answer) => answer.status).sort();
    expect(statuses.filter((status) => status === 200)).toHaveLength(8);
    expect(statuses.filter((status) => status === 429)).toHaveLength(8);
    const limited = calls.find((answer) => answer.status === 429)!;
    expect(limited.body.detail).toMatch(/This API key may make 20 calculations a minute/);
    expect(limited.headers['access-control-allow-origin']).toBe(PORTAL);
    const rows = usageRows().filter((row) => row.keyId === summary.id);
    expect(rows.filter((row) => row.status !== 429)).toHaveLength(20);
  });

  it('from another key’s exchange are each their own key’s', async () => {
    const first = createTestKey(temporary.database, { name: 'First', limitPerMinute: 5 });
    const second = createTestKey(temporary.database, { name: 'Second', limitPerMinute: 5 });
    const a = (await exchange(first.key).expect(201)).body.token;
    const b = (await exchange(second.key).expect(201)).body.token;
    await calc({ token: a }).expect(200);
    await calc({ token: b }).expect(200);
    expect(usageRows().map((row) => row.keyId)).toEqual([
      first.record.id,
      second.record.id,
      first.record.id,
      second.record.id,
    ]);
  });
});
