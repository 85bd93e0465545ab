import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from '../../../server/src/app';
import { DEMO_SEEDERS } from '../../../server/src/db/demo-seeders';
import { seedDemoData } from '../../../server/src/db/seed';
import { openTemporaryDatabase } from '../../../server/src/testing/temporary-database';
import { UsageLog } from '../../../server/src/usage/usage-log';

/** The production build of the workbench that `npm run build` leaves (WORKBENCH_DIR names another). */
export const WORKBENCH_DIR =
  process.env['WORKBENCH_DIR'] ?? fileURLToPath(new URL('../../../dist/workbench/browser', import.meta.url));

/** Fails at once, with the command that builds it, when the workbench the browser tests serve is not built. */
export function requireBuiltWorkbench(): void {
  if (!existsSync(join(WORKBENCH_DIR, 'index.html'))) {
    throw new Error(`The workbench is not built in ${WORKBENCH_DIR}: run \`npm run build\` first.`);
  }
}

/** A real Counterpoise server on a free loopback port, over a fresh SQLite file with the demo data. */
export interface TestServer {
  readonly url: string;
  stop(): Promise<void>;
}

/**
 * Starts the server as `npm start` does, but on a temporary database and a free port, serving the built
 * workbench or, for a benchmark's baseline, another built app.
 */
export async function startServer(staticDir: string = WORKBENCH_DIR): Promise<TestServer> {
  const temporary = openTemporaryDatabase();
  await seedDemoData(temporary.database, new Date(), DEMO_SEEDERS, { dataDir: dirname(temporary.path) });
  const usageLog = new UsageLog(temporary.database);
  const app = createApp({ database: temporary.database, staticDir, usageLog });
  const server = await new Promise<Server>((resolve) => {
    const listening = app.listen(0, '127.0.0.1', () => resolve(listening));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    stop: async () => {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      usageLog.close();
      temporary.dispose();
    },
  };
}
