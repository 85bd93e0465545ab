import { randomBytes } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { dirname } from 'node:path';
import { createApp } from '../../../server/src/app';
import { DEMO_SEEDERS } from '../../../server/src/db/demo-seeders';
import { seedDemoData } from '../../../server/src/db/seed';
import { smtpMailer } from '../../../server/src/mail/mailer';
import { startSmtpCapture } from '../../../server/src/mail/smtp-capture';
import { recordingMailer, SentMail, TEST_MAIL_FROM } from '../../../server/src/testing/accounts';
import { openTemporaryDatabase } from '../../../server/src/testing/temporary-database';
import { UsageLog } from '../../../server/src/usage/usage-log';
import { WORKBENCH_DIR } from './server';

/** The server of the accounts browser test, and the mail it sent as its recipients would get it. */
export interface AccountsServer {
  readonly url: string;
  /**
   * Every message the server sent, whole: the local mail server (and so the Outbox) keeps each one
   * with its links masked, so the test follows a link from here, as the recipient would from their
   * mailbox.
   */
  readonly sentMail: SentMail;
  stop(): Promise<void>;
}

/**
 * Starts the real server over a fresh database with the demo data, with its local mail server (and its
 * credentials) on a free port, as `npm start` does without `SMTP_URL`.
 */
export async function startAccountsServer(): Promise<AccountsServer> {
  const temporary = openTemporaryDatabase();
  await seedDemoData(temporary.database, new Date(), DEMO_SEEDERS, { dataDir: dirname(temporary.path) });
  const capture = await startSmtpCapture({
    database: temporary.database,
    clock: { now: () => new Date() },
    port: 0,
  });
  const sentMail = new SentMail(TEST_MAIL_FROM);
  const usageLog = new UsageLog(temporary.database);
  // Listening first, so that the links in the e-mails can name the server's own address.
  const server: Server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const app = createApp({
    database: temporary.database,
    staticDir: WORKBENCH_DIR,
    usageLog,
    log: () => undefined,
    accounts: {
      signingKey: randomBytes(48),
      publicUrl: url,
      mailer: recordingMailer(
        smtpMailer({ from: TEST_MAIL_FROM, localPort: capture.port, auth: capture.credentials }),
        sentMail,
      ),
    },
  });
  server.on('request', app);
  return {
    url,
    sentMail,
    stop: async () => {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await capture.close();
      usageLog.close();
      temporary.dispose();
    },
  };
}
