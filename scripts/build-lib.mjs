// `npm run build:lib`: builds @counterpoise/ng into dist/counterpoise as the one package a dealer installs.
// The balancing engine (shared/engine) and the API schemas (shared/api) are entry points of that package,
// @counterpoise/ng/engine and @counterpoise/ng/api, compiled by ng-packagr from their sources in shared/
// (projects/counterpoise/engine/ and api/ hold only their ng-package.json), so an install never asks a
// registry for another @counterpoise package.
//
// 1. The engine's declarations go to out-tsc/engine-types: shared/api imports the engine under its
//    workspace name, @counterpoise/engine, which the library's tsconfig resolves there (ng-packagr compiles
//    each entry within its own folder, so the api entry cannot take the engine's sources into its program).
// 2. `ng build counterpoise` (ng-packagr, partial compilation).
// 3. In the built api entry, that one import is renamed to the package's own entry, @counterpoise/ng/engine;
//    then no file of the package may import @counterpoise/engine or @counterpoise/api any more.
import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const dist = join(root, 'dist', 'counterpoise');
const tsc = join(root, 'node_modules', 'typescript', 'bin', 'tsc');
const ng = join(root, 'node_modules', '@angular', 'cli', 'bin', 'ng.js');

/** Runs a Node script to its end, or stops the build with its message and exit code. */
function step(what, args) {
  const result = spawnSync(process.execPath, args, {
    cwd: root,
    stdio: 'inherit',
    env: { NG_CLI_ANALYTICS: 'false', ...process.env },
  });
  if (result.status !== 0) {
    console.error(`\n${what} failed.`);
    process.exit(result.status ?? 1);
  }
}

/** Every file below `dir`. */
function filesBelow(dir) {
  return readdirSync(dir, { withFileTypes: true, recursive: true })
    .filter((entry) => entry.isFile())
    .map((entry) => join(entry.parentPath, entry.name));
}

rmSync(join(root, 'out-tsc', 'engine-types'), { recursive: true, force: true });
step('The engine declarations', [tsc, '-p', join(root, 'shared', 'engine', 'tsconfig.build.json')]);
step('The library build', [ng, 'build', 'counterpoise']);

// An import or export of a module by name: `from '…'`, `import('…')`, `import '…'`.
const WORKSPACE_NAME = /(\bfrom\s*|\bimport\s*\(\s*|\bimport\s+)(['"])@counterpoise\/(engine|api)\2/g;
const code = filesBelow(dist).filter((path) => /\.(mjs|d\.ts)$/.test(path));
for (const path of code) {
  const text = readFileSync(path, 'utf8');
  const renamed = text.replace(WORKSPACE_NAME, (_, keyword, quote, name) =>
    name === 'engine' ? `${keyword}${quote}@counterpoise/ng/engine${quote}` : _,
  );
  if (renamed !== text) writeFileSync(path, renamed);
}
const leftOver = code.filter((path) => new RegExp(WORKSPACE_NAME.source).test(readFileSync(path, 'utf8')));
if (leftOver.length > 0) {
  console.error(
    `\nThese files of the package still import @counterpoise/engine or @counterpoise/api, which no registry has:\n` +
      leftOver.map((path) => `  ${relative(root, path)}`).join('\n'),
  );
  process.exit(1);
}
console.log(`\n@counterpoise/ng → ${relative(root, dist)} (the engine and the API schemas inside it).`);
