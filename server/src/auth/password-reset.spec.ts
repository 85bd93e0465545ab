/*
 * Asking for a reset link as an attacker would: to learn which addresses exist, to flood a mailbox with
 * links, and to keep an old link alive after a newer one or a completed reset.
 */
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ProblemSchema } from '@counterpoise/api';
import type { Clock } from '../clock';
import type { OutgoingMail } from '../mail/mailer';
import { createTestOrganisation, type TestOrganisation } from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { AccountsRepo } from '../accounts/accounts.repo';
import { PASSWORD_RESET_MAIL_INTERVAL_MS, PASSWORD_RESET_TTL_MS } from './auth.service';
import { type GuardedApp, guardedApp, MemoryMailer, NO_CLIENT_LIMITS } from './testing/guarded-app';
import { generateSecret } from './tokens';

let temporary: TemporaryDatabase;
let shop: TestOrganisation;
let test: GuardedApp;
let now: Date;
const clock: Clock = { now: () => now };

beforeEach(() => {
  now = new Date('2026-05-04T08:00:00Z');
  temporary = openTemporaryDatabase();
  shop = createTestOrganisation(temporary.database, 'Rowan Impeller Depot', now);
});
afterEach(() => {
  test.close();
  temporary.dispose();
});

const askForLink = (email: string) => request(test.app).post('/api/v1/auth/password-reset').send({ email });
const choosePassword = (token: string, password = 'seven lanterns on the quay') =>
  request(test.app).post('/api/v1/auth/password-reset/confirm').send({ token, password });
const liveLinks = (userId: number) =>
  temporary.database.sqlite
    .prepare('SELECT count(*) FROM password_resets WHERE user_id = ? AND used_at IS NULL AND expires_at > ?')
    .pluck()
    .get(userId, now.getTime());

/** What an answer shows a client: its status, body and headers, less those that change every time. */
const visible = (response: request.Response) => {
  const headers: Record<string, unknown> = { ...response.headers };
  for (const name of ['date', 'ratelimit-remaining', 'ratelimit-reset']) delete headers[name];
  return { status: response.status, body: response.body as unknown, text: response.text, headers };
};

describe('POST /api/v1/auth/password-reset', () => {
  it('answers a known and an unknown address alike, at once, without waiting for the e-mail', async () => {
    // A mail server that never answers: the request must not wait for it.
    const mailer = new MemoryMailer(true);
    test = guardedApp(temporary.database, { clock, clientLimits: NO_CLIENT_LIMITS, mailer });
    const known = await askForLink(shop.people.technician.email);
    const unknown = await askForLink('nobody@rowan-impeller.test');
    expect(known.status).toBe(202);
    expect(visible(known)).toEqual(visible(unknown));

    // The e-mail is still on its way to the known address, and to it alone.
    await vi.waitFor(() =>
      expect(mailer.sent.map((mail) => mail.to)).toEqual([shop.people.technician.email]),
    );
  });

  it('issues one link and sends one e-mail for 50 requests at once for one address', async () => {
    test = guardedApp(temporary.database, { clock, clientLimits: NO_CLIENT_LIMITS });
    const email = shop.people.viewer.email;
    const answers = await Promise.all(Array.from({ length: 50 }, () => askForLink(email)));
    expect(new Set(answers.map((answer) => answer.status))).toEqual(new Set([202]));
    await test.background.settled();
    expect(test.mailer.sent).toHaveLength(1);
    expect(liveLinks(shop.people.viewer.id)).toBe(1);

    // Within the interval, more requests send nothing; after it, the next one does.
    now = new Date(now.getTime() + PASSWORD_RESET_MAIL_INTERVAL_MS - 1000);
    await askForLink(email).expect(202);
    await test.background.settled();
    expect(test.mailer.sent).toHaveLength(1);
    now = new Date(now.getTime() + 1000);
    await askForLink(email).expect(202);
    await test.background.settled();
    expect(test.mailer.sent).toHaveLength(2);
    expect(liveLinks(shop.people.viewer.id)).toBe(1);
  });

  it('logs an e-mail that could not be sent, and lets the next request send another', async () => {
    let failing = true;
    const mailer = new MemoryMailer();
    const send = mailer.send.bind(mailer);
    mailer.send = (mail: OutgoingMail) => (failing ? Promise.reject(new Error('refused')) : send(mail));
    test = guardedApp(temporary.database, { clock, clientLimits: NO_CLIENT_LIMITS, mailer });
    const email = shop.people.manager.email;

    await askForLink(email).expect(202);
    await test.background.settled();
    expect(test.logged).toEqual(['A password-reset e-mail could not be sent.']);
    expect(liveLinks(shop.people.manager.id)).toBe(0);

    failing = false;
    await askForLink(email).expect(202);
    await test.background.settled();
    expect(mailer.sent.map((mail) => mail.to)).toEqual([email]);
    await choosePassword(mailer.resetTokenTo(email)).expect(204);
  });
});

describe('older reset links', () => {
  it('stop working once a newer link is issued', async () => {
    test = guardedApp(temporary.database, { clock, clientLimits: NO_CLIENT_LIMITS });
    const email = shop.people.developer.email;
    await askForLink(email).expect(202);
    await test.background.settled();
    const older = test.mailer.resetTokenTo(email);

    now = new Date(now.getTime() + PASSWORD_RESET_MAIL_INTERVAL_MS);
    await askForLink(email).expect(202);
    await test.background.settled();
    const newer = test.mailer.resetTokenTo(email);
    expect(newer).not.toBe(older);

    const refused = await choosePassword(older);
    expect(refused.status).toBe(400);
    expect(ProblemSchema.parse(refused.body).code).toBe('LINK_INVALID');
    await choosePassword(newer).expect(204);
  });

  it('stop working once a reset is completed with another', async () => {
    test = guardedApp(temporary.database, { clock, clientLimits: NO_CLIENT_LIMITS });
    // Two links open at once, as the links issued before newer ones ended older ones left them.
    const repo = new AccountsRepo(temporary.database.orm);
    const [first, second] = [generateSecret(), generateSecret()];
    for (const { hash } of [first, second]) {
      repo.insertPasswordReset({
        userId: shop.people.owner.id,
        tokenHash: hash,
        createdAt: now,
        expiresAt: new Date(now.getTime() + PASSWORD_RESET_TTL_MS),
      });
    }
    await choosePassword(first.secret).expect(204);
    const refused = await choosePassword(second.secret, 'another fine long sentence');
    expect(refused.status).toBe(400);
    expect(ProblemSchema.parse(refused.body).errors?.[0]?.path).toBe('token');
    expect(liveLinks(shop.people.owner.id)).toBe(0);
  });
});
