import { CALC_ROUTE_NAMES } from '@counterpoise/api';
import type { Request, RequestHandler, Response } from 'express';
import type { Clock } from '../clock';
import type { UsageSink } from '../http/keyed-request';
import { normaliseRoutePath, unknownRouteLabel } from '../http/route-path';
import type { OpenApiDocument } from '../openapi/openapi';

/**
 * The paths of every route the app's OpenAPI document holds, in the spelling of `normaliseRoutePath`:
 * the routes a usage row may name. Built once, when the app is.
 */
export function documentedPaths(document: OpenApiDocument): ReadonlySet<string> {
  const paths = new Set<string>();
  for (const path of Object.keys(document.paths ?? {})) paths.add(normaliseRoutePath(path));
  return paths;
}

/**
 * The route a row names: the method and the documented path the request reached, read as Express
 * routes it (`/API/v1/Usage/` is `GET /api/v1/usage`), or one fixed label for a path no route documents.
 * The path, not Express's route pattern, because the pattern is no longer reliable once an error has
 * left the router that matched; the keyed routes have no path parameters, so the two agree.
 */
function routeOf(req: Request, documented: ReadonlySet<string>): string {
  const url = req.originalUrl;
  const query = url.indexOf('?');
  const path = normaliseRoutePath(query === -1 ? url : url.slice(0, query));
  return documented.has(path) ? `${req.method} ${path}` : unknownRouteLabel(req.method);
}

/** The routes a call of which is one calculation, as usage rows name them. */
const CALCULATOR_ROUTES: ReadonlySet<string> = new Set(
  CALC_ROUTE_NAMES.map((name) => `POST /api/v1/calc/${name}`),
);

function bytesOf(res: Response): number {
  const length = res.getHeader('content-length');
  const bytes = typeof length === 'number' ? length : Number(length);
  return Number.isFinite(bytes) ? bytes : 0;
}

declare global {
  // Express types `res.locals` through this interface.
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** When the usage recorder saw the request (`performance.now()`), for its row's duration. */
      usageStartedAt?: number;
    }
  }
}

/**
 * Records one usage row for every request that the key check let through, when its answer has been
 * handed to the network ('finish'), so the row has the final status and size and the response waits
 * for nothing. The row carries the request's calculations: one for a call of a calculator route, and
 * for a batch the count and the items' errors its route left in `res.locals.batchUsage` (none for a
 * batch refused whole). A handler that logged the request's row itself sets `res.locals.usageRecorded` and this
 * one stays silent. A request whose client went away before the
 * answer was sent got no answer and leaves no row. Rows name only `documented` paths (see `routeOf`),
 * so that made-up paths cannot fill the usage table with strings of the caller's choosing.
 */
export function recordUsage(sink: UsageSink, clock: Clock, documented: ReadonlySet<string>): RequestHandler {
  // One listener for every request, which finds its request through the response it is called on (`this`),
  // rather than a closure made for each: these are the API's busiest requests.
  function recordFinished(this: Response): void {
    record(this);
  }
  function record(res: Response): void {
    if (res.locals.usageRecorded === true) return;
    const route = routeOf(res.req, documented);
    const batch = res.locals.batchUsage;
    sink.record({
      keyId: res.locals.apiKey!.id,
      route,
      status: res.statusCode,
      durationMs: performance.now() - res.locals.usageStartedAt!,
      bytes: bytesOf(res),
      at: clock.now(),
      calculations: batch?.calculations ?? (CALCULATOR_ROUTES.has(route) ? 1 : 0),
      ...(batch?.itemErrors ? { itemErrors: batch.itemErrors } : {}),
    });
  }
  return (_req, res, next) => {
    if (res.locals.apiKey !== undefined) {
      res.locals.usageStartedAt = performance.now();
      // 'finish' comes once per response, so `on` does what `once` would without wrapping the listener.
      res.on('finish', recordFinished);
    }
    next();
  };
}
