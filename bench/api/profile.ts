/*
 * `node --import tsx bench/api/profile.ts <c|d> [file]`: where a calculator target spends its CPU under
 * load. Starts `serve-target.ts counterpoise` with BENCH_PROFILE, warms it up with autocannon, starts
 * the V8 CPU profiler (SIGUSR2), loads it for BENCH_SECONDS (default 10) with BENCH_CONNECTIONS (32),
 * stops it (the profile is written on SIGTERM), then prints self time per package and the busiest
 * functions. (c) is `POST /api/v1/calc/single-plane`, (d) a batch of 100 single-plane items, as in
 * `bench/api/run.ts`. The .cpuprofile (default /tmp/counterpoise-<c|d>.cpuprofile) opens in Chrome
 * DevTools. Figures, not assertions. The target runs under tsx here, so that the profile names our source
 * files; tsx adds a call to name each named closure it creates (`__name`, `set name`), 1–2 % of (c) that
 * the compiled targets of `bench/api/run.ts` do not have.
 */
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import { CALC_ROUTES } from '@counterpoise/api';

const SECONDS = Number(process.env['BENCH_SECONDS'] ?? 10);
const CONNECTIONS = Number(process.env['BENCH_CONNECTIONS'] ?? 32);
const root = fileURLToPath(new URL('../..', import.meta.url));
const which = process.argv[2] === 'd' ? 'd' : 'c';
const file = process.argv[3] ?? `/tmp/counterpoise-${which}.cpuprofile`;

const example = CALC_ROUTES['single-plane'].example;
const [path, body] =
  which === 'c'
    ? ['/api/v1/calc/single-plane', JSON.stringify(example)]
    : [
        '/api/v1/calc/batch',
        JSON.stringify({
          items: Array.from({ length: 100 }, (_, i) => ({
            id: `rotor-${i}`,
            route: 'single-plane',
            body: example,
          })),
        }),
      ];

const child = spawn(process.execPath, ['--import', 'tsx', 'bench/api/serve-target.ts', 'counterpoise'], {
  cwd: root,
  env: { ...process.env, NODE_ENV: 'production', BENCH_PROFILE: file },
  stdio: ['ignore', 'pipe', 'inherit'],
});
const { port, key } = await new Promise<{ port: number; key: string }>((resolve, reject) => {
  createInterface({ input: child.stdout! }).on('line', (line) => {
    const match = /^LISTENING (\d+) (\S+)$/.exec(line);
    if (match) resolve({ port: Number(match[1]), key: match[2]! });
  });
  child.on('exit', (code) => reject(new Error(`The target exited with ${code} before listening.`)));
});
const load = (duration: number) =>
  autocannon({
    url: `http://127.0.0.1:${port}${path}`,
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-api-key': key },
    body,
    connections: CONNECTIONS,
    duration,
  });
await load(3);
child.kill('SIGUSR2');
const result = await load(SECONDS);
await new Promise<void>((resolve) => {
  child.once('exit', () => resolve());
  child.kill('SIGTERM');
});
console.log(
  `${path}: ${Math.round(result.requests.average)} req/s, p99 ${result.latency.p99} ms, ${result.non2xx} non-2xx`,
);

interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
}
const profile = JSON.parse(readFileSync(file, 'utf8')) as {
  nodes: ProfileNode[];
  samples: number[];
  timeDeltas: number[];
};

/** Where a function lives: a package, a folder of ours, Node itself, or V8's own work. */
function placeOf({ functionName, url }: ProfileNode['callFrame']): string {
  if (url === '') return functionName.startsWith('(') ? functionName : `(native) ${functionName}`;
  if (url.startsWith('node:')) return 'node (internals)';
  const pkg = /node_modules\/((?:@[^/]+\/)?[^/]+)\//.exec(url);
  if (pkg) return pkg[1]!;
  const ours = /\/(server\/src\/[^/]+|shared\/[^/]+|bench\/[^/]+)\//.exec(url);
  return ours ? ours[1]! : url;
}

const nodes = new Map(profile.nodes.map((node) => [node.id, node]));
const byPlace = new Map<string, number>();
const byFunction = new Map<string, number>();
let total = 0;
for (let index = 0; index < profile.samples.length; index++) {
  const node = nodes.get(profile.samples[index]!)!;
  const micros = profile.timeDeltas[index] ?? 0;
  total += micros;
  const place = placeOf(node.callFrame);
  byPlace.set(place, (byPlace.get(place) ?? 0) + micros);
  const name = `${node.callFrame.functionName || '(anonymous)'} ${place}:${node.callFrame.lineNumber + 1}`;
  byFunction.set(name, (byFunction.get(name) ?? 0) + micros);
}
const busy = total - (byPlace.get('(idle)') ?? 0);
const table = (title: string, entries: Map<string, number>, rows: number) => {
  console.log(`\n| ${title} | self ms | % of busy |\n| --- | ---: | ---: |`);
  for (const [name, micros] of [...entries].sort((x, y) => y[1] - x[1]).slice(0, rows)) {
    if (name === '(idle)') continue;
    console.log(`| ${name} | ${(micros / 1000).toFixed(0)} | ${((100 * micros) / busy).toFixed(1)} |`);
  }
};
console.log(
  `profile: ${(total / 1e6).toFixed(1)} s, busy ${(busy / 1e6).toFixed(1)} s; ` +
    `${((busy / result.requests.total) * (which === 'd' ? 0.01 : 1)).toFixed(1)} µs of main-thread CPU per ${which === 'd' ? 'calculation' : 'request'}`,
);
table('place', byPlace, 25);
table('function', byFunction, 25);
