import { OpenApiGeneratorV31, type OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { Router } from 'express';
import swaggerUi from 'swagger-ui-express';

/** The OpenAPI 3.1 document built from every feature's registry. */
export type OpenApiDocument = ReturnType<OpenApiGeneratorV31['generateDocument']>;

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /**
       * On `app.locals`: the OpenAPI document of the routes this app built, as `/api/openapi.json`
       * serves it. Tests read the document of the app they built here.
       */
      openApiDocument?: OpenApiDocument;
    }
  }
}

/**
 * Merges the registries of every feature (each router registers its paths beside its routes) into one
 * OpenAPI 3.1 document.
 */
export function buildOpenApiDocument(
  registries: readonly OpenAPIRegistry[],
  version: string,
): OpenApiDocument {
  const definitions = registries.flatMap((registry) => registry.definitions);
  return new OpenApiGeneratorV31(definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Counterpoise API',
      version,
      description:
        'Field balancing of rotating equipment: the calculations of the Counterpoise engine and the data ' +
        'of the workbench. Errors are answered as RFC 9457 `application/problem+json`.',
    },
    servers: [{ url: '/' }],
  });
}

/** Serves the document at `/openapi.json` and Swagger UI at `/docs`. */
export function openApiRouter(document: OpenApiDocument): Router {
  const router = Router();
  router.get('/openapi.json', (_req, res) => {
    res.json(document);
  });
  router.use(
    '/docs',
    swaggerUi.serve,
    swaggerUi.setup(document, {
      customSiteTitle: 'Counterpoise API reference',
      swaggerOptions: { url: '/api/openapi.json', tryItOutEnabled: false },
    }),
  );
  return router;
}
