import type { RequestHandler, Response } from 'express';
import { KEY_PROBLEM_CODES } from '@counterpoise/api';
import { HttpProblem } from '../http/problem';

/** The window a limit counts over: a key's limit is per minute. */
const WINDOW_MS = 60_000;

/** One key's (or person's) count in its current window. */
interface Window {
  used: number;
  resetAtMs: number;
}

/** What `CalculationWindows.take` found: whether the calculations were granted, and the window after. */
export interface Take {
  readonly granted: boolean;
  /** Calculations counted in the window, these included when granted. */
  readonly used: number;
  readonly resetAtMs: number;
  readonly nowMs: number;
}

/**
 * Calculations counted per key or person in fixed one-minute windows, in this process's memory. A
 * window opens with the first calculation after the last one closed, as express-rate-limit's memory
 * store does. express-rate-limit itself cannot be used: its store counts one per request, when the
 * request arrives, and a batch's weight is known only once its body is read.
 *
 * Windows live in two maps that trade places once a window's length (as express-rate-limit's memory
 * store keeps them): a window not touched for two turns has closed and is dropped with its map, so
 * memory holds only the recently active, and each call does O(1) work.
 */
export class CalculationWindows {
  private current = new Map<string, Window>();
  private previous = new Map<string, Window>();
  private turnAtMs: number;

  constructor(
    private readonly nowMs: () => number = Date.now,
    /** The length of a window. */
    readonly windowMs = WINDOW_MS,
  ) {
    this.turnAtMs = nowMs() + windowMs;
  }

  /**
   * Counts `count` calculations against `id` if they all fit under `limit` in its current window, or
   * none of them: a request is granted whole or refused whole. `counted` are calculations of the same
   * request counted before, in the window that closes at `counted.resetAtMs`: while that window lasts
   * they are part of `count` already, so only the rest is taken.
   */
  take(id: string, count: number, limit: number, counted?: { count: number; resetAtMs: number }): Take {
    const nowMs = this.nowMs();
    const window = this.windowOf(id, nowMs);
    const needed = counted?.resetAtMs === window.resetAtMs ? count - counted.count : count;
    const granted = window.used + needed <= limit;
    if (granted) window.used += needed;
    return { granted, used: window.used, resetAtMs: window.resetAtMs, nowMs };
  }

  private windowOf(id: string, nowMs: number): Window {
    if (nowMs >= this.turnAtMs) {
      // Two turns late, both maps hold closed windows only.
      this.previous = nowMs >= this.turnAtMs + this.windowMs ? new Map() : this.current;
      this.current = new Map();
      this.turnAtMs = nowMs + this.windowMs;
    }
    let window = this.current.get(id);
    if (window === undefined) {
      window = this.previous.get(id);
      if (window === undefined) window = { used: 0, resetAtMs: nowMs + this.windowMs };
      else this.previous.delete(id);
      this.current.set(id, window);
    }
    if (window.resetAtMs <= nowMs) {
      window.used = 0;
      window.resetAtMs = nowMs + this.windowMs;
    }
    return window;
  }
}

/** What the rate limit leaves on a request it let in, for a route that counts more than one calculation. */
interface Meter {
  readonly windows: CalculationWindows;
  readonly id: string;
  readonly limit: number;
  readonly limited: Limited;
  /** The window this request's first calculation was counted in. */
  readonly resetAtMs: number;
}

declare global {
  // Express types `res.locals` through this interface.
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** Set by the rate limit on every request it lets in; `takeBatchCalculations` reads it. */
      calculationMeter?: Meter;
    }
  }
}

/** Whose limit a request counts against, for the wording of a refusal. */
type Limited = 'key' | 'user';

const limitSentence = (limited: Limited, limit: number) =>
  limited === 'key'
    ? `This API key may make ${limit} calculations a minute (a batch of n counts n).`
    : `You may make ${limit} calculations a minute here (a batch of n counts n).`;

const secondsUntil = (take: Take) => Math.max(0, Math.ceil((take.resetAtMs - take.nowMs) / 1000));

