// `npm run docs:build [-- --output-path <dir>] [-- --no-widgets]`: builds the docs site into `dist/docs`
// (or <dir>), which the server serves at /docs:
// 1. VitePress over docs/ (config in docs/.vitepress/config.mts): the pages, and their full-text search
//    index, built with the site (no network at build or run time).
// 2. The samples the pages link to (docs/samples/*.csv), copied beside the pages.
// 3. The widget catalogue: the static Storybook (`ng run counterpoise:build-storybook`) in `widgets/`,
//    every story with its controls and accessibility panel. Its docgen server gives each component two
//    minutes, which a machine far above its two cores' load can exceed: a failed build is tried once more.
//    `--no-widgets` leaves it out (a quicker build while writing pages).
// 4. `content-security.json`: the SHA-256 hash of every inline script of the built pages (VitePress's
//    colour-scheme check, Storybook's set-up), which the server's Content-Security-Policy for /docs
//    allows, and no other inline script.
// 5. scripts/compress-static.mjs: brotli and gzip copies beside the files, as for the workbench.
// Prints how long each step took.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { cpSync, existsSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { compressStatic, printTable } from './compress-static.mjs';

const root = fileURLToPath(new URL('..', import.meta.url));
const args = process.argv.slice(2);
const outputAt = args.indexOf('--output-path');
const outDir = resolve(root, outputAt >= 0 ? args[outputAt + 1] : 'dist/docs');
const withWidgets = !args.includes('--no-widgets');
const env = { ...process.env, NG_CLI_ANALYTICS: 'false', STORYBOOK_DISABLE_TELEMETRY: 'true' };

const timings = [];
/**
 * Runs a step's command, once per entry of `attempts` (extra environment of each) until one succeeds;
 * exits with the last code when none does.
 */
function step(name, command, commandArgs, attempts = [{}]) {
  const started = Date.now();
  for (const [index, attempt] of attempts.entries()) {
    const note = attempts.length > 1 ? ` (attempt ${index + 1} of ${attempts.length})` : '';
    console.log(`\n▶ ${name}${note}`);
    if (attempt.note) console.warn(attempt.note);
    const run = spawnSync(command, commandArgs, {
      cwd: root,
      env: { ...env, ...attempt.env },
      stdio: 'inherit',
    });
    if (run.status === 0) {
      timings.push([name, (Date.now() - started) / 1000]);
      return;
    }
    console.error(`${name} failed (exit ${run.status ?? run.signal}).`);
  }
  process.exit(1);
}

const started = Date.now();
rmSync(outDir, { recursive: true, force: true });

step(
  'Pages (VitePress)',
  process.execPath,
  [join(root, 'node_modules/vitepress/bin/vitepress.js'), 'build', 'docs'],
  [{ env: { DOCS_OUT_DIR: outDir } }],
);

cpSync(join(root, 'docs/samples'), join(outDir, 'samples'), { recursive: true });

if (withWidgets) {
  step(
    'Widget catalogue (Storybook)',
    process.execPath,
    [
      join(root, 'node_modules/@angular/cli/bin/ng.js'),
      'run',
      'counterpoise:build-storybook',
      '--output-dir',
      join(outDir, 'widgets'),
      '--quiet',
    ],
    // A second try when the first fails: on a machine under heavy load the docgen step can time out.
    [{}, {}],
  );
}

/** Every file under `dir` whose name ends in `.html`. */
function htmlFiles(dir) {
  return readdirSync(dir, { withFileTypes: true, recursive: true })
    .filter((entry) => entry.isFile() && entry.name.endsWith('.html'))
    .map((entry) => join(entry.parentPath, entry.name));
}

// An inline script is `<script>` with no `src`; its hash is over the exact text between the tags.
const INLINE_SCRIPT = /<script\b(?![^>]*\bsrc=)[^>]*>([\s\S]*?)<\/script>/gi;
const hashes = new Set();
for (const file of htmlFiles(outDir)) {
  for (const [, body] of readFileSync(file, 'utf8').matchAll(INLINE_SCRIPT)) {
    if (body.trim() === '') continue;
    hashes.add(`'sha256-${createHash('sha256').update(body, 'utf8').digest('base64')}'`);
  }
}
writeFileSync(
  join(outDir, 'content-security.json'),
  `${JSON.stringify({ scriptHashes: [...hashes].sort() }, null, 2)}\n`,
);

const compressStarted = Date.now();
printTable(await compressStatic(outDir));
timings.push(['Compressed copies', (Date.now() - compressStarted) / 1000]);

console.log(
  `\nDocs site in ${outDir}${existsSync(join(outDir, 'widgets')) ? ', widget catalogue in widgets/' : ''}`,
);
for (const [name, seconds] of timings) console.log(`  ${name.padEnd(32)}${seconds.toFixed(1)} s`);
console.log(`  ${'total'.padEnd(32)}${((Date.now() - started) / 1000).toFixed(1)} s`);
