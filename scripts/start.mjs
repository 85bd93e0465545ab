// `npm start`: builds the widget library, the workbench and the server (compiled to JavaScript once,
// dist/server/main.js, scripts/build-server.mjs), then serves the app, the API and Swagger UI from one
// Express process running the compiled server, with no TypeScript compiled at run time. The server migrates the SQLite file (created when absent) and seeds the demo
// data once. PORT, HOST and DATABASE_URL override the defaults (4300, localhost, data/counterpoise.sqlite).
//
// The server runs with NODE_ENV=production, where it seeds no demo data by default; `npm start` is how
// people try Counterpoise, so it asks for the demo data (SEED_DEMO=true) unless SEED_DEMO is set.
// SKIP_BUILD=true serves the library, app and docs already in dist/ instead of building them again.
//
// npm runs this script as `exec node scripts/start.mjs` (see package.json), so that this process is the
// one npm waits for and signals; a SIGINT or SIGTERM is handed on to the build or the server under way,
// and this process exits when it has finished.
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { constants } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const env = { ...process.env, NG_CLI_ANALYTICS: 'false' };

/** The child under way (a build, then the server): where a stop signal goes. */
let current;
let stopSignal;
for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => {
    stopSignal ??= signal;
    current?.kill(signal);
  });
}

/** Runs one step to its end; resolves with its exit code, or with the signal that ended it. */
function run(args, options) {
  return new Promise((settle, fail) => {
    current = spawn(process.execPath, args, { cwd: root, stdio: 'inherit', ...options });
    current.on('error', fail);
    current.on('exit', (code, signal) => settle({ code, signal }));
  });
}

/** Exits with the step's code, or as a shell reports a process ended by a signal (128 + its number). */
function exitLike({ code, signal }) {
  process.exit(code ?? 128 + (constants.signals[signal] ?? 0));
}

const builds = [
  // @counterpoise/ng, the engine and the API schemas inside it (scripts/build-lib.mjs).
  { name: 'counterpoise', args: [fileURLToPath(new URL('./build-lib.mjs', import.meta.url))] },
  // The workbench's production build, chunks merged and compressed copies beside (scripts/build-app.mjs).
  { name: 'workbench', args: [fileURLToPath(new URL('./build-app.mjs', import.meta.url))] },
  // The typed client of the API (dist/client), generated from the OpenAPI document (scripts/build-client.mjs).
  { name: 'the typed client', args: [fileURLToPath(new URL('./build-client.mjs', import.meta.url))] },
  // The docs site and its widget catalogue (dist/docs), served at /docs (scripts/build-docs.mjs).
  { name: 'the docs site', args: [fileURLToPath(new URL('./build-docs.mjs', import.meta.url))] },
];
/** The server compiled to JavaScript (scripts/build-server.mjs), what production runs. */
const serverBuild = {
  name: 'the server',
  args: [fileURLToPath(new URL('./build-server.mjs', import.meta.url))],
};
const serverMain = join(root, 'dist/server/main.js');
const skipBuild = ['true', '1', 'yes'].includes(process.env.SKIP_BUILD ?? '');

if (skipBuild) {
  const staticDir = resolve(root, process.env.STATIC_DIR ?? 'dist/workbench/browser');
  if (!existsSync(join(staticDir, 'index.html'))) {
    console.warn(`\nSKIP_BUILD: no built workbench in ${staticDir}; the API is served without it.`);
  }
}
// The server is compiled at every start, SKIP_BUILD or not: it takes about a second, and a stale
// dist/server would serve code older than the sources.
const steps = skipBuild ? [serverBuild] : [...builds, serverBuild];
for (const build of steps) {
  console.log(`\nBuilding ${build.name}…`);
  const result = await run(build.args, { env });
  if (stopSignal) {
    console.error(`\n${stopSignal} received during the build; the server was not started.`);
    exitLike({ code: null, signal: stopSignal });
  }
  if (result.code !== 0) {
    console.error(`\nThe build of ${build.name} failed; the server was not started.`);
    exitLike(result);
  }
}

if (process.env.SEED_DEMO === undefined) {
  console.log(
    '\nnpm start seeds the demo data for a local try (SEED_DEMO=true); SEED_DEMO=false starts without it.',
  );
}
// The compiled server runs in this process's child, which signals reach for the graceful shutdown.
const server = await run([serverMain], {
  env: { NODE_ENV: 'production', SEED_DEMO: 'true', ...env },
});
exitLike(server);
