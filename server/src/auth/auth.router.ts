import type { ResponseConfig } from '@asteasolutions/zod-to-openapi';
import express, { type Response, Router } from 'express';
import {
  MeSchema,
  PasswordResetConfirmSchema,
  PasswordResetRequestSchema,
  REFRESH_COOKIE,
  SessionSchema,
  SignInRequestSchema,
} from '@counterpoise/api';
import type * as z from 'zod';
import { requireJsonBody } from '../http/problem';
import { validateBody } from '../http/validate';
import {
  ACCESS_TOKEN_SECURITY,
  INVALID_BODY_RESPONSE,
  jsonBody,
  jsonResponse,
  problemResponse,
  REFRESH_COOKIE_SCHEME,
  SET_COOKIE_HEADER,
  SIGNED_IN_RESPONSES,
} from '../openapi/responses';
import { authRegistry } from './auth.openapi';
import { type ClientLimits, clientLimiter, defaultLimitInWords } from './client-limits';
import {
  type AuthService,
  type IssuedSession,
  PASSWORD_RESET_MAIL_INTERVAL_MS,
  permissionsOf,
  REFRESH_GRACE_MS,
  REFRESH_TOKEN_TTL_MS,
  toUser,
} from './auth.service';
import {
  ME_EXAMPLE,
  PASSWORD_RESET_CONFIRM_EXAMPLE,
  PASSWORD_RESET_EXAMPLE,
  SESSION_EXAMPLE,
  SIGN_IN_EXAMPLE,
} from './auth.examples';
import { cookieOf, requireUser } from './require-user';
import { refuseCrossSite, requireSameOrigin } from './same-origin';
import { retryAfterHeader } from './too-many-requests';

/** Where the refresh cookie is sent: the session routes only, never the rest of the API. */
export const REFRESH_COOKIE_PATH = '/api/v1/auth';

/** The body parser of the accounts routes: small JSON bodies only. */
export const accountsJson = [requireJsonBody, express.json({ limit: '16kb', type: () => true })];

/** Sends a session: the body, the refresh cookie, and no caching anywhere. */
export function sendSession(res: Response, issued: IssuedSession, secure: boolean, status = 200): void {
  res.cookie(REFRESH_COOKIE, issued.refreshToken, {
    httpOnly: true,
    sameSite: 'strict',
    secure,
    path: REFRESH_COOKIE_PATH,
    maxAge: REFRESH_TOKEN_TTL_MS,
  });
  res.status(status).set('Cache-Control', 'no-store').json(issued.session);
}

function clearRefreshCookie(res: Response, secure: boolean): void {
  res.clearCookie(REFRESH_COOKIE, { httpOnly: true, sameSite: 'strict', secure, path: REFRESH_COOKIE_PATH });
}

const SESSION_RESPONSE = {
  ...jsonResponse('Signed in: the access token and the person.', SessionSchema, SESSION_EXAMPLE),
  headers: SET_COOKIE_HEADER,
};

/** The `Retry-After` of every 429 of the accounts routes. */
export const RETRY_AFTER_HEADER = {
  'Retry-After': { description: 'Seconds to wait.', schema: { type: 'integer' as const } },
};

/** The 403 of a request that a page of another site made a browser send. */
export const CROSS_SITE_RESPONSE = problemResponse(
  'Sent by a page of another site (`Sec-Fetch-Site: cross-site` or `same-site`, or an `Origin` that is ' +
    'not this server): `code` `CROSS_SITE_REQUEST`. Requests without either header are taken.',
);

/** The 429 of too many requests of one client address (`CLIENT_THROTTLED`), with `Retry-After`. */
function clientThrottledResponse(what: string): ResponseConfig {
  return problemResponse(
    `Too many ${what} from this client address (\`code\`: \`CLIENT_THROTTLED\`).`,
    RETRY_AFTER_HEADER,
  );
}

/** The part of a 429's description for the hash gate's refusal. */
export const PASSWORD_CHECKS_BUSY =
  'the server is checking too many passwords at once (`PASSWORD_CHECKS_BUSY`)';

