import { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import {
  ApiKeyListSchema,
  CreateApiKeySchema,
  type CreateApiKey,
  CreatedApiKeySchema,
} from '@counterpoise/api';
import { Router } from 'express';
import type * as z from 'zod';
import {
  ACCESS_TOKEN_SECURITY,
  INVALID_BODY_RESPONSE,
  jsonBody,
  jsonResponse,
  problemResponse,
  SIGNED_IN_RESPONSES,
} from '../openapi/responses';
import { accountsJson } from '../auth/auth.router';
import type { AuthService } from '../auth/auth.service';
import { API_KEY_LIST_EXAMPLE, CREATED_API_KEY_EXAMPLE } from './keys.examples';
import { requirePermission, requireUser } from '../auth/require-user';
import type { Clock } from '../clock';
import { IdParamSchema, validateParams } from '../http/params';
import { HttpProblem } from '../http/problem';
import { validateBody } from '../http/validate';
import { type ApiKeyService, toApiKeySummary } from './keys.service';

/** The OpenAPI registry of the workbench's API-key routes. */
export const keyRoutesRegistry = new OpenAPIRegistry();

keyRoutesRegistry.registerPath({
  method: 'get',
  path: '/api/v1/keys',
  tags: ['API keys'],
  summary: "The organisation's API keys",
  description:
    'Owners and developers (`keys:manage`). Prefix, name, limit, when created and last used; never the key.',
  security: ACCESS_TOKEN_SECURITY,
  responses: {
    200: jsonResponse(
      'The keys, oldest first, revoked ones included.',
      ApiKeyListSchema,
      API_KEY_LIST_EXAMPLE,
    ),
    ...SIGNED_IN_RESPONSES,
  },
});

keyRoutesRegistry.registerPath({
  method: 'post',
  path: '/api/v1/keys',
  tags: ['API keys'],
  summary: 'Create an API key for the organisation',
  description:
    'Owners and developers. The answer holds the whole key, this once: only its hash is stored. Without ' +
    '`limitPerMinute`, the server’s default applies.',
  security: ACCESS_TOKEN_SECURITY,
  request: jsonBody(CreateApiKeySchema, { name: 'Dealer portal', limitPerMinute: 600 }),
  responses: {
    201: jsonResponse('The key, shown once.', CreatedApiKeySchema, CREATED_API_KEY_EXAMPLE),
    400: INVALID_BODY_RESPONSE,
    ...SIGNED_IN_RESPONSES,
  },
});

keyRoutesRegistry.registerPath({
  method: 'delete',
  path: '/api/v1/keys/{id}',
  tags: ['API keys'],
  summary: 'Revoke an API key',
  description:
    'Owners and developers. Requests with the key are refused from then on; its usage stays. Revoking ' +
    'twice is harmless. A key of another organisation is not found (404).',
  security: ACCESS_TOKEN_SECURITY,
  request: { params: IdParamSchema },
  responses: {
    204: { description: 'Revoked.' },
    400: problemResponse('The id is not a positive whole number.'),
    ...SIGNED_IN_RESPONSES,
    404: problemResponse('No such key in the organisation.'),
  },
});

/** `GET/POST /keys` and `DELETE /keys/:id` for signed-in owners and developers, mounted on `/api/v1`. */
export function keysRouter(deps: {
  auth: AuthService;
  keys: ApiKeyService;
  clock: Clock;
  defaultLimitPerMinute: number;
}): Router {
  const router = Router();
  const guard = [requireUser(deps.auth), requirePermission('keys:manage')];

  router.get('/keys', ...guard, (_req, res) => {
    const keys = deps.keys.listForOrganisation(res.locals.user!.organisationId);
    res.set('Cache-Control', 'no-store').json({ keys: keys.map(toApiKeySummary) });
  });

  router.post('/keys', ...guard, ...accountsJson, validateBody(CreateApiKeySchema), (_req, res) => {
    const body = res.locals.body as CreateApiKey;
    const { key, record } = deps.keys.create(
      { name: body.name, limitPerMinute: body.limitPerMinute ?? deps.defaultLimitPerMinute },
      deps.clock.now(),
      res.locals.user!.organisationId,
    );
    res
      .status(201)
      .set('Cache-Control', 'no-store')
      .json({ key, summary: toApiKeySummary(record) });
  });

  router.delete('/keys/:id', ...guard, validateParams(IdParamSchema), (_req, res) => {
    const { id } = res.locals.params as z.output<typeof IdParamSchema>;
    const outcome = deps.keys.revokeInOrganisation(res.locals.user!.organisationId, id, deps.clock.now());
    if (outcome.outcome === 'not-found')
      throw new HttpProblem(404, 'Not Found', `No API key ${id} in your organisation.`);
    res.status(204).end();
  });

  return router;
}
