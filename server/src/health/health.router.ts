import { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { type Health, HealthSchema } from '@counterpoise/api';
import { Router } from 'express';
import type { Clock } from '../clock';
import { appliedMigrationCount, type Database } from '../db/database';

export const healthRegistry = new OpenAPIRegistry();

healthRegistry.registerPath({
  method: 'get',
  path: '/api/health',
  tags: ['Server'],
  summary: 'Whether the server and its database work',
  description:
    'Answers 200 while the database answers a query, 503 when it does not. Needs no credentials, so ' +
    'that load balancers and the workbench can ask it.',
  responses: {
    200: { description: 'Working.', content: { 'application/json': { schema: HealthSchema } } },
    503: {
      description: 'The database does not answer.',
      content: { 'application/json': { schema: HealthSchema } },
    },
  },
});

/** Reads the state of the database; never throws. */
export function checkHealth(database: Database, version: string, uptimeSeconds: number): Health {
  try {
    database.sqlite.prepare('SELECT 1').get();
    return {
      status: 'ok',
      version,
      uptimeSeconds,
      database: { status: 'ok', migrations: appliedMigrationCount(database) },
    };
  } catch (error) {
    return {
      status: 'degraded',
      version,
      uptimeSeconds,
      database: {
        status: 'error',
        migrations: 0,
        detail: error instanceof Error ? error.message : 'The database did not answer.',
      },
    };
  }
}

/** `GET /health`. */
export function healthRouter(deps: { database: Database; clock: Clock; version: string }): Router {
  const startedAt = deps.clock.now().getTime();
  const router = Router();
  router.get('/health', (_req, res) => {
    const uptimeSeconds = Math.max(0, (deps.clock.now().getTime() - startedAt) / 1000);
    const health = checkHealth(deps.database, deps.version, uptimeSeconds);
    res
      .status(health.status === 'ok' ? 200 : 503)
      .set('Cache-Control', 'no-store')
      .json(health);
  });
  return router;
}
