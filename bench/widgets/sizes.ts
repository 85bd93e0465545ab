// `npm run bench:sizes`: what each entry point of @counterpoise/ng costs a dealer's app beyond Angular and
// Material. Each entry of the built package (dist/counterpoise, `npm run build:lib`) is linked by Angular's
// linker as an app build would, bundled alone with esbuild (production mode, every export kept, minified);
// the sizes go to the console and to the "Widget sizes" section of docs/benchmarks.md. A figure, not a
// test: the target (under 30 kB gzipped per widget) is read, not asserted.
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { constants, gzipSync } from 'node:zlib';
import { transformAsync } from '@babel/core';
import { createEs2015LinkerPlugin } from '@angular/compiler-cli/linker/babel';
import { build, type Plugin } from 'esbuild';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const LIBRARY = join(ROOT, 'dist', 'counterpoise');
const DOC = join(ROOT, 'docs', 'benchmarks.md');
const TARGET_GZIP_BYTES = 30 * 1024;
const START = '<!-- widget-sizes:start -->';
const END = '<!-- widget-sizes:end -->';

/** Angular (with the CDK and Material), rxjs and tslib: what every Angular app already pays for. */
const FRAMEWORK = ['@angular/*', 'rxjs', 'rxjs/*', 'tslib'];
/** The shared packages the engine-backed entries import, and zod beneath them. */
const SHARED = ['@counterpoise/api', '@counterpoise/engine', 'zod', 'zod/*'];

/** One entry point's cost, in bytes. */
interface EntrySize {
  /** The import path, e.g. `@counterpoise/ng/phase-dial`. */
  readonly entry: string;
  /** Minified, with @counterpoise/api, @counterpoise/engine and zod bundled in. */
  readonly minified: number;
  /** The same, gzipped. */
  readonly gzipped: number;
  /** Minified, with the shared packages left out (a page that already loads them pays only this). */
  readonly minifiedOwn: number;
  /** The same, gzipped. */
  readonly gzippedOwn: number;
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
 * Resolves `@counterpoise/ng[/entry]` to the built bundles through the package's own `exports`, links
 * them, and resolves the shared packages to dist/ or leaves them out.
 */
function builtLibrary(exportsField: Record<string, { default: string }>, withShared: boolean): Plugin {
  return {
    name: 'counterpoise-dist',
    setup(context) {
      context.onResolve({ filter: /^@counterpoise\/ng(\/.*)?$/ }, ({ path }) => {
        const key = `.${path.slice('@counterpoise/ng'.length)}`;
        const target = exportsField[key];
        if (!target) return { errors: [{ text: `dist/counterpoise exports no "${key}"` }] };
        return { path: join(LIBRARY, target.default) };
      });
      context.onResolve({ filter: /^@counterpoise\/(api|engine)$/ }, ({ path }) =>
        withShared
          ? { path: join(ROOT, 'dist', path.slice('@counterpoise/'.length), 'index.js') }
          : { path, external: true },
      );
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

async function bundledBytes(entry: string, plugin: Plugin, external: string[]): Promise<Uint8Array> {
  const result = await build({
    stdin: { contents: `export * from '${entry}';`, resolveDir: ROOT, loader: 'js' },
    bundle: true,
    write: false,
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
  return result.outputFiles[0]!.contents;
}

const gzip = (bytes: Uint8Array) => gzipSync(bytes, { level: constants.Z_BEST_COMPRESSION }).byteLength;

/** Measures every runtime entry of the built package; harness entries (`…/testing`) ship to tests only. */
async function measureEntries(): Promise<EntrySize[]> {
  const manifest = JSON.parse(readFileSync(join(LIBRARY, 'package.json'), 'utf8'));
  const exportsField = manifest.exports as Record<string, { default: string }>;
  const withShared = builtLibrary(exportsField, true);
  const withoutShared = builtLibrary(exportsField, false);
  const keys = Object.keys(exportsField).filter((key) => key.startsWith('./') && !key.endsWith('/testing'));
  const sizes: EntrySize[] = [];
  for (const key of keys.filter((key) => key !== './package.json')) {
    const entry = `@counterpoise/ng/${key.slice(2)}`;
    const all = await bundledBytes(entry, withShared, FRAMEWORK);
    const own = await bundledBytes(entry, withoutShared, [...FRAMEWORK, ...SHARED]);
    sizes.push({
      entry,
      minified: all.byteLength,
      gzipped: gzip(all),
      minifiedOwn: own.byteLength,
      gzippedOwn: gzip(own),
    });
  }
  return sizes;
}

const kB = (bytes: number) => (bytes / 1024).toFixed(1);

/** The Markdown table of the sizes, with a verdict against the target per row. */
function sizesTable(sizes: readonly EntrySize[]): string {
  const rows = sizes.map(
    (s) =>
      `| \`${s.entry}\` | ${kB(s.minified)} | ${kB(s.gzipped)} | ${kB(s.minifiedOwn)} | ${kB(s.gzippedOwn)} | ${
        s.gzipped <= TARGET_GZIP_BYTES ? 'yes' : '**no**'
      } |`,
  );
  return [
    '| entry point | minified kB | gzipped kB | minified kB, shared packages apart | gzipped kB, shared packages apart | under 30 kB gzipped |',
    '| --- | ---: | ---: | ---: | ---: | :---: |',
    ...rows,
  ].join('\n');
}

function section(sizes: readonly EntrySize[]): string {
  return [
    START,
    '## Widget sizes',
    '',
    "What each entry point of `@counterpoise/ng` adds to a dealer's app beyond Angular, the CDK, Material, rxjs",
    'and tslib. Each entry of the built package is bundled alone with esbuild (ES modules, minified, every',
    'export kept, so an app that imports less pays less) and gzipped at level 9. An entry counts what it',
    'imports from other entries of the package (the widgets share `core`). The first two columns count',
    '`@counterpoise/api`, `@counterpoise/engine` and zod in; the last two leave them out, as for a page that',
    'already loads them for another widget. Target: under 30 kB gzipped per widget (first gzipped column).',
    '',
    'Command: `npm run build:lib && npm run bench:sizes` (updates this section).',
    '',
    sizesTable(sizes),
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
const current = existsSync(DOC) ? readFileSync(DOC, 'utf8') : '# Benchmarks\n';
writeFileSync(DOC, withSection(current, section(sizes)));
console.log(`\nWritten to ${DOC}.`);
