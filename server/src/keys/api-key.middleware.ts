import type { IncomingHttpHeaders } from 'node:http';
import type { Request, RequestHandler, Response } from 'express';
import { API_KEY_HEADER, KEY_PROBLEM_CODES } from '@counterpoise/api';
import { HttpProblem } from '../http/problem';
import { looksLikeJwt } from '../auth/tokens';
import type { UserRecord } from '../accounts/accounts.repo';
import type { KeyCors } from './key-cors';
import type { ApiKeyCheckRow } from './keys.repo';
import { API_KEY_SCHEME_PREFIX, type ApiKeyService } from './keys.service';
import { isVisitorToken, type VisitorClaims, type VisitorTokens } from './visitor-tokens';

/** What identifies a signed-in person from their access token (the accounts' AuthService). */
export interface AccessTokenCheck {
  authenticate(token: string): Promise<UserRecord>;
}

const HEADER = API_KEY_HEADER.toLowerCase();
const BEARER = /^bearer[ \t]+(\S+)[ \t]*$/i;

const FORM = `Send it in the ${API_KEY_HEADER} header, or as Authorization: Bearer <key>.`;

/** Why a request carries no usable key; a string when it carries one. */
type Presented = string | HttpProblem;

const unauthorized = (detail: string, code: string) =>
  new HttpProblem(401, 'Unauthorized', detail, undefined, 'about:blank', code);

const MISSING = unauthorized(`This route needs an API key. ${FORM}`, KEY_PROBLEM_CODES.missing);
const NOT_BEARER = unauthorized(
  `The Authorization header does not hold a bearer key. ${FORM}`,
  KEY_PROBLEM_CODES.missing,
);
const TWO_KEYS = unauthorized(
  `The ${API_KEY_HEADER} and Authorization headers carry different keys. Send one key.`,
  KEY_PROBLEM_CODES.conflict,
);
const MALFORMED = unauthorized(
  'The API key is not in the form of a Counterpoise key (cpk_ and 43 letters, digits, - or _).',
  KEY_PROBLEM_CODES.invalid,
);
const UNKNOWN = unauthorized('The API key is not known to this server.', KEY_PROBLEM_CODES.invalid);

/**
 * The key a request presents. `X-Api-Key` wins when there is no bearer key beside it; an
 * Authorization header of another scheme (a proxy's own login, say) is then left alone. Two
 * different keys are refused rather than one picked silently.
 */
function presentedKey(headers: IncomingHttpHeaders): Presented {
  const header = headers[HEADER];
  const authorization = headers.authorization;
  const bearer = authorization === undefined ? undefined : BEARER.exec(authorization)?.[1];
  if (typeof header === 'string' && header !== '') {
    if (bearer !== undefined && bearer !== header) return TWO_KEYS;
    return header;
  }
  if (Array.isArray(header)) return TWO_KEYS;
  if (bearer !== undefined) return bearer;
  return authorization === undefined ? MISSING : NOT_BEARER;
}

/** RFC 9110 asks a 401 to say how to authenticate; RFC 6750 adds why a presented key failed. */
function challenge(res: Response, problem: HttpProblem): void {
  res.setHeader(
    'WWW-Authenticate',
    problem === MISSING || problem === NOT_BEARER
      ? 'Bearer realm="Counterpoise API"'
      : 'Bearer realm="Counterpoise API", error="invalid_token"',
  );
}

/**
 * A token the request carries instead of a key (a signed-in person's access token or a visitor token):
 * a bearer value in the form of a JWT, not a `cpk_` key, with no `X-Api-Key` beside it.
 */
function presentedJwt(headers: IncomingHttpHeaders): string | undefined {
  const header = headers[HEADER];
  if (header !== undefined && header !== '') return undefined;
  const authorization = headers.authorization;
  const bearer = authorization === undefined ? undefined : BEARER.exec(authorization)?.[1];
  if (bearer === undefined || bearer.startsWith(API_KEY_SCHEME_PREFIX) || !looksLikeJwt(bearer)) {
    return undefined;
  }
  return bearer;
}

/** What the key check is built with, beside the key service. */
export interface KeyCheckOptions {
  /** Accepts signed-in people's access tokens beside keys. */
  readonly tokens?: AccessTokenCheck;
  /** Accepts visitor tokens, on the paths under `visitorTokenScope` only. */
  readonly visitorTokens?: VisitorTokens;
  /** The base path of the routes a visitor token may call: the calculator's (`/api/v1/calc`). */
  readonly visitorTokenScope?: string;
  /** CORS of the keyed routes; without it, no CORS header is set or removed here. */
  readonly cors?: KeyCors;
}

const forbidden = (detail: string, code: string) =>
  new HttpProblem(403, 'Forbidden', detail, undefined, 'about:blank', code);

const revokedProblem = (row: ApiKeyCheckRow, revokedAt: Date, token: boolean) =>
  forbidden(
    token
      ? `The API key this token was made with (${row.prefix}…) was revoked on ${revokedAt.toISOString()}; its tokens no longer work.`
      : `This API key (${row.prefix}…) was revoked on ${revokedAt.toISOString()}. Ask for a new one.`,
    KEY_PROBLEM_CODES.revoked,
  );

/**
 * Why a request may not use a key limited to web origins (`allowed`), or undefined when it may: its
 * `Origin` header must be one of them. A request without one is refused too: browsers send `Origin` on
 * every cross-origin request, so a request without it comes from a program, which should hold a key
 * without origins (or a visitor token) rather than a key that any visitor of the portal can read.
 */