authRegistry.registerPath({
  method: 'post',
  path: '/api/v1/auth/sign-in',
  tags: ['Accounts'],
  summary: 'Sign in with an e-mail address and a password',
  description:
    'Answers a short-lived access token (10 minutes) and sets the refresh cookie. After 5 failed ' +
    'attempts in a row with one address, each further attempt must wait (1, 2, 4, 8, 16 s: 429 with ' +
    '`Retry-After`); after 10, the address is locked for 15 minutes. Each attempt counts as a failure ' +
    'until its password proves right, so attempts sent at once are all counted. Known and unknown ' +
    'addresses are answered alike. Failed attempts are also limited per client address ' +
    `(${defaultLimitInWords('signIn')} by default).`,
  request: jsonBody(SignInRequestSchema, SIGN_IN_EXAMPLE),
  responses: {
    200: SESSION_RESPONSE,
    400: INVALID_BODY_RESPONSE,
    401: problemResponse('The address or the password is not right (`code`: `INVALID_CREDENTIALS`).'),
    403: problemResponse(
      'The account is deactivated (`code`: `ACCOUNT_DEACTIVATED`), or the request came from a page of ' +
        'another site (`CROSS_SITE_REQUEST`).',
    ),
    429: problemResponse(
      'Too many failures with this address (`code`: `SIGN_IN_THROTTLED`, `SIGN_IN_LOCKED`), too many ' +
        `failed sign-ins from this client address (\`CLIENT_THROTTLED\`), or ${PASSWORD_CHECKS_BUSY}.`,
      RETRY_AFTER_HEADER,
    ),
  },
});

authRegistry.registerPath({
  method: 'post',
  path: '/api/v1/auth/refresh',
  tags: ['Accounts'],
  summary: 'Renew the access token with the refresh cookie',
  description:
    'Replaces the refresh cookie with a new one and answers a new access token. A refresh token works ' +
    'once: presenting one that was already replaced ends every session that descends from the same ' +
    'sign-in (`code`: `REFRESH_REUSED`). Within ' +
    `${REFRESH_GRACE_MS / 1000} seconds of its replacement, while its successor is unused, it answers ` +
    'that same successor again with a fresh access token (two tabs refreshing at once).',
  security: [{ [REFRESH_COOKIE_SCHEME]: [] }],
  responses: {
    200: SESSION_RESPONSE,
    401: problemResponse(
      'No cookie, or a refresh token that is unknown, expired, revoked or reused (`code`: `REFRESH_INVALID`, `REFRESH_REUSED`).',
    ),
    403: CROSS_SITE_RESPONSE,
  },
});

authRegistry.registerPath({
  method: 'post',
  path: '/api/v1/auth/sign-out',
  tags: ['Accounts'],
  summary: 'Sign out',
  description:
    'Revokes the session of the refresh cookie and clears the cookie (when one was sent). Taken only ' +
    'from a page of this server: the request must carry an `Origin` of this server or ' +
    '`Sec-Fetch-Site: same-origin` (browsers send them with every fetch), and no body or a JSON one.',
  security: [{ [REFRESH_COOKIE_SCHEME]: [] }],
  responses: {
    204: { description: 'Signed out.', headers: SET_COOKIE_HEADER },
    403: problemResponse(
      'Not sent by a page of this server: no such `Origin` nor `Sec-Fetch-Site` (`code`: `CROSS_SITE_REQUEST`).',
    ),
    415: problemResponse('A body that is not JSON.'),
  },
});

authRegistry.registerPath({
  method: 'post',
  path: '/api/v1/auth/password-reset',
  tags: ['Accounts'],
  summary: 'Ask for a password-reset link by e-mail',
  description:
    'Answers 202 at once, before the address is looked up, so the answer tells nothing of it. Then, ' +
    'when an active account has this address, sends it a link to `/reset-password` that works once, ' +
    'within the hour, and ends every older link; at most one e-mail per address in ' +
    `${PASSWORD_RESET_MAIL_INTERVAL_MS / 60_000} minutes (later requests are answered alike and send ` +
    'nothing). Limited per client address ' +
    `(${defaultLimitInWords('passwordReset')} by default).`,
  request: jsonBody(PasswordResetRequestSchema, PASSWORD_RESET_EXAMPLE),
  responses: {
    202: { description: 'Taken in hand.' },
    400: INVALID_BODY_RESPONSE,
    403: CROSS_SITE_RESPONSE,
    429: clientThrottledResponse('requests for a reset e-mail'),
  },
});

