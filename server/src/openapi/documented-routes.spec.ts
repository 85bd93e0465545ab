import express from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../app';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { servedRoutes } from './served-routes';

/** Served for the documentation itself, not part of the API it documents. */
const NOT_API = new Set(['get /api/openapi.json']);

let temporary: TemporaryDatabase;
beforeAll(() => (temporary = openTemporaryDatabase()));
afterAll(() => temporary.dispose());

const documented = () => {
  const document = createApp({ database: temporary.database, staticDir: '/nowhere' }).locals.openApiDocument!;
  return Object.entries(document.paths ?? {}).flatMap(([path, item]) =>
    Object.keys(item as object)
      .filter((method) => ['get', 'post', 'put', 'patch', 'delete'].includes(method))
      .map((method) => `${method} ${path}`),
  );
};

describe('the routes Express serves and the OpenAPI document', () => {
  const served = () =>
    servedRoutes(createApp({ database: temporary.database, staticDir: '/nowhere' }))
      .filter((route) => route.path.startsWith('/api/'))
      .map((route) => `${route.method} ${route.path}`)
      .filter((route) => !NOT_API.has(route));

  it('documents every route the app serves under /api', () => {
    // The document is built once: building the app for each served route would take seconds.
    const routes = documented();
    const undocumented = served().filter((route) => !routes.includes(route));
    expect(undocumented).toEqual([]);
  });

  it('serves every documented route', () => {
    const routes = served();
    const missing = documented().filter((route) => !routes.includes(route));
    expect(missing).toEqual([]);
  });

  it('finds the routes of the calculator’s table and of routers mounted at a path', () => {
    const routes = served();
    expect(routes).toContain('post /api/v1/calc/single-plane');
    expect(routes).toContain('post /api/v1/calc/batch');
    expect(routes).toContain('get /api/v1/usage');
    expect(routes).toContain('patch /api/v1/people/{id}');
  });

  it('would catch a route added without documentation', () => {
    const app = createApp({ database: temporary.database });
    const extra = express.Router();
    extra.get('/shadow/:id', (_req, res) => {
      res.end();
    });
    app.use('/api/v1', extra);
    const routes = servedRoutes(app).map((route) => `${route.method} ${route.path}`);
    expect(routes).toContain('get /api/v1/shadow/{id}');
    expect(documented()).not.toContain('get /api/v1/shadow/{id}');
  });
});
