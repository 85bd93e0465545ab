import cors from 'cors';
import { type RequestHandler, Router } from 'express';
import { API_KEY_HEADER } from '@counterpoise/api';
import type { Clock } from '../clock';
import type { Database } from '../db/database';
import { type AccessTokenCheck, requireApiKey } from '../keys/api-key.middleware';
import { apiKeyRateLimit } from '../keys/api-key.rate-limit';
import { ApiKeysRepo } from '../keys/keys.repo';
import { ApiKeyService } from '../keys/keys.service';
import { UsageRepo } from '../usage/usage.repo';
import { recordUsage } from '../usage/usage.recorder';
import { usageRouter } from '../usage/usage.router';
import type { UsageSink } from './keyed-request';

/** What the keyed `/api/v1` chain is built from. */
export interface KeyedV1Deps {
  readonly database: Database;
  readonly clock: Clock;
  /** Where each keyed request's row goes; the calculator routes log batch items to the same sink. */
  readonly usage: UsageSink;
  /** Web origins whose pages may call the API; none means no cross-origin access. */
  readonly corsOrigins: readonly string[];
  /** The key service to share with the workbench's key routes, so that a revocation there counts at once. */
  readonly keys?: ApiKeyService;
  /** Accepts signed-in people's access tokens beside API keys. */
  readonly tokens?: AccessTokenCheck;
  /** Requests per minute of a signed-in person on these routes. */
  readonly userLimitPerMinute?: number;
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
 * The `/api/v1` router every keyed route hangs from: CORS (when origins are configured), the API-key
 * check, the usage recorder, the per-key rate limit, then the usage report. Routes mounted on the
 * returned router afterwards (`v1.use('/calc', …)`) pass through the same chain and find the key on
 * `res.locals.apiKey`.
 *
 * With `tokens`, a signed-in person's access token is accepted in place of a key; such requests are
 * rate-limited per person and leave no usage row (usage is the keys' account).
 *
 * The recorder sits before the rate limit so that a refused 429 is still a logged request of its key;
 * requests without a valid key have no key to log against and are not recorded.
 */
export function keyedV1Router(deps: KeyedV1Deps): Router {
  const router = Router();
  if (deps.corsOrigins.length > 0) router.use(corsFor(deps.corsOrigins));
  const keys = deps.keys ?? new ApiKeyService(new ApiKeysRepo(deps.database.orm));
  router.use(requireApiKey(keys, deps.tokens));
  router.use(recordUsage(deps.usage, deps.clock));
  router.use(
    apiKeyRateLimit(
      deps.userLimitPerMinute === undefined ? {} : { userLimitPerMinute: deps.userLimitPerMinute },
    ),
  );
  // Mounted at its path, so that the calculator's requests skip it without entering it.
  router.use('/usage', usageRouter({ repo: new UsageRepo(deps.database.orm), clock: deps.clock }));
  return router;
}
