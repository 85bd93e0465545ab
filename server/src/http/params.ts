import type { RequestHandler } from 'express';
import * as z from 'zod';
import { HttpProblem } from './problem';

/** A path parameter that names a stored row: a positive whole number. */
export const IdParamSchema = z.object({
  id: z
    .string()
    .regex(/^[1-9]\d{0,15}$/, { error: 'The id is a positive whole number.' })
    .transform(Number)
    .meta({ param: { name: 'id', in: 'path' }, example: '3' }),
});

/** A path parameter that carries the secret of a link (an invitation's token). */
export const TokenParamSchema = z.object({
  token: z
    .string()
    .min(1)
    .max(200)
    .meta({ param: { name: 'token', in: 'path' }, example: 'q8W1mZk3r5T7v9X0b2N4c6M8a0S2d4F6g8H0j2K4l6P' }),
});

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** The path parameters as the route's schema parsed them. */
      params?: unknown;
    }
  }
}

/** Checks the path parameters and keeps the parsed values in `res.locals.params`; 400 naming the one at fault. */
export function validateParams(schema: z.ZodType): RequestHandler {
  return (req, res, next) => {
    const parsed = schema.safeParse(req.params);
    if (!parsed.success) {
      const errors = parsed.error.issues.map((issue) => ({
        path: issue.path.join('.'),
        message: issue.message,
      }));
      next(
        new HttpProblem(
          400,
          'Bad Request',
          errors.map((error) => `${error.path}: ${error.message}`).join(' '),
          errors,
          'about:blank',
          'INVALID_REQUEST',
        ),
      );
      return;
    }
    res.locals.params = parsed.data;
    next();
  };
}
