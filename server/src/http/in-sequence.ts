import type { RequestHandler } from 'express';

/**
 * Runs handlers one after the other as one handler, the way a route runs its middleware: each goes on
 * to the next by calling `next()`, and an error skips the rest to the caller's `next`. What a handler
 * throws, or the promise it returns rejects with, becomes that error too, as Express does for each layer:
 * a handler may run in a body parser's callback, where nothing else would catch it. For a hot path that
 * finds its handlers in a table instead of through a router.
 */
export function inSequence(...handlers: readonly RequestHandler[]): RequestHandler {
  return (req, res, next) => {
    // One `next` for the whole sequence, as Express's router keeps one per request: the busiest requests
    // pass here, and a closure per handler would be garbage on every one of them.
    let index = 0;
    const step = (error?: unknown): void => {
      if (error) {
        next(error);
        return;
      }
      const handler = handlers[index++];
      if (handler === undefined) {
        next();
        return;
      }
      try {
        const result: unknown = handler(req, res, step);
        if (result instanceof Promise) result.catch(next);
      } catch (thrown) {
        next(thrown);
      }
    };
    step();
  };
}
