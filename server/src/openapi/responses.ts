import type { ResponseConfig } from '@asteasolutions/zod-to-openapi';
import { PROBLEM_MEDIA_TYPE, ProblemSchema, REFRESH_COOKIE } from '@counterpoise/api';
import type * as z from 'zod';

/*
 * The pieces of the OpenAPI document that many features' routes share: problem and JSON answers, the
 * refusals of the signed-in routes, the names of the security schemes. They build no registry; the
 * features that own a scheme register it (auth.openapi.ts, keys.openapi.ts).
 */

/** The security scheme of a signed-in person's access token. */
export const ACCESS_TOKEN_SCHEME = 'AccessToken';
/** The security scheme of the refresh cookie. */
export const REFRESH_COOKIE_SCHEME = 'RefreshCookie';

/** The `security` of the routes for signed-in people. */
export const ACCESS_TOKEN_SECURITY: Record<string, string[]>[] = [{ [ACCESS_TOKEN_SCHEME]: [] }];

/** A problem answer for a route's `responses`. */
export function problemResponse(description: string, headers?: ResponseConfig['headers']): ResponseConfig {
  return {
    description,
    ...(headers ? { headers } : {}),
    content: { [PROBLEM_MEDIA_TYPE]: { schema: ProblemSchema } },
  };
}

/** A JSON answer with its schema and example. */
export function jsonResponse(description: string, schema: z.ZodType, example: unknown): ResponseConfig {
  return { description, content: { 'application/json': { schema, example } } };
}

/** A JSON request body with its schema and example. */
export function jsonBody(schema: z.ZodType, example: unknown) {
  return { body: { required: true, content: { 'application/json': { schema, example } } } };
}

/** The refusals of every route for signed-in people. */
export const SIGNED_IN_RESPONSES: Record<401 | 403, ResponseConfig> = {
  401: problemResponse(
    'No access token, or an expired or invalid one (`code`: `SIGN_IN_REQUIRED`, `TOKEN_EXPIRED`, `TOKEN_INVALID`).',
  ),
  403: problemResponse('The role of the signed-in person does not allow this (`code`: `FORBIDDEN`).'),
};

/** A 400 for a body that does not fit its schema. */
export const INVALID_BODY_RESPONSE = problemResponse(
  'The body does not fit the route; `errors` names each field at fault.',
);

/** The header that sets or clears the refresh cookie. */
export const SET_COOKIE_HEADER = {
  'Set-Cookie': {
    description: `The refresh token in \`${REFRESH_COOKIE}\` (HttpOnly; SameSite=Strict; Path=/api/v1/auth).`,
    schema: { type: 'string' as const },
  },
};
