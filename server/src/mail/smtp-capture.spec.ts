import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { connect } from 'node:net';
import nodemailer from 'nodemailer';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { MASKED_SECRET, OutboxSchema } from '@counterpoise/api';
import { mailAttachments, mailMessages } from '../db/schema';
import {
  createTestOrganisation,
  signIn,
  startAccountsTestApp,
  type TestOrganisation,
} from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { composeMail, smtpMailer } from './mailer';
import { MAX_MESSAGE_BYTES, type SmtpCapture, startSmtpCapture } from './smtp-capture';

let temporary: TemporaryDatabase;
let capture: SmtpCapture;
let shop: TestOrganisation;
beforeEach(async () => {
  temporary = openTemporaryDatabase();
  shop = createTestOrganisation(temporary.database, 'Alder Shop');
  capture = await startSmtpCapture({
    database: temporary.database,
    clock: { now: () => new Date('2026-05-04T08:00:00Z') },
    port: 0,
    log: () => undefined,
  });
});
afterEach(async () => {
  await capture.close();
  temporary.dispose();
});

const stored = () => temporary.database.orm.select().from(mailMessages).all();

/** A client as another program on the machine would write it: nodemailer straight at the port. */
function rawTransport(auth?: { user: string; pass: string }, authMethod?: 'PLAIN' | 'LOGIN') {
  return nodemailer.createTransport({
    host: '127.0.0.1',
    port: capture.port,
    secure: false,
    ignoreTLS: true,
    ...(auth ? { auth } : {}),
    ...(authMethod ? { authMethod } : {}),
  });
}

/** What another local user would slip into the shop's Outbox if the server took it. */
const message = () => ({
  from: 'Someone <someone@elsewhere.test>',
  to: 'owner@alder-shop.test',
  subject: 'Your account needs attention',
  text: 'Sign in again at http://elsewhere.test/sign-in',
  headers: { 'X-Counterpoise-Organisation': String(shop.id) },
});

