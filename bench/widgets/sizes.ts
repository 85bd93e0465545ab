// `npm run bench:sizes`: what each entry point of @counterpoise/ng costs a dealer's app beyond Angular and
// Material. Each entry of the built package (dist/counterpoise, `npm run build:lib`) is linked by Angular's
// linker as an app build would, bundled alone with esbuild (production mode, every export kept, minified);
// the sizes go to the console and to the "Widget sizes" section of docs/benchmarks.md. Then a dealer's app
// with the weight calculator is built by the Angular CLI and visited in Chromium, computing remotely and on
// the device (remote-dealer-app.ts): what a page downloads, Angular included. Figures, not a test: the
// target (under 30 kB gzipped per widget) is read, not asserted.
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { constants, gzipSync } from 'node:zlib';
import { transformAsync } from '@babel/core';
import { createEs2015LinkerPlugin } from '@angular/compiler-cli/linker/babel';
import { build, type Plugin } from 'esbuild';
import { type DealerAppSizes, type DealerAppVariant, measureDealerApp } from './remote-dealer-app';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const LIBRARY = join(ROOT, 'dist', 'counterpoise');
const DOC = join(ROOT, 'docs', 'benchmarks.md');
const TARGET_GZIP_BYTES = 30 * 1024;
const START = '<!-- widget-sizes:start -->';
const END = '<!-- widget-sizes:end -->';

/** Angular (with the CDK and Material), rxjs and tslib: what every Angular app already pays for. */
const FRAMEWORK = ['@angular/*', 'rxjs', 'rxjs/*', 'tslib'];
/** zod, the one dependency of the package beneath its API entry (`@counterpoise/ng/api`). */
const SHARED = ['zod', 'zod/*'];
/** Entries that draw nothing: the engine and the API schemas (loaded when idle by the solvers). No target. */
const NOT_WIDGETS = ['@counterpoise/ng/engine', '@counterpoise/ng/api'];

/** One entry point's cost, in bytes. */
interface EntrySize {
  /** The import path, e.g. `@counterpoise/ng/phase-dial`. */
  readonly entry: string;
  /** What a page loads with the entry (the entry and what it imports statically), minified. */
  readonly minified: number;
  /** The same, gzipped (each file apart, as they are served). */
  readonly gzipped: number;
  /** What the entry imports dynamically (loaded in the background, when idle), gzipped. */
  readonly deferredGzipped: number;
  /** The entry's own code, gzipped: other entries of the package and the shared packages apart. */
  readonly ownGzipped: number;
}

/** Angular's linker turns the package's partial declarations into what an app build ships. */
const linker = createEs2015LinkerPlugin({
  linkerJitMode: false,
  sourceMapping: false,
  // Node's path functions return plain strings where the linker's types ask for branded paths.
  fileSystem: {
    resolve,
    exists: existsSync,
    dirname,
    relative,
    readFile: (path: string) => readFileSync(path, 'utf8'),
  } as unknown as Parameters<typeof createEs2015LinkerPlugin>[0]['fileSystem'],
  logger: {
    level: 2,
    debug: () => undefined,
    info: () => undefined,
    warn: console.warn,
    error: console.error,
  },
});

/**
 * Resolves `@counterpoise/ng[/entry]` to the built bundles through the package's own `exports` (the engine
 * and the API schemas are entries of it too) and links them; what stays external is the caller's choice.
 */
function builtLibrary(exportsField: Record<string, { default: string }>, otherEntriesApart: boolean): Plugin {
  return {
    name: 'counterpoise-dist',
    setup(context) {
      context.onResolve({ filter: /^@counterpoise\/ng(\/.*)?$/ }, ({ path, importer }) => {
        // An entry's imports of other entries, when only its own code is measured.
        if (otherEntriesApart && importer !== '' && !importer.endsWith('entry.js')) {
          return { path, external: true };
        }
        const key = `.${path.slice('@counterpoise/ng'.length)}`;
        const target = exportsField[key];
        if (!target) return { errors: [{ text: `dist/counterpoise exports no "${key}"` }] };
        return { path: join(LIBRARY, target.default) };
      });
      context.onLoad({ filter: /[\\/]dist[\\/]counterpoise[\\/].*\.mjs$/ }, async ({ path }) => {
        const source = readFileSync(path, 'utf8');
        const linked = await transformAsync(source, {
          filename: path,
          plugins: [linker],
          compact: false,
          configFile: false,
          babelrc: false,
          sourceMaps: false,
        });
        return { contents: linked?.code ?? source, loader: 'js' };
      });
    },
  };
}

