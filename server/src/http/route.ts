import { OpenAPIRegistry, type ResponseConfig, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import express, { type Request, type RequestHandler, type Response, Router } from 'express';
import type * as z from 'zod';
import { problemResponse } from '../openapi/responses';
import { validateParams } from './params';
import { requireJsonBody } from './problem';
import { validateBody, validateHeaders, validateQuery } from './validate';

/** The HTTP methods a route may take. */
export type RouteMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/**
 * Who may call a route, as the app wires it: a name the route table maps to its guard (the middleware
 * that lets the request through or refuses it) and to what the OpenAPI document says of it.
 */
export interface AccessRule {
  /** The middleware that runs before anything else of the route: authentication, role checks. */
  readonly guard: readonly RequestHandler[];
  /** The OpenAPI `security` of the route; absent for a public route. */
  readonly security?: RouteConfig['security'];
  /** The refusals the guard may answer (401, 403, 429…), merged into the route's responses. */
  readonly responses?: Readonly<Record<number, ResponseConfig>>;
  /** A sentence for the route's description: who may call it. */
  readonly describe?: string;
}

/** The answer of a route that succeeds. */
export interface RouteAnswer<S extends z.ZodType | undefined> {
  /** The status of the answer: 200, 201, 202 or 204. */
  readonly status: 200 | 201 | 202 | 204;
  readonly description: string;
  /** The schema of the body (none for 202 and 204). */
  readonly schema?: S;
  /** An example the schema accepts (the documentation test parses it). */
  readonly example?: S extends z.ZodType ? z.input<S> : never;
  readonly headers?: ResponseConfig['headers'];
  /**
   * The documented content of an answer that is not JSON (a PDF, a CSV file, an image), by media type:
   * `{ 'application/pdf': { schema: { type: 'string', format: 'binary' } } }`. Such a route has no
   * `schema`, and its handler writes the answer itself (`res.type(...).send(bytes)`).
   */
  readonly content?: ResponseConfig['content'];
}

/**
 * A request body that is not JSON (a file sent as `multipart/form-data`, a CSV file as `text/csv`): the
 * middleware that parses it (multer, `express.text`), run after the guard, the parameters and `before`,
 * and how the OpenAPI document describes it. The handler reads what the parser left (`req.file`,
 * `req.body`).
 */
export interface RawBody {
  readonly parse: readonly RequestHandler[];
  readonly content: NonNullable<NonNullable<RouteConfig['request']>['body']>['content'];
  readonly description?: string;
}

/** What a handler receives: the parsed, typed parts of the request and the signed-in person, if any. */
export interface RouteInput<P, Q, B, H = undefined> {
  readonly params: P;
  readonly query: Q;
  readonly body: B;
  /** The request headers the route declares, parsed. */
  readonly headers: H;
  readonly req: Request;
  readonly res: Response;
}

type Out<S> = S extends z.ZodType ? z.output<S> : undefined;
type AnswerOf<S> = S extends z.ZodType ? z.input<S> : void;

/**
 * One route, declared once: method, path, the zod schemas of its parameters, query, body and answer,
 * who may call it, its documentation and its handler. `RouteTable.add` mounts it on Express and
 * registers it in the OpenAPI document from this one declaration, so the two cannot drift.
 */
export interface RouteDeclaration<
  A extends string,
  P extends z.ZodType | undefined,
  Q extends z.ZodType | undefined,
  B extends z.ZodType | undefined,
  R extends z.ZodType | undefined,
  H extends z.ZodType | undefined = undefined,
> {
  readonly method: RouteMethod;
  /** The path below the table's base, OpenAPI style: `/customers/{id}`. */
  readonly path: string;
  readonly summary: string;
  readonly description?: string;
  /** Who may call it: a name of the table's access rules. */
  readonly access: A;
  readonly params?: P;
  readonly query?: Q;
  /**
   * The request headers the route reads (`If-Match`): a zod object of lower-case header names, checked
   * before `before` runs and documented as header parameters.
   */
  readonly headers?: H;
  readonly body?: B;
  /** An example of the body that the body schema accepts. */
  readonly bodyExample?: B extends z.ZodType ? z.input<B> : never;
  /** A body that is not JSON, parsed by its own middleware; never together with `body`. */
  readonly rawBody?: RawBody;
  /** Largest body accepted; 16 kB unless said. */
  readonly bodyLimit?: string;
  readonly answer: RouteAnswer<R>;
  /** The route's own problem answers, by status: a description each (400 is added for any input). */
  readonly problems?: Readonly<Record<number, string | ResponseConfig>>;
  /** Middleware between the guard and the body parser: per-client limits, conditional checks. */
  readonly before?: readonly RequestHandler[];
  /**
   * Answers the request. What it returns is sent with the answer's status as JSON (or an empty body
   * for 202 and 204); a handler that wrote the answer itself (a session with its cookie) returns
   * nothing and leaves `res.headersSent` true. One that does neither for a route with a body is a bug,
   * and fails the request with a 500 rather than send an empty 200.
   */
  readonly handle: (
    input: RouteInput<Out<P>, Out<Q>, Out<B>, Out<H>>,
  ) => AnswerOf<R> | undefined | Promise<AnswerOf<R> | undefined>;
}

/** The 400 of every route that takes input. */
const INVALID_INPUT = problemResponse(
  'The request does not fit the route; `errors` names each parameter or field at fault.',
);

/** `/customers/{id}/contacts/{contactId}` as Express writes it: `/customers/:id/contacts/:contactId`. */
export function toExpressPath(openApiPath: string): string {
  return openApiPath.replace(/\{([A-Za-z_][A-Za-z0-9_]*)\}/g, ':$1');
}

/**
 * What a feature's router factory hands the app: the router to mount and the registry of the routes
 * it declared, which the app merges into its own OpenAPI document.
 */
export interface FeatureRoutes {
  readonly router: Router;
  readonly registry: OpenAPIRegistry;
}

/**
 * The routes of one feature: each is declared once with `add`, which mounts it on `router` and
 * registers it in `registry` under `basePath`. The access rules are given by the app, so that a
 * feature names who may call a route without constructing any other feature's objects. Each table
 * documents in a registry of its own (unless given one), so that every app's document holds the routes
 * that app built, once.
 */
export class RouteTable<A extends string> implements FeatureRoutes {
  /** The Express router to mount at `basePath`. */
  readonly router = Router();
  /** The OpenAPI registry the table's routes are documented in. */
  readonly registry: OpenAPIRegistry;

  constructor(
    private readonly options: {
      /** Where the router is mounted, as the OpenAPI document writes it (`/api/v1`). */
      readonly basePath: string;
      /** Where to document the routes; a new registry of the table's own when absent. */
      readonly registry?: OpenAPIRegistry;
      /** The OpenAPI tag of every route of the table. */
      readonly tag: string;
      readonly access: Readonly<Record<A, AccessRule>>;
    },
  ) {
    this.registry = options.registry ?? new OpenAPIRegistry();
  }

  /** Declares one route: mounts it and documents it. */
  add<
    P extends z.ZodType | undefined = undefined,
    Q extends z.ZodType | undefined = undefined,
    B extends z.ZodType | undefined = undefined,
    R extends z.ZodType | undefined = undefined,
    H extends z.ZodType | undefined = undefined,
  >(route: RouteDeclaration<A, P, Q, B, R, H>): this {
    if (route.body !== undefined && route.rawBody !== undefined) {
      throw new Error(`${route.method} ${route.path} declares both a JSON body and a raw body.`);
    }
    const access = this.options.access[route.access];
    this.register(route, access);
    const handlers: RequestHandler[] = [
      ...access.guard,
      ...(route.params ? [validateParams(route.params)] : []),
      ...(route.query ? [validateQuery(route.query)] : []),
      ...(route.headers ? [validateHeaders(route.headers)] : []),
      ...(route.before ?? []),
      ...(route.body
        ? [
            requireJsonBody,
            express.json({ limit: route.bodyLimit ?? '16kb', type: () => true }),
            validateBody(route.body),
          ]
        : []),
      ...(route.rawBody?.parse ?? []),
      async (req, res) => {
        const answer = await route.handle({
          params: res.locals.params as Out<P>,
          query: res.locals.query as Out<Q>,
          body: res.locals.body as Out<B>,
          headers: res.locals.headers as Out<H>,
          req,
          res,
        });
        if (res.headersSent) return;
        res.status(route.answer.status);
        if (route.answer.schema === undefined && route.answer.content === undefined) res.end();
        else if (answer === undefined) throw new Error(`${route.method} ${route.path} answered nothing.`);
        else res.json(answer);
      },
    ];
    this.router[route.method](toExpressPath(route.path), ...handlers);
    return this;
  }

  private register(
    route: RouteDeclaration<
      A,
      z.ZodType | undefined,
      z.ZodType | undefined,
      z.ZodType | undefined,
      z.ZodType | undefined,
      z.ZodType | undefined
    >,
    access: AccessRule,
  ): void {
    const { answer } = route;
    const responses: Record<number, ResponseConfig> = {
      [answer.status]: {
        description: answer.description,
        ...(answer.headers ? { headers: answer.headers } : {}),
        ...(answer.content ? { content: answer.content } : {}),
        ...(answer.schema
          ? {
              content: {
                'application/json': {
                  schema: answer.schema,
                  ...(answer.example === undefined ? {} : { example: answer.example }),
                },
              },
            }
          : {}),
      },
      ...access.responses,
    };
    if (route.params || route.query || route.headers || route.body || route.rawBody) {
      responses[400] = INVALID_INPUT;
    }
    for (const [status, problem] of Object.entries(route.problems ?? {})) {
      responses[Number(status)] = typeof problem === 'string' ? problemResponse(problem) : problem;
    }
    const description = [access.describe, route.description].filter(Boolean).join(' ');
    this.registry.registerPath({
      method: route.method,
      path: `${this.options.basePath}${route.path}`,
      tags: [this.options.tag],
      summary: route.summary,
      ...(description ? { description } : {}),
      ...(access.security ? { security: access.security } : {}),
      request: {
        ...(route.params ? { params: route.params as RouteParameter } : {}),
        ...(route.query ? { query: route.query as RouteParameter } : {}),
        ...(route.headers ? { headers: route.headers as RouteParameter } : {}),
        ...(route.body
          ? {
              body: {
                required: true,
                content: {
                  'application/json': {
                    schema: route.body,
                    ...(route.bodyExample === undefined ? {} : { example: route.bodyExample }),
                  },
                },
              },
            }
          : {}),
        ...(route.rawBody
          ? {
              body: {
                required: true,
                content: route.rawBody.content,
                ...(route.rawBody.description ? { description: route.rawBody.description } : {}),
              },
            }
          : {}),
      },
      responses,
    });
  }
}

type RouteParameter = NonNullable<NonNullable<RouteConfig['request']>['params']>;
