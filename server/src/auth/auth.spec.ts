import { randomBytes } from 'node:crypto';
import { SignJWT, UnsecuredJWT } from 'jose';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { MeSchema, ProblemSchema, SessionSchema } from '@counterpoise/api';
import type { Clock } from '../clock';
import {
  type AccountsTestApp,
  createTestOrganisation,
  linkTokenIn,
  refreshCookieOf,
  signIn,
  startAccountsTestApp,
  TEST_PASSWORD,
  type TestOrganisation,
} from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { LOCK_MS, REFRESH_GRACE_MS } from './auth.service';
import { ACCESS_TOKEN_TTL_SECONDS, signAccessToken } from './tokens';

let temporary: TemporaryDatabase;
let test: AccountsTestApp;
let shop: TestOrganisation;
let now: Date;
const clock: Clock = { now: () => now };
const signingKey = randomBytes(48);

beforeEach(async () => {
  now = new Date('2026-05-04T08:00:00Z');
  temporary = openTemporaryDatabase();
  shop = createTestOrganisation(temporary.database, 'Cedar Rotor Shop', now);
  test = await startAccountsTestApp(temporary.database, { clock, signingKey });
});
afterEach(async () => {
  await test.close();
  temporary.dispose();
});

const me = (token: string) => request(test.app).get('/api/v1/me').set('Authorization', `Bearer ${token}`);
const refresh = (cookie?: string) => {
  const call = request(test.app).post('/api/v1/auth/refresh');
  return cookie ? call.set('Cookie', cookie) : call;
};
const problemOf = (response: request.Response, status: number) => {
  expect(response.status, JSON.stringify(response.body)).toBe(status);
  expect(response.headers['content-type']).toContain('application/problem+json');
  return ProblemSchema.parse(response.body);
};
/** Sign-out as the workbench sends it: from a page of the server, so with its Origin. */
const signOut = (cookie?: string) => {
  const call = request(test.app).post('/api/v1/auth/sign-out').set('Origin', 'http://workbench.test:4300');
  return cookie ? call.set('Cookie', cookie) : call;
};
/** The reset e-mail goes out after the answer: waits for it to arrive. */
const resetLinkSentTo = (email: string) =>
  vi.waitFor(() => linkTokenIn(test.mail, email, '/reset-password'), { timeout: 5000 });

