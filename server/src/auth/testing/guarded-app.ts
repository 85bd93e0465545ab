import { randomBytes } from 'node:crypto';
import type { Express } from 'express';
import { createApp } from '../../app';
import type { Clock } from '../../clock';
import type { Database } from '../../db/database';
import type { Mailer, OutgoingMail } from '../../mail/mailer';
import { TEST_HASH_COST } from '../../testing/accounts';
import { UsageLog } from '../../usage/usage-log';
import { BackgroundWork } from '../background-work';
import type { ClientLimits } from '../client-limits';
import type { HashGate } from '../hash-gate';

/** The workbench's address in these tests: the links of the e-mails and the server's own origin. */
export const GUARDED_APP_URL = 'http://workbench.test:4300';

/** A mailer that keeps what it is asked to send, in order; `hold` makes every send wait forever. */
export class MemoryMailer implements Mailer {
  readonly sent: OutgoingMail[] = [];

  constructor(private readonly hold = false) {}

  send(mail: OutgoingMail): Promise<void> {
    this.sent.push(mail);
    return this.hold ? new Promise<void>(() => undefined) : Promise.resolve();
  }

  /** The token of the `/reset-password` link in the newest message to `address`. */
  resetTokenTo(address: string): string {
    const message = this.sent.filter((mail) => mail.to === address).at(-1);
    const token = message && /\/reset-password\?token=([A-Za-z0-9_-]+)/.exec(message.text)?.[1];
    if (!token) throw new Error(`No reset link was sent to ${address}.`);
    return token;
  }
}

/** An app whose accounts protections the test sets, and a handle on its after-the-answer work. */
export interface GuardedApp {
  readonly app: Express;
  readonly mailer: MemoryMailer;
  /** Resolves once every reset e-mail under way has been dealt with. */
  readonly background: BackgroundWork;
  /** What the app logged (failures of the background work among them). */
  readonly logged: string[];
  /** Stops the app's usage log; the database is the test's to dispose of. */
  close(): void;
}

/**
 * Builds the real app over `database` with a fast password hash, an in-memory mailer and the given
 * limits, so that a test can reach them in a few requests, or lift them out of its way.
 */
export function guardedApp(
  database: Database,
  options: {
    clock: Clock;
    clientLimits?: Partial<ClientLimits>;
    hashGate?: HashGate;
    mailer?: MemoryMailer;
  },
): GuardedApp {
  const logged: string[] = [];
  const log = (message: string) => void logged.push(message);
  const background = new BackgroundWork(log);
  const mailer = options.mailer ?? new MemoryMailer();
  const usageLog = new UsageLog(database, { log });
  const app = createApp({
    database,
    clock: options.clock,
    usageLog,
    log,
    accounts: {
      signingKey: randomBytes(48),
      passwordHashCost: TEST_HASH_COST,
      publicUrl: GUARDED_APP_URL,
      mailer,
      background,
      ...(options.clientLimits ? { clientLimits: options.clientLimits } : {}),
      ...(options.hashGate ? { hashGate: options.hashGate } : {}),
    },
  });
  return { app, mailer, background, logged, close: () => usageLog.close() };
}

/** Limits high enough that a test of something else never meets them. */
export const NO_CLIENT_LIMITS: ClientLimits = {
  signIn: { limit: 1_000_000, windowMs: 60_000 },
  passwordReset: { limit: 1_000_000, windowMs: 60_000 },
  passwordResetConfirm: { limit: 1_000_000, windowMs: 60_000 },
  invitationAccept: { limit: 1_000_000, windowMs: 60_000 },
};
