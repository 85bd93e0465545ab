import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { KEY_PROBLEM_CODES } from '@counterpoise/api';
import { HttpProblem } from '../http/problem';

/** The window the stored limit counts over: a key's limit is per minute. */
const WINDOW_MS = 60_000;

/**
 * The per-key rate limit: each key may make `limitPerMinute` requests in a fixed one-minute window,
 * counted in this process's memory. Every answer carries `RateLimit-Limit`, `RateLimit-Remaining`,
 * `RateLimit-Reset` and `RateLimit-Policy` (IETF draft 6); a request over the limit gets a 429
 * problem with `Retry-After`. It runs after the key check, so it counts keys, never addresses.
 */
export function apiKeyRateLimit(options: { userLimitPerMinute?: number } = {}): RequestHandler {
  const userLimit = options.userLimitPerMinute ?? 600;
  return rateLimit({
    windowMs: WINDOW_MS,
    // A signed-in person (the workbench's calculator) is counted apart from every key, at `userLimit`.
    limit: (_req, res) => res.locals.apiKey?.limitPerMinute ?? (res.locals.user ? userLimit : 1),
    keyGenerator: (_req, res) =>
      res.locals.apiKey ? `key:${res.locals.apiKey.id}` : `user:${res.locals.user?.id}`,
    standardHeaders: 'draft-6',
    legacyHeaders: false,
    handler: (_req, res, next) => {
      const retryAfterSeconds = res.getHeader('Retry-After');
      const who = res.locals.apiKey
        ? `This API key may make ${res.locals.apiKey.limitPerMinute} requests a minute.`
        : `You may make ${userLimit} requests a minute here.`;
      next(
        new HttpProblem(
          429,
          'Too Many Requests',
          `${who} Try again in ${retryAfterSeconds} s.`,
          undefined,
          'about:blank',
          KEY_PROBLEM_CODES.rateLimited,
        ),
      );
    },
  });
}
