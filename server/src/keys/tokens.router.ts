import { CreateVisitorTokenSchema, KEY_PROBLEM_CODES, VisitorTokenSchema } from '@counterpoise/api';
import type { RequestHandler } from 'express';
import { HttpProblem } from '../http/problem';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { VISITOR_TOKEN_EXAMPLE } from './keys.examples';
import type { ApiKeyService } from './keys.service';
import type { VisitorTokens } from './visitor-tokens';

/** Who may exchange a key for a visitor token: the keyed chain's callers with a secret key. */
export type TokensAccess = 'exchange';

/**
 * The guard of the exchange, after the keyed chain: the key itself, and one without origins. A
 * person's access token has no key to exchange; a key limited to web origins is no secret (it sits in a
 * page), so tokens made from it would protect nothing.
 */
export function requireSecretKey(keys: ApiKeyService): RequestHandler {
  return (_req, res, next) => {
    const identity = res.locals.apiKey;
    const key = identity === undefined ? undefined : keys.checkById(identity.id);
    if (key === undefined || key === 'unknown') {
      next(
        new HttpProblem(
          403,
          'Forbidden',
          'A visitor token is exchanged for an API key, sent by the portal’s back end; a person’s access ' +
            'token cannot be exchanged.',
          undefined,
          'about:blank',
          KEY_PROBLEM_CODES.exchangeRefused,
        ),
      );
      return;
    }
    if (key.allowedOrigins.length > 0) {
      next(
        new HttpProblem(
          403,
          'Forbidden',
          `This API key (${key.prefix}…) is limited to web origins, so it is no secret: pages use it ` +
            'directly. Exchange a key without origins, kept on the portal’s back end.',
          undefined,
          'about:blank',
          KEY_PROBLEM_CODES.exchangeRefused,
        ),
      );
      return;
    }
    next();
  };
}

/**
 * `POST /tokens`, mounted on the keyed `/api/v1` chain: a portal's back end exchanges its secret key for
 * a short-lived token for one visitor, which the visitor's browser then sends to the calculation routes.
 */
export function tokensRoutes(deps: {
  tokens: VisitorTokens;
  access: Readonly<Record<TokensAccess, AccessRule>>;
}): FeatureRoutes {
  const table = new RouteTable({ basePath: '/api/v1', tag: 'API keys', access: deps.access });
  table.add<undefined, undefined, typeof CreateVisitorTokenSchema, typeof VisitorTokenSchema>({
    method: 'post',
    path: '/tokens',
    summary: 'Exchange the API key for a short-lived token for one visitor',
    description:
      'For a portal’s back end, which keeps its key secret and hands each visitor’s page a token instead. ' +
      'The token calls the calculation routes (`/api/v1/calc/…`) only, as `Authorization: Bearer <token>`, ' +
      'until `expiresAt` (at most 15 minutes); its requests count as the key’s, in its usage and its rate ' +
      'limit, and it stops working when the key is revoked. With `origin`, only pages of that origin may ' +
      'use it (and CORS answers them). The exchange itself counts as one request of the key. A key ' +
      'limited to web origins cannot be exchanged.',
    access: 'exchange',
    body: CreateVisitorTokenSchema,
    bodyExample: { origin: 'https://portal.example.com', visitor: 'visitor-2231', ttlSeconds: 600 },
    answer: {
      status: 201,
      description: 'The token, and when it ends.',
      schema: VisitorTokenSchema,
      example: VISITOR_TOKEN_EXAMPLE,
    },
    problems: {
      403: 'The key is revoked, limited to web origins, or the caller is a person or a visitor token (`code`: `API_KEY_REVOKED`, `API_KEY_ORIGIN_REFUSED`, `TOKEN_EXCHANGE_REFUSED`, `TOKEN_SCOPE`).',
    },
    handle: async ({ body, res }) => {
      const key = res.locals.apiKey!;
      const { token, expiresAt } = await deps.tokens.issue(key.id, {
        ...(body.origin === undefined ? {} : { origin: body.origin }),
        ...(body.visitor === undefined ? {} : { visitor: body.visitor }),
        ...(body.ttlSeconds === undefined ? {} : { ttlSeconds: body.ttlSeconds }),
      });
      res.set('Cache-Control', 'no-store');
      return { token, expiresAt: expiresAt.toISOString() };
    },
  });
  return table;
}
