import cors from 'cors';
import { type RequestHandler, Router } from 'express';
import { API_KEY_HEADER } from '@counterpoise/api';
import type { Clock } from '../clock';
import { type AccessTokenCheck, requireApiKey } from '../keys/api-key.middleware';
import { apiKeyRateLimit } from '../keys/api-key.rate-limit';
import type { ApiKeyService } from '../keys/keys.service';
import { recordUsage } from '../usage/usage.recorder';
import type { UsageSink } from './keyed-request';

/** What the keyed `/api/v1` chain is built from. */
export interface KeyedV1Deps {
  readonly clock: Clock;
  /** Where each keyed request's row goes; the calculator routes log batch items to the same sink. */
  readonly usage: UsageSink;
  /** Web origins whose pages may call the API; none means no cross-origin access. */
  readonly corsOrigins: readonly string[];
  /**
   * The key service, built by the app and shared with the workbench's key routes, so that a revocation
   * there counts at once.
   */
  readonly keys: ApiKeyService;
  /** Accepts signed-in people's access tokens beside API keys. */
  readonly tokens?: AccessTokenCheck;
  /** Calculations per minute of a signed-in person on these routes (a batch of n counts n). */
  readonly userLimitPerMinute?: number;
  /**
   * The paths the API documents (`documentedPaths` of its OpenAPI registries): a usage row names one
   * of these, or the fixed label of an unknown route.
   */
  readonly documentedPaths: ReadonlySet<string>;
}

/**
 * CORS for the configured origins. Preflights are answered here, before the key check, because a
 * browser sends them without the key; answers expose the rate-limit headers to the page's script.
 */
function corsFor(origins: readonly string[]): RequestHandler {
  return cors({
    origin: [...origins],
    methods: ['GET', 'POST'],
    allowedHeaders: [API_KEY_HEADER, 'Authorization', 'Content-Type'],
    exposedHeaders: [
      'RateLimit-Limit',
      'RateLimit-Remaining',
      'RateLimit-Reset',
      'RateLimit-Policy',
      'Retry-After',
    ],
    maxAge: 600,
  });
}

/**
 * The middleware every keyed route sits behind, in order: CORS (when origins are configured), the API-key
 * check, the usage recorder, the per-key rate limit. Build it once and mount it wherever keyed routes are
 * (`app.use(path, chain, routes)`): its rate-limit counters and key cache are then shared by every mount.
 *
 * With `tokens`, a signed-in person's access token is accepted in place of a key; such requests are
 * rate-limited per person and leave no usage row (usage is the keys' account). The limit counts
 * calculations, as the usage log does: a request counts one, a batch of n counts n.
 *
 * The recorder sits before the rate limit so that a refused 429 is still a logged request of its key;
 * requests without a valid key have no key to log against and are not recorded.
 */
export function keyedMiddleware(deps: KeyedV1Deps): RequestHandler[] {
  return [
    ...(deps.corsOrigins.length > 0 ? [corsFor(deps.corsOrigins)] : []),
    requireApiKey(deps.keys, deps.tokens),
    recordUsage(deps.usage, deps.clock, deps.documentedPaths),
    apiKeyRateLimit(
      deps.userLimitPerMinute === undefined ? {} : { userLimitPerMinute: deps.userLimitPerMinute },
    ),
  ];
}

/**
 * The `/api/v1` router of the keyed routes that are not the calculator: the keyed middleware (`chain`,
 * or a new one), then `routes` (the usage report, which the app builds). Routes mounted on the returned
 * router afterwards pass through the same chain and find the key on `res.locals.apiKey`; a path none
 * answers is still a logged request of its key, and falls through to the 404.
 */
export function keyedV1Router(
  deps: KeyedV1Deps & { readonly chain?: RequestHandler[]; readonly routes?: readonly Router[] },
): Router {
  const router = Router();
  router.use(deps.chain ?? keyedMiddleware(deps));
  for (const routes of deps.routes ?? []) router.use(routes);
  return router;
}
