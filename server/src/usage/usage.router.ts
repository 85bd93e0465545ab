import { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import {
  OrganisationUsageReportSchema,
  PROBLEM_MEDIA_TYPE,
  ProblemSchema,
  type UsageQuery,
  UsageQuerySchema,
  UsageReportSchema,
} from '@counterpoise/api';
import { Router } from 'express';
import type { Clock } from '../clock';
import { validateQuery } from '../http/validate';
import { ACCESS_TOKEN_SCHEME } from '../openapi/responses';
import { requirePermission } from '../auth/require-user';
import { API_KEY_SECURITY, KEYED_ROUTE_RESPONSES, RATE_LIMIT_HEADERS } from '../keys/keys.openapi';
import type { UsageRepo } from './usage.repo';
import { buildOrganisationUsageReport, buildUsageReport } from './usage.service';

/** The OpenAPI registry of the usage report. */
export const usageRegistry = new OpenAPIRegistry();

usageRegistry.registerPath({
  method: 'get',
  path: '/api/v1/usage',
  tags: ['Usage'],
  summary: 'How much the calling API key, or the organisation’s keys, used the API',
  description:
    'Counts the requests made with the calling key over a span, per UTC day, per route or per key, ' +
    'with their errors, bytes and durations. Requests reach the report within about a tenth of a ' +
    'second. The call itself counts as a request. Asked with the access token of a signed-in owner ' +
    'or developer (`usage:read`), it reports every key of their organisation instead ' +
    '(`OrganisationUsageReport`); other roles get 403.',
  security: [...API_KEY_SECURITY, { [ACCESS_TOKEN_SCHEME]: [] }],
  request: { query: UsageQuerySchema },
  responses: {
    200: {
      description: 'The report.',
      headers: RATE_LIMIT_HEADERS,
      content: {
        'application/json': { schema: UsageReportSchema.or(OrganisationUsageReportSchema) },
      },
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

/**
 * `GET /`, mounted at `/usage` on the keyed `/api/v1` chain: either `res.locals.apiKey` (the key's own
 * report) or `res.locals.user` (their organisation's) is set here.
 */
export function usageRouter(deps: { repo: UsageRepo; clock: Clock }): Router {
  const router = Router();
  router.get('/', requirePermission('usage:read'), validateQuery(UsageQuerySchema), (_req, res) => {
    const { apiKey, user } = res.locals;
    const query = res.locals.query as UsageQuery;
    const now = deps.clock.now();
    let report;
    if (apiKey !== undefined) report = buildUsageReport(deps.repo, apiKey, query, now);
    else if (user !== undefined) {
      const organisation = { id: user.organisationId, name: user.organisationName };
      report = buildOrganisationUsageReport(deps.repo, organisation, query, now);
    } else throw new Error('The usage route is mounted without the API-key check.');
    res.set('Cache-Control', 'no-store').json(report);
  });
  return router;
}
