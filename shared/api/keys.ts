import * as z from 'zod';
import { displayName } from './display-name';

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

/** What creating a key takes; without a limit, the server's default applies. */
export const CreateApiKeySchema = z
  .object({
    name: ApiKeyNameSchema,
    limitPerMinute: LimitPerMinuteSchema.optional(),
  })
  .meta({ id: 'CreateApiKey', example: { name: 'Dealer portal', limitPerMinute: 600 } });

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
    },
  });

export type CreateApiKey = z.infer<typeof CreateApiKeySchema>;
export type ApiKeySummary = z.infer<typeof ApiKeySummarySchema>;
