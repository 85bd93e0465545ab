// `node scripts/compress-static.mjs <dir>`: compresses a built app once, at build time, so that the server
// sends a ready file instead of compressing each response. Beside every compressible file of at least
// 1 kB it writes `<file>.br` (brotli, quality 11) and `<file>.gz` (gzip, level 9), each kept only when it
// is smaller than the file; then prints the raw, gzip and brotli totals per kind of file.
//
// Compressible: scripts, styles, HTML, SVG, JSON, the web app manifest and text. Left alone: source maps
// (never sent to a browser here), and fonts and pictures (woff2, png, webp, jpg: compressed already).
// The server (serveWorkbench in server/src/app.ts) picks `.br`, then `.gz`, then the file itself, by the
// request's Accept-Encoding. Node's zlib only.
import { readdir, readFile, rm, stat, writeFile } from 'node:fs/promises';
import { extname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { brotliCompress, constants, gzip } from 'node:zlib';

const COMPRESSIBLE = new Set(['.js', '.mjs', '.css', '.html', '.svg', '.json', '.webmanifest', '.txt']);
/** Under this size the headers outweigh what compression saves. */
const MIN_BYTES = 1024;

const brotli = promisify(brotliCompress);
const gzipAsync = promisify(gzip);

/** Every file under `dir`, as absolute paths. */
async function filesUnder(dir) {
  const entries = await readdir(dir, { withFileTypes: true, recursive: true });
  return entries.filter((entry) => entry.isFile()).map((entry) => join(entry.parentPath, entry.name));
}

/** Writes `file + suffix` when `packed` is smaller than the raw file, and removes a stale one otherwise. */
async function keepIfSmaller(file, suffix, raw, packed) {
  if (packed.length < raw.length) {
    await writeFile(file + suffix, packed);
    return packed.length;
  }
  await rm(file + suffix, { force: true });
  return raw.length;
}

/**
 * Compresses every compressible file under `dir`; resolves with one row per file:
 * `{ path, raw, gzip, brotli }` in bytes (a size equal to `raw` where no smaller copy was kept).
 */
export async function compressStatic(dir) {
  const root = resolve(dir);
  const files = (await filesUnder(root)).filter((file) => COMPRESSIBLE.has(extname(file).toLowerCase()));
  const rows = [];
  for (const file of files) {
    const raw = await readFile(file);
    if (raw.length < MIN_BYTES) continue;
    const [br, gz] = await Promise.all([
      brotli(raw, {
        params: {
          [constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT,
          [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY,
          [constants.BROTLI_PARAM_SIZE_HINT]: raw.length,
        },
      }),
      gzipAsync(raw, { level: constants.Z_BEST_COMPRESSION }),
    ]);
    rows.push({
      path: relative(root, file),
      raw: raw.length,
      gzip: await keepIfSmaller(file, '.gz', raw, gz),
      brotli: await keepIfSmaller(file, '.br', raw, br),
    });
  }
  return rows;
}

/** The table printed after a build: one line per kind of file, then the total. */
export function printTable(rows) {
  const byKind = new Map();
  for (const row of rows) {
    const kind = extname(row.path).toLowerCase();
    const sum = byKind.get(kind) ?? { files: 0, raw: 0, gzip: 0, brotli: 0 };
    byKind.set(kind, {
      files: sum.files + 1,
      raw: sum.raw + row.raw,
      gzip: sum.gzip + row.gzip,
      brotli: sum.brotli + row.brotli,
    });
  }
  const total = [...byKind.values()].reduce(
    (sum, kind) => ({
      files: sum.files + kind.files,
      raw: sum.raw + kind.raw,
      gzip: sum.gzip + kind.gzip,
      brotli: sum.brotli + kind.brotli,
    }),
    { files: 0, raw: 0, gzip: 0, brotli: 0 },
  );
  const kB = (bytes) => `${(bytes / 1000).toFixed(1)} kB`.padStart(12);
  const line = (name, sum) =>
    `  ${name.padEnd(14)}${String(sum.files).padStart(6)}${kB(sum.raw)}${kB(sum.gzip)}${kB(sum.brotli)}`;
  console.log(
    `  ${'kind'.padEnd(14)}${'files'.padStart(6)}${'raw'.padStart(12)}${'gzip'.padStart(12)}${'brotli'.padStart(12)}`,
  );
  for (const [kind, sum] of [...byKind].sort(([a], [b]) => a.localeCompare(b))) console.log(line(kind, sum));
  console.log(line('total', total));
}

// Run as a script (not imported by scripts/build-app.mjs).
const isMain = process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const dir = process.argv[2];
  if (!dir || !(await stat(dir).catch(() => null))?.isDirectory()) {
    console.error('Usage: node scripts/compress-static.mjs <folder of the built app>');
    process.exit(2);
  }
  const rows = await compressStatic(dir);
  console.log(
    `\nCompressed ${rows.length} files under ${dir} (brotli 11, gzip 9; files under 1 kB left alone):`,
  );
  printTable(rows);
}