describe('POST /api/v1/auth/sign-in', () => {
  it('answers a session and sets an httpOnly, SameSite=Strict refresh cookie scoped to /api/v1/auth', async () => {
    const response = await request(test.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'Technician@Cedar-Rotor-Shop.test', password: TEST_PASSWORD })
      .expect(200);
    const session = SessionSchema.parse(response.body);
    expect(session.user).toMatchObject({ email: 'technician@cedar-rotor-shop.test', role: 'technician' });
    expect(session.permissions).toContain('jobs:write');
    expect(session.permissions).not.toContain('people:read');
    expect(session.expiresInSeconds).toBe(ACCESS_TOKEN_TTL_SECONDS);
    expect(response.headers['cache-control']).toBe('no-store');
    const cookie = ([] as string[]).concat(response.headers['set-cookie'] ?? []).join('\n');
    expect(cookie).toMatch(/^cp_refresh=[A-Za-z0-9_-]{43};/);
    expect(cookie).toContain('Path=/api/v1/auth');
    expect(cookie).toContain('HttpOnly');
    expect(cookie).toContain('SameSite=Strict');
    expect(cookie).not.toContain('Secure');

    const answered = MeSchema.parse((await me(session.accessToken).expect(200)).body);
    expect(answered.user.id).toBe(shop.people.technician.id);
  });

  it('answers a wrong password and an unknown address alike, and stores no password', async () => {
    const wrong = await request(test.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'owner@cedar-rotor-shop.test', password: 'not the password at all' });
    const unknown = await request(test.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'nobody@cedar-rotor-shop.test', password: 'not the password at all' });
    expect(problemOf(wrong, 401)).toEqual({ ...problemOf(unknown, 401), instance: '/api/v1/auth/sign-in' });
    expect(wrong.body.code).toBe('INVALID_CREDENTIALS');
    const dump = JSON.stringify(temporary.database.sqlite.prepare('SELECT * FROM users').all());
    expect(dump).not.toContain(TEST_PASSWORD);
    expect(dump).toMatch(/scrypt\$10\$8\$1\$/);
  });

  it('refuses a body that does not fit, naming the field, and a non-JSON body', async () => {
    const response = await request(test.app).post('/api/v1/auth/sign-in').send({ email: 'not-an-address' });
    const problem = problemOf(response, 400);
    expect(problem.errors?.map((error) => error.path).sort()).toEqual(['email', 'password']);
    await request(test.app).post('/api/v1/auth/sign-in').type('text/plain').send('x').expect(415);
  });

  it('slows down after 5 failures in a row, locks after 10, and answers unknown addresses the same', async () => {
    for (const email of ['viewer@cedar-rotor-shop.test', 'ghost@cedar-rotor-shop.test']) {
      const attempt = (password = 'a wrong password, again') =>
        request(test.app).post('/api/v1/auth/sign-in').send({ email, password });
      for (let failure = 1; failure <= 5; failure++) expect((await attempt()).status).toBe(401);

      // The 6th attempt comes too soon: refused without checking, even with the right password.
      const early = await attempt(TEST_PASSWORD);
      expect(problemOf(early, 429).code).toBe('SIGN_IN_THROTTLED');
      expect(early.headers['retry-after']).toBe('1');

      const waits = [1, 2, 4, 8, 16];
      for (const [index, seconds] of waits.entries()) {
        now = new Date(now.getTime() + seconds * 1000);
        const failed = await attempt();
        expect(failed.status).toBe(401);
        if (index < waits.length - 1) {
          expect(Number((await attempt()).headers['retry-after'])).toBe(waits[index + 1]);
        }
      }
      // The 10th failure locks the address for 15 minutes.
      const locked = await attempt(TEST_PASSWORD);
      expect(problemOf(locked, 429).code).toBe('SIGN_IN_LOCKED');
      expect(Number(locked.headers['retry-after'])).toBe(LOCK_MS / 1000);
      now = new Date(now.getTime() + LOCK_MS - 1000);
      expect((await attempt(TEST_PASSWORD)).status).toBe(429);
      now = new Date(now.getTime() + 1000);
    }
    await signIn(test.app, 'viewer@cedar-rotor-shop.test');
  });

  it('forgets old failures after an hour, and a success clears them', async () => {
    const attempt = (password: string) =>
      request(test.app)
        .post('/api/v1/auth/sign-in')
        .send({ email: 'manager@cedar-rotor-shop.test', password });
    for (let failure = 1; failure <= 4; failure++) await attempt('wrong wrong wrong').expect(401);
    now = new Date(now.getTime() + 61 * 60_000);
    for (let failure = 1; failure <= 4; failure++) await attempt('wrong wrong wrong').expect(401);
    await attempt(TEST_PASSWORD).expect(200);
    for (let failure = 1; failure <= 4; failure++) await attempt('wrong wrong wrong').expect(401);
    await attempt(TEST_PASSWORD).expect(200);
  });

  it('refuses a deactivated person who knows their password', async () => {
    temporary.database.sqlite
      .prepare("UPDATE users SET status = 'deactivated' WHERE id = ?")
      .run(shop.people.viewer.id);
    const response = await request(test.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'viewer@cedar-rotor-shop.test', password: TEST_PASSWORD });
    expect(problemOf(response, 403).code).toBe('ACCOUNT_DEACTIVATED');
  });
});

