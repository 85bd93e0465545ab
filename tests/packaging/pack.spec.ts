import { execFileSync, spawnSync } from 'node:child_process';
import {
  existsSync,
  lstatSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  symlinkSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type ConsumedEntry, consumedEntries, consumerAppFiles } from './consumer-app';

/*
 * Packs the three packages as they would be published (`npm pack` of dist/engine, dist/api and
 * dist/counterpoise), installs the tarballs into a fresh app as a dealer would, and builds that app with
 * the Angular CLI. Angular itself and the build tools are linked from this workspace's node_modules, so
 * the test needs no network and no second install of Angular.
 */

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const DIST = join(ROOT, 'dist');
const PACKAGES = ['engine', 'api', 'counterpoise'] as const;

interface PackResult {
  readonly name: string;
  readonly filename: string;
  readonly files: readonly { readonly path: string }[];
}

let work: string;
let app: string;
const packed = new Map<string, PackResult>();
let entries: ConsumedEntry[] = [];
let build: { status: number | null; output: string };

const npm = (args: string[], cwd: string) =>
  execFileSync('npm', args, {
    cwd,
    encoding: 'utf8',
    env: { ...process.env, npm_config_update_notifier: 'false', npm_config_fund: 'false' },
  });

/** Links every package of the workspace the app has not installed itself: Angular, rxjs, the CLI. */
function linkWorkspacePackages(target: string): void {
  const source = join(ROOT, 'node_modules');
  for (const name of readdirSync(source)) {
    if (name.startsWith('.') || name === '@counterpoise') continue;
    const scoped = name.startsWith('@');
    for (const pkg of scoped ? readdirSync(join(source, name)) : [name]) {
      const id = scoped ? `${name}/${pkg}` : pkg;
      const destination = join(target, id);
      if (existsSync(destination)) continue;
      mkdirSync(dirname(destination), { recursive: true });
      symlinkSync(join(source, id), destination, lstatSync(join(source, id)).isDirectory() ? 'dir' : 'file');
    }
  }
}

beforeAll(() => {
  for (const name of PACKAGES) {
    if (!existsSync(join(DIST, name, 'package.json'))) {
      throw new Error(`dist/${name} is not built: run \`npm run build:lib\` first.`);
    }
  }
  work = mkdtempSync(join(tmpdir(), 'counterpoise-pack-'));
  const report = JSON.parse(
    npm(['pack', '--json', '--pack-destination', work, ...PACKAGES.map((name) => join(DIST, name))], ROOT),
  ) as PackResult[];
  for (const result of report) packed.set(result.name, result);

  const library = JSON.parse(readFileSync(join(DIST, 'counterpoise', 'package.json'), 'utf8'));
  entries = consumedEntries(library.exports);

  app = join(work, 'portal');
  mkdirSync(join(app, 'src'), { recursive: true });
  const tarballs = Object.fromEntries(
    [...packed.values()].map((result) => [result.name, `file:../${result.filename}`]),
  );
  writeFileSync(
    join(app, 'package.json'),
    JSON.stringify({ name: 'service-portal', private: true, dependencies: tarballs }, null, 2),
  );
  // Peers (Angular, rxjs) are the app's own business: they come linked from the workspace below.
  npm(
    [
      'install',
      '--prefer-offline',
      '--legacy-peer-deps',
      '--ignore-scripts',
      '--no-audit',
      '--no-package-lock',
    ],
    app,
  );
  linkWorkspacePackages(join(app, 'node_modules'));
  for (const [path, text] of Object.entries(consumerAppFiles(entries))) {
    mkdirSync(dirname(join(app, path)), { recursive: true });
    writeFileSync(join(app, path), text);
  }

  const run = spawnSync(
    process.execPath,
    [join(app, 'node_modules', '@angular', 'cli', 'bin', 'ng.js'), 'build'],
    { cwd: app, encoding: 'utf8', env: { ...process.env, NG_CLI_ANALYTICS: 'false', NO_COLOR: '1' } },
  );
  build = { status: run.status, output: `${run.stdout}\n${run.stderr}` };
});

afterAll(() => {
  if (work) rmSync(work, { recursive: true, force: true });
});

