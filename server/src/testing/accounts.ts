import { randomBytes } from 'node:crypto';
import type { Express } from 'express';
import request from 'supertest';
import { ROLES, type Role } from '@counterpoise/api';
import { createApp } from '../app';
import { AccountsRepo, type UserRecord } from '../auth/accounts.repo';
import { hashPasswordSync } from '../auth/passwords';
import type { Clock } from '../clock';
import type { Database } from '../db/database';
import { smtpMailer } from '../mail/mailer';
import { MailRepo } from '../mail/mail.repo';
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

/** An app over a database, with a local SMTP capture server that the app's mail goes to. */
export interface AccountsTestApp {
  readonly app: Express;
  readonly capture: SmtpCapture;
  readonly usageLog: UsageLog;
  readonly mail: MailRepo;
  close(): Promise<void>;
}

/** Builds the app as main.ts does, with a fast password hash and a local mail server on a free port. */
export async function startAccountsTestApp(
  database: Database,
  options: { clock?: Clock; signingKey?: Uint8Array; userCalcLimitPerMinute?: number } = {},
): Promise<AccountsTestApp> {
  const clock = options.clock ?? { now: () => new Date() };
  const capture = await startSmtpCapture({ database, clock, port: 0, log: () => undefined });
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
      mailer: smtpMailer({ from: 'Counterpoise <no-reply@counterpoise.test>', localPort: capture.port }),
      ...(options.userCalcLimitPerMinute === undefined
        ? {}
        : { userCalcLimitPerMinute: options.userCalcLimitPerMinute }),
    },
  });
  return {
    app,
    capture,
    usageLog,
    mail: new MailRepo(database.orm),
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

/** The token of the first link to `path` in the newest message to `address`. */
export function linkTokenIn(mail: MailRepo, address: string, path: string): string {
  const [message] = mail.listTo(address);
  if (!message) throw new Error(`No message to ${address} was captured.`);
  const match = new RegExp(`${path}\\?token=([A-Za-z0-9_-]+)`).exec(message.text);
  if (!match?.[1]) throw new Error(`The message to ${address} has no ${path} link:\n${message.text}`);
  return match[1];
}
