import type { Request, RequestHandler, Response } from 'express';
import type { Clock } from '../clock';
import type { UsageSink } from '../http/keyed-request';

/** Paths are cut here: a route name is for reading, and a junk path must not bloat the log. */
const MAX_ROUTE_LENGTH = 200;

/**
 * The route a row names: the method and the path without its query. The path, not Express's route
 * pattern, because the pattern is no longer reliable once an error has left the router that matched;
 * the keyed routes have no path parameters, so the two agree.
 */
function routeOf(req: Request): string {
  const url = req.originalUrl;
  const query = url.indexOf('?');
  let path = query === -1 ? url : url.slice(0, query);
  if (path.length > 1 && path.endsWith('/')) path = path.slice(0, -1);
  if (path.length > MAX_ROUTE_LENGTH) path = path.slice(0, MAX_ROUTE_LENGTH);
  return `${req.method} ${path}`;
}

function bytesOf(res: Response): number {
  const length = res.getHeader('content-length');
  const bytes = typeof length === 'number' ? length : Number(length);
  return Number.isFinite(bytes) ? bytes : 0;
}

/**
 * Records one usage row for every request that the key check let through, when its answer has been
 * handed to the network ('finish'), so the row has the final status and size and the response waits
 * for nothing. A handler that logged its own rows (the batch route: one per item) sets
 * `res.locals.usageRecorded` and this one stays silent. A request whose client went away before the
 * answer was sent got no answer and leaves no row.
 */
export function recordUsage(sink: UsageSink, clock: Clock): RequestHandler {
  return (req, res, next) => {
    const apiKey = res.locals.apiKey;
    if (apiKey !== undefined) {
      const startedAt = performance.now();
      res.once('finish', () => {
        if (res.locals.usageRecorded === true) return;
        sink.record({
          keyId: apiKey.id,
          route: routeOf(req),
          status: res.statusCode,
          durationMs: performance.now() - startedAt,
          bytes: bytesOf(res),
          at: clock.now(),
        });
      });
    }
    next();
  };
}
