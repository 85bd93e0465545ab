import { existsSync } from 'node:fs';
import type { IncomingMessage, ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { dirname, join } from 'node:path';
import { eq } from 'drizzle-orm';
import { createApp } from './app';
import { systemClock } from './clock';
import { ConfigError, demoDataNotice, loadConfig } from './config';
import { migrateDatabase, openDatabase } from './db/database';
import { appMeta } from './db/schema';
import { DEMO_SEEDED_KEY, seedDemoData } from './db/seed';
import { DEMO_SEEDERS } from './db/demo-seeders';
import { DEMO_API_KEY_FILE } from './keys/keys.seed';
import { DEMO_PASSWORD, DEMO_PEOPLE } from './auth/accounts.seed';
import { BackgroundWork } from './auth/background-work';
import { loadSigningKey } from './auth/tokens';
import { type Mailer, smtpMailer } from './mail/mailer';
import { type SmtpCapture, startSmtpCapture } from './mail/smtp-capture';
import { UsageLog } from './usage/usage-log';
import { VERSION } from './version';

/**
 * Starts the server: reads the configuration, migrates the SQLite file, seeds the demo data once,
 * starts the local mail server (unless `SMTP_URL` names a real one), listens, and on SIGINT or SIGTERM
 * stops taking requests, lets those under way finish, writes the usage rows still queued, stops the
 * mail server and closes the database.
 */
async function main(): Promise<void> {
  const config = loadConfig();
  const database = openDatabase(config.DATABASE_URL);
  const migrations = migrateDatabase(database);
  const dataDir = dirname(config.DATABASE_URL);
  const seed = config.SEED_DEMO
    ? await seedDemoData(database, systemClock.now(), DEMO_SEEDERS, {
        dataDir,
        uploadsDir: config.UPLOADS_DIR,
      })
    : { seeded: false };
  const demoData = demoDataNotice(
    config,
    seed.seeded ||
      database.orm.select().from(appMeta).where(eq(appMeta.key, DEMO_SEEDED_KEY)).get() !== undefined,
  );
  // Where the demo key is, never the key itself: logs travel further than the data folder.
  const demoKeyFile = join(dataDir, DEMO_API_KEY_FILE);

  let capture: SmtpCapture | undefined;
  let mailer: Mailer;
  if (config.SMTP_URL) {
    mailer = smtpMailer({ from: config.MAIL_FROM, url: config.SMTP_URL });
  } else {
    capture = await startSmtpCapture({ database, clock: systemClock, port: config.SMTP_FAKE_PORT });
    mailer = smtpMailer({ from: config.MAIL_FROM, localPort: capture.port, auth: capture.credentials });
  }

  // The rows are written in a thread of their own, so that a burst of requests never waits on SQLite.
  const usageLog = new UsageLog(database, { inWorker: true });
  // Work that routes start after answering (reset e-mails), awaited at shutdown before the database closes.
  const background = new BackgroundWork((message, error) => console.error(message, error));
  const app = createApp({
    database,
    clock: systemClock,
    version: VERSION,
    staticDir: config.STATIC_DIR,
    docsDir: config.DOCS_DIR,
    uploadsDir: config.UPLOADS_DIR,
    usageLog,
    corsOrigins: config.CORS_ORIGINS,
    // Behind HTTPS (the cookie is Secure), browsers are told to keep to HTTPS too.
    secureTransport: config.COOKIE_SECURE,
    trustProxy: config.TRUST_PROXY,
    accounts: {
      signingKey: loadSigningKey(config.AUTH_SIGNING_KEY, dataDir),
      passwordHashCost: config.PASSWORD_HASH_COST,
      secureCookie: config.COOKIE_SECURE,
      publicUrl: config.PUBLIC_URL,
      mailer,
      background,
      defaultKeyLimitPerMinute: config.API_KEY_DEFAULT_LIMIT,
      userCalcLimitPerMinute: config.USER_CALC_LIMIT,
    },
  });
  const server = app.listen(config.PORT, config.HOST, () => {
    const { port } = server.address() as AddressInfo;
    const host = config.HOST === '0.0.0.0' || config.HOST === '::' ? 'localhost' : config.HOST;
    console.log(
      [
        `Counterpoise ${VERSION} is running at http://${host}:${port}`,
        `  API reference: http://${host}:${port}/api/docs`,
        `  Database:      ${config.DATABASE_URL} (${migrations} migrations applied${seed.seeded ? ', demo data seeded' : ''})`,
        `  Demo data:     ${demoData.status}`,
        ...(existsSync(demoKeyFile) ? [`  Demo API key:  in ${demoKeyFile}`] : []),
        capture
          ? `  E-mail:        not delivered: the local mail server on 127.0.0.1:${capture.port} keeps a copy with its links masked for the Outbox; set SMTP_URL to deliver it`
          : `  E-mail:        sent through SMTP_URL`,
        ...(config.SEED_DEMO
          ? [
              `  Demo sign-ins (password "${DEMO_PASSWORD}"), unless changed since:`,
              ...DEMO_PEOPLE.map((person) => `    ${person.role.padEnd(11)} ${person.email}`),
            ]
          : []),
      ].join('\n'),
    );
    if (demoData.warning) console.warn(`\n${demoData.warning}\n`);
  });

  let stopping = false;
  const stop = (signal: NodeJS.Signals) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal} received: finishing the requests under way, then stopping.`);
    // A client that keeps its connection busy would otherwise be served on it for as long as it sends:
    // every answer from now on closes its connection, so that the server can finish.
    server.prependListener('request', (_req: IncomingMessage, res: ServerResponse) => {
      res.setHeader('Connection', 'close');
    });
    server.close(() => {
      // Every response has been sent, so every usage row is queued: write them before closing.
      let code = 0;
      try {
        usageLog.close();
      } catch (error) {
        console.error(`${usageLog.pending} usage rows could not be written before stopping.`, error);
        code = 1;
      }
      const finish = () => {
        database.sqlite.close();
        process.exit(code);
      };
      // Reset e-mails go out after their answer: let those under way reach the mail server first.
      void background
        .settled()
        .then(() => capture?.close())
        .then(finish, finish);
    });
    server.closeIdleConnections();
    setTimeout(() => {
      console.error('Requests still open after 10 s; stopping anyway.');
      server.closeAllConnections();
    }, 10_000).unref();
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((error: unknown) => {
  if (error instanceof ConfigError) {
    console.error(error.message);
    process.exit(1);
  }
  if ((error as NodeJS.ErrnoException | null)?.code === 'EADDRINUSE') {
    console.error(
      `${(error as Error).message}: another program uses the local mail server's port. Set SMTP_FAKE_PORT ` +
        'to a free port (0 picks one), or SMTP_URL to send through a real server.',
    );
    process.exit(1);
  }
  throw error;
});
