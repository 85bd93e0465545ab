import type { IncomingHttpHeaders } from 'node:http';
import type { RequestHandler } from 'express';
import { can, type Permission } from '@counterpoise/api';
import { HttpProblem } from '../http/problem';
import type { UserRecord } from '../accounts/accounts.repo';
import { AUTH_PROBLEM_CODES, type AuthService } from './auth.service';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** The signed-in person of the request's access token, as the database has them now. */
      user?: UserRecord;
    }
  }
}

const BEARER = /^bearer[ \t]+(\S+)[ \t]*$/i;

/** The bearer value of the Authorization header, if it carries one. */
export function bearerOf(headers: IncomingHttpHeaders): string | undefined {
  const authorization = headers.authorization;
  return authorization === undefined ? undefined : BEARER.exec(authorization)?.[1];
}

const SIGN_IN_REQUIRED = new HttpProblem(
  401,
  'Unauthorized',
  'Sign in first: this route needs an access token in Authorization: Bearer <token>.',
  undefined,
  'about:blank',
  AUTH_PROBLEM_CODES.signInRequired,
);

/**
 * Lets through only requests of a signed-in, active person, and leaves them on `res.locals.user`.
 * 401 (with a `WWW-Authenticate` challenge) without a token, or with an expired or invalid one.
 */
export function requireUser(auth: AuthService): RequestHandler {
  return async (req, res, next) => {
    const token = bearerOf(req.headers);
    if (token === undefined) {
      res.setHeader('WWW-Authenticate', 'Bearer realm="Counterpoise"');
      throw SIGN_IN_REQUIRED;
    }
    try {
      res.locals.user = await auth.authenticate(token);
    } catch (error) {
      res.setHeader('WWW-Authenticate', 'Bearer realm="Counterpoise", error="invalid_token"');
      throw error;
    }
    next();
  };
}

/**
 * The role check of a route: the signed-in person's role must hold one of `permissions` (see
 * `ROLE_PERMISSIONS`), or the answer is 403. Runs after `requireUser`, or after the API-key check on
 * the keyed routes, where a request made with an API key passes (a key may use what it is keyed for).
 */
export function requirePermission(...permissions: readonly Permission[]): RequestHandler {
  return (_req, res, next) => {
    const user = res.locals.user;
    if (user === undefined) {
      if (res.locals.apiKey !== undefined) {
        next();
        return;
      }
      throw new Error('requirePermission runs after requireUser or the API-key check.');
    }
    if (!permissions.some((permission) => can(user.role, permission))) {
      throw new HttpProblem(
        403,
        'Forbidden',
        `The role ${user.role} may not do this.`,
        undefined,
        'about:blank',
        AUTH_PROBLEM_CODES.forbidden,
      );
    }
    next();
  };
}

/** The value of one cookie of the request, read without a cookie-parsing dependency. */
export function cookieOf(headers: IncomingHttpHeaders, name: string): string | undefined {
  const header = headers.cookie;
  if (!header) return undefined;
  for (const part of header.split(';')) {
    const separator = part.indexOf('=');
    if (separator === -1) continue;
    if (part.slice(0, separator).trim() === name) {
      const value = part.slice(separator + 1).trim();
      try {
        return decodeURIComponent(value);
      } catch {
        return undefined;
      }
    }
  }
  return undefined;
}
