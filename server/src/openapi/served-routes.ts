import type { Express } from 'express';

/** One method and path that the app answers, OpenAPI style (`/api/v1/customers/{id}`). */
export interface ServedRoute {
  readonly method: string;
  readonly path: string;
}

/**
 * What a handler that dispatches from a table of its own (not through Express routes) declares it
 * answers: the walk below reads it, so that such a handler is held to the documentation like a router.
 */
export interface DispatchTable {
  readonly servedRoutes: readonly ServedRoute[];
}

/** The parts of Express 5's router layers (router 2.x) that the walk reads. */
interface Layer {
  readonly rawPath?: unknown;
  readonly route?: { readonly path: unknown; readonly methods: Record<string, boolean> };
  readonly handle?: { readonly stack?: readonly Layer[]; readonly servedRoutes?: readonly ServedRoute[] };
}

const toOpenApiPath = (path: string) => path.replace(/:([A-Za-z_][A-Za-z0-9_]*)/g, '{$1}');

const join = (prefix: string, path: string) =>
  path === '/' || path === '' ? prefix || '/' : `${prefix}${path}`.replace(/\/{2,}/g, '/');

/**
 * Every route the app serves, found by walking Express's own router tree: the routes, the routers
 * mounted at a path, and the handlers that declare a dispatch table. What the app serves, not a list
 * written by hand, is what the documentation test compares with the OpenAPI document. A layer whose
 * path is not a string (a pattern) is reported with its pattern, so that it fails the comparison.
 */
export function servedRoutes(app: Express): ServedRoute[] {
  const routes: ServedRoute[] = [];
  const walk = (stack: readonly Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const path = join(prefix, String(layer.route.path));
        for (const method of Object.keys(layer.route.methods)) {
          if (method !== '_all') routes.push({ method, path: toOpenApiPath(path) });
        }
        continue;
      }
      const mountedAt = typeof layer.rawPath === 'string' ? layer.rawPath : '/';
      if (layer.handle?.servedRoutes) {
        routes.push(...layer.handle.servedRoutes);
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack, join(prefix, mountedAt === '/' ? '' : mountedAt));
      }
    }
  };
  const router = (app as unknown as { router: { stack: readonly Layer[] } }).router;
  walk(router.stack, '');
  return routes;
}
