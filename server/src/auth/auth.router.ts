import type { ResponseConfig } from '@asteasolutions/zod-to-openapi';
import type { Response } from 'express';
import {
  MeSchema,
  PasswordResetConfirmSchema,
  PasswordResetRequestSchema,
  REFRESH_COOKIE,
  SessionSchema,
  SignInRequestSchema,
} from '@counterpoise/api';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import {
  ACCESS_TOKEN_SECURITY,
  problemResponse,
  REFRESH_COOKIE_SCHEME,
  SET_COOKIE_HEADER,
  SIGNED_IN_RESPONSES,
} from '../openapi/responses';
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

/** Where the refresh cookie is sent: the session routes only, never the rest of the API. */
export const REFRESH_COOKIE_PATH = '/api/v1/auth';

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

/** The answer of the routes that sign in: the session, and the refresh cookie. */
const SESSION_ANSWER = {
  status: 200,
  description: 'Signed in: the access token and the person.',
  schema: SessionSchema,
  example: SESSION_EXAMPLE,
  headers: SET_COOKIE_HEADER,
} as const;

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

/** What the session routes are built with besides the service. */
export interface AuthRouterOptions {
  /** The per-client limits; the defaults of `DEFAULT_CLIENT_LIMITS` for those left out. */
  readonly clientLimits?: Partial<ClientLimits>;
}

/**
 * Who may call a session route: anyone (`public`: the password or the reset link is the credential),
 * the holder of the refresh cookie (`refresh`), or a signed-in person of any role (`signedIn`). The
 * rules are the feature's own: sign-in is what gives a role, so no permission of the app's table applies.
 */
type AuthAccess = 'public' | 'refresh' | 'signedIn';

/**
 * The session routes (`/auth/…`) and `/me`, mounted on `/api/v1`. They need no role: signing in is
 * how one gets one, and `/me` answers any signed-in person about themselves. Every `/auth` POST refuses
 * what a page of another site sends; sign-out takes only what a page of this server sends.
 */
