import type { ErrorRequestHandler } from 'express';
import { HttpProblem } from '../http/problem';

/** A 429 problem that says how long to wait; the accounts routers answer it with `Retry-After`. */
export class TooManyRequests extends HttpProblem {
  constructor(
    detail: string,
    code: string,
    /** Whole seconds before a new attempt can be taken. */
    readonly retryAfterSeconds: number,
  ) {
    super(429, 'Too Many Requests', detail, undefined, 'about:blank', code);
  }
}

/**
 * Sets `Retry-After` on the answer of a `TooManyRequests` problem, then hands the problem on to the
 * final handler. Mounted last in the accounts routers, so that every refusal of theirs tells the client
 * when to come back, whichever layer refused.
 */
export const retryAfterHeader: ErrorRequestHandler = (error, _req, res, next) => {
  if (error instanceof TooManyRequests && !res.headersSent) {
    res.setHeader('Retry-After', String(error.retryAfterSeconds));
  }
  next(error);
};
