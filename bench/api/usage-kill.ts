/*
 * `node --import tsx bench/api/usage-kill.ts`: how many usage rows a server killed with SIGKILL in the
 * middle of a burst loses. The server is started as main.ts starts it (usage rows queued in memory and
 * written by the writer thread every flush interval), keyed requests are sent with autocannon, and the
 * process is killed once a set number of answers has arrived. Then the rows stored in the SQLite file
 * are counted against the 200 answers the client received; the difference is the loss, also given as
 * milliseconds of traffic at the rate the burst was answered.
 *
 * Options (environment): KILL_ROUNDS (default 5), KILL_AFTER (answers before the kill, default 20000),
 * KILL_CONNECTIONS (default 20). Figures, not assertions: they go to docs/benchmarks.md and docs/api.md.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import { CALC_ROUTES } from '@counterpoise/api';
import { migrateDatabase, openDatabase } from '../../server/src/db/database';
import { ApiKeysRepo } from '../../server/src/keys/keys.repo';
import { ApiKeyService } from '../../server/src/keys/keys.service';

const ROUNDS = Math.max(1, Number(process.env['KILL_ROUNDS'] ?? 5));
const KILL_AFTER = Number(process.env['KILL_AFTER'] ?? 20_000);
const CONNECTIONS = Number(process.env['KILL_CONNECTIONS'] ?? 20);
const root = fileURLToPath(new URL('../..', import.meta.url));
const body = JSON.stringify(CALC_ROUTES['single-plane'].example);

interface Round {
  answered: number;
  stored: number;
  lost: number;
  ratePerMs: number;
  lostMs: number;
}

async function round(): Promise<Round> {
  const folder = mkdtempSync(join(tmpdir(), 'counterpoise-kill-'));
  try {
    const databasePath = join(folder, 'counterpoise.sqlite');
    const database = openDatabase(databasePath);
    migrateDatabase(database);
    const { key } = new ApiKeyService(new ApiKeysRepo(database.orm)).create(
      { name: 'Kill measurement', limitPerMinute: 100_000_000 },
      new Date(),
    );
    database.sqlite.close();

    const server = spawn(process.execPath, ['--import', 'tsx', 'server/src/main.ts'], {
      cwd: root,
      env: {
        ...process.env,
        PORT: '0',
        HOST: '127.0.0.1',
        DATABASE_URL: databasePath,
        SEED_DEMO: 'false',
        STATIC_DIR: join(folder, 'no-workbench'),
        NODE_ENV: 'production',
        SMTP_FAKE_PORT: '0',
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    server.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
    const exited = new Promise<NodeJS.Signals | null>((resolve) =>
      server.on('exit', (_code, signal) => resolve(signal)),
    );
    const url = await new Promise<string>((resolve, reject) => {
      server.stdout.on('data', (chunk: Buffer) => {
        output += chunk.toString();
        const match = /running at (http:\/\/127\.0\.0\.1:\d+)/.exec(output);
        if (match?.[1]) resolve(match[1]);
      });
      server.on('exit', () => reject(new Error(`The server stopped before listening:\n${output}`)));
    });

    let answered = 0;
    let firstAtMs = 0;
    let killedAtMs = 0;
    let finished: (error: unknown) => void = () => undefined;
    const done = new Promise<unknown>((resolve) => (finished = resolve));
    // With a callback, autocannon returns the running instance (to listen to and stop), not a promise.
    const instance = autocannon(
      {
        url: `${url}/api/v1/calc/single-plane`,
        method: 'POST',
        headers: { 'content-type': 'application/json', 'x-api-key': key },
        body,
        connections: CONNECTIONS,
        amount: KILL_AFTER * 10,
        // Once the server is gone, stop at the first refused connection instead of retrying.
        bailout: 1,
      },
      (error) => finished(error),
    );
    instance.on('response', (_client, statusCode) => {
      if (statusCode !== 200) return;
      answered++;
      if (answered === 1) firstAtMs = performance.now();
      if (answered === KILL_AFTER) {
        killedAtMs = performance.now();
        server.kill('SIGKILL');
      }
    });
    const signal = await exited;
    // Answers the server wrote before it died may still sit in the client's socket buffers.
    await new Promise((resolve) => setTimeout(resolve, 500));
    instance.stop();
    await done;
    if (signal !== 'SIGKILL') throw new Error(`The server exited on its own (${signal}):\n${output}`);

    const after = openDatabase(databasePath);
    const stored = after.sqlite
      .prepare('SELECT count(*) FROM api_usage WHERE status = 200')
      .pluck()
      .get() as number;
    after.sqlite.close();
    const ratePerMs = KILL_AFTER / (killedAtMs - firstAtMs);
    const lost = answered - stored;
    return { answered, stored, lost, ratePerMs, lostMs: lost / ratePerMs };
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

const rounds: Round[] = [];
for (let index = 1; index <= ROUNDS; index++) {
  const result = await round();
  rounds.push(result);
  console.log(
    `round ${index}: ${result.answered} answers received, ${result.stored} rows stored, ${result.lost} lost ` +
      `(${result.lostMs.toFixed(0)} ms of traffic at ${(result.ratePerMs * 1000).toFixed(0)} answers/s)`,
  );
}
const sorted = [...rounds].sort((x, y) => x.lostMs - y.lostMs);
const median = sorted[Math.floor((sorted.length - 1) / 2)]!;
const worst = sorted[sorted.length - 1]!;
console.log(
  `\nnode ${process.version}, ${CONNECTIONS} connections, SIGKILL after ${KILL_AFTER} answers, ${ROUNDS} rounds: ` +
    `median ${median.lost} rows (${median.lostMs.toFixed(0)} ms of traffic), ` +
    `worst ${worst.lost} rows (${worst.lostMs.toFixed(0)} ms)`,
);
