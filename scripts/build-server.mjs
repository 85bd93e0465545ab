// `node scripts/build-server.mjs [--out <dir>] [--entry <name>=<file>]…`: compiles the server to JavaScript once, so that
// production runs `node dist/server/main.js` instead of compiling TypeScript at every start (tsx).
// esbuild bundles our own code (server/ and shared/, the path aliases of tsconfig.json resolved) into
// two ES modules: main.js, and usage-writer.thread.js, the usage log's writer thread, which the
// compiled usage-writer.js starts from beside itself. Packages stay in node_modules (imported at run
// time), as does everything the server reads from the repository at run time: a
// `new URL('<file>', import.meta.url)` that names a file of the source tree (the migrations, the list
// of common passwords, package.json) is rewritten to the same file read from the repository's root, so
// the compiled server finds them where the source server does. `--entry` adds an entry of its own beside
// those two, for a program that runs the server as production does (`bench/api/run.ts` builds its
// targets so); its output must stay inside the repository, where the packages are found.
import { existsSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

const root = fileURLToPath(new URL('..', import.meta.url));
const outAt = process.argv.indexOf('--out');
const outdir = resolve(root, outAt === -1 ? 'dist/server' : process.argv[outAt + 1]);
const extraEntries = Object.fromEntries(
  process.argv.flatMap((argument, at) =>
    process.argv[at - 1] === '--entry' ? [argument.split('=', 2)] : [],
  ),
);
const started = Date.now();

/** `new URL('<relative path>', import.meta.url)` in a source file. */
const RELATIVE_URL = /new URL\((['"])(\.{1,2}\/[^'"]+)\1,\s*import\.meta\.url\)/g;

/** Points a source file's relative URLs of repository files at the repository's root, from `outdir`. */
const repositoryFiles = {
  name: 'repository-files',
  setup(builder) {
    builder.onLoad({ filter: /\.ts$/ }, async ({ path }) => {
      const source = await readFile(path, 'utf8');
      if (!source.includes('import.meta.url')) return undefined;
      const contents = source.replace(RELATIVE_URL, (whole, _quote, target) => {
        const file = join(dirname(path), target);
        // Code that is compiled (the writer thread's entry) is found beside the bundle instead.
        if (!existsSync(file) || /\.(m?js|ts)$/.test(file)) return whole;
        const fromOut = relative(outdir, file).split('\\').join('/');
        return `new URL(${JSON.stringify(fromOut)}, import.meta.url)`;
      });
      return { contents, loader: 'ts' };
    });
  },
};

await build({
  absWorkingDir: root,
  entryPoints: {
    main: 'server/src/main.ts',
    'usage-writer.thread': 'server/src/usage/usage-writer.thread.ts',
    ...extraEntries,
  },
  outdir,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  packages: 'external',
  tsconfig: 'tsconfig.json',
  sourcemap: true,
  logLevel: 'warning',
  plugins: [repositoryFiles],
});
console.log(
  `The server compiled to ${relative(root, outdir) || '.'}/main.js in ${((Date.now() - started) / 1000).toFixed(1)} s.`,
);