describe('the local mail server', () => {
  it('refuses mail from a client without its credentials, or with wrong ones, and stores nothing', async () => {
    const attempts = await Promise.allSettled([
      rawTransport().sendMail(message()),
      rawTransport().sendMail(message()),
      rawTransport({ user: capture.credentials.user, pass: 'guessed' }).sendMail(message()),
      rawTransport({ user: 'counterpoise', pass: capture.credentials.pass }).sendMail(message()),
      rawTransport({ user: capture.credentials.user, pass: 'guessed' }, 'LOGIN').sendMail(message()),
    ]);
    const codes = attempts.map((attempt) =>
      attempt.status === 'rejected' ? (attempt.reason as { responseCode?: number }).responseCode : 'sent',
    );
    expect(codes).toEqual([530, 530, 535, 535, 535]);
    expect(stored()).toEqual([]);
  });

  it.each(['PLAIN', 'LOGIN'] as const)('takes mail authenticated with AUTH %s', async (method) => {
    await rawTransport(capture.credentials, method).sendMail(message());
    expect(stored()).toMatchObject([
      { organisationId: shop.id, to: '["owner@alder-shop.test"]', subject: message().subject },
    ]);
  });

  it('keeps the files a message carries, and refuses a message over its size limit whole', async () => {
    const pdf = Buffer.concat([Buffer.from('%PDF-1.7\n'), randomBytes(2048)]);
    await rawTransport(capture.credentials).sendMail({
      ...message(),
      attachments: [{ filename: 'report-J-000007-r1.pdf', contentType: 'application/pdf', content: pdf }],
    });
    const [row] = stored();
    const files = temporary.database.orm.select().from(mailAttachments).all();
    expect(files).toEqual([
      {
        id: expect.any(Number),
        messageId: row!.id,
        filename: 'report-J-000007-r1.pdf',
        contentType: 'application/pdf',
        byteSize: pdf.length,
        content: pdf,
      },
    ]);
    const tooLarge = await rawTransport(capture.credentials)
      .sendMail({
        ...message(),
        attachments: [{ filename: 'huge.bin', content: randomBytes(MAX_MESSAGE_BYTES) }],
      })
      .then(
        () => 'sent',
        (error: { responseCode?: number }) => error.responseCode,
      );
    expect(tooLarge).toBe(552);
    expect(stored()).toHaveLength(1);
    expect(temporary.database.orm.select().from(mailAttachments).all()).toHaveLength(1);
  });

  it('draws new credentials at each start', async () => {
    const other = await startSmtpCapture({
      database: temporary.database,
      clock: { now: () => new Date() },
      port: 0,
    });
    try {
      expect(other.credentials.user).not.toBe(capture.credentials.user);
      expect(other.credentials.pass).not.toBe(capture.credentials.pass);
      expect(capture.credentials.pass.length).toBeGreaterThanOrEqual(43);
    } finally {
      await other.close();
    }
  });

  it('listens on 127.0.0.1 alone', async () => {
    const reached = (host: string) =>
      new Promise<boolean>((resolve) => {
        const socket = connect({ host, port: capture.port }, () => {
          socket.destroy();
          resolve(true);
        });
        socket.on('error', () => resolve(false));
      });
    expect(await reached('127.0.0.1')).toBe(true);
    // On Linux the whole of 127/8 is the loopback: a server bound to every address would answer here.
    expect(await reached('127.0.0.2')).toBe(false);
  });

  it('keeps no link that works: the token is masked, the HTML is dropped, the file holds neither', async () => {
    const token = randomBytes(32).toString('base64url');
    const url = `http://workbench.test:4300/reset-password?token=${token}`;
    await smtpMailer({
      from: 'Counterpoise <no-reply@counterpoise.test>',
      localPort: capture.port,
      auth: capture.credentials,
    }).send({
      organisationId: shop.id,
      to: 'Owner@Alder-Shop.test',
      subject: 'Choose a new Counterpoise password',
      ...composeMail(['Someone asked for a new password.'], { label: 'Choose a new password', url }),
    });

    const [row] = stored();
    expect(row).toMatchObject({
      organisationId: shop.id,
      from: '"Counterpoise" <no-reply@counterpoise.test>',
      to: '["owner@alder-shop.test"]',
      subject: 'Choose a new Counterpoise password',
      text:
        'Someone asked for a new password.\n\nChoose a new password: ' +
        `http://workbench.test:4300/reset-password?token=${MASKED_SECRET}\n`,
      html: null,
      receivedAt: new Date('2026-05-04T08:00:00Z'),
    });
    temporary.database.sqlite.pragma('wal_checkpoint(TRUNCATE)');
    expect(readFileSync(temporary.path).includes(token)).toBe(false);
  });
});

describe('GET /api/v1/outbox', () => {
  it('shows the owner that the invitation went out, its link masked, while the invitee gets a working one', async () => {
    const test = await startAccountsTestApp(temporary.database);
    try {
      const { accessToken } = await signIn(test.app, shop.people.owner.email);
      await request(test.app)
        .post('/api/v1/people/invitations')
        .set('Authorization', `Bearer ${accessToken}`)
        .send({ email: 'new.hand@alder-shop.test', role: 'viewer' })
        .expect(201);

      const [sent] = test.mail.listTo('new.hand@alder-shop.test');
      const token = /accept-invitation\?token=([\w-]+)/.exec(sent!.text)![1]!;
      await request(test.app).get(`/api/v1/invitations/${token}`).expect(200);

      const outbox = OutboxSchema.parse(
        (
          await request(test.app)
            .get('/api/v1/outbox')
            .set('Authorization', `Bearer ${accessToken}`)
            .expect(200)
        ).body,
      );
      expect(outbox.messages).toHaveLength(1);
      const [shown] = outbox.messages;
      expect(shown).toMatchObject({ to: ['new.hand@alder-shop.test'], subject: sent!.subject, html: null });
      expect(shown!.text).toBe(sent!.text.replace(token, MASKED_SECRET));
      expect(JSON.stringify(outbox)).not.toContain(token);
    } finally {
      await test.close();
    }
  });
});
