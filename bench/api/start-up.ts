/*
 * `node --import tsx bench/api/start-up.ts`: the server's start-up time and memory, run from the
 * TypeScript sources through tsx (`node --import tsx server/src/main.ts`, as `npm start` ran it before)
 * and compiled (`node dist/server/main.js`, built here first with scripts/build-server.mjs into a folder
 * of this run's own), in interleaved rounds (STARTUP_ROUNDS, default 5). Each start is over the same
 * migrated SQLite file, without demo data: a restart of an installed server.
 *
 * For each start: milliseconds from spawning the process to the first 200 of /api/health (polled every
 * 5 ms), and the resident memory of the process and its children (tsx runs an esbuild service) once
 * started and again after a short load (LOAD_SECONDS, default 3, of keyed single-plane calculations).
 * Figures, not assertions: they go to docs/benchmarks.md.
 */
import { type ChildProcess, execFileSync, spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import { CALC_ROUTES } from '@counterpoise/api';
import { migrateDatabase, openDatabase } from '../../server/src/db/database';
import { createTestKey } from '../../server/src/keys/testing/test-keys';

const ROUNDS = Number(process.env['STARTUP_ROUNDS'] ?? 5);
const LOAD_SECONDS = Number(process.env['LOAD_SECONDS'] ?? 3);
const root = fileURLToPath(new URL('../..', import.meta.url));
const folder = mkdtempSync(join(tmpdir(), 'counterpoise-start-up-'));
// Inside the repository, so that the compiled server finds node_modules as dist/server does.
const compiled = mkdtempSync(join(root, 'dist', 'start-up-bench-'));
execFileSync(process.execPath, ['scripts/build-server.mjs', '--out', compiled], {
  cwd: root,
  stdio: 'inherit',
});

const databasePath = join(folder, 'counterpoise.sqlite');
const database = openDatabase(databasePath);
migrateDatabase(database);
const { key } = createTestKey(database);
database.sqlite.close();

/** Resident memory in MB of `pid` and every process below it, from /proc. */
function treeRssMb(pid: number): number {
  const parents = new Map<number, number>();
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      parents.set(Number(entry), Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]));
    } catch {
      // The process ended while we looked.
    }
  }
  const tree = [pid];
  // The iterator reaches the children pushed while it runs.
  for (const member of tree) {
    for (const [child, parent] of parents) if (parent === member) tree.push(child);
  }
  let kb = 0;
  for (const member of tree) {
    const status = readFileSync(`/proc/${member}/status`, 'utf8');
    kb += Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? 0);
  }
  return kb / 1024;
}

const healthy = (port: number) =>
  new Promise<boolean>((resolve) => {
    const asked = request({ host: '127.0.0.1', port, path: '/api/health' }, (answer) => {
      answer.resume();
      resolve(answer.statusCode === 200);
    });
    asked.on('error', () => resolve(false));
    asked.end();
  });

interface Start {
  startMs: number;
  rssStartedMb: number;
  rssLoadedMb: number;
}

let nextPort = 4680;
async function start(args: string[]): Promise<Start> {
  const port = nextPort++;
  const began = performance.now();
  const child: ChildProcess = spawn(process.execPath, args, {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_URL: databasePath,
      SEED_DEMO: 'false',
      SMTP_FAKE_PORT: '0',
      STATIC_DIR: join(folder, 'no-workbench'),
      DOCS_DIR: join(folder, 'no-docs'),
    },
    stdio: 'ignore',
  });
  while (!(await healthy(port))) {
    if (child.exitCode !== null) throw new Error(`${args.join(' ')} exited with ${child.exitCode}.`);
    await new Promise((resolve) => setTimeout(resolve, 5));
  }
  const startMs = performance.now() - began;
  await new Promise((resolve) => setTimeout(resolve, 500));
  const rssStartedMb = treeRssMb(child.pid!);
  await autocannon({
    url: `http://127.0.0.1:${port}/api/v1/calc/single-plane`,
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-api-key': key },
    body: JSON.stringify(CALC_ROUTES['single-plane'].example),
    connections: 16,
    duration: LOAD_SECONDS,
  });
  const rssLoadedMb = treeRssMb(child.pid!);
  await new Promise<void>((resolve) => {
    child.once('exit', () => resolve());
    child.kill('SIGTERM');
  });
  return { startMs, rssStartedMb, rssLoadedMb };
}

const modes = {
  'tsx (node --import tsx server/src/main.ts)': ['--import', 'tsx', 'server/src/main.ts'],
  'compiled (node dist/server/main.js)': [join(compiled, 'main.js')],
};
const results = new Map<string, Start[]>(Object.keys(modes).map((name) => [name, []]));
try {
  for (let round = 1; round <= ROUNDS; round++) {
    for (const [name, args] of Object.entries(modes)) {
      const result = await start(args);
      results.get(name)!.push(result);
      console.log(
        `round ${round}, ${name}: ${result.startMs.toFixed(0)} ms, ` +
          `${result.rssStartedMb.toFixed(0)} MB started, ${result.rssLoadedMb.toFixed(0)} MB after load`,
      );
    }
  }
} finally {
  rmSync(folder, { recursive: true, force: true });
  rmSync(compiled, { recursive: true, force: true });
}

const median = (values: number[]) => [...values].sort((x, y) => x - y)[Math.floor((values.length - 1) / 2)]!;
const each = (values: number[]) => values.map((value) => value.toFixed(0)).join(' / ');
console.log(`\nnode ${process.version}, ${ROUNDS} interleaved rounds, medians (each round)\n`);
console.log('| server | start to first 200 of /api/health, ms | RSS started, MB | RSS after load, MB |');
console.log('| --- | ---: | ---: | ---: |');
for (const [name, starts] of results) {
  const column = (pick: (start: Start) => number) => {
    const values = starts.map(pick);
    return `${median(values).toFixed(0)} (${each(values)})`;
  };
  console.log(
    `| ${name} | ${column((s) => s.startMs)} | ${column((s) => s.rssStartedMb)} | ${column((s) => s.rssLoadedMb)} |`,
  );
}
