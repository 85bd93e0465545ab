import { randomBytes } from 'node:crypto';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { CALC_ROUTE_NAMES, CALC_ROUTES } from '@counterpoise/api';
import { createApp } from '../app';
import { createTestKey } from '../keys/testing/test-keys';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from './usage-log';
import { documentedPaths } from './usage.recorder';

let temporary: TemporaryDatabase;
let usageLog: UsageLog;
let key: string;

beforeEach(() => {
  temporary = openTemporaryDatabase();
  usageLog = new UsageLog(temporary.database);
  key = createTestKey(temporary.database).key;
});
afterEach(() => {
  usageLog.close();
  temporary.dispose();
});

const app = () => createApp({ database: temporary.database, usageLog, log: () => undefined });
const routes = () => {
  usageLog.flush();
  return temporary.database.sqlite.prepare('SELECT route, status FROM api_usage ORDER BY id').all();
};

describe('the route a usage row names', () => {
  it('is the documented route, whatever the spelling of the path that reached it', async () => {
    const server = app();
    await request(server).get('/API/v1/Usage/').set('X-Api-Key', key).expect(200);
    await request(server)
      .post('/Api/V1/calc/RADIUS?units=metric')
      .set('X-Api-Key', key)
      .send(CALC_ROUTES.radius.example)
      .expect(200);
    expect(routes()).toEqual([
      { route: 'GET /api/v1/usage', status: 200 },
      { route: 'POST /api/v1/calc/radius', status: 200 },
    ]);
  });

  it('is one fixed label for every path no route documents, so junk adds no new strings', async () => {
    const server = app();
    const junk = [
      `/api/v1/${randomBytes(24).toString('hex')}`,
      `/api/v1/calc/${'x'.repeat(3000)}`,
      '/api/v1/%E2%80%AE%3Cscript%3E',
      `/api/v1/usage/${randomBytes(8).toString('base64url')}`,
      '/api/v1/calc/radius/extra',
    ];
    for (const path of junk) {
      await request(server).get(path).set('X-Api-Key', key).expect(404);
      await request(server).post(path).set('X-Api-Key', key).send({}).expect(404);
    }
    const logged = routes() as { route: string }[];
    expect(logged).toHaveLength(junk.length * 2);
    expect(new Set(logged.map((row) => row.route))).toEqual(
      new Set(['GET (unknown route)', 'POST (unknown route)']),
    );
  });
});

describe('documentedPaths', () => {
  it('holds every keyed route of the OpenAPI document, in lower case', () => {
    const paths = documentedPaths(app().locals.openApiDocument!);
    for (const name of [...CALC_ROUTE_NAMES, 'batch']) expect(paths).toContain(`/api/v1/calc/${name}`);
    expect(paths).toContain('/api/v1/usage');
    for (const path of paths) expect(path).toBe(path.toLowerCase());
  });
});