describe('the packed packages', () => {
  it('pack all three, each with its manifest, code and declarations', () => {
    expect([...packed.keys()].sort()).toEqual([
      '@counterpoise/api',
      '@counterpoise/engine',
      '@counterpoise/ng',
    ]);
    for (const name of ['@counterpoise/engine', '@counterpoise/api']) {
      const files = packed.get(name)!.files.map((file) => file.path);
      expect(files).toEqual(expect.arrayContaining(['package.json', 'index.js', 'index.d.ts']));
    }
  });

  it('ship the library with a secondary entry, a harness entry and a theme mixin per widget', () => {
    const files = packed.get('@counterpoise/ng')!.files.map((file) => file.path);
    expect(files).toEqual(
      expect.arrayContaining([
        'package.json',
        'fesm2022/counterpoise-ng-core.mjs',
        'fesm2022/counterpoise-ng-core-testing.mjs',
        'core/_safety-notice-theme.scss',
      ]),
    );
    // Every entry that renders something ships its theme mixins; the solver entry renders nothing.
    const rendering = entries
      .filter((entry) => entry.specifier.startsWith('@counterpoise/ng/'))
      .map((entry) => entry.specifier.slice('@counterpoise/ng/'.length))
      .filter((folder) => folder !== 'solver');
    for (const folder of rendering) {
      const theme = files.find((path) => new RegExp(`^${folder}/_[\\w-]+-theme\\.scss$`).test(path));
      expect(theme, `${folder} ships no _<widget>-theme.scss`).toBeDefined();
    }
  });

  it('declare the shared packages as dependencies and Angular as peers', () => {
    const manifest = JSON.parse(readFileSync(join(DIST, 'counterpoise', 'package.json'), 'utf8'));
    expect(Object.keys(manifest.dependencies)).toEqual(
      expect.arrayContaining(['@counterpoise/api', '@counterpoise/engine']),
    );
    expect(Object.keys(manifest.peerDependencies)).toEqual(
      expect.arrayContaining(['@angular/core', '@angular/material']),
    );
    const api = JSON.parse(readFileSync(join(DIST, 'api', 'package.json'), 'utf8'));
    expect(Object.keys(api.dependencies)).toEqual(['@counterpoise/engine', 'zod']);
  });
});

describe('a dealer app built against the tarballs', () => {
  it('installs the three packages from their tarballs, not from the workspace', () => {
    for (const name of ['engine', 'api', 'ng']) {
      const installed = join(app, 'node_modules', '@counterpoise', name);
      expect(lstatSync(installed).isSymbolicLink()).toBe(false);
      expect(existsSync(join(installed, 'package.json'))).toBe(true);
    }
  });

  it('imports every public entry point and builds with the Angular CLI', () => {
    expect(entries.map((entry) => entry.specifier)).toEqual(
      expect.arrayContaining(['@counterpoise/ng', '@counterpoise/ng/core']),
    );
    expect(build.output).not.toMatch(/\[ERROR\]/);
    expect(build.status, build.output).toBe(0);
  });

  it('bundles the widgets into the first load, the API runtime into a chunk loaded later, and the themed styles', () => {
    const browser = join(app, 'dist', 'browser');
    const html = readFileSync(join(browser, 'index.html'), 'utf8');
    // What the page loads at once: its scripts and the chunks it preloads.
    const initial = [...html.matchAll(/(?:src|href)="([^"]+\.js)"/g)].map((match) => match[1]!);
    expect(initial).toContain('main.js');
    const scripts = readdirSync(browser).filter((file) => file.endsWith('.js'));
    const text = (files: string[]) =>
      files.map((file) => readFileSync(join(browser, file), 'utf8')).join('\n');
    expect(text(initial)).toContain('Lock out and tag out');
    // zod's own message, with the schemas and the engine: in a chunk of its own, fetched when idle.
    const later = scripts.filter((file) => !initial.includes(file));
    expect(text(initial)).not.toContain('Invalid input');
    expect(text(later)).toContain('Invalid input');
    const styles = readFileSync(join(browser, 'styles.css'), 'utf8');
    expect(styles).toMatch(/--cp-safety-notice-accent-color:\s*#7a3e00/);
  });
});
