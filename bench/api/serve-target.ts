/*
 * One benchmark target, in a process of its own so that the load generator never shares its event loop:
 *   bare-http     node:http answering a small JSON
 *   bare-express  Express 5 with express.json() answering the same
 *   counterpoise  the real app (helmet, key check, rate limit, usage log, validation, engine) over a
 *                 temporary SQLite file, with a key whose limit the benchmark cannot reach
 * Prints `LISTENING <port> [<api key>]` once ready; stops on SIGTERM, flushing the usage log.
 * With BENCH_PROFILE=<file>, SIGUSR2 starts the CPU profiler (after the warm-up) and SIGTERM writes the
 * profile to <file> before stopping (`bench/api/profile.ts`).
 */
import { writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { Session } from 'node:inspector';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { createApp } from '../../server/src/app';
import { ApiKeysRepo } from '../../server/src/keys/keys.repo';
import { ApiKeyService } from '../../server/src/keys/keys.service';
import { openTemporaryDatabase } from '../../server/src/testing/temporary-database';
import { UsageLog } from '../../server/src/usage/usage-log';

const SMALL_JSON = JSON.stringify({ ok: true, message: 'hello' });

const profileFile = process.env['BENCH_PROFILE'];
const profiler = profileFile ? new Session() : undefined;
if (profiler) {
  profiler.connect();
  process.on('SIGUSR2', () => {
    profiler.post('Profiler.enable', () => profiler.post('Profiler.start'));
  });
}

/** Writes the profile taken since SIGUSR2, if one was asked for, then calls `then`. */
function writeProfile(then: () => void): void {
  if (!profiler || !profileFile) {
    then();
    return;
  }
  profiler.post('Profiler.stop', (error, result) => {
    if (!error) writeFileSync(profileFile, JSON.stringify(result.profile));
    then();
  });
}

function listen(server: Server, extra = '', onStop: () => void = () => undefined): void {
  server.listen(0, '127.0.0.1', () => {
    console.log(`LISTENING ${(server.address() as AddressInfo).port} ${extra}`.trim());
  });
  process.on('SIGTERM', () => {
    writeProfile(() =>
      server.close(() => {
        onStop();
        process.exit(0);
      }),
    );
    server.closeAllConnections();
  });
}

const target = process.argv[2];
if (target === 'bare-http') {
  listen(
    createServer((req, res) => {
      req.resume();
      req.on('end', () => {
        res.writeHead(200, { 'Content-Type': 'application/json' });
        res.end(SMALL_JSON);
      });
    }),
  );
} else if (target === 'bare-express') {
  const app = express();
  app.use(express.json());
  app.post('/{*splat}', (_req, res) => {
    res.type('application/json').send(SMALL_JSON);
  });
  listen(createServer(app));
} else if (target === 'counterpoise') {
  const temporary = openTemporaryDatabase();
  const { key } = new ApiKeyService(new ApiKeysRepo(temporary.database.orm)).create(
    { name: 'Benchmark', limitPerMinute: 100_000_000 },
    new Date(),
  );
  // As main.ts builds it: the rows are written in a thread of their own.
  const usageLog = new UsageLog(temporary.database, { inWorker: true });
  const app = createApp({ database: temporary.database, usageLog, log: () => undefined });
  listen(createServer(app), key, () => {
    usageLog.close();
    const rows = temporary.database.sqlite.prepare('SELECT count(*) AS n FROM api_usage').get() as {
      n: number;
    };
    console.log(`USAGE_ROWS ${rows.n}`);
    temporary.dispose();
  });
} else {
  console.error(`Unknown target "${target}": bare-http, bare-express or counterpoise.`);
  process.exit(2);
}
