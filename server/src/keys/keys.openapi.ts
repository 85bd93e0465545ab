import { OpenAPIRegistry, type ResponseConfig } from '@asteasolutions/zod-to-openapi';
import { API_KEY_HEADER, PROBLEM_MEDIA_TYPE, ProblemSchema } from '@counterpoise/api';

/** The OpenAPI registry of API keys: their security schemes and the headers of the rate limit. */
export const keysRegistry = new OpenAPIRegistry();

/** The name of the security scheme for a key in the `X-Api-Key` header. */
export const API_KEY_HEADER_SCHEME = 'ApiKeyHeader';
/** The name of the security scheme for a key as `Authorization: Bearer <key>`. */
export const API_KEY_BEARER_SCHEME = 'ApiKeyBearer';

keysRegistry.registerComponent('securitySchemes', API_KEY_HEADER_SCHEME, {
  type: 'apiKey',
  in: 'header',
  name: API_KEY_HEADER,
  description:
    'An API key (`cpk_` and 43 characters). Create one with `npm run api-key -- create --name <who>`; ' +
    'the demo data leaves one in `data/demo-api-key.txt`.',
});
keysRegistry.registerComponent('securitySchemes', API_KEY_BEARER_SCHEME, {
  type: 'http',
  scheme: 'bearer',
  bearerFormat: 'cpk_…',
  description:
    `The same API key, as \`Authorization: Bearer <key>\` instead of the ${API_KEY_HEADER} header. The ` +
    'calculator routes also take the access token of a signed-in person here (see `AccessToken`), and a ' +
    'visitor token from `POST /api/v1/tokens`.',
});

/** The `security` of every keyed route: either scheme will do. */
export const API_KEY_SECURITY: Record<string, string[]>[] = [
  { [API_KEY_HEADER_SCHEME]: [] },
  { [API_KEY_BEARER_SCHEME]: [] },
];

const integerHeader = (description: string) => ({ description, schema: { type: 'integer' as const } });

const HEADER_COMPONENTS = {
  'RateLimit-Limit': integerHeader('Calculations per minute this key may make (a batch of n counts n).'),
  'RateLimit-Remaining': integerHeader('Calculations left in the current window.'),
  'RateLimit-Reset': integerHeader('Seconds until the window starts afresh.'),
  'RateLimit-Policy': {
    description: 'The limit and its window in seconds, e.g. `600;w=60`.',
    schema: { type: 'string' as const },
  },
  'Retry-After': integerHeader('Seconds to wait before calling again.'),
};
for (const [name, header] of Object.entries(HEADER_COMPONENTS)) {
  keysRegistry.registerComponent('headers', name, header);
}
const headerRef = (name: keyof typeof HEADER_COMPONENTS) => ({ $ref: `#/components/headers/${name}` });

/** The headers every answer of a keyed route carries, for its `responses`. */
export const RATE_LIMIT_HEADERS = {
  'RateLimit-Limit': headerRef('RateLimit-Limit'),
  'RateLimit-Remaining': headerRef('RateLimit-Remaining'),
  'RateLimit-Reset': headerRef('RateLimit-Reset'),
  'RateLimit-Policy': headerRef('RateLimit-Policy'),
};

const problem = (description: string, headers?: ResponseConfig['headers']): ResponseConfig => ({
  description,
  ...(headers ? { headers } : {}),
  content: { [PROBLEM_MEDIA_TYPE]: { schema: ProblemSchema } },
});

/**
 * The refusals every keyed route may answer, to spread into its `responses`: 401 without a valid
 * key, 403 with a revoked one, 429 over the key's limit.
 */
export const KEYED_ROUTE_RESPONSES: Record<401 | 403 | 429, ResponseConfig> = {
  401: problem(
    'No API key, two different ones, or one that is malformed or unknown (`code`: `API_KEY_MISSING`, ' +
      '`API_KEY_CONFLICT`, `API_KEY_INVALID`); a visitor token that has expired or is not valid ' +
      '(`TOKEN_EXPIRED`, `TOKEN_INVALID`).',
    {
      'WWW-Authenticate': { description: 'How to authenticate.', schema: { type: 'string' } },
    },
  ),
  403: problem(
    'The API key was revoked (`code`: `API_KEY_REVOKED`); it is limited to web origins and the request ' +
      'came from another origin or with no Origin header (`API_KEY_ORIGIN_REFUSED`); a visitor token was ' +
      'sent to a route outside the calculation routes (`TOKEN_SCOPE`).',
  ),
  429: problem(
    'The key asked for more calculations this minute than its limit allows (a batch of n counts n) (`code`: `RATE_LIMITED`).',
    {
      ...RATE_LIMIT_HEADERS,
      'Retry-After': headerRef('Retry-After'),
    },
  ),
};
