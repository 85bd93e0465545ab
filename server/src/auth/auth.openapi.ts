import { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { REFRESH_COOKIE } from '@counterpoise/api';
import { ACCESS_TOKEN_SCHEME, REFRESH_COOKIE_SCHEME } from '../openapi/responses';

/**
 * The OpenAPI registry of sign-in's security schemes. They are components, not routes: the same for
 * every app, so one module-level registry serves them all.
 */
export const authRegistry = new OpenAPIRegistry();

authRegistry.registerComponent('securitySchemes', ACCESS_TOKEN_SCHEME, {
  type: 'http',
  scheme: 'bearer',
  bearerFormat: 'JWT',
  description:
    'The access token of a signed-in person (HS256 JWT, 10 minutes), as `POST /api/v1/auth/sign-in` ' +
    'answers it. Renew it with `POST /api/v1/auth/refresh`.',
});
authRegistry.registerComponent('securitySchemes', REFRESH_COOKIE_SCHEME, {
  type: 'apiKey',
  in: 'cookie',
  name: REFRESH_COOKIE,
  description: 'The refresh token: httpOnly, SameSite=Strict, Path=/api/v1/auth; replaced on every use.',
});
