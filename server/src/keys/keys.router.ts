import { ApiKeyListSchema, CreateApiKeySchema, CreatedApiKeySchema } from '@counterpoise/api';
import type { Response } from 'express';
import type { Clock } from '../clock';
import { IdParamSchema } from '../http/params';
import { HttpProblem } from '../http/problem';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { API_KEY_LIST_EXAMPLE, CREATED_API_KEY_EXAMPLE } from './keys.examples';
import { type ApiKeyService, toApiKeySummary } from './keys.service';

/** Who may manage the organisation's keys: the app maps it to a permission (`keys:manage`). */
export type KeysAccess = 'manage';

/** The organisation of the signed-in person of a request that passed the guard. */
function organisationOf(res: Response): number {
  const user = res.locals.user;
  if (user === undefined) throw new Error('The key routes run behind requireUser.');
  return user.organisationId;
}

/**
 * `GET/POST /keys` and `DELETE /keys/{id}`, mounted on `/api/v1`; who may call them comes from the
 * app. The key service is the one the keyed chain checks keys with, so that a revocation counts at once.
 */
export function keysRoutes(deps: {
  keys: ApiKeyService;
  clock: Clock;
  defaultLimitPerMinute: number;
  access: Readonly<Record<KeysAccess, AccessRule>>;
}): FeatureRoutes {
  const table = new RouteTable({ basePath: '/api/v1', tag: 'API keys', access: deps.access });
  table
    .add<undefined, undefined, undefined, typeof ApiKeyListSchema>({
      method: 'get',
      path: '/keys',
      summary: "The organisation's API keys",
      description: 'Prefix, name, limit, when created and last used; never the key.',
      access: 'manage',
      answer: {
        status: 200,
        description: 'The keys, oldest first, revoked ones included.',
        schema: ApiKeyListSchema,
        example: API_KEY_LIST_EXAMPLE,
      },
      handle: ({ res }) => {
        const keys = deps.keys.listForOrganisation(organisationOf(res));
        res.set('Cache-Control', 'no-store');
        return { keys: keys.map(toApiKeySummary) };
      },
    })
    .add<undefined, undefined, typeof CreateApiKeySchema, typeof CreatedApiKeySchema>({
      method: 'post',
      path: '/keys',
      summary: 'Create an API key for the organisation',
      description:
        'The answer holds the whole key, this once: only its hash is stored. Without `limitPerMinute`, ' +
        'the server’s default applies.',
      access: 'manage',
      body: CreateApiKeySchema,
      bodyExample: { name: 'Dealer portal', limitPerMinute: 600 },
      answer: {
        status: 201,
        description: 'The key, shown once.',
        schema: CreatedApiKeySchema,
        example: CREATED_API_KEY_EXAMPLE,
      },
      handle: ({ body, res }) => {
        const { key, record } = deps.keys.create(
          {
            name: body.name,
            limitPerMinute: body.limitPerMinute ?? deps.defaultLimitPerMinute,
            allowedOrigins: body.allowedOrigins ?? [],
          },
          deps.clock.now(),
          organisationOf(res),
        );
        res.set('Cache-Control', 'no-store');
        return { key, summary: toApiKeySummary(record) };
      },
    })
    .add<typeof IdParamSchema>({
      method: 'delete',
      path: '/keys/{id}',
      summary: 'Revoke an API key',
      description:
        'Requests with the key are refused from then on; its usage stays. Revoking twice is harmless. A ' +
        'key of another organisation is not found (404).',
      access: 'manage',
      params: IdParamSchema,
      answer: { status: 204, description: 'Revoked.' },
      problems: { 400: 'The id is not a positive whole number.', 404: 'No such key in the organisation.' },
      handle: ({ params, res }) => {
        const outcome = deps.keys.revokeInOrganisation(organisationOf(res), params.id, deps.clock.now());
        if (outcome.outcome === 'not-found')
          throw new HttpProblem(404, 'Not Found', `No API key ${params.id} in your organisation.`);
      },
    });
  return table;
}
