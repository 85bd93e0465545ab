import { randomBytes } from 'node:crypto';
import type { Express } from 'express';
import request from 'supertest';
import { ROLES, type Role } from '@counterpoise/api';
import { createApp } from '../app';
import { AccountsRepo, type UserRecord } from '../accounts/accounts.repo';
import { hashPasswordSync } from '../auth/passwords';
import type { Clock } from '../clock';
import type { Database } from '../db/database';
import { type Mailer, type OutgoingMail, smtpMailer } from '../mail/mailer';
import { type SmtpCapture, startSmtpCapture } from '../mail/smtp-capture';
import { UsageLog } from '../usage/usage-log';

/** scrypt's lowest cost the server takes: enough to exercise hashing, fast enough for many sign-ins. */
export const TEST_HASH_COST = 10;

/** The password of every test person. */
export const TEST_PASSWORD = 'a ladder of copper gears';

/** One organisation with one person per role. */
export interface TestOrganisation {
  readonly id: number;
  readonly name: string;
  readonly people: Record<Role, UserRecord>;
}

/** Creates an organisation and one active person per role (`<role>@<slug>.test`). */
export function createTestOrganisation(database: Database, name: string, now = new Date()): TestOrganisation {
  const repo = new AccountsRepo(database.orm);
  const organisation = repo.insertOrganisation(name, now);
  const slug = name.toLowerCase().replace(/[^a-z0-9]+/g, '-');
  const passwordHash = hashPasswordSync(TEST_PASSWORD, { log2N: TEST_HASH_COST });
  const people = Object.fromEntries(
    ROLES.map((role) => [
      role,
      repo.insertUser({
        organisationId: organisation.id,
        email: `${role}@${slug}.test`,
        name: `${name} ${role}`,
        role,
        passwordHash,
        createdAt: now,
      }),
    ]),
  ) as Record<Role, UserRecord>;
  return { ...organisation, people };
}

/** A message a test app sent, whole, as its recipient's mailbox would have it: its links work. */
export interface SentMessage {
  /** The order of sending, from 1. */
  readonly id: number;
  readonly organisationId: number;
  readonly from: string;
  readonly to: string[];
  readonly subject: string;
  readonly text: string;
  readonly html: string;
  readonly receivedAt: Date;
}

/**
 * The mail a test app sent, kept in the test's memory: the local mail server keeps only a masked copy
 * (no link in it works), so a test follows a link the way its recipient would, from the message itself.
 */
export class SentMail {
  private readonly messages: SentMessage[] = [];

  constructor(
    private readonly from: string,
    private readonly clock: Clock = { now: () => new Date() },
  ) {}

  /** Keeps a message that the mail server accepted. */
  record(mail: OutgoingMail): void {
    this.messages.push({
      id: this.messages.length + 1,
      organisationId: mail.organisationId,
      from: this.from,
      to: [mail.to.toLowerCase()],
      subject: mail.subject,
      text: mail.text,
      html: mail.html,
      receivedAt: this.clock.now(),
    });
  }

  /** Every message to an address (of one organisation when given), newest first. */
  listTo(address: string, organisationId?: number): SentMessage[] {
    return this.messages
      .filter(
        (message) =>
          message.to.includes(address.toLowerCase()) &&
          (organisationId === undefined || message.organisationId === organisationId),
      )
      .reverse();
  }
}

/**
 * A mailer that sends through `mailer` and, once the server has accepted a message, keeps it whole in
 * `sent`: the real SMTP path still runs and stores its masked copy for the Outbox.
 */
export function recordingMailer(mailer: Mailer, sent: SentMail): Mailer {
  return {
    async send(mail) {
      await mailer.send(mail);
      sent.record(mail);
    },
  };
}

/** The sender of every test app's mail. */
export const TEST_MAIL_FROM = 'Counterpoise <no-reply@counterpoise.test>';

/** An app over a database, with a local SMTP capture server that the app's mail goes to. */
export interface AccountsTestApp {
  readonly app: Express;
  readonly capture: SmtpCapture;
  readonly usageLog: UsageLog;
  /** What the app sent, whole (the capture server's store holds masked copies only). */
  readonly mail: SentMail;
  close(): Promise<void>;
}

/**
 * Builds the app as main.ts does, with a fast password hash and a local mail server on a free port; the
 * messages it sends are also kept whole in `mail`, for the test to follow their links.
 */
export async function startAccountsTestApp(
  database: Database,
  options: { clock?: Clock; signingKey?: Uint8Array; userCalcLimitPerMinute?: number } = {},
): Promise<AccountsTestApp> {
  const clock = options.clock ?? { now: () => new Date() };
  const capture = await startSmtpCapture({ database, clock, port: 0, log: () => undefined });
  const mail = new SentMail(TEST_MAIL_FROM, clock);
  const usageLog = new UsageLog(database, { log: () => undefined });
  const app = createApp({
    database,
    clock,
    usageLog,
    log: () => undefined,
    accounts: {
      signingKey: options.signingKey ?? randomBytes(48),
      passwordHashCost: TEST_HASH_COST,
      publicUrl: 'http://workbench.test:4300',
      mailer: recordingMailer(
        smtpMailer({ from: TEST_MAIL_FROM, localPort: capture.port, auth: capture.credentials }),
        mail,
      ),
      ...(options.userCalcLimitPerMinute === undefined
        ? {}
        : { userCalcLimitPerMinute: options.userCalcLimitPerMinute }),
    },
  });
  return {
    app,
    capture,
    usageLog,
    mail,
    close: async () => {
      usageLog.close();
      await capture.close();
    },
  };
}

/** Signs in and returns the access token and the refresh cookie as sent back (`cp_refresh=…`). */
export async function signIn(
  app: Express,
  email: string,
  password = TEST_PASSWORD,
): Promise<{ accessToken: string; cookie: string }> {
  const response = await request(app).post('/api/v1/auth/sign-in').send({ email, password });
  if (response.status !== 200) {
    throw new Error(`Sign-in of ${email} answered ${response.status}: ${JSON.stringify(response.body)}`);
  }
  return { accessToken: response.body.accessToken as string, cookie: refreshCookieOf(response) };
}

/** The `cp_refresh=<token>` pair of a response's Set-Cookie, ready for a Cookie header. */
export function refreshCookieOf(response: request.Response): string {
  const cookies = ([] as string[]).concat(response.headers['set-cookie'] ?? []);
  const cookie = cookies.find((line) => line.startsWith('cp_refresh='));
  if (!cookie) throw new Error('The answer set no refresh cookie.');
  return cookie.split(';')[0]!;
}

/** The token of the first link to `path` in the newest message the test app sent to `address`. */
export function linkTokenIn(mail: SentMail, address: string, path: string): string {
  const [message] = mail.listTo(address);
  if (!message) throw new Error(`No message to ${address} was sent.`);
  const match = new RegExp(`${path}\\?token=([A-Za-z0-9_-]+)`).exec(message.text);
  if (!match?.[1]) throw new Error(`The message to ${address} has no ${path} link:\n${message.text}`);
  return match[1];
}
