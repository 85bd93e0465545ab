/*
 * The session routes against what browsers do: two tabs refreshing with one cookie at the same moment,
 * and pages of other sites that make the browser post to them.
 */
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ProblemSchema, SessionSchema } from '@counterpoise/api';
import type { Clock } from '../clock';
import {
  createTestOrganisation,
  refreshCookieOf,
  TEST_PASSWORD,
  type TestOrganisation,
} from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { REFRESH_GRACE_MS } from './auth.service';
import { GUARDED_APP_URL, type GuardedApp, guardedApp, NO_CLIENT_LIMITS } from './testing/guarded-app';

let temporary: TemporaryDatabase;
let shop: TestOrganisation;
let test: GuardedApp;
let now: Date;
const clock: Clock = { now: () => now };

beforeEach(() => {
  now = new Date('2026-05-04T08:00:00Z');
  temporary = openTemporaryDatabase();
  shop = createTestOrganisation(temporary.database, 'Larch Coupling Shop', now);
  test = guardedApp(temporary.database, { clock, clientLimits: NO_CLIENT_LIMITS });
});
afterEach(() => {
  test.close();
  temporary.dispose();
});

const EVIL = 'https://evil.example';
const signIn = async (email = shop.people.technician.email) => {
  const response = await request(test.app)
    .post('/api/v1/auth/sign-in')
    .send({ email, password: TEST_PASSWORD })
    .expect(200);
  return refreshCookieOf(response);
};
const refresh = (cookie: string) => request(test.app).post('/api/v1/auth/refresh').set('Cookie', cookie);
const me = (accessToken: string) =>
  request(test.app).get('/api/v1/me').set('Authorization', `Bearer ${accessToken}`);
const codeOf = (response: request.Response, status: number) => {
  expect(response.status, JSON.stringify(response.body)).toBe(status);
  return ProblemSchema.parse(response.body).code;
};

describe('two refreshes with one cookie', () => {
  it('at the same moment both go on, with the same new cookie and a fresh access token each', async () => {
    const cookie = await signIn();
    const [one, two] = await Promise.all([refresh(cookie), refresh(cookie)]);
    expect([one!.status, two!.status]).toEqual([200, 200]);
    const successor = refreshCookieOf(one!);
    expect(refreshCookieOf(two!)).toBe(successor);
    expect(successor).not.toBe(cookie);
    for (const answer of [one!, two!]) await me(SessionSchema.parse(answer.body).accessToken).expect(200);
    // The family lives on: the shared successor renews as usual.
    await refresh(successor).expect(200);
  });

  it('once the grace is over, a replaced token is a copy: the whole family ends', async () => {
    const cookie = await signIn();
    const successor = refreshCookieOf(await refresh(cookie).expect(200));
    now = new Date(now.getTime() + REFRESH_GRACE_MS - 1);
    expect(refreshCookieOf(await refresh(cookie).expect(200))).toBe(successor);
    now = new Date(now.getTime() + 1);
    expect(codeOf(await refresh(cookie), 401)).toBe('REFRESH_REUSED');
    expect(codeOf(await refresh(successor), 401)).toBe('REFRESH_INVALID');
  });

  it('within the grace, a replaced token whose successor was already renewed is a copy too', async () => {
    const cookie = await signIn();
    const successor = refreshCookieOf(await refresh(cookie).expect(200));
    const third = refreshCookieOf(await refresh(successor).expect(200));
    expect(codeOf(await refresh(cookie), 401)).toBe('REFRESH_REUSED');
    expect(codeOf(await refresh(third), 401)).toBe('REFRESH_INVALID');
  });
});

