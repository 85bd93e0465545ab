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
    readonly code?: string,
  ) {
    super(detail ?? title);
  }

  /**
   * Headers the answer carries beside the problem (`Retry-After` of a 429, the `ETag` of the record a
   * 412 names). A subclass sets them, so that the final handler writes every problem the same way.
   */
  readonly headers?: Readonly<Record<string, string>>;
  /**
   * Extension members of the problem (RFC 9457 section 3.2), such as the stored record of a 412; the
   * standard members always win over an extension of the same name.
   */
  readonly extensions?: Readonly<Record<string, unknown>>;

  /** The error that answers with `problem` (its `instance` is set from the request). */
  static from(problem: Problem): HttpProblem {
    return new HttpProblem(
      problem.status,
      problem.title,
      problem.detail,
      problem.errors,
      problem.type,
      problem.code,
    );
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

/** A 405 problem, with the `Allow` header, for a known path asked with a method it does not take. */
export function methodNotAllowed(...allowed: readonly string[]): RequestHandler {
  const allow = allowed.join(', ');
  return (req, res, next) => {
    res.setHeader('Allow', allow);
    next(new HttpProblem(405, 'Method Not Allowed', `${req.method} is not allowed here; use ${allow}.`));
  };
}

/** The charset parameter of a Content-Type, quoted or not. */
const CHARSET_PARAMETER = /;\s*charset\s*=\s*(?:"([^"]*)"|([^;\s]*))/i;
const UNSUPPORTED_CHARSET_DETAIL =
  'The body must be JSON in UTF-8: send Content-Type: application/json, with no charset or charset=utf-8.';
const UNSUPPORTED_CHARSET = new HttpProblem(415, 'Unsupported Media Type', UNSUPPORTED_CHARSET_DETAIL);

/**
 * A 415 problem unless the request says its body is JSON, in UTF-8. RFC 8259 (8.1) has JSON exchanged
 * between systems in UTF-8 alone; a body declared in another charset (`koi8-r`, or `utf-7`, which the
 * parser would decode and so let `+ADw-` through as `<`) is refused before it is read, whatever parser
 * follows.
 */
export const requireJsonBody: RequestHandler = (req, _res, next) => {
  const headers = req.headers;
  // The usual spelling, with a body, is decided without parsing the type: what `req.is` would answer,
  // on every one of the API's busiest requests, for a fraction of its work. (type-is counts a body when
  // Transfer-Encoding is present or Content-Length is a number.)
  if (
    headers['content-type'] === 'application/json' &&
    (headers['transfer-encoding'] !== undefined || !Number.isNaN(Number(headers['content-length'])))
  ) {
    next();
    return;
  }
  if (!req.is('application/json')) {
    const sent = req.headers['content-type'] ?? 'no Content-Type';
    next(
      new HttpProblem(
        415,
        'Unsupported Media Type',
        `The body must be JSON, sent with Content-Type: application/json (got ${sent}).`,
      ),
    );
    return;
  }
  const contentType = req.headers['content-type']!;
  if (contentType.includes(';')) {
    const match = CHARSET_PARAMETER.exec(contentType);
    const charset = (match?.[1] ?? match?.[2])?.toLowerCase();
    if (charset !== undefined && charset !== 'utf-8') {
      next(UNSUPPORTED_CHARSET);
      return;
    }
  }
  next();
};

/**
 * The status and wording of the errors Express's own body parsers raise (body-parser and raw-body set
 * `type` on each). Each is the client's doing, so none is logged.
 */
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
    detail:
      'The body uses a Content-Encoding this server does not read; send it as it is, or in gzip, deflate or br.',
  },
  'charset.unsupported': {
    status: 415,
    title: 'Unsupported Media Type',
    detail: UNSUPPORTED_CHARSET_DETAIL,
  },
  'request.size.invalid': {
    status: 400,
    title: 'Bad Request',
    detail: 'The body is not as long as its Content-Length says.',
  },
  'request.aborted': {
    status: 400,
    title: 'Bad Request',
    detail: 'The request was broken off before its body had arrived.',
  },
};

/** The encodings body-parser decompresses; any other is refused as `encoding.unsupported`. */
const DECOMPRESSED_ENCODINGS = new Set(['gzip', 'deflate', 'br', 'zstd']);

/**
 * The problem of a body that failed to decompress, or whose stream broke, or undefined for any other
 * error. body-parser passes such a failure on as the stream's own error (zlib's `Z_DATA_ERROR`, a
 * Brotli `ERR_…` code, a socket's `ECONNRESET`: a Node error with `code` and `errno`), marked for the
 * client (`expose`) with status 400 and no `type`.
 */
function unreadableBody(error: unknown, contentEncoding: string | undefined): Problem | undefined {
  const candidate = error as
    | { status?: unknown; expose?: unknown; type?: unknown; code?: unknown; errno?: unknown }
    | null
    | undefined;
  if (
    candidate?.status !== 400 ||
    candidate.expose !== true ||
    candidate.type !== undefined ||
    typeof candidate.code !== 'string' ||
    typeof candidate.errno !== 'number'
  ) {
    return undefined;
  }
  const encoding = contentEncoding?.trim().toLowerCase();
  return {
    type: 'about:blank',
    title: 'Bad Request',
    status: 400,
    detail:
      encoding !== undefined && DECOMPRESSED_ENCODINGS.has(encoding)
        ? `The body is not valid ${encoding} data, as its Content-Encoding says: it is corrupt or cut short.`
        : 'The body could not be read to its end.',
  };
}

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
      if (error.headers) res.set(error.headers);
      sendProblem(res, {
        ...error.extensions,
        type: error.type,
        title: error.title,
        status: error.status,
        ...(error.detail === undefined ? {} : { detail: error.detail }),
        ...(error.errors === undefined ? {} : { errors: [...error.errors] }),
        ...(error.code === undefined ? {} : { code: error.code }),
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
    const unreadable = unreadableBody(error, req.headers['content-encoding']);
    if (unreadable) {
      sendProblem(res, { ...unreadable, instance });
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
