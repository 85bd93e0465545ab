import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { ACCOUNTS_PROBLEM_CODES } from '@counterpoise/api';
import { TooManyRequests } from './too-many-requests';

/** So many requests of one client address within a window. */
export interface ClientLimit {
  readonly limit: number;
  readonly windowMs: number;
}

/**
 * The per-address limits of the routes that anyone may call and that cost a password hash or an
 * e-mail. They sit beside the per-account limits (the slow-down and lock of an address that fails to
 * sign in, one reset e-mail per address at a time): those stop guesses at one account, these stop one
 * client from spreading guesses over many accounts or from keeping the server busy hashing.
 */
export interface ClientLimits {
  /** Failed sign-ins; a successful one is not counted, so colleagues behind one address never wait. */
  readonly signIn: ClientLimit;
  /** Asks for a reset e-mail. */
  readonly passwordReset: ClientLimit;
  /** New passwords chosen with a reset link (a weak one refused counts). */
  readonly passwordResetConfirm: ClientLimit;
  /** Invitations accepted (a weak password refused counts). */
  readonly invitationAccept: ClientLimit;
}

const FIFTEEN_MINUTES_MS = 15 * 60_000;

/**
 * Sized for a shop: a dozen people behind one NAT address, each mistyping a password a few times or
 * choosing a new one twice, stay well inside them; a script does not.
 */
export const DEFAULT_CLIENT_LIMITS: ClientLimits = {
  signIn: { limit: 50, windowMs: FIFTEEN_MINUTES_MS },
  passwordReset: { limit: 10, windowMs: FIFTEEN_MINUTES_MS },
  passwordResetConfirm: { limit: 20, windowMs: FIFTEEN_MINUTES_MS },
  invitationAccept: { limit: 20, windowMs: FIFTEEN_MINUTES_MS },
};

/** What each limited route is, in the words of the refusal. */
const WHAT: Record<keyof ClientLimits, string> = {
  signIn: 'failed sign-ins',
  passwordReset: 'requests for a reset e-mail',
  passwordResetConfirm: 'new passwords chosen with a reset link',
  invitationAccept: 'invitations accepted',
};

/** A window in words: "15 minutes", "1 minute", "30 seconds". */
function spanOf(windowMs: number): string {
  const [amount, unit] =
    windowMs % 60_000 === 0 ? [windowMs / 60_000, 'minute'] : [Math.ceil(windowMs / 1000), 'second'];
  return `${amount} ${unit}${amount === 1 ? '' : 's'}`;
}

/** A route's default limit in words, for its documentation: "50 in 15 minutes". */
export function defaultLimitInWords(name: keyof ClientLimits): string {
  const { limit, windowMs } = DEFAULT_CLIENT_LIMITS[name];
  return `${limit} in ${spanOf(windowMs)}`;
}

/**
 * The limiter of one route (express-rate-limit, counted in this process's memory, keyed by the client's
 * address as Express sees it in `req.ip`; IPv6 addresses by their /56 network), with the limit of
 * `limits` or the default. A request over it is answered 429 with `Retry-After` and the code
 * `CLIENT_THROTTLED`, before its body is read. Each call counts on its own: build one per route.
 */
export function clientLimiter(name: keyof ClientLimits, limits: Partial<ClientLimits> = {}): RequestHandler {
  const { limit, windowMs } = limits[name] ?? DEFAULT_CLIENT_LIMITS[name];
  return rateLimit({
    windowMs,
    limit,
    skipSuccessfulRequests: name === 'signIn',
    standardHeaders: 'draft-6',
    legacyHeaders: false,
    handler: (_req, res, next) => {
      const seconds = Number(res.getHeader('Retry-After')) || Math.ceil(windowMs / 1000);
      next(
        new TooManyRequests(
          `Too many ${WHAT[name]} from your network address: at most ${limit} in ${spanOf(windowMs)}. ` +
            `Try again in ${seconds} s.`,
          ACCOUNTS_PROBLEM_CODES.clientThrottled,
          seconds,
        ),
      );
    },
  });
}
