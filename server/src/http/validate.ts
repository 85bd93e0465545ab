import { invalidRequestProblem } from '@counterpoise/api';
import type { RequestHandler } from 'express';
import type * as z from 'zod';
import { compileJsonAcceptor } from './json-acceptor';
import { HttpProblem } from './problem';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** The request body as the route's schema parsed it; handlers read this, never `req.body`. */
      body?: unknown;
      /** The query string as the route's schema parsed it. */
      query?: unknown;
      /** The request headers the route declares, as its schema parsed them. */
      headers?: unknown;
    }
  }
}

/**
 * Checks the body against the route's zod schema and keeps the parsed, typed value in `res.locals.body`,
 * so that the handler never parses twice. A body that does not fit answers 400 with every field at fault.
 */
export function validateBody(schema: z.ZodType): RequestHandler {
  return (req, res, next) => {
    const parsed = schema.safeParse(req.body);
    if (!parsed.success) {
      next(HttpProblem.from(invalidRequestProblem(parsed.error)));
      return;
    }
    res.locals.body = parsed.data;
    next();
  };
}

/**
 * `validateBody` for the busiest routes: a body that the schema's JSON acceptor takes (json-acceptor.ts)
 * is kept as it is, which zod would give back unchanged; any other is validated by zod, whose problem
 * names the fields at fault. A schema without an acceptor is validated by zod alone.
 */
export function validateJsonBody(schema: z.ZodType): RequestHandler {
  const validate = validateBody(schema);
  const accept = compileJsonAcceptor(schema);
  if (accept === undefined) return validate;
  return (req, res, next) => {
    if (!accept(req.body)) {
      validate(req, res, next);
      return;
    }
    res.locals.body = req.body;
    next();
  };
}

/** The same for the query string, kept in `res.locals.query`. */
export function validateQuery(schema: z.ZodType): RequestHandler {
  return (req, res, next) => {
    const parsed = schema.safeParse(req.query);
    if (!parsed.success) {
      next(HttpProblem.from(invalidRequestProblem(parsed.error)));
      return;
    }
    res.locals.query = parsed.data;
    next();
  };
}

/**
 * The same for the request headers a route declares (a zod object of lower-case names, as Node gives
 * them), kept in `res.locals.headers`. Headers the schema does not name are left alone.
 */
export function validateHeaders(schema: z.ZodType): RequestHandler {
  return (req, res, next) => {
    const parsed = schema.safeParse(req.headers);
    if (!parsed.success) {
      next(HttpProblem.from(invalidRequestProblem(parsed.error)));
      return;
    }
    res.locals.headers = parsed.data;
    next();
  };
}
