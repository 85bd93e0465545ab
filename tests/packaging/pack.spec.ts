import { lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type ConsumedEntry, consumedEntries, consumerAppFiles } from './consumer-app';
import type * as PackagedApi from '@counterpoise/api';
import { createApp } from '../../server/src/app';
import { createTestKey } from '../../server/src/keys/testing/test-keys';
import { openTemporaryDatabase } from '../../server/src/testing/temporary-database';
import { UsageLog } from '../../server/src/usage/usage-log';
import { installTarball, LIBRARY_DIST, ng, packLibrary, type PackResult } from './dealer-install';

/*
 * Packs @counterpoise/ng as it would be published (`npm pack` of dist/counterpoise), installs that one
 * tarball into a fresh app as a dealer would, with every registry unreachable (dealer-install.ts), and
 * builds the app with the Angular CLI: the engine and the API schemas must come inside the tarball.
 */

let work: string;
let app: string;
let packed: PackResult;
let entries: ConsumedEntry[] = [];
let build: { status: number | null; output: string };

beforeAll(() => {
  work = mkdtempSync(join(tmpdir(), 'counterpoise-pack-'));
  packed = packLibrary(work);
  const library = JSON.parse(readFileSync(join(LIBRARY_DIST, 'package.json'), 'utf8'));
  entries = consumedEntries(library.exports);

  app = join(work, 'portal');
  mkdirSync(join(app, 'src'), { recursive: true });
  installTarball(app, `../${packed.filename}`);
  for (const [path, text] of Object.entries(consumerAppFiles(entries))) {
    mkdirSync(dirname(join(app, path)), { recursive: true });
    writeFileSync(join(app, path), text);
  }
  build = ng(app, ['build']);
}, 300_000);

afterAll(() => {
  if (work) rmSync(work, { recursive: true, force: true });
});

describe('the packed package', () => {
  it('is one tarball with the widgets, the engine, the API schemas, the license and the README', () => {
    const files = packed.files.map((file) => file.path);
    expect(packed.name).toBe('@counterpoise/ng');
    expect(files).toEqual(
      expect.arrayContaining([
        'package.json',
        'LICENSE',
        'README.md',
        'fesm2022/counterpoise-ng-core.mjs',
        'fesm2022/counterpoise-ng-core-testing.mjs',
        'fesm2022/counterpoise-ng-engine.mjs',
        'fesm2022/counterpoise-ng-api.mjs',
        'types/counterpoise-ng-engine.d.ts',
        'types/counterpoise-ng-api.d.ts',
        'core/_safety-notice-theme.scss',
      ]),
    );
    // Every entry that renders something ships its theme mixins; the solver, engine and api render nothing.
    const rendering = entries
      .filter((entry) => entry.specifier.startsWith('@counterpoise/ng/'))
      .map((entry) => entry.specifier.slice('@counterpoise/ng/'.length))
      .filter((folder) => !['solver', 'engine', 'api'].includes(folder));
    for (const folder of rendering) {
      const theme = files.find((path) => new RegExp(`^${folder}/_[\\w-]+-theme\\.scss$`).test(path));
      expect(theme, `${folder} ships no _<widget>-theme.scss`).toBeDefined();
    }
  });

  it('depends on no other @counterpoise package, names its license, and has Angular as peers', () => {
    const manifest = JSON.parse(readFileSync(join(LIBRARY_DIST, 'package.json'), 'utf8'));
    expect(Object.keys(manifest.dependencies).sort()).toEqual(['tslib', 'zod']);
    expect(Object.keys(manifest.peerDependencies)).toEqual(
      expect.arrayContaining(['@angular/core', '@angular/material']),
    );
    expect(manifest.license).toBe('MIT');
    expect(readFileSync(join(LIBRARY_DIST, 'LICENSE'), 'utf8')).toMatch(
      /^MIT License\n\nCopyright \(c\) \d{4} The Counterpoise authors\n/,
    );
    expect(Object.keys(manifest.exports)).toEqual(expect.arrayContaining(['./engine', './api']));
  });

  it('imports no package by a name only this workspace knows', () => {
    const code = packed.files.map((file) => file.path).filter((path) => /\.(mjs|d\.ts)$/.test(path));
    const offenders = code.filter((path) =>
      /(?:from\s*|import\s*\(\s*|import\s+)['"]@counterpoise\/(?:engine|api)['"]/.test(
        readFileSync(join(LIBRARY_DIST, path), 'utf8'),
      ),
    );
    expect(offenders).toEqual([]);
  });
});

describe('a dealer app built against the tarball', () => {
  it('installs @counterpoise/ng from its tarball, with no registry to reach, and nothing else of ours', () => {
    const scope = join(app, 'node_modules', '@counterpoise');
    expect(readdirSync(scope)).toEqual(['ng']);
    expect(lstatSync(join(scope, 'ng')).isSymbolicLink()).toBe(false);
    expect(JSON.parse(readFileSync(join(scope, 'ng', 'package.json'), 'utf8')).version).toBe(
      JSON.parse(readFileSync(join(LIBRARY_DIST, 'package.json'), 'utf8')).version,
    );
  });

  it('imports every public entry point and builds with the Angular CLI', () => {
    expect(entries.map((entry) => entry.specifier)).toEqual(
      expect.arrayContaining([
        '@counterpoise/ng',
        '@counterpoise/ng/core',
        '@counterpoise/ng/engine',
        '@counterpoise/ng/api',
      ]),
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

describe('the two engines, from the installed package', () => {
  it('the engine inside the tarball answers every calculator route as the server does', async () => {
    // The API entry as the dealer's install has it: its own bundle, importing the engine entry and zod.
    const entry = join(app, 'node_modules', '@counterpoise', 'ng', 'fesm2022', 'counterpoise-ng-api.mjs');
    const local = (await import(pathToFileURL(entry).href)) as typeof PackagedApi;

    const temporary = openTemporaryDatabase();
    const usageLog = new UsageLog(temporary.database);
    const server = await new Promise<Server>((resolve) => {
      const listening = createApp({ database: temporary.database, usageLog }).listen(0, '127.0.0.1', () =>
        resolve(listening),
      );
    });
    try {
      const { key } = createTestKey(temporary.database, { name: 'Packaging check' });
      const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
      expect(local.CALC_ROUTE_NAMES.length).toBeGreaterThan(3);
      for (const route of local.CALC_ROUTE_NAMES) {
        const request = local.CALC_ROUTES[route].example;
        const outcome = local.calculate(route, request);
        expect(outcome.status, route).toBe(200);
        const answer = await fetch(`${url}/api/v1/calc/${route}`, {
          method: 'POST',
          headers: { 'content-type': 'application/json', 'x-api-key': key },
          body: JSON.stringify(request),
        });
        expect(answer.status, route).toBe(200);
        expect(await answer.json(), route).toEqual(outcome.status === 200 ? outcome.result : null);
      }
    } finally {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      usageLog.close();
      temporary.dispose();
    }
  });
});