/** The files of one bundled entry: those loaded with it, and those it imports dynamically. */
interface Bundle {
  readonly eager: Uint8Array[];
  readonly deferred: Uint8Array[];
}

async function bundled(entry: string, plugin: Plugin, external: string[]): Promise<Bundle> {
  const result = await build({
    stdin: { contents: `export * from '${entry}';`, resolveDir: ROOT, loader: 'js', sourcefile: 'entry.js' },
    bundle: true,
    write: false,
    // Split as an app build splits: what the entry imports dynamically goes to chunks of its own.
    splitting: true,
    outdir: join(ROOT, 'dist', 'widget-sizes'),
    metafile: true,
    minify: true,
    format: 'esm',
    platform: 'browser',
    target: 'es2022',
    legalComments: 'none',
    // As the Angular CLI's production build: development-only checks and JIT support drop out.
    define: { ngDevMode: 'false', ngJitMode: 'false', ngI18nClosureMode: 'false' },
    external,
    plugins: [plugin],
    logLevel: 'silent',
  });
  const outputs = result.metafile!.outputs;
  const files = new Map(result.outputFiles.map((file) => [relative(ROOT, file.path), file.contents]));
  const start = Object.keys(outputs).find((path) => outputs[path]!.entryPoint !== undefined)!;
  // The entry and the chunks it reaches through static imports load together; the rest is deferred.
  const eager = new Set<string>([start]);
  for (const path of eager) {
    for (const imported of outputs[path]!.imports) {
      if (imported.kind === 'import-statement' && !imported.external) eager.add(imported.path);
    }
  }
  const pick = (inEager: boolean) =>
    Object.keys(outputs)
      .filter((path) => path.endsWith('.js') && eager.has(path) === inEager)
      .map((path) => files.get(path)!);
  return { eager: pick(true), deferred: pick(false) };
}

const gzip = (files: readonly Uint8Array[]) =>
  files.reduce((sum, bytes) => sum + gzipSync(bytes, { level: constants.Z_BEST_COMPRESSION }).byteLength, 0);
const length = (files: readonly Uint8Array[]) => files.reduce((sum, bytes) => sum + bytes.byteLength, 0);

/** Measures every runtime entry of the built package; harness entries (`…/testing`) ship to tests only. */
async function measureEntries(): Promise<EntrySize[]> {
  const manifest = JSON.parse(readFileSync(join(LIBRARY, 'package.json'), 'utf8'));
  const exportsField = manifest.exports as Record<string, { default: string }>;
  const withShared = builtLibrary(exportsField, false);
  const ownOnly = builtLibrary(exportsField, true);
  const keys = Object.keys(exportsField).filter((key) => key.startsWith('./') && !key.endsWith('/testing'));
  const sizes: EntrySize[] = [];
  for (const key of keys.filter((key) => key !== './package.json')) {
    const entry = `@counterpoise/ng/${key.slice(2)}`;
    const all = await bundled(entry, withShared, FRAMEWORK);
    const own = await bundled(entry, ownOnly, [...FRAMEWORK, ...SHARED]);
    sizes.push({
      entry,
      minified: length(all.eager),
      gzipped: gzip(all.eager),
      deferredGzipped: gzip(all.deferred),
      ownGzipped: gzip([...own.eager, ...own.deferred]),
    });
  }
  return sizes;
}

const kB = (bytes: number) => (bytes / 1024).toFixed(1);

/** The Markdown table of the sizes, with a verdict against the target per row. */
function sizesTable(sizes: readonly EntrySize[]): string {
  const rows = sizes.map(
    (s) =>
      `| \`${s.entry}\` | ${kB(s.minified)} | ${kB(s.gzipped)} | ${s.deferredGzipped === 0 ? '–' : kB(s.deferredGzipped)} | ${kB(s.ownGzipped)} | ${
        NOT_WIDGETS.includes(s.entry) ? '–' : s.gzipped <= TARGET_GZIP_BYTES ? 'yes' : '**no**'
      } |`,
  );
  return [
    '| entry point | first load, minified kB | first load, gzipped kB | loaded when idle, gzipped kB | own code, gzipped kB | first load under 30 kB gzipped |',
    '| --- | ---: | ---: | ---: | ---: | :---: |',
    ...rows,
  ].join('\n');
}

const DEALER_APPS: Record<DealerAppVariant, string> = {
  remote: "remote only: `provideCounterpoise({ solver: 'remote', … })`",
  default: 'on the device: no `provideCounterpoise()`, the default engine',
};

