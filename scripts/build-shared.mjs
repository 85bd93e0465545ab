// `npm run build:shared`: builds shared/engine and shared/api into dist/engine and dist/api as two real
// npm packages (@counterpoise/engine, @counterpoise/api), one ES module bundle and its declarations each.
// The widget library's build imports them from there, as a dealer's app imports them from npm: ng-packagr
// cannot compile sources outside the library's root.
import { spawnSync } from 'node:child_process';
import { copyFileSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

const root = fileURLToPath(new URL('..', import.meta.url));
const tsc = join(root, 'node_modules', 'typescript', 'bin', 'tsc');

/** In dependency order: the API's declarations read the engine's. */
const packages = ['engine', 'api'];

for (const name of packages) {
  const source = join(root, 'shared', name);
  const out = join(root, 'dist', name);
  const manifest = JSON.parse(readFileSync(join(source, 'package.json'), 'utf8'));
  rmSync(out, { recursive: true, force: true });

  await build({
    entryPoints: [join(source, 'index.ts')],
    outfile: join(out, 'index.js'),
    bundle: true,
    format: 'esm',
    platform: 'neutral',
    target: 'es2022',
    sourcemap: true,
    // What the package depends on stays an import, resolved by the consumer's own install.
    external: Object.keys(manifest.dependencies ?? {}),
    logLevel: 'warning',
  });

  const declarations = spawnSync(process.execPath, [tsc, '-p', join(source, 'tsconfig.build.json')], {
    cwd: root,
    stdio: 'inherit',
  });
  if (declarations.status !== 0) {
    console.error(`\nThe declarations of ${manifest.name} did not compile.`);
    process.exit(declarations.status ?? 1);
  }

  copyFileSync(join(source, 'package.json'), join(out, 'package.json'));
  console.log(`${manifest.name}@${manifest.version} → dist/${name}`);
}
