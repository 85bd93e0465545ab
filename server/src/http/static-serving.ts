import { existsSync, statSync } from 'node:fs';
import type { ServerResponse } from 'node:http';
import { basename, extname, join, resolve } from 'node:path';
import type { Express, RequestHandler } from 'express';
import expressStaticGzip from 'express-static-gzip';
import { HttpProblem } from './problem';

/**
 * A file whose name carries the hash of its content, so never changes: Angular's `outputHashing` names
 * (`main-QJ4TBAFZ.js`; the chunk optimizer of scripts/build-app.mjs writes base64url ones,
 * `chunk-B_bxu6eo.js`).
 */
const HASHED_FILE = /-[A-Za-z0-9_-]{8}\.(js|css)$/;

/** The files whose name stays while their content changes, whatever their name looks like. */
const NEVER_HASHED = new Set([
  'ngsw-worker.js',
  'safety-worker.js',
  'worker-basic.min.js',
  'color-scheme.js',
]);

/** The extensions of the build's own files: a path ending so asks for a file, never for a page. */
const FILE_EXTENSIONS = new Set([
  '.js',
  '.mjs',
  '.css',
  '.map',
  '.json',
  '.webmanifest',
  '.html',
  '.txt',
  '.svg',
  '.png',
  '.ico',
  '.webp',
  '.jpg',
  '.woff2',
  '.br',
  '.gz',
]);

/** Where a compressed copy (`x.js.br`, `x.js.gz`) is sent, its caching is the raw file's. */
function rawPath(path: string): string {
  return path.replace(/\.(br|gz)$/, '');
}

/**
 * Caching: files named by their content's hash (and what Angular puts in `media/`) for a year,
 * `immutable`; every other file `no-cache`, to be checked again on each use. The other files are the
 * ones whose name stays while their content changes: `index.html`, the web app manifest, the icons,
 * and what the Angular service worker reads to learn of a new version (`ngsw-worker.js`, `ngsw.json`,
 * `safety-worker.js`, `worker-basic.min.js`), which must never come from a stale HTTP cache.
 */
function setCacheHeaders(res: ServerResponse, path: string): void {
  const raw = rawPath(path);
  const hashed = !NEVER_HASHED.has(basename(raw)) && (HASHED_FILE.test(raw) || raw.includes('/media/'));
  res.setHeader('Cache-Control', hashed ? 'public, max-age=31536000, immutable' : 'no-cache');
}

/**
 * express-static-gzip over the build: it lists the compressed copies (`.br`, `.gz` from
 * scripts/compress-static.mjs) when built, so the list is built again when the build changes (a new
 * `index.html`), and a build made while the server runs is sent compressed too. `setHeaders` sets the
 * caching of a file (the workbench's rules by default).
 */
export function compressedFiles(
  root: string,
  setHeaders: (res: ServerResponse, path: string) => void = setCacheHeaders,
): RequestHandler {
  const indexFile = join(root, 'index.html');
  let built: { stamp: number; serve: RequestHandler } | undefined;
  return (req, res, next) => {
    const stamp = existsSync(indexFile) ? statSync(indexFile).mtimeMs : 0;
    if (built?.stamp !== stamp) {
      built = {
        stamp,
        serve: expressStaticGzip(root, {
          enableBrotli: true,
          orderPreference: ['br', 'gzip'],
          index: false,
          serveStatic: { index: false, dotfiles: 'ignore', redirect: false, setHeaders },
        }),
      };
    }
    built.serve(req, res, next);
  };
}

/** Whether a request path could be one of the app's own pages (no file extension of the build's). */
function isClientRoute(path: string): boolean {
  return !FILE_EXTENSIONS.has(extname(path).toLowerCase());
}

/**
 * Serves the built workbench with content negotiation: the brotli copy of a file when the browser takes
 * `br`, else the gzip copy, else the file itself, with `Vary: Accept-Encoding` and the raw file's
 * Content-Type. Every GET of a page (a path with no file extension that asks for HTML) is answered with
 * `index.html`, through the same negotiation, so that deep links reach the app's router. A file that
 * the build does not hold is a 404 problem; nothing outside the build folder is ever sent, and no
 * folder is listed.
 */
export function serveWorkbench(app: Express, staticDir: string): void {
  const root = resolve(staticDir);
  const indexFile = join(root, 'index.html');
  const serveFile = compressedFiles(root);

  app.use((req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      next();
      return;
    }
    try {
      decodeURIComponent(req.path);
    } catch {
      next(new HttpProblem(400, 'Bad Request', `The path ${req.path} is not a valid URL path.`));
      return;
    }
    serveFile(req, res, next);
  });

  app.get('/{*splat}', (req, res, next) => {
    if (!isClientRoute(req.path) || !req.accepts('html')) {
      next();
      return;
    }
    if (!existsSync(indexFile)) {
      res
        .status(503)
        .type('text/plain')
        .send('The workbench is not built yet. Run `npm run build`, or `npm start` to build and serve.');
      return;
    }
    const url = req.url;
    req.url = '/index.html';
    serveFile(req, res, (error?: unknown) => {
      req.url = url;
      next(error);
    });
  });

  app.get('/{*splat}', (req, _res, next) => {
    next(new HttpProblem(404, 'Not Found', `The workbench has no file ${req.path}.`));
  });
}