function originRefusal(
  origin: string | undefined,
  allowed: readonly string[],
  what: string,
): HttpProblem | undefined {
  if (allowed.length === 0 || (origin !== undefined && allowed.includes(origin))) return undefined;
  const listed = allowed.join(', ');
  return forbidden(
    origin === undefined
      ? `${what} may be used only from web pages of ${listed}, and this request carries no Origin header. ` +
          'A program outside a browser needs a key without origins, or a visitor token.'
      : `${what} may not be used from ${origin}, only from ${listed}. An owner or developer can add ` +
          'this origin to the key in the developer portal.',
    KEY_PROBLEM_CODES.originRefused,
  );
}

/** The path of a request without its query, in lower case: Express matches routes regardless of case. */
const pathOf = (req: Request) => req.originalUrl.split('?')[0]!.toLowerCase();

/**
 * Lets through only requests with a valid, unrevoked API key, and leaves the key on
 * `res.locals.apiKey`. 401 for no key, a malformed or an unknown one; 403 for a revoked one, and for a
 * key limited to web origins sent from another origin or with none. The fixed refusals are built once: a
 * flood of bad keys allocates nothing but the answer.
 *
 * With `tokens`, a signed-in person's access token (`Authorization: Bearer <jwt>`) is accepted too, so
 * that the workbench's calculator calls these routes as its user: the person is left on
 * `res.locals.user` and `res.locals.apiKey` stays unset (no usage row is written for them).
 *
 * With `visitorTokens`, a visitor token is accepted on the routes under `visitorTokenScope`: it stands
 * for its key (`res.locals.apiKey`, so that usage and limit are the key's), while the key is not
 * revoked, from the origin it is bound to, and from the key's origins if it has any.
 */
export function requireApiKey(keys: ApiKeyService, options: KeyCheckOptions = {}): RequestHandler {
  const { tokens, visitorTokens, cors } = options;
  const scope = options.visitorTokenScope;
  return (req, res, next) => {
    const jwt = presentedJwt(req.headers);
    if (jwt !== undefined && visitorTokens !== undefined && isVisitorToken(jwt)) {
      checkVisitorToken(jwt).then(next, (error: unknown) => {
        if (error instanceof HttpProblem && error.status === 401) {
          res.setHeader('WWW-Authenticate', 'Bearer realm="Counterpoise API", error="invalid_token"');
        }
        next(error);
      });
      return;
    }
    if (jwt !== undefined && tokens !== undefined) {
      tokens.authenticate(jwt).then(
        (user) => {
          cors?.settle(req, res, false);
          res.locals.user = user;
          next();
        },
        (error: unknown) => {
          res.setHeader('WWW-Authenticate', 'Bearer realm="Counterpoise API", error="invalid_token"');
          next(error);
        },
      );
      return;
    }
    const presented = presentedKey(req.headers);
    if (typeof presented !== 'string') {
      challenge(res, presented);
      next(presented);
      return;
    }
    const checked = keys.check(presented);
    if (checked === 'malformed' || checked === 'unknown') {
      const problem = checked === 'malformed' ? MALFORMED : UNKNOWN;
      challenge(res, problem);
      next(problem);
      return;
    }
    if (checked.revokedAt !== null) {
      next(revokedProblem(checked, checked.revokedAt, false));
      return;
    }
    const refusal = originRefusal(
      req.headers.origin,
      checked.allowedOrigins,
      `This API key (${checked.prefix}…)`,
    );
    if (refusal !== undefined) {
      next(refusal);
      return;
    }
    cors?.settle(req, res, checked.allowedOrigins.length > 0);
    res.locals.apiKey = checked;
    next();

    /** Checks a visitor token; resolves when the request may go on, rejects with its problem. */
    async function checkVisitorToken(token: string): Promise<void> {
      const claims = await visitorTokens!.verify(token);
      if (claims === 'expired') {
        throw unauthorized(
          'The token has expired. Ask the portal for a new one (its back end exchanges its key for it).',
          KEY_PROBLEM_CODES.tokenExpired,
        );
      }
      if (claims === 'invalid') {
        throw unauthorized(
          'The token is not one of this server’s, or was altered.',
          KEY_PROBLEM_CODES.tokenInvalid,
        );
      }
      const path = pathOf(req);
      const base = scope?.toLowerCase();
      if (base === undefined || (path !== base && !path.startsWith(`${base}/`))) {
        throw forbidden(
          `A visitor token may call the calculation routes (${scope ?? 'none here'}/…) only; ${req.method} ` +
            `${path} needs the API key itself.`,
          KEY_PROBLEM_CODES.tokenScope,
        );
      }
      const row = keys.checkById(claims.keyId);
      if (row === 'unknown') {
        throw unauthorized(
          'The key this token was made with no longer exists.',
          KEY_PROBLEM_CODES.tokenInvalid,
        );
      }
      if (row.revokedAt !== null) throw revokedProblem(row, row.revokedAt, true);
      const origin = req.headers.origin;
      if (claims.origin !== undefined && origin !== claims.origin) {
        throw forbidden(
          origin === undefined
            ? `This token is for pages of ${claims.origin}, and this request carries no Origin header.`
            : `This token is for pages of ${claims.origin}, not of ${origin}.`,
          KEY_PROBLEM_CODES.originRefused,
        );
      }
      const refusal = originRefusal(origin, row.allowedOrigins, `The API key of this token (${row.prefix}…)`);
      if (refusal !== undefined) throw refusal;
      cors?.settle(req, res, claims.origin !== undefined || row.allowedOrigins.length > 0);
      res.locals.apiKey = row;
      res.locals.visitorToken = claims;
    }
  };
}

declare global {
  // Express types `res.locals` through this interface.
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** Set by the key check when the request came with a visitor token instead of the key. */
      visitorToken?: VisitorClaims;
    }
  }
}
