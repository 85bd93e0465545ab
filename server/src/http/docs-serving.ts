import { existsSync, readFileSync, statSync } from 'node:fs';
import type { ServerResponse } from 'node:http';
import { extname, join, resolve, sep } from 'node:path';
import { type Express, type RequestHandler, Router } from 'express';
import { HttpProblem } from './problem';
import { compressedFiles } from './static-serving';

/** Where the docs site is served. */
export const DOCS_BASE_PATH = '/docs';

/**
 * A file of the docs site named by its content's hash: VitePress's `assets/app.BvXz12Ab.js`, Storybook's
 * `assets/iframe-C4Pwhtxe.js` and the fonts beside them. Only files under an `assets/` folder: the pages,
 * the search index's loader and Storybook's own manager files keep their names from build to build.
 */
const HASHED_ASSET = /\/assets\/(?:.*\/)?[^/]+[.-][A-Za-z0-9_-]{8}\.(?:js|css|woff2?)$/;

/** Caching: hashed assets for a year, `immutable`; pages and everything else checked again on each use. */
function setDocsCacheHeaders(res: ServerResponse, path: string): void {
  const raw = path
    .replace(/\.(br|gz)$/, '')
    .split(sep)
    .join('/');
  res.setHeader('Cache-Control', HASHED_ASSET.test(raw) ? 'public, max-age=31536000, immutable' : 'no-cache');
}

/**
 * The Content-Security-Policy of the docs: helmet's defaults for the pages (scripts from the site itself,
 * no plugins, no other site framing them), plus the inline scripts whose SHA-256 the build listed in
 * `content-security.json` (VitePress's colour-scheme check before the page paints, Storybook's set-up) and
 * no other. The widget catalogue also needs `'unsafe-eval'`: Storybook's Angular renderer compiles each
 * story's template in the browser (Angular's JIT compiler builds functions from text). The catalogue holds
 * our own stories only, nothing a visitor types or uploads.
 */
function contentSecurityPolicy(scriptHashes: readonly string[], widgets: boolean): string {
  const scripts = ["'self'", ...scriptHashes, ...(widgets ? ["'unsafe-eval'"] : [])];
  return [
    "default-src 'self'",
    "base-uri 'self'",
    "font-src 'self' data:",
    "form-action 'self'",
    "frame-ancestors 'self'",
    "img-src 'self' data: blob:",
    "object-src 'none'",
    `script-src ${scripts.join(' ')}`,
    "script-src-attr 'none'",
    "style-src 'self' 'unsafe-inline'",
    "worker-src 'self' blob:",
  ].join(';');
}

/** Reads the build's list of inline-script hashes again whenever the site is built again. */
function scriptHashesOf(root: string): () => readonly string[] {
  const indexFile = join(root, 'index.html');
  const listFile = join(root, 'content-security.json');
  let read: { stamp: number; hashes: readonly string[] } | undefined;
  return () => {
    const stamp = existsSync(indexFile) ? statSync(indexFile).mtimeMs : 0;
    if (read?.stamp !== stamp) {
      let hashes: readonly string[] = [];
      try {
        const parsed = JSON.parse(readFileSync(listFile, 'utf8')) as { scriptHashes?: unknown };
        if (Array.isArray(parsed.scriptHashes)) {
          hashes = parsed.scriptHashes.filter(
            (hash): hash is string => typeof hash === 'string' && /^'sha256-[A-Za-z0-9+/=]+'$/.test(hash),
          );
        }
      } catch {
        hashes = [];
      }
      read = { stamp, hashes };
    }
    return read.hashes;
  };
}

/** The file under `root` that a path names, if it is a file there (never anything outside `root`). */
function fileAt(root: string, path: string): string | undefined {
  const file = resolve(root, `.${path}`);
  if (file !== root && !file.startsWith(root + sep)) return undefined;
  return existsSync(file) && statSync(file).isFile() ? file : undefined;
}

/**
 * Serves the docs site (`npm run docs:build`, `dist/docs`) at `/docs`, with the workbench's compression
 * (the brotli or gzip copy the build wrote, by Accept-Encoding) and a caching rule of its own. Clean
 * addresses: `/docs/methods` is the page `methods.html`, `/docs/field-guide` moves to `/docs/field-guide/`
 * (its `index.html`, so that relative addresses in it resolve), and `/docs` to `/docs/`. A path that names
 * no file of the site is a 404 problem: nothing under `/docs` falls through to the workbench's pages, and
 * with no `docsDir` (or none built yet) every path under it says so.
 */
export function serveDocs(app: Express, docsDir: string | undefined): void {
  const router = Router({ strict: true });
  const root = docsDir === undefined ? undefined : resolve(docsDir);

  if (root !== undefined) {
    const serveFile = compressedFiles(root, setDocsCacheHeaders);
    const scriptHashes = scriptHashesOf(root);
    const built = (): boolean => existsSync(join(root, 'index.html'));

    router.use(((req, res, next) => {
      if (req.method !== 'GET' && req.method !== 'HEAD') {
        next();
        return;
      }
      let path: string;
      try {
        path = decodeURIComponent(req.path);
      } catch {
        next(new HttpProblem(400, 'Bad Request', `The path ${req.originalUrl} is not a valid URL path.`));
        return;
      }
      const query = req.url.slice(req.path.length);
      if (!built()) {
        res
          .status(503)
          .type('text/plain')
          .send(
            'The docs site is not built yet. Run `npm run docs:build`, or `npm start` to build and serve.',
          );
        return;
      }
      // `/docs` itself: its pages' relative addresses need the trailing slash.
      if (req.baseUrl === DOCS_BASE_PATH && req.originalUrl.split('?')[0] === DOCS_BASE_PATH) {
        res.redirect(301, `${DOCS_BASE_PATH}/${query}`);
        return;
      }
      let file: string | undefined;
      let servedPath = path;
      if (path.endsWith('/')) {
        servedPath = `${path}index.html`;
        file = fileAt(root, servedPath);
      } else if (extname(path) === '') {
        servedPath = `${path}.html`;
        file = fileAt(root, servedPath);
        if (file === undefined && fileAt(root, `${path}/index.html`) !== undefined) {
          res.redirect(301, `${DOCS_BASE_PATH}${req.path}/${query}`);
          return;
        }
      } else {
        file = fileAt(root, path);
      }
      if (file === undefined) {
        next();
        return;
      }
      if (file.endsWith('.html')) {
        res.setHeader(
          'Content-Security-Policy',
          contentSecurityPolicy(scriptHashes(), servedPath.startsWith('/widgets/')),
        );
      }
      const url = req.url;
      req.url = encodeURI(servedPath) + query;
      serveFile(req, res, (error?: unknown) => {
        req.url = url;
        next(error);
      });
    }) satisfies RequestHandler);
  }

  router.use((req, _res, next) => {
    next(
      new HttpProblem(
        404,
        'Not Found',
        root === undefined
          ? 'This server does not serve the docs site.'
          : `The docs site has no page or file ${req.originalUrl.split('?')[0]}.`,
      ),
    );
  });

  app.use(DOCS_BASE_PATH, router);
}