export function authRoutes(auth: AuthService, options: AuthRouterOptions = {}): FeatureRoutes {
  const secure = auth.settings.secureCookie;
  const notCrossSite = refuseCrossSite(auth.settings.publicUrl);
  const limits = options.clientLimits;
  const access: Record<AuthAccess, AccessRule> = {
    public: { guard: [] },
    refresh: { guard: [], security: [{ [REFRESH_COOKIE_SCHEME]: [] }] },
    signedIn: {
      guard: [requireUser(auth)],
      security: ACCESS_TOKEN_SECURITY,
      responses: { 401: SIGNED_IN_RESPONSES[401] },
    },
  };
  const table = new RouteTable({ basePath: '/api/v1', tag: 'Accounts', access });

  table
    .add<undefined, undefined, typeof SignInRequestSchema, typeof SessionSchema>({
      method: 'post',
      path: '/auth/sign-in',
      summary: 'Sign in with an e-mail address and a password',
      description:
        'Answers a short-lived access token (10 minutes) and sets the refresh cookie. After 5 failed ' +
        'attempts in a row with one address, each further attempt must wait (1, 2, 4, 8, 16 s: 429 with ' +
        '`Retry-After`); after 10, the address is locked for 15 minutes. Each attempt counts as a failure ' +
        'until its password proves right, so attempts sent at once are all counted. Known and unknown ' +
        'addresses are answered alike. Failed attempts are also limited per client address ' +
        `(${defaultLimitInWords('signIn')} by default).`,
      access: 'public',
      before: [notCrossSite, clientLimiter('signIn', limits)],
      body: SignInRequestSchema,
      bodyExample: SIGN_IN_EXAMPLE,
      answer: SESSION_ANSWER,
      problems: {
        401: 'The address or the password is not right (`code`: `INVALID_CREDENTIALS`).',
        403:
          'The account is deactivated (`code`: `ACCOUNT_DEACTIVATED`), or the request came from a page of ' +
          'another site (`CROSS_SITE_REQUEST`).',
        429: problemResponse(
          'Too many failures with this address (`code`: `SIGN_IN_THROTTLED`, `SIGN_IN_LOCKED`), too many ' +
            `failed sign-ins from this client address (\`CLIENT_THROTTLED\`), or ${PASSWORD_CHECKS_BUSY}.`,
          RETRY_AFTER_HEADER,
        ),
      },
      handle: async ({ body, res }) => {
        sendSession(res, await auth.signIn(body.email, body.password), secure);
        return undefined;
      },
    })
    .add<undefined, undefined, undefined, typeof SessionSchema>({
      method: 'post',
      path: '/auth/refresh',
      summary: 'Renew the access token with the refresh cookie',
      description:
        'Replaces the refresh cookie with a new one and answers a new access token. A refresh token works ' +
        'once: presenting one that was already replaced ends every session that descends from the same ' +
        'sign-in (`code`: `REFRESH_REUSED`). Within ' +
        `${REFRESH_GRACE_MS / 1000} seconds of its replacement, while its successor is unused, it answers ` +
        'that same successor again with a fresh access token (two tabs refreshing at once).',
      access: 'refresh',
      before: [notCrossSite],
      answer: SESSION_ANSWER,
      problems: {
        401: 'No cookie, or a refresh token that is unknown, expired, revoked or reused (`code`: `REFRESH_INVALID`, `REFRESH_REUSED`).',
        403: CROSS_SITE_RESPONSE,
      },
      handle: async ({ req, res }) => {
        try {
          sendSession(res, await auth.refresh(cookieOf(req.headers, REFRESH_COOKIE)), secure);
        } catch (error) {
          clearRefreshCookie(res, secure);
          throw error;
        }
        return undefined;
      },
    })
    .add({
      method: 'post',
      path: '/auth/sign-out',
      summary: 'Sign out',
      description:
        'Revokes the session of the refresh cookie and clears the cookie (when one was sent). Taken only ' +
        'from a page of this server: the request must carry an `Origin` of this server or ' +
        '`Sec-Fetch-Site: same-origin` (browsers send them with every fetch), and no body or a JSON one.',
      access: 'refresh',
      before: [requireSameOrigin(auth.settings.publicUrl)],
      answer: { status: 204, description: 'Signed out.', headers: SET_COOKIE_HEADER },
      problems: {
        403: 'Not sent by a page of this server: no such `Origin` nor `Sec-Fetch-Site` (`code`: `CROSS_SITE_REQUEST`).',
        415: 'A body that is not JSON.',
      },
      handle: ({ req, res }) => {
        const token = cookieOf(req.headers, REFRESH_COOKIE);
        if (token !== undefined) {
          auth.signOut(token);
          clearRefreshCookie(res, secure);
        }
        return undefined;
      },
    })
    .add<undefined, undefined, typeof PasswordResetRequestSchema>({
      method: 'post',
      path: '/auth/password-reset',
      summary: 'Ask for a password-reset link by e-mail',
      description:
        'Answers 202 at once, before the address is looked up, so the answer tells nothing of it. Then, ' +
        'when an active account has this address, sends it a link to `/reset-password` that works once, ' +
        'within the hour, and ends every older link; at most one e-mail per address in ' +
        `${PASSWORD_RESET_MAIL_INTERVAL_MS / 60_000} minutes (later requests are answered alike and send ` +
        'nothing). Limited per client address ' +
        `(${defaultLimitInWords('passwordReset')} by default).`,
      access: 'public',
      before: [notCrossSite, clientLimiter('passwordReset', limits)],
      body: PasswordResetRequestSchema,
      bodyExample: PASSWORD_RESET_EXAMPLE,
      answer: { status: 202, description: 'Taken in hand.' },
      problems: {
        403: CROSS_SITE_RESPONSE,
        429: clientThrottledResponse('requests for a reset e-mail'),
      },
      handle: ({ body }) => {
        auth.requestPasswordReset(body.email);
        return undefined;
      },
    })
    .add<undefined, undefined, typeof PasswordResetConfirmSchema>({
      method: 'post',
      path: '/auth/password-reset/confirm',
      summary: 'Choose a new password with a reset link',
      description:
        'Sets the password, spends the link with every other open link of the person, and ends every ' +
        'session of the person. Passwords follow NIST SP 800-63B: 15 to 128 characters of any kind, not ' +
        'one of the most common ones. Limited per client address ' +
        `(${defaultLimitInWords('passwordResetConfirm')} by default).`,
      access: 'public',
      before: [notCrossSite, clientLimiter('passwordResetConfirm', limits)],
      body: PasswordResetConfirmSchema,
      bodyExample: PASSWORD_RESET_CONFIRM_EXAMPLE,
      answer: { status: 204, description: 'The password is changed; sign in with it.' },
      problems: {
        400: 'The password breaks a rule (`code`: `WEAK_PASSWORD`, `errors` on `password`), or the link is not valid, expired or spent (`code`: `LINK_INVALID`, `errors` on `token`).',
        403: CROSS_SITE_RESPONSE,
        429: problemResponse(
          `Too many new passwords from this client address (\`code\`: \`CLIENT_THROTTLED\`), or ${PASSWORD_CHECKS_BUSY}.`,
          RETRY_AFTER_HEADER,
        ),
      },
      handle: async ({ body }) => {
        await auth.confirmPasswordReset(body.token, body.password);
        return undefined;
      },
    })
    .add<undefined, undefined, undefined, typeof MeSchema>({
      method: 'get',
      path: '/me',
      summary: 'The signed-in person and what their role allows',
      access: 'signedIn',
      answer: {
        status: 200,
        description: 'The person and their permissions.',
        schema: MeSchema,
        example: ME_EXAMPLE,
      },
      handle: ({ res }) => {
        const user = res.locals.user;
        if (user === undefined) throw new Error('/me runs behind requireUser.');
        res.set('Cache-Control', 'no-store');
        return { user: toUser(user), permissions: permissionsOf(user) };
      },
    });

  return table;
}