describe('access tokens', () => {
  it('expire after ten minutes', async () => {
    const { accessToken } = await signIn(test.app, 'owner@cedar-rotor-shop.test');
    now = new Date(now.getTime() + (ACCESS_TOKEN_TTL_SECONDS - 1) * 1000);
    await me(accessToken).expect(200);
    now = new Date(now.getTime() + 2000);
    const expired = await me(accessToken);
    expect(problemOf(expired, 401).code).toBe('TOKEN_EXPIRED');
    expect(expired.headers['www-authenticate']).toContain('error="invalid_token"');
  });

  it('refuse a tampered token: another role in the claims, the signature kept', async () => {
    const { accessToken } = await signIn(test.app, 'viewer@cedar-rotor-shop.test');
    const [header, payload, signature] = accessToken.split('.') as [string, string, string];
    const claims = JSON.parse(Buffer.from(payload, 'base64url').toString('utf8'));
    const forged = Buffer.from(JSON.stringify({ ...claims, role: 'owner' })).toString('base64url');
    expect(problemOf(await me(`${header}.${forged}.${signature}`), 401).code).toBe('TOKEN_INVALID');
    await request(test.app)
      .get('/api/v1/people')
      .set('Authorization', `Bearer ${header}.${forged}.${signature}`)
      .expect(401);
  });

  it('refuse an unsigned token (alg "none") and one signed with another key', async () => {
    const claims = { org: shop.id, role: 'owner' };
    const unsigned = new UnsecuredJWT(claims)
      .setSubject(String(shop.people.owner.id))
      .setIssuer('counterpoise')
      .setAudience('counterpoise-workbench')
      .setIssuedAt(Math.floor(now.getTime() / 1000))
      .setExpirationTime(Math.floor(now.getTime() / 1000) + 600)
      .encode();
    expect(unsigned.split('.')[2]).toBe('');
    expect(problemOf(await me(unsigned), 401).code).toBe('TOKEN_INVALID');

    const otherKey = await signAccessToken(
      { userId: shop.people.owner.id, organisationId: shop.id, role: 'owner' },
      randomBytes(48),
      now,
    );
    expect(problemOf(await me(otherKey), 401).code).toBe('TOKEN_INVALID');

    // The right key with another algorithm of the same family is refused too: the algorithm is pinned.
    const hs512 = await new SignJWT(claims)
      .setProtectedHeader({ alg: 'HS512' })
      .setSubject(String(shop.people.owner.id))
      .setIssuer('counterpoise')
      .setAudience('counterpoise-workbench')
      .setIssuedAt(Math.floor(now.getTime() / 1000))
      .setExpirationTime(Math.floor(now.getTime() / 1000) + 600)
      .sign(signingKey);
    expect(problemOf(await me(hs512), 401).code).toBe('TOKEN_INVALID');
  });

  it('stop working when the person is deactivated, and follow a change of role at once', async () => {
    const { accessToken } = await signIn(test.app, 'technician@cedar-rotor-shop.test');
    const owner = (await signIn(test.app, 'owner@cedar-rotor-shop.test')).accessToken;
    const patch = (body: object) =>
      request(test.app)
        .patch(`/api/v1/people/${shop.people.technician.id}`)
        .set('Authorization', `Bearer ${owner}`)
        .send(body);
    await patch({ role: 'viewer' }).expect(200);
    expect((await me(accessToken).expect(200)).body.user.role).toBe('viewer');
    await patch({ status: 'deactivated' }).expect(200);
    await me(accessToken).expect(401);
  });
});

