import {
  OrganisationUsageReportSchema,
  PROBLEM_MEDIA_TYPE,
  ProblemSchema,
  UsageQuerySchema,
  UsageReportSchema,
} from '@counterpoise/api';
import type { Clock } from '../clock';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { RATE_LIMIT_HEADERS } from '../keys/keys.openapi';
import type { UsageRepo } from './usage.repo';
import { buildOrganisationUsageReport, buildUsageReport } from './usage.service';

/** Who may read the usage report: the keyed chain's callers whose key or role holds `usage:read`. */
export type UsageAccess = 'report';

/** The answer of the report: one key's, or (asked with an access token) the organisation's. */
const UsageAnswerSchema = UsageReportSchema.or(OrganisationUsageReportSchema);

/**
 * `GET /usage`, mounted on the keyed `/api/v1` chain: either `res.locals.apiKey` (the key's own
 * report) or `res.locals.user` (their organisation's) is set here. The access rule, given by the app,
 * is the chain's permission check and what the document says of the key and the access token.
 */
export function usageRoutes(deps: {
  repo: UsageRepo;
  clock: Clock;
  access: Readonly<Record<UsageAccess, AccessRule>>;
}): FeatureRoutes {
  const table = new RouteTable({ basePath: '/api/v1', tag: 'Usage', access: deps.access });
  table.add<undefined, typeof UsageQuerySchema, undefined, typeof UsageAnswerSchema>({
    method: 'get',
    path: '/usage',
    summary: 'How much the calling API key, or the organisation’s keys, used the API',
    description:
      'Counts the requests made with the calling key over a span, per UTC day, per route or per key, ' +
      'with their errors, bytes and durations. Requests reach the report within about a tenth of a ' +
      'second. The call itself counts as a request. Asked with the access token of a signed-in owner ' +
      'or developer (`usage:read`), it reports every key of their organisation instead ' +
      '(`OrganisationUsageReport`); other roles get 403.',
    access: 'report',
    query: UsageQuerySchema,
    answer: {
      status: 200,
      description: 'The report.',
      schema: UsageAnswerSchema,
      headers: RATE_LIMIT_HEADERS,
    },
    problems: {
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
    },
    handle: ({ query, res }) => {
      const { apiKey, user } = res.locals;
      const now = deps.clock.now();
      res.set('Cache-Control', 'no-store');
      if (apiKey !== undefined) return buildUsageReport(deps.repo, apiKey, query, now);
      if (user !== undefined) {
        const organisation = { id: user.organisationId, name: user.organisationName };
        return buildOrganisationUsageReport(deps.repo, organisation, query, now);
      }
      throw new Error('The usage route is mounted without the API-key check.');
    },
  });
  return table;
}
