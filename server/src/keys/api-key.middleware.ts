import type { IncomingHttpHeaders } from 'node:http';
import type { RequestHandler, Response } from 'express';
import { API_KEY_HEADER, KEY_PROBLEM_CODES } from '@counterpoise/api';
import { HttpProblem } from '../http/problem';
import { looksLikeJwt } from '../auth/tokens';
import type { UserRecord } from '../accounts/accounts.repo';
import { API_KEY_SCHEME_PREFIX, type ApiKeyService } from './keys.service';

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
 * The access token of a signed-in person, when the request carries one instead of a key: a bearer
 * value in the form of a JWT, not a `cpk_` key, with no `X-Api-Key` beside it.
 */
function presentedAccessToken(headers: IncomingHttpHeaders): string | undefined {
  const header = headers[HEADER];
  if (header !== undefined && header !== '') return undefined;
  const authorization = headers.authorization;
  const bearer = authorization === undefined ? undefined : BEARER.exec(authorization)?.[1];
  if (bearer === undefined || bearer.startsWith(API_KEY_SCHEME_PREFIX) || !looksLikeJwt(bearer)) {
    return undefined;
  }
  return bearer;
}

/**
 * Lets through only requests with a valid, unrevoked API key, and leaves the key on
 * `res.locals.apiKey`. 401 for no key, a malformed or an unknown one; 403 for a revoked one. The
 * refusals are built once: a flood of bad keys allocates nothing but the answer.
 *
 * With `tokens`, a signed-in person's access token (`Authorization: Bearer <jwt>`) is accepted too, so
 * that the workbench's calculator calls these routes as its user: the person is left on
 * `res.locals.user` and `res.locals.apiKey` stays unset (no usage row is written for them).
 */
export function requireApiKey(keys: ApiKeyService, tokens?: AccessTokenCheck): RequestHandler {
  return (req, res, next) => {
    const accessToken = tokens === undefined ? undefined : presentedAccessToken(req.headers);
    if (accessToken !== undefined) {
      tokens!.authenticate(accessToken).then(
        (user) => {
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
      next(
        new HttpProblem(
          403,
          'Forbidden',
          `This API key (${checked.prefix}…) was revoked on ${checked.revokedAt.toISOString()}. Ask for a new one.`,
          undefined,
          'about:blank',
          KEY_PROBLEM_CODES.revoked,
        ),
      );
      return;
    }
    res.locals.apiKey = checked;
    next();
  };
}
