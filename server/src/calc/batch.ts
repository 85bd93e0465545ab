import {
  type BatchRequestSchema,
  calculate,
  CALC_ROUTE_NAMES,
  type CalcOutcome,
  type CalcRouteName,
  isCalcRouteName,
  type Problem,
} from '@counterpoise/api';
import type { Response } from 'express';
import type * as z from 'zod';
import { sendJsonText } from '../http/json';
import { answerSerializer } from './serializers';

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
      ? calculate(item.route as CalcRouteName, item.body)
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