authRegistry.registerPath({
  method: 'post',
  path: '/api/v1/auth/password-reset/confirm',
  tags: ['Accounts'],
  summary: 'Choose a new password with a reset link',
  description:
    'Sets the password, spends the link with every other open link of the person, and ends every ' +
    'session of the person. Passwords follow NIST SP 800-63B: 15 to 128 characters of any kind, not ' +
    'one of the most common ones. Limited per client address ' +
    `(${defaultLimitInWords('passwordResetConfirm')} by default).`,
  request: jsonBody(PasswordResetConfirmSchema, PASSWORD_RESET_CONFIRM_EXAMPLE),
  responses: {
    204: { description: 'The password is changed; sign in with it.' },
    400: problemResponse(
      'The password breaks a rule (`code`: `WEAK_PASSWORD`, `errors` on `password`), or the link is not valid, expired or spent (`code`: `LINK_INVALID`, `errors` on `token`).',
    ),
    403: CROSS_SITE_RESPONSE,
    429: problemResponse(
      `Too many new passwords from this client address (\`code\`: \`CLIENT_THROTTLED\`), or ${PASSWORD_CHECKS_BUSY}.`,
      RETRY_AFTER_HEADER,
    ),
  },
});

authRegistry.registerPath({
  method: 'get',
  path: '/api/v1/me',
  tags: ['Accounts'],
  summary: 'The signed-in person and what their role allows',
  security: ACCESS_TOKEN_SECURITY,
  responses: {
    200: jsonResponse('The person and their permissions.', MeSchema, ME_EXAMPLE),
    401: SIGNED_IN_RESPONSES[401],
  },
});

/** What the session routes are built with besides the service. */
export interface AuthRouterOptions {
  /** The per-client limits; the defaults of `DEFAULT_CLIENT_LIMITS` for those left out. */
  readonly clientLimits?: Partial<ClientLimits>;
}

/**
 * The session routes (`/auth/…`) and `/me`, mounted on `/api/v1`. They need no role: signing in is
 * how one gets one, and `/me` answers any signed-in person about themselves. Every `/auth` POST refuses
 * what a page of another site sends; sign-out takes only what a page of this server sends.
 */
export function authRouter(auth: AuthService, options: AuthRouterOptions = {}): Router {
  const router = Router();
  const secure = auth.settings.secureCookie;
  const notCrossSite = refuseCrossSite(auth.settings.publicUrl);
  const limits = options.clientLimits;

  router.post(
    '/auth/sign-in',
    notCrossSite,
    clientLimiter('signIn', limits),
    ...accountsJson,
    validateBody(SignInRequestSchema),
    async (_req, res) => {
      const { email, password } = res.locals.body as z.output<typeof SignInRequestSchema>;
      sendSession(res, await auth.signIn(email, password), secure);
    },
  );

  router.post('/auth/refresh', notCrossSite, async (req, res) => {
    try {
      sendSession(res, await auth.refresh(cookieOf(req.headers, REFRESH_COOKIE)), secure);
    } catch (error) {
      clearRefreshCookie(res, secure);
      throw error;
    }
  });

  router.post('/auth/sign-out', requireSameOrigin(auth.settings.publicUrl), (req, res) => {
    const token = cookieOf(req.headers, REFRESH_COOKIE);
    if (token !== undefined) {
      auth.signOut(token);
      clearRefreshCookie(res, secure);
    }
    res.status(204).end();
  });

  router.post(
    '/auth/password-reset',
    notCrossSite,
    clientLimiter('passwordReset', limits),
    ...accountsJson,
    validateBody(PasswordResetRequestSchema),
    (_req, res) => {
      const { email } = res.locals.body as z.output<typeof PasswordResetRequestSchema>;
      auth.requestPasswordReset(email);
      res.status(202).end();
    },
  );

  router.post(
    '/auth/password-reset/confirm',
    notCrossSite,
    clientLimiter('passwordResetConfirm', limits),
    ...accountsJson,
    validateBody(PasswordResetConfirmSchema),
    async (_req, res) => {
      const { token, password } = res.locals.body as z.output<typeof PasswordResetConfirmSchema>;
      await auth.confirmPasswordReset(token, password);
      res.status(204).end();
    },
  );

  router.get('/me', requireUser(auth), (_req, res) => {
    const user = res.locals.user!;
    res.set('Cache-Control', 'no-store').json({ user: toUser(user), permissions: permissionsOf(user) });
  });

  router.use(retryAfterHeader);
  return router;
}
