import { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import {
  BatchRequestSchema,
  BatchResponseSchema,
  CALC_ROUTE_NAMES,
  CALC_ROUTES,
  computeCalc,
  ProblemSchema,
} from '@counterpoise/api';
import express, { type RequestHandler } from 'express';
import type * as z from 'zod';
import type { DispatchTable } from '../openapi/served-routes';
import { inSequence } from '../http/in-sequence';
import { normaliseRoutePath } from '../http/route-path';
import { sendJsonText } from '../http/json';
import { apiNotFound, HttpProblem, methodNotAllowed, requireJsonBody } from '../http/problem';
import { validateJsonBody } from '../http/validate';
import { takeBatchCalculations } from '../keys/api-key.rate-limit';
import { API_KEY_SECURITY, KEYED_ROUTE_RESPONSES, RATE_LIMIT_HEADERS } from '../keys/keys.openapi';
import { answerBatch, calculateParsed } from './batch';
import { answerSerializer } from './serializers';

/** Where the calculator routes are mounted. */
export const CALC_BASE_PATH = '/api/v1/calc';

/** The largest body of one calculation; a batch may carry more. */
export const CALC_BODY_LIMIT = '64kb';
export const BATCH_BODY_LIMIT = '2mb';

export const calcRegistry = new OpenAPIRegistry();

const problemResponse = (description: string) => ({
  description,
  content: { 'application/problem+json': { schema: ProblemSchema } },
});

/** The error answers every calculator route can give. */
const PROBLEM_RESPONSES = {
  400: problemResponse(
    'The body does not fit the route, or the engine cannot compute it; `errors` names the field.',
  ),
  ...KEYED_ROUTE_RESPONSES,
  413: problemResponse('The body is larger than the route accepts.'),
  415: problemResponse('The body is not sent as application/json.'),
};

for (const name of CALC_ROUTE_NAMES) {
  const definition = CALC_ROUTES[name] as unknown as {
    summary: string;
    description: string;
    request: z.ZodType;
    response: z.ZodType;
    example: unknown;
  };
  // The answer shown is computed from the example request, so the two can never disagree.
  const outcome = computeCalc(name, definition.request.parse(definition.example) as never);
  calcRegistry.registerPath({
    method: 'post',
    path: `${CALC_BASE_PATH}/${name}`,
    operationId: `calc-${name}`,
    tags: ['Calculations'],
    summary: definition.summary,
    description: definition.description,
    security: API_KEY_SECURITY,
    request: {
      body: {
        required: true,
        content: { 'application/json': { schema: definition.request, example: definition.example } },
      },
    },
    responses: {
      200: {
        description: 'The answer, with `warnings` in plain words.',
        headers: RATE_LIMIT_HEADERS,
        content: {
          'application/json': {
            schema: definition.response,
            ...(outcome.status === 200 ? { example: outcome.result } : {}),
          },
        },
      },
      ...PROBLEM_RESPONSES,
    },
  });
}

calcRegistry.registerPath({
  method: 'post',
  path: `${CALC_BASE_PATH}/batch`,
  operationId: 'calc-batch',
  tags: ['Calculations'],
  summary: 'Many calculations in one request',
  description:
    'Up to 1,000 items, each `{ id?, route, body }` with `route` one of the calculator routes. Each item is ' +
    'validated and answered on its own, with the status that route alone would give; one bad item never ' +
    'fails the others. Each item is one calculation: a batch of n counts n against the key’s limit per ' +
    'minute and in its usage. A batch larger than what remains of the limit is refused ' +
    'whole (429) before any item is computed.',
  security: API_KEY_SECURITY,
  request: {
    body: {
      required: true,
      content: {
        'application/json': {
          schema: BatchRequestSchema,
          example: {
            items: [
              { id: 'drum-7', route: 'single-plane', body: CALC_ROUTES['single-plane'].example },
              { id: 'drum-8', route: 'radius', body: CALC_ROUTES.radius.example },
            ],
          },
        },
      },
    },
  },
  responses: {
    200: {
      description: 'One answer per item, in order.',
      headers: RATE_LIMIT_HEADERS,
      content: { 'application/json': { schema: BatchResponseSchema } },
    },
    ...PROBLEM_RESPONSES,
  },
});

/**
 * The calculator routes, `POST /<route>` and `POST /batch`, as one handler mounted at `CALC_BASE_PATH`
 * behind the API-key, rate-limit and usage middleware. One lookup in a table finds the route, where a
 * router would try each route's pattern in turn: these are the API's busiest requests. Every path under
 * the mount is answered here: another method gets 405, an unknown route 404. A batch counts its items
 * against the key's limit once they are validated, before computing any, and leaves its calculations and
 * its items' errors for the request's usage row.
 *
 * `before` (the keyed chain) runs inside the same handler, so that the app mounts the calculator as one
 * layer: Express matches the mount path once, not once per middleware (`npm run bench:api`).
 *
 * It is not a `RouteTable` on purpose: a table mounts one Express route per declaration, and `npm run
 * bench:api` showed the single lookup answering these requests measurably faster than Express matching
 * their patterns. It stays held to the documentation all the same: `servedRoutes` declares what it
 * answers, and the documentation test compares that with the OpenAPI document.
 */
export function calcRouter(
  options: {
    /**
     * What every calculator request passes first (the keyed chain, the permission check), run in
     * sequence inside this one handler: mounted as one Express layer, not one layer each.
     */
    readonly before?: readonly RequestHandler[];
  } = {},
): RequestHandler & DispatchTable {
  const parseCalc = express.json({ limit: CALC_BODY_LIMIT, type: () => true });
  const answers = new Map<string, RequestHandler>();
  answers.set(
    '/batch',
    inSequence(
      requireJsonBody,
      express.json({ limit: BATCH_BODY_LIMIT, type: () => true }),
      // Ajv's check first, then zod for a batch it does not accept (json-acceptor.ts).
      validateJsonBody(BatchRequestSchema),
      (_req, res, next) => {
        const { items } = res.locals.body as z.output<typeof BatchRequestSchema>;
        const refusal = takeBatchCalculations(res, items.length);
        if (refusal) next(refusal);
        else answerBatch(res, items);
      },
    ),
  );
  for (const name of CALC_ROUTE_NAMES) {
    // Compiled from the route's response schema (serializers.ts).
    const serialize = answerSerializer(name);
    answers.set(
      `/${name}`,
      inSequence(requireJsonBody, parseCalc, (req, res, next) => {
        // Validated with the route's schema and computed, as the batch does for each item.
        const outcome = calculateParsed(name, req.body);
        if (outcome.status === 200) sendJsonText(res, serialize(outcome.result));
        else next(HttpProblem.from(outcome.problem));
      }),
    );
  }
  const onlyPost = methodNotAllowed('POST');

  const dispatch: RequestHandler = (req, res, next) => {
    // Express matches paths without regard to case or a trailing slash; so does this table, and the
    // usage log names the route by the same reading.
    const answer = answers.get(normaliseRoutePath(req.path));
    if (answer === undefined) apiNotFound(req, res, next);
    else if (req.method !== 'POST') onlyPost(req, res, next);
    else answer(req, res, next);
  };
  // The documentation test walks Express's routes; this table is not one, so it says what it serves.
  const servedRoutes = [...answers.keys()].map((path) => ({
    method: 'post',
    path: `${CALC_BASE_PATH}${path}`,
  }));
  const handler = options.before?.length ? inSequence(...options.before, dispatch) : dispatch;
  return Object.assign(handler, { servedRoutes });
}
