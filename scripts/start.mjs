// `npm start`: builds the widget library and the workbench, then serves the app, the API and Swagger UI
// from one Express process. The server migrates the SQLite file (created when absent) and seeds the demo
// data once. PORT, HOST and DATABASE_URL override the defaults (4300, localhost, data/counterpoise.sqlite).
import { spawn, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const ng = fileURLToPath(new URL('../node_modules/@angular/cli/bin/ng.js', import.meta.url));
const env = { ...process.env, NG_CLI_ANALYTICS: 'false' };

// The library's build imports @counterpoise/engine and @counterpoise/api as packages, built first.
console.log('\nBuilding the shared packages…');
const shared = spawnSync(process.execPath, [fileURLToPath(new URL('./build-shared.mjs', import.meta.url))], {
  cwd: root,
  env,
  stdio: 'inherit',
});
if (shared.status !== 0) {
  console.error('\nThe build of the shared packages failed; the server was not started.');
  process.exit(shared.status ?? 1);
}

for (const project of ['counterpoise', 'workbench']) {
  console.log(`\nBuilding ${project}…`);
  const build = spawnSync(process.execPath, [ng, 'build', project], { cwd: root, env, stdio: 'inherit' });
  if (build.status !== 0) {
    console.error(`\nThe build of ${project} failed; the server was not started.`);
    process.exit(build.status ?? 1);
  }
}

// tsx runs in the server's own process (not a child of its CLI), so signals reach the graceful shutdown.
const server = spawn(process.execPath, ['--import', 'tsx', 'server/src/main.ts'], {
  cwd: root,
  env: { NODE_ENV: 'production', ...env },
  stdio: 'inherit',
});
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
server.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
