/*
 * `npm run bench:api`: requests per second and p99 latency on loopback, in one run, of
 *   (a) a bare node:http server answering a small JSON,
 *   (b) a bare Express 5 app with express.json() answering the same,
 *   (c) POST /api/v1/calc/single-plane with key check, validation and usage logging,
 *   (d) POST /api/v1/calc/batch with 100 single-plane items,
 * then the targets as ratios of the same run: (c) req/s >= 0.9 x (b); p99 of (c) <= 1.1 x p99 of (b);
 * (d) calculations/s >= 25 x (b) req/s; and whether each is met. Each target runs in its own
 * process; the load comes from this one. Figures, not assertions: results go to docs/benchmarks.md.
 *
 * Options (environment): BENCH_SECONDS (default 10), BENCH_CONNECTIONS (default 32), BENCH_TARGETS (the
 * letters to run, default abcd; ratios need their targets in the same run), BENCH_ROUNDS (default 1:
 * with more, the targets run in interleaved rounds and the median round of each is reported).
 *
 * The targets run as production runs the server: compiled to JavaScript once, by the same build as
 * `npm start` (scripts/build-server.mjs, into dist/bench-api), not compiled at run time by tsx.
 */
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { createInterface } from 'node:readline';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import { CALC_ROUTES } from '@counterpoise/api';

const SECONDS = Number(process.env['BENCH_SECONDS'] ?? 10);
const CONNECTIONS = Number(process.env['BENCH_CONNECTIONS'] ?? 32);
const WARM_UP_SECONDS = 3;
const BATCH_ITEMS = 100;
const root = fileURLToPath(new URL('../..', import.meta.url));

interface Target {
  process: ChildProcess;
  port: number;
  apiKey?: string;
  output: string[];
}

const built = spawnSync(
  process.execPath,
  [
    'scripts/build-server.mjs',
    '--out',
    'dist/bench-api',
    '--entry',
    'serve-target=bench/api/serve-target.ts',
  ],
  { cwd: root, stdio: 'inherit' },
);
if (built.status !== 0) throw new Error('The benchmark targets did not compile.');