/** The `RateLimit-*` headers of IETF draft 6, counting calculations. */
function setRateLimitHeaders(res: Response, limit: number, take: Take): void {
  res.setHeader('RateLimit-Policy', `${limit};w=${WINDOW_MS / 1000}`);
  res.setHeader('RateLimit-Limit', limit);
  res.setHeader('RateLimit-Remaining', Math.max(0, limit - take.used));
  res.setHeader('RateLimit-Reset', secondsUntil(take));
}

function tooMany(res: Response, take: Take, detail: string): HttpProblem {
  const retryAfterSeconds = secondsUntil(take);
  res.setHeader('Retry-After', retryAfterSeconds);
  return new HttpProblem(
    429,
    'Too Many Requests',
    `${detail} Try again in ${retryAfterSeconds} s.`,
    undefined,
    'about:blank',
    KEY_PROBLEM_CODES.rateLimited,
  );
}

/**
 * The per-key rate limit, in calculations: each key may make `limitPerMinute` calculations in a fixed
 * one-minute window; a signed-in person (the workbench's calculator) is counted apart, at
 * `userLimitPerMinute`. Every request counts one when it is let in; a batch of n counts the other n − 1
 * once its items are read (`takeBatchCalculations`). Every answer carries `RateLimit-Limit`,
 * `RateLimit-Remaining`, `RateLimit-Reset` and `RateLimit-Policy` (IETF draft 6) in calculations; a
 * request over the limit gets a 429 problem with `Retry-After`, and is not counted. It runs after the
 * key check, so it counts keys and people, never addresses.
 */
export function apiKeyRateLimit(options: { userLimitPerMinute?: number } = {}): RequestHandler {
  const userLimit = options.userLimitPerMinute ?? 600;
  const windows = new CalculationWindows();
  return (_req, res, next) => {
    const { apiKey, user } = res.locals;
    let id: string;
    let limit: number;
    let limited: Limited;
    if (apiKey !== undefined) {
      id = `key:${apiKey.id}`;
      limit = apiKey.limitPerMinute;
      limited = 'key';
    } else if (user !== undefined) {
      id = `user:${user.id}`;
      limit = userLimit;
      limited = 'user';
    } else {
      next(new Error('The rate limit is mounted without the API-key check.'));
      return;
    }
    const take = windows.take(id, 1, limit);
    setRateLimitHeaders(res, limit, take);
    if (!take.granted) {
      next(tooMany(res, take, `${limitSentence(limited, limit)} None are left in this minute.`));
      return;
    }
    res.locals.calculationMeter = { windows, id, limit, limited, resetAtMs: take.resetAtMs };
    next();
  };
}

/**
 * Counts a batch of `itemCount` calculations against the limit that let its request in, before any
 * item is computed: the one its request counted, and the rest now, all of them or none. Returns the
 * 429 problem (with `Retry-After` set) when they do not all fit; the request then stays counted as one,
 * so that oversized batches are not read for free. A request let in without a rate limit (the router's
 * own specs) is not limited.
 */
export function takeBatchCalculations(res: Response, itemCount: number): HttpProblem | undefined {
  const meter = res.locals.calculationMeter;
  if (meter === undefined) return undefined;
  const take = meter.windows.take(meter.id, itemCount, meter.limit, {
    count: 1,
    resetAtMs: meter.resetAtMs,
  });
  setRateLimitHeaders(res, meter.limit, take);
  if (take.granted) return undefined;
  const remaining = Math.max(0, meter.limit - take.used);
  let advice = '';
  if (itemCount > meter.limit) advice = ` Split it into batches of at most ${meter.limit} items.`;
  else if (remaining > 0) advice = ` Send at most ${remaining} items now, or the whole batch later.`;
  return tooMany(
    res,
    take,
    `This batch asks for ${itemCount} calculations, and ${remaining} remain in this minute (its own ` +
      `request counted as one). ${limitSentence(meter.limited, meter.limit)}${advice}`,
  );
}
