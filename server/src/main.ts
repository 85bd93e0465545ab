import type { AddressInfo } from 'node:net';
import { createApp } from './app';
import { systemClock } from './clock';
import { ConfigError, loadConfig } from './config';
import { migrateDatabase, openDatabase } from './db/database';
import { seedDemoData } from './db/seed';
import { DEMO_SEEDERS } from './db/demo-seeders';
import { VERSION } from './version';

/**
 * Starts the server: reads the configuration, migrates the SQLite file, seeds the demo data once,
 * listens, and on SIGINT or SIGTERM stops taking requests, lets those under way finish, and closes
 * the database.
 */
function main(): void {
  const config = loadConfig();
  const database = openDatabase(config.DATABASE_URL);
  const migrations = migrateDatabase(database);
  const seed = config.SEED_DEMO ? seedDemoData(database, systemClock.now(), DEMO_SEEDERS) : { seeded: false };

  const app = createApp({ database, clock: systemClock, version: VERSION, staticDir: config.STATIC_DIR });
  const server = app.listen(config.PORT, config.HOST, () => {
    const { port } = server.address() as AddressInfo;
    const host = config.HOST === '0.0.0.0' || config.HOST === '::' ? 'localhost' : config.HOST;
    console.log(
      [
        `Counterpoise ${VERSION} is running at http://${host}:${port}`,
        `  API reference: http://${host}:${port}/api/docs`,
        `  Database:      ${config.DATABASE_URL} (${migrations} migrations applied${seed.seeded ? ', demo data seeded' : ''})`,
      ].join('\n'),
    );
  });

  let stopping = false;
  const stop = (signal: NodeJS.Signals) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal} received: finishing the requests under way, then stopping.`);
    server.close(() => {
      database.sqlite.close();
      process.exit(0);
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
