import {
  ApiKeyListSchema,
  ApiKeySummarySchema,
  CreateApiKeySchema,
  CreatedApiKeySchema,
  UpdateApiKeyOriginsSchema,
} from '@counterpoise/api';
import type { Response } from 'express';
import type { Clock } from '../clock';
import { IdParamSchema } from '../http/params';
import { HttpProblem } from '../http/problem';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { API_KEY_LIST_EXAMPLE, CREATED_API_KEY_EXAMPLE, LIMITED_API_KEY_EXAMPLE } from './keys.examples';
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
 * `GET/POST /keys`, `PUT /keys/{id}/origins` and `DELETE /keys/{id}`, mounted on `/api/v1`; who may call them comes from the
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
        'the server’s default applies. With `allowedOrigins`, the key works only from the pages of those ' +
        'web origins (for a key put in a page: give it a low limit, anyone can read it there).',
      access: 'manage',
      body: CreateApiKeySchema,
      bodyExample: {
        name: 'Dealer portal',
        limitPerMinute: 600,
        allowedOrigins: ['https://portal.example.com'],
      },
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
    .add<typeof IdParamSchema, undefined, typeof UpdateApiKeyOriginsSchema, typeof ApiKeySummarySchema>({
      method: 'put',
      path: '/keys/{id}/origins',
      summary: 'Change the web origins an API key may be used from',
      description:
        'Replaces the whole list: requests with the key (and its visitor tokens) from any other origin, or ' +
        'with no Origin header, are refused from then on, and CORS answers the listed origins. An empty ' +
        'list lifts the limit. Each origin is normalised as browsers send it and the list deduplicated. A ' +
        'key of another organisation is not found (404).',
      access: 'manage',
      params: IdParamSchema,
      body: UpdateApiKeyOriginsSchema,
      bodyExample: { allowedOrigins: ['https://portal.example.com', 'http://localhost:4200'] },
      answer: {
        status: 200,
        description: 'The key with its new origins.',
        schema: ApiKeySummarySchema,
        example: LIMITED_API_KEY_EXAMPLE,
      },
      problems: { 404: 'No such key in the organisation.' },
      handle: ({ params, body, res }) => {
        const outcome = deps.keys.updateOriginsInOrganisation(
          organisationOf(res),
          params.id,
          body.allowedOrigins,
        );
        if (outcome.outcome === 'not-found')
          throw new HttpProblem(404, 'Not Found', `No API key ${params.id} in your organisation.`);
        res.set('Cache-Control', 'no-store');
        return toApiKeySummary(outcome.key);
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
