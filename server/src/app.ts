import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import express, { type Express, Router } from 'express';
import helmet from 'helmet';
import { type Clock, systemClock } from './clock';
import type { Database } from './db/database';
import { healthRegistry, healthRouter } from './health/health.router';
import { apiNotFound, problemHandler } from './http/problem';
import { calcRegistry, calcRouter } from './calc/calc.router';
import { keyedV1Router } from './http/v1';
import { keysRegistry } from './keys/keys.openapi';
import { buildOpenApiDocument, openApiRouter } from './openapi/openapi';
import { UsageLog } from './usage/usage-log';
import { usageRegistry } from './usage/usage.router';
import { VERSION } from './version';

/** What the app is built from; tests pass a temporary database and a fixed clock. */
export interface AppDeps {
  readonly database: Database;
  readonly clock?: Clock;
  readonly version?: string;
  /** The built workbench (`dist/workbench/browser`); the app is not served when absent. */
  readonly staticDir?: string;
  readonly log?: (message: string, error?: unknown) => void;
  /**
   * The usage log of keyed requests. main.ts builds it so that it can `close()` it at shutdown, after
   * the server has finished its requests and before the database closes; without one, the app builds
   * its own (tests that make keyed requests pass theirs, to `flush()` it).
   */
  readonly usageLog?: UsageLog;
  /** Web origins whose pages may call `/api/v1` (CORS); none by default. */
  readonly corsOrigins?: readonly string[];
}

/** Every feature's OpenAPI registry, in the order of the document. */
export const OPENAPI_REGISTRIES = [healthRegistry, keysRegistry, usageRegistry, calcRegistry];

/**
 * Builds the Express app: the API under `/api`, its OpenAPI document and Swagger UI, and the workbench
 * with its client-side routes. It does not listen, so tests drive it with supertest.
 */
export function createApp(deps: AppDeps): Express {
  const clock = deps.clock ?? systemClock;
  const version = deps.version ?? VERSION;
  const log = deps.log ?? ((message, error) => console.error(message, error));

  const app = express();
  app.disable('x-powered-by');
  app.set('query parser', 'simple');
  app.use(
    helmet({
      contentSecurityPolicy: {
        // Served over plain HTTP on a shop's network; upgrading would break every asset there.
        directives: { upgradeInsecureRequests: null },
      },
    }),
  );

  const usageLog = deps.usageLog ?? new UsageLog(deps.database, { log });
  const v1 = keyedV1Router({
    database: deps.database,
    clock,
    usage: usageLog,
    corsOrigins: deps.corsOrigins ?? [],
  });
  v1.use('/calc', calcRouter({ usage: usageLog, clock }));
  // Mounted ahead of `/api` so that keyed requests, the busy ones, pass through no other router;
  // a path no keyed route answers falls through to the 404 below.
  app.use('/api/v1', v1);

  const api = Router();
  api.use(healthRouter({ database: deps.database, clock, version }));
  api.use(openApiRouter(buildOpenApiDocument(OPENAPI_REGISTRIES, version)));
  api.use(apiNotFound);
  app.use('/api', api);

  if (deps.staticDir) serveWorkbench(app, deps.staticDir);

  app.use(problemHandler(log));
  return app;
}

/**
 * Serves the built workbench: hashed files for a year, `index.html` never cached, and every other
 * GET that asks for HTML answered with `index.html` so that deep links reach the app's router.
 */
function serveWorkbench(app: Express, staticDir: string): void {
  const root = resolve(staticDir);
  const indexFile = join(root, 'index.html');
  app.use(
    express.static(root, {
      index: false,
      setHeaders: (res, path) => {
        if (/-[A-Z0-9]{8}\.(js|css)$/.test(path) || path.includes('/media/')) {
          res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        }
      },
    }),
  );
  app.get('/{*splat}', (req, res, next) => {
    if (!req.accepts('html')) {
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
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexFile);
  });
}
