import express, { type Express } from 'express';
import type { Clock } from '../clock';
import type { UsageRow, UsageSink } from '../http/keyed-request';
import { apiNotFound, problemHandler } from '../http/problem';
import { normaliseRoutePath } from '../http/route-path';
import { recordUsage } from '../usage/usage.recorder';
import { CALC_BASE_PATH, calcRouter } from './calc.router';

/**
 * The calculator routes alone, behind a stand-in for the key middleware that marks every request as made
 * with key 7, and the usage recorder writing to a sink that keeps its rows in memory: for the router's own
 * specs. The routes behind
 * the real key, limit and usage middleware are exercised through `createApp` in the API specs.
 */
export function calcTestApp(clock: Clock = { now: () => new Date('2026-06-01T08:00:00Z') }): {
  app: Express;
  rows: UsageRow[];
} {
  const rows: UsageRow[] = [];
  const usage: UsageSink = { record: (row) => rows.push(row) };
  const app = express();
  app.use((_req, res, next) => {
    res.locals.apiKey = { id: 7, name: 'spec', prefix: 'cpk_spec', limitPerMinute: 1000 };
    next();
  });
  const router = calcRouter();
  const documented = new Set(router.servedRoutes.map((route) => normaliseRoutePath(route.path)));
  app.use(recordUsage(usage, clock, documented));
  app.use(CALC_BASE_PATH, router);
  app.use('/api', apiNotFound);
  app.use(problemHandler(() => undefined));
  return { app, rows };
}
