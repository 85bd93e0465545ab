import { existsSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { dirname, join } from 'node:path';
import { createApp } from './app';
import { systemClock } from './clock';
import { ConfigError, loadConfig } from './config';
import { migrateDatabase, openDatabase } from './db/database';
import { seedDemoData } from './db/seed';
import { DEMO_SEEDERS } from './db/demo-seeders';
import { DEMO_API_KEY_FILE } from './keys/keys.seed';
import { UsageLog } from './usage/usage-log';
import { VERSION } from './version';

/**
 * Starts the server: reads the configuration, migrates the SQLite file, seeds the demo data once,
 * listens, and on SIGINT or SIGTERM stops taking requests, lets those under way finish, writes the
 * usage rows still queued, and closes the database.
 */
function main(): void {
  const config = loadConfig();
  const database = openDatabase(config.DATABASE_URL);
  const migrations = migrateDatabase(database);
  const dataDir = dirname(config.DATABASE_URL);
  const seed = config.SEED_DEMO
    ? seedDemoData(database, systemClock.now(), DEMO_SEEDERS, { dataDir })
    : { seeded: false };
  // Where the demo key is, never the key itself: logs travel further than the data folder.
  const demoKeyFile = join(dataDir, DEMO_API_KEY_FILE);

  const usageLog = new UsageLog(database);
  const app = createApp({
    database,
    clock: systemClock,
    version: VERSION,
    staticDir: config.STATIC_DIR,
    usageLog,
    corsOrigins: config.CORS_ORIGINS,
  });
  const server = app.listen(config.PORT, config.HOST, () => {
    const { port } = server.address() as AddressInfo;
    const host = config.HOST === '0.0.0.0' || config.HOST === '::' ? 'localhost' : config.HOST;
    console.log(
      [
        `Counterpoise ${VERSION} is running at http://${host}:${port}`,
        `  API reference: http://${host}:${port}/api/docs`,
        `  Database:      ${config.DATABASE_URL} (${migrations} migrations applied${seed.seeded ? ', demo data seeded' : ''})`,
        ...(existsSync(demoKeyFile) ? [`  Demo API key:  in ${demoKeyFile}`] : []),
      ].join('\n'),
    );
  });

  let stopping = false;
  const stop = (signal: NodeJS.Signals) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal} received: finishing the requests under way, then stopping.`);
    server.close(() => {
      // Every response has been sent, so every usage row is queued: write them before closing.
      let code = 0;
      try {
        usageLog.close();
      } catch (error) {
        console.error(`${usageLog.pending} usage rows could not be written before stopping.`, error);
        code = 1;
      }
      database.sqlite.close();
      process.exit(code);
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

try {
  main();
} catch (error) {
  if (error instanceof ConfigError) {
    console.error(error.message);
    process.exit(1);
  }
  throw error;
}
