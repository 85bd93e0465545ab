import { execFileSync, spawnSync } from 'node:child_process';
import {
  existsSync,
  lstatSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  symlinkSync,
  writeFileSync,
} from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/*
 * How the packaging tests install @counterpoise/ng as a dealer does: `npm pack` of dist/counterpoise, then
 * `npm install` of that one tarball into a fresh app, with every registry unreachable. The package's own
 * dependencies (zod, tslib) are the public packages this workspace already has: they are linked into the
 * app before the install, so npm finds them there; anything else npm asked for (an @counterpoise package
 * the tarball does not hold) would fail the install. Angular and the build tools are linked after it.
 */

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
export const LIBRARY_DIST = join(ROOT, 'dist', 'counterpoise');

/** Where no registry answers: connections to port 9 (discard) on this machine are refused. */
const UNREACHABLE_REGISTRY = 'http://127.0.0.1:9/';

/** What `npm pack --json` reports of a tarball. */
export interface PackResult {
  readonly name: string;
  readonly filename: string;
  readonly files: readonly { readonly path: string }[];
}

const npmEnv = { ...process.env, npm_config_update_notifier: 'false', npm_config_fund: 'false' };

const npm = (args: string[], cwd: string) =>
  execFileSync('npm', args, { cwd, encoding: 'utf8', env: npmEnv });

/** Packs the built library into `destination`, as it would be published. */
export function packLibrary(destination: string): PackResult {
  if (!existsSync(join(LIBRARY_DIST, 'package.json'))) {
    throw new Error('dist/counterpoise is not built: run `npm run build:lib` first.');
  }
  const [report] = JSON.parse(
    npm(['pack', '--json', '--pack-destination', destination, LIBRARY_DIST], ROOT),
  ) as [PackResult];
  return report;
}

/** Links one package of the workspace's node_modules into `nodeModules`, unless the app has it already. */
function linkFromWorkspace(nodeModules: string, id: string): void {
  const source = join(ROOT, 'node_modules', id);
  const destination = join(nodeModules, id);
  if (existsSync(destination) || !existsSync(source)) return;
  mkdirSync(dirname(destination), { recursive: true });
  symlinkSync(source, destination, lstatSync(source).isDirectory() ? 'dir' : 'file');
}

/** Links every package of the workspace the app has not installed itself: Angular, rxjs, the CLI. */
export function linkWorkspacePackages(nodeModules: string): void {
  const source = join(ROOT, 'node_modules');
  for (const name of readdirSync(source)) {
    if (name.startsWith('.') || name === '@counterpoise') continue;
    const scoped = name.startsWith('@');
    for (const pkg of scoped ? readdirSync(join(source, name)) : [name]) {
      linkFromWorkspace(nodeModules, scoped ? `${name}/${pkg}` : pkg);
    }
  }
}

/**
 * Installs the tarball (a path relative to `app`) as the app's one dependency, with every registry
 * unreachable, then links the workspace's Angular beside it. The app's package.json is written anew.
 */
export function installTarball(app: string, tarball: string): void {
  writeFileSync(
    join(app, 'package.json'),
    JSON.stringify(
      { name: 'dealer-app', private: true, dependencies: { '@counterpoise/ng': `file:${tarball}` } },
      null,
      2,
    ),
  );
  const manifest = JSON.parse(readFileSync(join(LIBRARY_DIST, 'package.json'), 'utf8')) as {
    dependencies?: Record<string, string>;
  };
  const nodeModules = join(app, 'node_modules');
  for (const dependency of Object.keys(manifest.dependencies ?? {}))
    linkFromWorkspace(nodeModules, dependency);
  npm(
    [
      'install',
      `--registry=${UNREACHABLE_REGISTRY}`,
      `--@counterpoise:registry=${UNREACHABLE_REGISTRY}`,
      '--fetch-retries=0',
      '--fetch-timeout=10000',
      // Peers (Angular, rxjs) are the app's own business: they come linked from the workspace below.
      '--legacy-peer-deps',
      '--ignore-scripts',
      '--no-audit',
      '--no-package-lock',
    ],
    app,
  );
  linkWorkspacePackages(nodeModules);
}

/** Runs the Angular CLI installed in `app`; the exit status and everything it printed. */
export function ng(app: string, args: string[]): { status: number | null; output: string } {
  const run = spawnSync(
    process.execPath,
    [join(app, 'node_modules', '@angular', 'cli', 'bin', 'ng.js'), ...args],
    {
      cwd: app,
      encoding: 'utf8',
      env: { ...process.env, NG_CLI_ANALYTICS: 'false', NO_COLOR: '1', CI: 'true' },
    },
  );
  return { status: run.status, output: `${run.stdout}\n${run.stderr}` };
}
