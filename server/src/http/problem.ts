import type { ErrorRequestHandler, RequestHandler, Response } from 'express';
import { type FieldError, PROBLEM_MEDIA_TYPE, type Problem } from '@counterpoise/api';

/**
 * An error that the client can act on, answered as RFC 9457 `application/problem+json`. Throw it (or
 * pass it to `next`) from any handler; the final error handler writes it.
 */
export class HttpProblem extends Error {
  override readonly name = 'HttpProblem';

  constructor(
    readonly status: number,
    readonly title: string,
    readonly detail?: string,
    readonly errors?: readonly FieldError[],
    readonly type = 'about:blank',
  ) {
    super(detail ?? title);
  }
}

/** Writes a problem answer. */
export function sendProblem(res: Response, problem: Problem): void {
  res.status(problem.status).type(PROBLEM_MEDIA_TYPE).json(problem);
}

/** A 404 problem for every API path that no route answered. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpProblem(404, 'Not Found', `No route ${req.method} ${req.originalUrl.split('?')[0]}.`));
};

/** The status and wording of the errors Express's own body parsers raise. */
const BODY_PARSER_ERRORS: Record<string, { status: number; title: string; detail: string }> = {
  'entity.parse.failed': {
    status: 400,
    title: 'Bad Request',
    detail: 'The body is not valid JSON.',
  },
  'entity.too.large': {
    status: 413,
    title: 'Content Too Large',
    detail: 'The body is larger than this route accepts.',
  },
  'encoding.unsupported': {
    status: 415,
    title: 'Unsupported Media Type',
    detail: 'The body uses a content encoding this server does not read.',
  },
};

/**
 * The last handler: every error becomes a problem answer. Anything unexpected is logged and answered
 * as a bare 500, so that no stack trace or internal detail reaches the client.
 */
export function problemHandler(log: (message: string, error: unknown) => void): ErrorRequestHandler {
  return (error: unknown, req, res, next) => {
    if (res.headersSent) {
      next(error);
      return;
    }
    const instance = req.originalUrl.split('?')[0];
    if (error instanceof HttpProblem) {
      sendProblem(res, {
        type: error.type,
        title: error.title,
        status: error.status,
        ...(error.detail === undefined ? {} : { detail: error.detail }),
        ...(error.errors === undefined ? {} : { errors: [...error.errors] }),
        instance,
      });
      return;
    }
    const parserType = (error as { type?: unknown } | null)?.type;
    const parserError = typeof parserType === 'string' ? BODY_PARSER_ERRORS[parserType] : undefined;
    if (parserError) {
      sendProblem(res, { type: 'about:blank', ...parserError, instance });
      return;
    }
    log(`Unexpected error on ${req.method} ${instance}`, error);
    sendProblem(res, {
      type: 'about:blank',
      title: 'Internal Server Error',
      status: 500,
      detail: 'The server failed to answer this request. It has been logged.',
      instance,
    });
  };
}
