import * as z from 'zod';
import { displayName, HIDDEN_CHARACTERS } from './display-name';

// The rule for names people read lives beside the key's own, so that every name of the API shares it.
export * from './display-name';

/** The header an API key travels in; `Authorization: Bearer <key>` is accepted as well. */
export const API_KEY_HEADER = 'X-Api-Key';

/**
 * What every Counterpoise API key looks like: `cpk_` and 43 base64url characters (32 random bytes).
 * A request whose key does not match is refused without a database lookup.
 */
export const API_KEY_PATTERN = /^cpk_[A-Za-z0-9_-]{43}$/;

/** How many characters of a key are kept in the clear, so that a person can tell keys apart. */
export const API_KEY_PREFIX_LENGTH = 12;

/**
 * The `code` of the problems that refuse a keyed request, for programs to act on: ask for a key,
 * fix the one sent, replace a revoked one, or wait `Retry-After` seconds.
 */
export const KEY_PROBLEM_CODES = {
  /** No key, or an Authorization header of another scheme (401). */
  missing: 'API_KEY_MISSING',
  /** Two different keys in one request (401). */
  conflict: 'API_KEY_CONFLICT',
  /** A malformed key, or one this server does not know (401). */
  invalid: 'API_KEY_INVALID',
  /** A revoked key (403). */
  revoked: 'API_KEY_REVOKED',
  /** Over the key's limit (429). */
  rateLimited: 'RATE_LIMITED',
  /**
   * A key limited to web origins, sent from an origin not in its list or with no `Origin` header at
   * all; or a visitor token bound to another origin (403).
   */
  originRefused: 'API_KEY_ORIGIN_REFUSED',
  /** A visitor token past its expiry (401): ask the portal's back end for a new one. */
  tokenExpired: 'TOKEN_EXPIRED',
  /** A visitor token that is not one of this server's, or was altered (401). */
  tokenInvalid: 'TOKEN_INVALID',
  /** A visitor token on a route outside its scope, the calculation routes (403). */
  tokenScope: 'TOKEN_SCOPE',
  /** A token exchange asked with a key limited to web origins, which is no secret (403). */
  exchangeRefused: 'TOKEN_EXCHANGE_REFUSED',
} as const;

/** The highest per-key rate a key may be given, in calculations per minute. */
export const MAX_LIMIT_PER_MINUTE = 1_000_000;

/** A person's name for a key: who or what uses it. */
export const ApiKeyNameSchema = displayName({
  field: 'the name of a key',
  maxLength: 100,
  missing: 'Give the key a name that says who or what uses it.',
}).meta({ description: 'Who or what uses the key.', example: 'Dealer portal' });

/** How many calculations per minute a key may make; a batch of n counts n. */
export const LimitPerMinuteSchema = z
  .number()
  .int('The limit is a whole number of calculations per minute.')
  .min(1, 'The limit is at least 1 calculation per minute.')
  .max(MAX_LIMIT_PER_MINUTE, `The limit is at most ${MAX_LIMIT_PER_MINUTE} calculations per minute.`)
  .meta({ description: 'Calculations per minute the key may make; a batch of n counts n.', example: 600 });

/** How many web origins one key may be limited to: a dealer's portal and its test sites, not a directory. */
export const MAX_ALLOWED_ORIGINS = 20;

/** Host names that are this computer, where plain `http:` is allowed for a developer's own tests. */
const LOOPBACK_HOSTS = new Set(['localhost', '127.0.0.1', '[::1]']);

const ORIGIN_EXAMPLE = 'https://portal.example.com';

/**
 * Reads a web origin as browsers send it in the `Origin` header (RFC 6454): scheme, host and port,
 * nothing else. The host is lower-cased and an international name turned to its `xn--` form, the
 * default port dropped and one trailing `/` forgiven, so that the stored text is exactly what a browser
 * sends. `https:` only, but for `http://localhost`, `127.0.0.1` and `[::1]` (a developer's own computer).
 * Returns the origin, or why the text is not one.
 */
