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
import { HttpProblem, requireJsonBody } from '../http/problem';
import { validateBody } from '../http/validate';
import {
  ACCESS_TOKEN_SECURITY,
  authRegistry,
  INVALID_BODY_RESPONSE,
  jsonBody,
  jsonResponse,
  problemResponse,
  REFRESH_COOKIE_SCHEME,
  SET_COOKIE_HEADER,
  SIGNED_IN_RESPONSES,
} from './auth.openapi';
import {
  type AuthService,
  type IssuedSession,
  permissionsOf,
  REFRESH_TOKEN_TTL_MS,
  toUser,
} from './auth.service';
import {
  ME_EXAMPLE,
  PASSWORD_RESET_CONFIRM_EXAMPLE,
  PASSWORD_RESET_EXAMPLE,
  SESSION_EXAMPLE,
  SIGN_IN_EXAMPLE,
} from './examples';
import { cookieOf, requireUser } from './require-user';

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

authRegistry.registerPath({
  method: 'post',
  path: '/api/v1/auth/sign-in',
  tags: ['Accounts'],
  summary: 'Sign in with an e-mail address and a password',
  description:
    'Answers a short-lived access token (10 minutes) and sets the refresh cookie. After 5 failed ' +
    'attempts in a row with one address, each further attempt must wait (1, 2, 4, 8, 16 s: 429 with ' +
    '`Retry-After`); after 10, the address is locked for 15 minutes. Known and unknown addresses are ' +
    'answered alike.',
  request: jsonBody(SignInRequestSchema, SIGN_IN_EXAMPLE),
  responses: {
    200: SESSION_RESPONSE,
    400: INVALID_BODY_RESPONSE,
    401: problemResponse('The address or the password is not right (`code`: `INVALID_CREDENTIALS`).'),
    403: problemResponse('The account is deactivated (`code`: `ACCOUNT_DEACTIVATED`).'),
    429: problemResponse(
      'Too many failures with this address (`code`: `SIGN_IN_THROTTLED`, `SIGN_IN_LOCKED`).',
      {
        'Retry-After': { description: 'Seconds to wait.', schema: { type: 'integer' } },
      },
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
    'sign-in (`code`: `REFRESH_REUSED`).',
  security: [{ [REFRESH_COOKIE_SCHEME]: [] }],
  responses: {
    200: SESSION_RESPONSE,
    401: problemResponse(
      'No cookie, or a refresh token that is unknown, expired, revoked or reused (`code`: `REFRESH_INVALID`, `REFRESH_REUSED`).',
    ),
  },
});

authRegistry.registerPath({
  method: 'post',
  path: '/api/v1/auth/sign-out',
  tags: ['Accounts'],
  summary: 'Sign out',
  description: 'Revokes the session of the refresh cookie and clears the cookie. Always 204.',
  security: [{ [REFRESH_COOKIE_SCHEME]: [] }],
  responses: { 204: { description: 'Signed out.', headers: SET_COOKIE_HEADER } },
});

authRegistry.registerPath({
  method: 'post',
  path: '/api/v1/auth/password-reset',
  tags: ['Accounts'],
  summary: 'Ask for a password-reset link by e-mail',
  description:
    'When an active account has this address, sends it a link to `/reset-password` that works once, ' +
    'within the hour. Answers 202 either way, so the answer tells nothing of the address.',
  request: jsonBody(PasswordResetRequestSchema, PASSWORD_RESET_EXAMPLE),
  responses: { 202: { description: 'Taken in hand.' }, 400: INVALID_BODY_RESPONSE },
});

authRegistry.registerPath({
  method: 'post',
  path: '/api/v1/auth/password-reset/confirm',
  tags: ['Accounts'],
  summary: 'Choose a new password with a reset link',
  description:
    'Sets the password, spends the link, and ends every session of the person. Passwords follow ' +
    'NIST SP 800-63B: 15 to 128 characters of any kind, not one of the most common ones.',
  request: jsonBody(PasswordResetConfirmSchema, PASSWORD_RESET_CONFIRM_EXAMPLE),
  responses: {
    204: { description: 'The password is changed; sign in with it.' },
    400: problemResponse(
      'The password breaks a rule (`code`: `WEAK_PASSWORD`, `errors` on `password`), or the link is not valid, expired or spent (`code`: `LINK_INVALID`, `errors` on `token`).',
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

/**
 * The session routes (`/auth/…`) and `/me`, mounted on `/api/v1`. They need no role: signing in is
 * how one gets one, and `/me` answers any signed-in person about themselves.
 */
export function authRouter(auth: AuthService): Router {
  const router = Router();
  const secure = auth.settings.secureCookie;

  router.post('/auth/sign-in', ...accountsJson, validateBody(SignInRequestSchema), async (_req, res) => {
    const { email, password } = res.locals.body as z.output<typeof SignInRequestSchema>;
    try {
      sendSession(res, await auth.signIn(email, password), secure);
    } catch (error) {
      const wait = (error as { retryAfterSeconds?: number }).retryAfterSeconds;
      if (error instanceof HttpProblem && wait !== undefined) res.setHeader('Retry-After', String(wait));
      throw error;
    }
  });

  router.post('/auth/refresh', async (req, res) => {
    try {
      sendSession(res, await auth.refresh(cookieOf(req.headers, REFRESH_COOKIE)), secure);
    } catch (error) {
      clearRefreshCookie(res, secure);
      throw error;
    }
  });

  router.post('/auth/sign-out', (req, res) => {
    auth.signOut(cookieOf(req.headers, REFRESH_COOKIE));
    clearRefreshCookie(res, secure);
    res.status(204).end();
  });

  router.post(
    '/auth/password-reset',
    ...accountsJson,
    validateBody(PasswordResetRequestSchema),
    async (_req, res) => {
      const { email } = res.locals.body as z.output<typeof PasswordResetRequestSchema>;
      await auth.requestPasswordReset(email);
      res.status(202).end();
    },
  );

  router.post(
    '/auth/password-reset/confirm',
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

  return router;
}
