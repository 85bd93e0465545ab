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
export function apiKeyRateLimit(): RequestHandler {
  return rateLimit({
    windowMs: WINDOW_MS,
    limit: (_req, res) => res.locals.apiKey?.limitPerMinute ?? 1,
    keyGenerator: (_req, res) => String(res.locals.apiKey?.id),
    standardHeaders: 'draft-6',
    legacyHeaders: false,
    handler: (_req, res, next) => {
      const limit = res.locals.apiKey?.limitPerMinute;
      const retryAfterSeconds = res.getHeader('Retry-After');
      next(
        new HttpProblem(
          429,
          'Too Many Requests',
          `This API key may make ${limit} requests a minute. Try again in ${retryAfterSeconds} s.`,
          undefined,
          'about:blank',
          KEY_PROBLEM_CODES.rateLimited,
        ),
      );
    },
  });
}