function startTarget(name: string): Promise<Target> {
  const child = spawn(process.execPath, ['dist/bench-api/serve-target.js', name], {
    cwd: root,
    env: { ...process.env, NODE_ENV: 'production' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const output: string[] = [];
  return new Promise((resolve, reject) => {
    const lines = createInterface({ input: child.stdout! });
    lines.on('line', (line) => {
      output.push(line);
      const match = /^LISTENING (\d+)(?: (\S+))?$/.exec(line);
      if (match) resolve({ process: child, port: Number(match[1]), apiKey: match[2], output });
    });
    child.on('exit', (code) => reject(new Error(`Target ${name} exited with ${code} before listening.`)));
  });
}

async function stopTarget(target: Target): Promise<string[]> {
  await new Promise<void>((resolve) => {
    target.process.once('exit', () => resolve());
    target.process.kill('SIGTERM');
  });
  return target.output;
}

interface Measured {
  requestsPerSecond: number;
  p99Ms: number;
  non2xx: number;
  errors: number;
  requests: number;
}

async function load(
  url: string,
  headers: Record<string, string>,
  body: string,
  seconds: number,
): Promise<Measured> {
  const result = await autocannon({
    url,
    method: 'POST',
    headers: { 'content-type': 'application/json', ...headers },
    body,
    connections: CONNECTIONS,
    duration: seconds,
  });
  return {
    requestsPerSecond: result.requests.average,
    p99Ms: result.latency.p99,
    non2xx: result.non2xx,
    errors: result.errors + result.timeouts,
    requests: result.requests.total,
  };
}

async function measure(
  name: string,
  path: string,
  body: string,
  keyed: boolean,
): Promise<Measured & { usageRows?: number }> {
  const target = await startTarget(name);
  const url = `http://127.0.0.1:${target.port}${path}`;
  const headers: Record<string, string> = keyed && target.apiKey ? { 'x-api-key': target.apiKey } : {};
  process.stdout.write(`${name} ${path}: warming up… `);
  await load(url, headers, body, WARM_UP_SECONDS);
  process.stdout.write('measuring… ');
  const measured = await load(url, headers, body, SECONDS);
  const output = await stopTarget(target);
  const rows = output.map((line) => /^USAGE_ROWS (\d+)$/.exec(line)).find(Boolean);
  console.log('done');
  return { ...measured, ...(rows ? { usageRows: Number(rows[1]) } : {}) };
}

const singlePlane = JSON.stringify(CALC_ROUTES['single-plane'].example);
const batch = JSON.stringify({
  items: Array.from({ length: BATCH_ITEMS }, (_, i) => ({
    id: `rotor-${i}`,
    route: 'single-plane',
    body: CALC_ROUTES['single-plane'].example,
  })),
});

const TARGETS = process.env['BENCH_TARGETS'] ?? 'abcd';
const ROUNDS = Math.max(1, Number(process.env['BENCH_ROUNDS'] ?? 1));

type Result = Measured & { usageRows?: number };
const skipped: Result = {
  requestsPerSecond: Number.NaN,
  p99Ms: Number.NaN,
  non2xx: 0,
  errors: 0,
  requests: 0,
};
const runs: Record<'a' | 'b' | 'c' | 'd', Result[]> = { a: [], b: [], c: [], d: [] };
// Rounds interleave the targets, so that a slow spell of the machine weighs on all of them alike.
for (let round = 1; round <= ROUNDS; round++) {
  if (ROUNDS > 1) console.log(`round ${round} of ${ROUNDS}`);
  if (TARGETS.includes('a')) runs.a.push(await measure('bare-http', '/', singlePlane, false));
  if (TARGETS.includes('b')) runs.b.push(await measure('bare-express', '/', singlePlane, false));
  if (TARGETS.includes('c')) {
    runs.c.push(await measure('counterpoise', '/api/v1/calc/single-plane', singlePlane, true));
  }
  if (TARGETS.includes('d')) runs.d.push(await measure('counterpoise', '/api/v1/calc/batch', batch, true));
}

/** The round with the median requests per second (the lower middle one of an even count). */
function median(results: Result[]): Result {
  if (results.length === 0) return skipped;
  const sorted = [...results].sort((x, y) => x.requestsPerSecond - y.requestsPerSecond);
  return sorted[Math.floor((sorted.length - 1) / 2)]!;
}
const [a, b, c, d] = [median(runs.a), median(runs.b), median(runs.c), median(runs.d)];

const fmt = (n: number, digits = 0) => n.toLocaleString('en-US', { maximumFractionDigits: digits });
const row = (label: string, m: Measured, all: Result[]) =>
  `| ${label} | ${fmt(m.requestsPerSecond)} | ${fmt(m.p99Ms, 1)} | ${m.non2xx} | ${m.errors} |` +
  (ROUNDS > 1 ? ` ${all.map((one) => fmt(one.requestsPerSecond)).join(' / ')} |` : '');
console.log(
  `\nnode ${process.version}, ${CONNECTIONS} connections, ${SECONDS} s per target after ${WARM_UP_SECONDS} s ` +
    `warm-up${ROUNDS > 1 ? `, median of ${ROUNDS} interleaved rounds` : ''}\n`,
);
console.log(`| target | req/s | p99 ms | non-2xx | errors |${ROUNDS > 1 ? ' req/s of each round |' : ''}`);
console.log(`| --- | ---: | ---: | ---: | ---: |${ROUNDS > 1 ? ' ---: |' : ''}`);
console.log(row('(a) bare node:http', a, runs.a));
console.log(row('(b) bare Express + express.json()', b, runs.b));
console.log(row('(c) POST /api/v1/calc/single-plane', c, runs.c));
console.log(row(`(d) POST /api/v1/calc/batch, ${BATCH_ITEMS} items`, d, runs.d));
// The targets, as ratios within this run (figures from different runs do not compare). Each round
// measures (b), (c) and (d) back to back, so a ratio is taken within each round and the verdict is on
// the median of those; with one round, or targets missing from some rounds, on the median rounds.
const paired = ROUNDS > 1 && runs.b.length === runs.c.length && runs.b.length === runs.d.length;
const medianOf = (values: number[]) =>
  [...values].sort((x, y) => x - y)[Math.floor((values.length - 1) / 2)]!;
const rounds = paired
  ? runs.b.map((_, i) => ({ b: runs.b[i]!, c: runs.c[i]!, d: runs.d[i]! }))
  : [{ b, c, d }];
const targets = [
  {
    name: '(c) req/s >= 0.9 x (b) req/s',
    ratios: rounds.map((round) => round.c.requestsPerSecond / round.b.requestsPerSecond),
    met: (ratio: number) => ratio >= 0.9,
    label: 'c/b',
    digits: 2,
  },
  {
    name: `p99 of (c) <= 1.1 x p99 of (b) at ${CONNECTIONS} connections`,
    ratios: rounds.map((round) => round.c.p99Ms / round.b.p99Ms),
    met: (ratio: number) => ratio <= 1.1,
    label: 'p99 c/b',
    digits: 2,
  },
  {
    name: '(d) calculations/s >= 25 x (b) req/s',
    ratios: rounds.map((round) => (round.d.requestsPerSecond * BATCH_ITEMS) / round.b.requestsPerSecond),
    met: (ratio: number) => ratio >= 25,
    label: 'd calculations/s / b req/s',
    digits: 1,
  },
];
console.log('');
for (const target of targets) {
  const ratio = medianOf(target.ratios);
  const verdict = Number.isNaN(ratio) ? 'not measured' : target.met(ratio) ? 'met' : 'NOT met';
  const each = paired
    ? ` (median of the rounds' ${target.ratios.map((one) => one.toFixed(target.digits)).join(' / ')}; ` +
      `met in ${target.ratios.filter(target.met).length} of ${target.ratios.length} rounds)`
    : '';
  console.log(`${target.label} = ${ratio.toFixed(target.digits)}${each}: target ${target.name}: ${verdict}`);
}
console.log(`c/a = ${(c.requestsPerSecond / a.requestsPerSecond).toFixed(2)}`);
console.log(`(d) calculations/s = ${fmt(d.requestsPerSecond * BATCH_ITEMS)}`);
console.log(
  `usage rows written: (c) ${c.usageRows ?? '?'} for ${fmt(c.requests + 0)} measured + warm-up requests; ` +
    `(d) ${d.usageRows ?? '?'} for ${fmt(d.requests)} measured + warm-up batches of ${BATCH_ITEMS}`,
);