export function parseWebOrigin(text: string): { origin: string } | { error: string } {
  const trimmed = text.trim();
  const like = `give the scheme and host only, like ${ORIGIN_EXAMPLE}`;
  if (trimmed === '') return { error: `Enter a web origin, like ${ORIGIN_EXAMPLE}.` };
  if (trimmed.includes('*'))
    return { error: `“${trimmed}” holds a wildcard; list each origin in full, like ${ORIGIN_EXAMPLE}.` };
  if (!/^[a-z][a-z0-9+.-]*:\/\//i.test(trimmed)) {
    return { error: `“${trimmed}” has no scheme; ${like}.` };
  }
  let url: URL;
  try {
    url = new URL(trimmed);
  } catch {
    return { error: `“${trimmed}” is not a web address; ${like}.` };
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') {
    return { error: `“${trimmed}” is not a web origin (https:); ${like}.` };
  }
  const rest = trimmed.slice(trimmed.indexOf('//') + 2);
  const authority = /^[^/?#]*/.exec(rest)![0];
  if (authority.includes('@') || url.username !== '' || url.password !== '') {
    return { error: `“${trimmed}” holds a user name or password; ${like}.` };
  }
  const afterHost = rest.slice(authority.length);
  if (afterHost !== '' && afterHost !== '/') {
    return { error: `“${trimmed}” has a path, query or fragment after its host; ${like}.` };
  }
  if (url.protocol === 'http:' && !LOOPBACK_HOSTS.has(url.hostname)) {
    return {
      error: `“${trimmed}” uses http:, which anyone on the way can read and alter; use https:, or http:// only for localhost.`,
    };
  }
  return { origin: url.origin };
}

/** One web origin a key may be used from (see `parseWebOrigin`); stored and shown normalised. */
export const WebOriginSchema = z
  .string({ error: `Enter a web origin, like ${ORIGIN_EXAMPLE}.` })
  .max(300, { error: 'Keep a web origin to 300 characters.' })
  .transform((text, context) => {
    const parsed = parseWebOrigin(text);
    if ('origin' in parsed) return parsed.origin;
    context.issues.push({ code: 'custom', input: text, message: parsed.error });
    return z.NEVER;
  })
  .meta({
    description: 'A web origin: https://, a host and an optional port, no path (http:// for localhost only).',
    example: ORIGIN_EXAMPLE,
  });

/**
 * The web origins a key may be used from: the pages of a dealer's portal. Each is normalised and the
 * list deduplicated (the first of each kept, in order). An empty list means the key is not limited, as
 * a key made without one.
 */
export const AllowedOriginsSchema = z
  .array(WebOriginSchema, {
    error: 'List the web origins as an array of texts, like ["https://portal.example.com"].',
  })
  .max(MAX_ALLOWED_ORIGINS, {
    error: `A key may be limited to at most ${MAX_ALLOWED_ORIGINS} web origins; use a key per portal.`,
  })
  .transform((origins) => [...new Set(origins)])
  .meta({
    description:
      'Web origins whose pages may use the key; requests from any other origin, or with no Origin ' +
      `header, are refused. Empty: the key is not limited. At most ${MAX_ALLOWED_ORIGINS}.`,
    example: [ORIGIN_EXAMPLE, 'http://localhost:4200'],
  });

/** What creating a key takes; without a limit, the server's default applies; without origins, none. */
export const CreateApiKeySchema = z
  .object({
    name: ApiKeyNameSchema,
    limitPerMinute: LimitPerMinuteSchema.optional(),
    allowedOrigins: AllowedOriginsSchema.optional(),
  })
  .meta({ id: 'CreateApiKey', example: { name: 'Dealer portal', limitPerMinute: 600 } });

/** `PUT /api/v1/keys/{id}/origins`: the key's whole new list of origins (empty: not limited). */
export const UpdateApiKeyOriginsSchema = z.strictObject({ allowedOrigins: AllowedOriginsSchema }).meta({
  id: 'UpdateApiKeyOrigins',
  example: { allowedOrigins: [ORIGIN_EXAMPLE, 'http://localhost:4200'] },
});

/** A key as it may be shown after its creation: never the key itself, only its prefix. */
export const ApiKeySummarySchema = z
  .object({
    id: z.number().int().positive(),
    name: z.string(),
    prefix: z.string().meta({ description: 'The visible start of the key.', example: 'cpk_Q2xvY2s5' }),
    limitPerMinute: z.number().int().positive(),
    createdAt: z.iso.datetime(),
    lastUsedAt: z.iso.datetime().nullable().meta({ description: 'Up to a fraction of a second behind.' }),
    revokedAt: z.iso.datetime().nullable(),
    allowedOrigins: z.array(z.string()).meta({
      description: 'Web origins whose pages may use the key; empty when the key is not limited.',
      example: [ORIGIN_EXAMPLE],
    }),
  })
  .meta({
    id: 'ApiKeySummary',
    description: 'An API key without its secret part.',
    example: {
      id: 1,
      name: 'Dealer portal',
      prefix: 'cpk_Q2xvY2s5',
      limitPerMinute: 600,
      createdAt: '2026-05-04T08:00:00.000Z',
      lastUsedAt: '2026-05-04T09:12:30.250Z',
      revokedAt: null,
      allowedOrigins: [],
    },
  });

/** The longest a visitor token lives, in seconds: 15 minutes. */
export const MAX_VISITOR_TOKEN_SECONDS = 900;
/** How long a visitor token lives when the exchange does not say: 5 minutes. */
export const DEFAULT_VISITOR_TOKEN_SECONDS = 300;

/**
 * `POST /api/v1/tokens`: what a portal's back end asks for when it exchanges its secret key for a
 * short-lived token for one visitor. Everything is optional; an origin binds the token to the pages of
 * that origin (give it whenever the token goes to a browser).
 */
export const CreateVisitorTokenSchema = z
  .strictObject({
    origin: WebOriginSchema.optional().meta({
      description:
        'The web origin of the page the token is for: requests with another Origin, or none, are refused, ' +
        'and CORS answers that origin. Leave out for a token used by a program.',
      example: ORIGIN_EXAMPLE,
    }),
    visitor: z
      .string({ error: 'The visitor is a text: your own id of the person the token is for.' })
      .trim()
      .min(1, { error: 'Leave out the visitor, or give your id of the person the token is for.' })
      .max(100, { error: 'Keep the visitor to 100 characters.' })
      .refine((text) => !HIDDEN_CHARACTERS.test(text), {
        error: 'The visitor holds an invisible control or text-direction character; leave it out.',
      })
      .optional()
      .meta({
        description: 'Your own id of the visitor (no e-mail address needed), carried in the token as `sub`.',
        example: 'visitor-2231',
      }),
    ttlSeconds: z
      .number({ error: 'ttlSeconds is a number of seconds.' })
      .int({ error: 'ttlSeconds is a whole number of seconds.' })
      .min(30, { error: 'A token lives at least 30 seconds.' })
      .max(MAX_VISITOR_TOKEN_SECONDS, {
        error: `A token lives at most ${MAX_VISITOR_TOKEN_SECONDS} seconds (15 minutes); ask for a new one when it ends.`,
      })
      .optional()
      .meta({
        description: `Seconds the token lives: 30 to ${MAX_VISITOR_TOKEN_SECONDS}, ${DEFAULT_VISITOR_TOKEN_SECONDS} when left out.`,
        example: 600,
      }),
  })
  .meta({
    id: 'CreateVisitorToken',
    example: { origin: ORIGIN_EXAMPLE, visitor: 'visitor-2231', ttlSeconds: 600 },
  });

/** The answer of `POST /api/v1/tokens`. */
export const VisitorTokenSchema = z
  .object({
    token: z.string().meta({
      description:
        'Send it as `Authorization: Bearer <token>` to the calculation routes, until `expiresAt`. It is ' +
        'counted as the key’s usage and rate limit, and stops working when the key is revoked.',
    }),
    expiresAt: z.iso.datetime().meta({ example: '2026-05-04T09:22:30.000Z' }),
  })
  .meta({ id: 'VisitorToken', description: 'A short-lived token for one visitor of a portal.' });

export type CreateVisitorToken = z.infer<typeof CreateVisitorTokenSchema>;
export type VisitorToken = z.infer<typeof VisitorTokenSchema>;
export type CreateApiKey = z.infer<typeof CreateApiKeySchema>;
export type UpdateApiKeyOrigins = z.infer<typeof UpdateApiKeyOriginsSchema>;
export type ApiKeySummary = z.infer<typeof ApiKeySummarySchema>;