describe('refresh tokens', () => {
  it('are replaced on every use', async () => {
    const first = (await signIn(test.app, 'developer@cedar-rotor-shop.test')).cookie;
    const renewed = await refresh(first).expect(200);
    const session = SessionSchema.parse(renewed.body);
    await me(session.accessToken).expect(200);
    const second = refreshCookieOf(renewed);
    expect(second).not.toBe(first);
    await refresh(second).expect(200);
  });

  it('revoke the whole family when a replaced one is presented again', async () => {
    const first = (await signIn(test.app, 'developer@cedar-rotor-shop.test')).cookie;
    const second = refreshCookieOf(await refresh(first).expect(200));
    // Past the grace that lets two tabs refresh at once.
    now = new Date(now.getTime() + REFRESH_GRACE_MS);
    const reused = await refresh(first);
    expect(problemOf(reused, 401).code).toBe('REFRESH_REUSED');
    expect(([] as string[]).concat(reused.headers['set-cookie'] ?? []).join()).toMatch(/cp_refresh=;/);
    // The legitimate holder's newer token is revoked with it.
    expect(problemOf(await refresh(second), 401).code).toBe('REFRESH_INVALID');
  });

  it('leave other sign-ins of the same person alone when one family is revoked', async () => {
    const tablet = (await signIn(test.app, 'developer@cedar-rotor-shop.test')).cookie;
    const laptop = (await signIn(test.app, 'developer@cedar-rotor-shop.test')).cookie;
    await refresh(tablet).expect(200);
    now = new Date(now.getTime() + REFRESH_GRACE_MS);
    await refresh(tablet).expect(401);
    await refresh(laptop).expect(200);
  });

  it('are refused once revoked by signing out, without a cookie, or when unknown', async () => {
    const { cookie } = await signIn(test.app, 'owner@cedar-rotor-shop.test');
    const out = await signOut(cookie).expect(204);
    expect(([] as string[]).concat(out.headers['set-cookie'] ?? []).join()).toMatch(
      /cp_refresh=;.*Path=\/api\/v1\/auth/,
    );
    expect(problemOf(await refresh(cookie), 401).code).toBe('REFRESH_INVALID');
    expect(problemOf(await refresh(), 401).code).toBe('REFRESH_INVALID');
    expect(problemOf(await refresh('cp_refresh=made-up'), 401).code).toBe('REFRESH_INVALID');
    // Without a cookie there is nothing to end, nor to clear.
    const none = await signOut().expect(204);
    expect(none.headers['set-cookie']).toBeUndefined();
  });

  it('expire two weeks after their last use', async () => {
    const { cookie } = await signIn(test.app, 'owner@cedar-rotor-shop.test');
    now = new Date(now.getTime() + 14 * 24 * 3_600_000);
    await refresh(cookie).expect(401);
  });
});

describe('password reset', () => {
  it('mails a single-use link that sets a new password and ends every session', async () => {
    const email = 'technician@cedar-rotor-shop.test';
    const { cookie } = await signIn(test.app, email);
    await request(test.app).post('/api/v1/auth/password-reset').send({ email }).expect(202);
    const token = await resetLinkSentTo(email);
    const [message] = test.mail.listTo(email);
    expect(message?.subject).toBe('Choose a new Counterpoise password');
    expect(message?.text).toContain('http://workbench.test:4300/reset-password?token=');

    const weak = await request(test.app)
      .post('/api/v1/auth/password-reset/confirm')
      .send({ token, password: 'passwordpassword' });
    expect(problemOf(weak, 400).errors).toEqual([
      { path: 'password', message: expect.stringMatching(/most common/) },
    ]);

    const password = 'seven lanterns on the quay';
    await request(test.app).post('/api/v1/auth/password-reset/confirm').send({ token, password }).expect(204);
    await refresh(cookie).expect(401);
    await signIn(test.app, email, password);
    const again = await request(test.app)
      .post('/api/v1/auth/password-reset/confirm')
      .send({ token, password: 'another fine long sentence' });
    expect(problemOf(again, 400).errors?.[0]?.path).toBe('token');
  });

  it('answers 202 for an unknown address and sends nothing', async () => {
    await request(test.app)
      .post('/api/v1/auth/password-reset')
      .send({ email: 'nobody@cedar-rotor-shop.test' })
      .expect(202);
    expect(test.mail.listTo('nobody@cedar-rotor-shop.test')).toEqual([]);
  });

  it('refuses a link older than an hour', async () => {
    const email = 'viewer@cedar-rotor-shop.test';
    await request(test.app).post('/api/v1/auth/password-reset').send({ email }).expect(202);
    const token = await resetLinkSentTo(email);
    now = new Date(now.getTime() + 3_600_001);
    const late = await request(test.app)
      .post('/api/v1/auth/password-reset/confirm')
      .send({ token, password: 'seven lanterns on the quay' });
    expect(problemOf(late, 400).code).toBe('LINK_INVALID');
  });
});