describe('requests made by pages of other sites', () => {
  it('are refused on every /auth route; the same origin and clients without the headers are taken', async () => {
    const signInFrom = (headers: Record<string, string>) =>
      request(test.app)
        .post('/api/v1/auth/sign-in')
        .set(headers)
        .send({ email: shop.people.viewer.email, password: TEST_PASSWORD });
    expect(codeOf(await signInFrom({ Origin: EVIL }), 403)).toBe('CROSS_SITE_REQUEST');
    expect(codeOf(await signInFrom({ 'Sec-Fetch-Site': 'cross-site' }), 403)).toBe('CROSS_SITE_REQUEST');
    expect(codeOf(await signInFrom({ 'Sec-Fetch-Site': 'same-site' }), 403)).toBe('CROSS_SITE_REQUEST');
    expect(codeOf(await signInFrom({ Origin: 'null' }), 403)).toBe('CROSS_SITE_REQUEST');
    await signInFrom({ Origin: GUARDED_APP_URL }).expect(200);
    await signInFrom({ Origin: 'http://counterpoise.lan:4300', Host: 'counterpoise.lan:4300' }).expect(200);
    await signInFrom({ 'Sec-Fetch-Site': 'same-origin', Origin: 'http://localhost:4200' }).expect(200);
    await signInFrom({}).expect(200);

    const cookie = await signIn();
    const crossRefresh = await refresh(cookie).set('Origin', EVIL);
    expect(codeOf(crossRefresh, 403)).toBe('CROSS_SITE_REQUEST');
    await refresh(cookie).expect(200);

    const crossReset = await request(test.app)
      .post('/api/v1/auth/password-reset')
      .set('Sec-Fetch-Site', 'cross-site')
      .send({ email: shop.people.viewer.email });
    expect(codeOf(crossReset, 403)).toBe('CROSS_SITE_REQUEST');
    const crossConfirm = await request(test.app)
      .post('/api/v1/auth/password-reset/confirm')
      .set('Origin', EVIL)
      .send({ token: 'A'.repeat(43), password: 'seven lanterns on the quay' });
    expect(codeOf(crossConfirm, 403)).toBe('CROSS_SITE_REQUEST');
    const crossAccept = await request(test.app)
      .post(`/api/v1/invitations/${'A'.repeat(43)}/accept`)
      .set('Origin', EVIL)
      .send({ name: 'Someone', password: 'seven lanterns on the quay' });
    expect(codeOf(crossAccept, 403)).toBe('CROSS_SITE_REQUEST');
    await test.background.settled();
    expect(test.mailer.sent).toEqual([]);
  });
});

describe('POST /api/v1/auth/sign-out', () => {
  const signOut = (cookie: string) => request(test.app).post('/api/v1/auth/sign-out').set('Cookie', cookie);

  it('refuses a form posted by a page of another site, and the session lives on', async () => {
    const cookie = await signIn();
    const forged = await signOut(cookie)
      .set('Origin', EVIL)
      .type('application/x-www-form-urlencoded')
      .send('anything=1');
    expect(codeOf(forged, 403)).toBe('CROSS_SITE_REQUEST');
    expect(forged.headers['set-cookie']).toBeUndefined();
    await refresh(cookie).expect(200);
  });

  it('takes only what a page of this server sends: no body or JSON, with its Origin or Sec-Fetch-Site', async () => {
    const cookie = await signIn();
    // Without Origin nor Sec-Fetch-Site, no page is known to have sent it (curl, a script).
    expect(codeOf(await signOut(cookie), 403)).toBe('CROSS_SITE_REQUEST');
    // A form of this very origin is no way the workbench signs out.
    const form = await signOut(cookie)
      .set('Origin', GUARDED_APP_URL)
      .type('application/x-www-form-urlencoded')
      .send('anything=1');
    expect(form.status).toBe(415);
    const textPlain = await signOut(cookie).set('Origin', GUARDED_APP_URL).type('text/plain').send('x');
    expect(textPlain.status).toBe(415);
    const cookieNow = refreshCookieOf(await refresh(cookie).expect(200));

    // What the workbench sends: a POST without a body, from its own page.
    const out = await signOut(cookieNow).set('Sec-Fetch-Site', 'same-origin').set('Origin', GUARDED_APP_URL);
    expect(out.status).toBe(204);
    expect(([] as string[]).concat(out.headers['set-cookie'] ?? []).join()).toMatch(/cp_refresh=;/);
    expect(codeOf(await refresh(cookieNow), 401)).toBe('REFRESH_INVALID');

    const json = await signIn();
    await signOut(json).set('Origin', GUARDED_APP_URL).send({}).expect(204);
    expect(codeOf(await refresh(json), 401)).toBe('REFRESH_INVALID');
  });

  it('clears the cookie only when one was sent', async () => {
    const out = await request(test.app).post('/api/v1/auth/sign-out').set('Origin', GUARDED_APP_URL);
    expect(out.status).toBe(204);
    expect(out.headers['set-cookie']).toBeUndefined();
  });
});
