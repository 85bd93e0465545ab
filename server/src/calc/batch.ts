import {
  type BatchRequestSchema,
  calculate,
  CALC_ROUTE_NAMES,
  computeCalc,
  CALC_ROUTES,
  type CalcOutcome,
  type CalcRouteName,
  isCalcRouteName,
  type Problem,
} from '@counterpoise/api';
import type { Response } from 'express';
import type * as z from 'zod';
import { compileJsonAcceptor, type JsonAcceptor } from '../http/json-acceptor';
import { sendJsonText } from '../http/json';
import { answerSerializer } from './serializers';

/** Each route's acceptor (json-acceptor.ts), where its request schema has one. */
const acceptors = new Map<CalcRouteName, JsonAcceptor | undefined>(
  CALC_ROUTE_NAMES.map((name) => [name, compileJsonAcceptor(CALC_ROUTES[name].request)]),
);

/**
 * `calculate` for a body parsed from JSON: a body that the route's acceptor takes is computed as it is,
 * since zod would give it back unchanged; any other is validated by zod, whose problem names the fields
 * at fault. The same answer as `calculate`, for a fraction of the validation's cost.
 */
export function calculateParsed<Name extends CalcRouteName>(name: Name, body: unknown): CalcOutcome<Name> {
  return acceptors.get(name)?.(body) === true
    ? computeCalc(name, body as Parameters<typeof computeCalc<Name>>[1])
    : calculate(name, body);
}

function unknownRouteProblem(route: string): Problem {
  const message = `"${route}" is not a calculator route; use one of ${CALC_ROUTE_NAMES.join(', ')}.`;
  return {
    type: 'about:blank',
    title: 'Not Found',
    status: 404,
    code: 'UNKNOWN_ROUTE',
    detail: message,
    errors: [{ path: 'route', message }],
  };
}

/**
 * Answers every item of a batch on its own, in order. The request's usage row (written by the usage
 * middleware, as for every keyed request) carries the batch's calculations, one per item as the key's
 * limit counts them, and its items' errors by status: `res.locals.batchUsage`. One row per request
 * rather than one per item, so that a batch of a thousand costs the log one row. The caller has counted
 * the items against the limit (`takeBatchCalculations`) beforehand.
 */
export function answerBatch(res: Response, items: z.output<typeof BatchRequestSchema>['items']): void {
  const parts: string[] = new Array(items.length);
  let itemErrors: Record<string, number> | undefined;
  for (let index = 0; index < items.length; index++) {
    const item = items[index]!;
    const known = isCalcRouteName(item.route);
    const outcome: CalcOutcome | { status: 404; problem: Problem } = known
      ? calculateParsed(item.route as CalcRouteName, item.body)
      : { status: 404, problem: unknownRouteProblem(item.route) };
    const id = item.id ?? String(index);
    if (outcome.status === 200) {
      // The result written by its route's compiled serializer, as the route alone would answer it.
      const result = answerSerializer(item.route as CalcRouteName)(outcome.result);
      parts[index] = `{"id":${JSON.stringify(id)},"status":200,"result":${result}}`;
    } else {
      parts[index] = JSON.stringify({ id, status: outcome.status, problem: outcome.problem });
      itemErrors ??= {};
      itemErrors[outcome.status] = (itemErrors[outcome.status] ?? 0) + 1;
    }
  }
  res.locals.batchUsage = { calculations: items.length, ...(itemErrors ? { itemErrors } : {}) };
  sendJsonText(res, `{"items":[${parts.join(',')}]}`);
}
