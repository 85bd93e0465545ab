// `node scripts/build-app.mjs [ng build options]`: the production build of the workbench as users get it,
// the one command that `npm run build:app`, `npm start` and `npm test` run. Two steps:
//
// 1. `ng build workbench` with Angular's chunk optimizer on (NG_BUILD_OPTIMIZE_CHUNKS=1, an option of
//    @angular/build read from the environment): it merges the many small chunks that code splitting
//    leaves into few, so that the first load makes a dozen requests instead of forty. Over HTTP/1.1 each
//    request costs a round trip and about 1 kB of headers, which weighed more than the code in most of them.
// 2. scripts/preload-fonts.mjs: `index.html` preloads the fonts of the first page (their names are hashed).
// 3. scripts/compress-static.mjs over the output: brotli and gzip copies beside the files.
//
// Options are handed to `ng build` (`--output-path /tmp/me/dist`, `--configuration development`); the
// compressed copies go beside the files in `<output path>/browser`.
import { spawnSync } from 'node:child_process';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { compressStatic, printTable } from './compress-static.mjs';
import { preloadFirstPageFonts } from './preload-fonts.mjs';

const root = fileURLToPath(new URL('..', import.meta.url));
const ng = join(root, 'node_modules', '@angular', 'cli', 'bin', 'ng.js');
const args = process.argv.slice(2);

/** The folder `ng build` writes to: `--output-path X` or `--output-path=X`, else angular.json's. */
function outputPath() {
  const at = args.findIndex((arg) => arg === '--output-path' || arg.startsWith('--output-path='));
  if (at < 0) return join(root, 'dist', 'workbench');
  const arg = args[at];
  return resolve(arg.includes('=') ? arg.slice(arg.indexOf('=') + 1) : (args[at + 1] ?? ''));
}

const build = spawnSync(process.execPath, [ng, 'build', 'workbench', ...args], {
  cwd: root,
  stdio: 'inherit',
  env: { NG_CLI_ANALYTICS: 'false', ...process.env, NG_BUILD_OPTIMIZE_CHUNKS: '1' },
});
if (build.status !== 0) process.exit(build.status ?? 1);

const browserDir = join(outputPath(), 'browser');
const preloaded = await preloadFirstPageFonts(browserDir);
console.log(`\nindex.html preloads ${preloaded.join(', ')}`);
const rows = await compressStatic(browserDir);
console.log(
  `\nCompressed ${rows.length} files in ${browserDir} (brotli 11, gzip 9; files under 1 kB left alone):`,
);
printTable(rows);
