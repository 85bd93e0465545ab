import { type Health, HealthSchema } from '@counterpoise/api';
import type { Clock } from '../clock';
import { appliedMigrationCount, type Database } from '../db/database';
import { type FeatureRoutes, RouteTable } from '../http/route';

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

/**
 * `GET /health`, mounted on `/api`. It needs no credentials, so that load balancers and the workbench
 * can ask it; it writes its own answer, since its status (200 or 503) follows the database's state.
 */
export function healthRoutes(deps: { database: Database; clock: Clock; version: string }): FeatureRoutes {
  const startedAt = deps.clock.now().getTime();
  const table = new RouteTable({ basePath: '/api', tag: 'Server', access: { public: { guard: [] } } });
  table.add<undefined, undefined, undefined, typeof HealthSchema>({
    method: 'get',
    path: '/health',
    summary: 'Whether the server and its database work',
    description:
      'Answers 200 while the database answers a query, 503 when it does not. Needs no credentials, so ' +
      'that load balancers and the workbench can ask it.',
    access: 'public',
    answer: { status: 200, description: 'Working.', schema: HealthSchema },
    problems: {
      503: {
        description: 'The database does not answer.',
        content: { 'application/json': { schema: HealthSchema } },
      },
    },
    handle: ({ res }) => {
      const uptimeSeconds = Math.max(0, (deps.clock.now().getTime() - startedAt) / 1000);
      const health = checkHealth(deps.database, deps.version, uptimeSeconds);
      res
        .status(health.status === 'ok' ? 200 : 503)
        .set('Cache-Control', 'no-store')
        .json(health);
      return undefined;
    },
  });
  return table;
}
