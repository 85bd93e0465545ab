import { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import {
  PROBLEM_MEDIA_TYPE,
  ProblemSchema,
  type UsageQuery,
  UsageQuerySchema,
  UsageReportSchema,
} from '@counterpoise/api';
import { Router } from 'express';
import type { Clock } from '../clock';
import { validateQuery } from '../http/validate';
import { API_KEY_SECURITY, KEYED_ROUTE_RESPONSES, RATE_LIMIT_HEADERS } from '../keys/keys.openapi';
import type { UsageRepo } from './usage.repo';
import { buildUsageReport } from './usage.service';

/** The OpenAPI registry of the usage report. */
export const usageRegistry = new OpenAPIRegistry();

usageRegistry.registerPath({
  method: 'get',
  path: '/api/v1/usage',
  tags: ['Usage'],
  summary: 'How much the calling API key used the API',
  description:
    'Counts the requests made with the calling key over a span, per UTC day, per route or per key, ' +
    'with their errors, bytes and durations. Requests reach the report within about a tenth of a ' +
    'second. The call itself counts as a request.',
  security: API_KEY_SECURITY,
  request: { query: UsageQuerySchema },
  responses: {
    200: {
      description: 'The report.',
      headers: RATE_LIMIT_HEADERS,
      content: { 'application/json': { schema: UsageReportSchema } },
    },
    400: {
      description: 'A query parameter is not valid; `errors` names each one.',
      content: {
        [PROBLEM_MEDIA_TYPE]: {
          schema: ProblemSchema,
          example: {
            type: 'about:blank',
            title: 'Bad Request',
            status: 400,
            code: 'INVALID_REQUEST',
            detail: 'groupBy: Expected day, route or key.',
            errors: [{ path: 'groupBy', message: 'Expected day, route or key.' }],
            instance: '/api/v1/usage',
          },
        },
      },
    },
    ...KEYED_ROUTE_RESPONSES,
  },
});

/** `GET /`, mounted at `/usage` on the keyed `/api/v1` chain: `res.locals.apiKey` is always set here. */
export function usageRouter(deps: { repo: UsageRepo; clock: Clock }): Router {
  const router = Router();
  router.get('/', validateQuery(UsageQuerySchema), (_req, res) => {
    const apiKey = res.locals.apiKey;
    if (apiKey === undefined) throw new Error('The usage route is mounted without the API-key check.');
    const query = res.locals.query as UsageQuery;
    const report = buildUsageReport(deps.repo, apiKey, query, deps.clock.now());
    res.set('Cache-Control', 'no-store').json(report);
  });
  return router;
}
