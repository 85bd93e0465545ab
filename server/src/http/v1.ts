import { type RequestHandler, Router } from 'express';
import type { Clock } from '../clock';
import { type AccessTokenCheck, requireApiKey } from '../keys/api-key.middleware';
import { apiKeyRateLimit } from '../keys/api-key.rate-limit';
import { KeyCors } from '../keys/key-cors';
import type { ApiKeyService } from '../keys/keys.service';
import type { VisitorTokens } from '../keys/visitor-tokens';
import { recordUsage } from '../usage/usage.recorder';
import type { UsageSink } from './keyed-request';

/** What the keyed `/api/v1` chain is built from. */
export interface KeyedV1Deps {
  readonly clock: Clock;
  /** Where each keyed request's row goes; the calculator routes log batch items to the same sink. */
  readonly usage: UsageSink;
  /**
   * Web origins whose pages may read every keyed answer (`CORS_ORIGINS`); a key limited to web origins
   * opens CORS for its own origins beside them (`KeyCors`).
   */
  readonly corsOrigins: readonly string[];
  /** Accepts visitor tokens (exchanged for a key by a portal's back end) on `visitorTokenScope`. */
  readonly visitorTokens?: VisitorTokens;
  /** The base path of the routes a visitor token may call (the calculator's). */
  readonly visitorTokenScope?: string;
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
 * The middleware every keyed route sits behind, in order: CORS (the configured origins and the keys'
 * own, `KeyCors`), the API-key check (which settles CORS for the key), the usage recorder, the per-key
 * rate limit. Build it once and mount it wherever keyed routes are (`app.use(path, chain, routes)`): its
 * rate-limit counters and key cache are then shared by every mount.
 *
 * With `tokens`, a signed-in person's access token is accepted in place of a key; such requests are
 * rate-limited per person and leave no usage row (usage is the keys' account). The limit counts
 * calculations, as the usage log does: a request counts one, a batch of n counts n.
 *
 * The recorder sits before the rate limit so that a refused 429 is still a logged request of its key;
 * requests without a valid key have no key to log against and are not recorded.
 */
export function keyedMiddleware(deps: KeyedV1Deps): RequestHandler[] {
  const cors = new KeyCors(deps.corsOrigins, deps.keys, deps.visitorTokens);
  return [
    cors.middleware,
    requireApiKey(deps.keys, {
      cors,
      ...(deps.tokens ? { tokens: deps.tokens } : {}),
      ...(deps.visitorTokens ? { visitorTokens: deps.visitorTokens } : {}),
      ...(deps.visitorTokenScope ? { visitorTokenScope: deps.visitorTokenScope } : {}),
    }),
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