/** The Markdown table of the dealer apps' downloads. */
function appsTable(apps: ReadonlyMap<DealerAppVariant, DealerAppSizes>): string {
  const rows = [...apps].map(([variant, app]) => {
    const inFirstLoad = (what: string) =>
      app.scripts.some((script) => script.initial && script.holds.includes(what)) ? 'yes' : 'no';
    const engineFetched = app.scripts.some((script) => script.fetched && script.holds.includes('cp/api'));
    return `| ${DEALER_APPS[variant]} | ${kB(app.firstLoad)} | ${kB(app.visit)} | ${kB(app.built)} | ${inFirstLoad('HttpClient')} | ${engineFetched ? 'yes' : 'no'} |`;
  });
  return [
    '| dealer app with the weight calculator | first load, gzipped kB | a visit left idle, gzipped kB | every script built, gzipped kB | HttpClient in the first load | engine and schemas fetched |',
    '| --- | ---: | ---: | ---: | :---: | :---: |',
    ...rows,
  ].join('\n');
}

/** Each script of each dealer app: when it loads and what it holds. */
function scriptsList(apps: ReadonlyMap<DealerAppVariant, DealerAppSizes>): string {
  return [...apps]
    .map(([variant, app]) =>
      [
        `${variant}:`,
        ...app.scripts.map(
          (script) =>
            `  ${script.initial ? 'first load' : script.fetched ? 'when idle ' : 'not loaded'}  ${kB(script.gzipped).padStart(6)} kB  ${script.holds || '(shared helpers)'}`,
        ),
      ].join('\n'),
    )
    .join('\n');
}

function section(sizes: readonly EntrySize[], apps: ReadonlyMap<DealerAppVariant, DealerAppSizes>): string {
  return [
    START,
    '## Widget sizes',
    '',
    "What each entry point of `@counterpoise/ng` adds to a dealer's app beyond Angular, the CDK, Material, rxjs",
    'and tslib. Each entry of the built package is bundled alone with esbuild as an app build does (ES modules,',
    'minified, split at dynamic imports, every export kept, so an app that imports less pays less); each file',
    'is gzipped at level 9. "First load" is what a page loads with the widget: the entry and everything it',
    'imports statically, other entries of the package included (the calculator embeds the dial and the',
    'overlay). "Loaded when idle" is what the entry imports dynamically: `@counterpoise/ng/api` (zod, the',
    'schemas, the engine), which the local engine starts loading once the browser is idle, so that it is there',
    'for the first calculation and for work without a connection later (the remote engine never loads it);',
    'and the calculator\'s overlay. "Own code" leaves the other entries and zod out. Target: under 30 kB',
    'gzipped per widget at first load.',
    '',
    'Command: `npm run build:lib && npm run bench:sizes` (updates this section).',
    '',
    sizesTable(sizes),
    '',
    "A dealer's app, Angular included: one page with the weight calculator, built by the Angular CLI",
    '(production) against the built package, served and opened in headless Chromium with a fresh profile and',
    'left alone for 5 s. "First load" is the scripts of its `index.html`; "a visit left idle" adds what the',
    'page fetched on its own after that; "every script built" adds what only a need loads (the engine, for the',
    'remote app: only when the service cannot be reached and the calculator offers the device). Scripts',
    'gzipped at level 9, each apart.',
    '',
    appsTable(apps),
    '',
    '```text',
    scriptsList(apps),
    '```',
    '',
    `Measured ${new Date().toISOString().slice(0, 10)} on Node ${process.versions.node}.`,
    END,
  ].join('\n');
}

/** Replaces the widget-sizes section of docs/benchmarks.md, or appends it; other sections stay as they are. */
function withSection(document: string, replacement: string): string {
  const start = document.indexOf(START);
  const end = document.indexOf(END);
  if (start !== -1 && end > start) {
    return document.slice(0, start) + replacement + document.slice(end + END.length);
  }
  return `${document.trimEnd()}\n\n${replacement}\n`;
}

if (!existsSync(join(LIBRARY, 'package.json'))) {
  console.error('dist/counterpoise is not built: run `npm run build:lib` first.');
  process.exit(1);
}
const sizes = await measureEntries();
console.log(sizesTable(sizes));
const apps = new Map<DealerAppVariant, DealerAppSizes>();
for (const variant of ['remote', 'default'] as const) {
  apps.set(variant, await measureDealerApp(ROOT, LIBRARY, variant));
}
console.log(`\n${appsTable(apps)}\n\n${scriptsList(apps)}`);
const current = existsSync(DOC) ? readFileSync(DOC, 'utf8') : '# Benchmarks\n';
writeFileSync(DOC, withSection(current, section(sizes, apps)));
console.log(`\nWritten to ${DOC}.`);
