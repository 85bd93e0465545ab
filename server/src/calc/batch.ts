import { performance } from 'node:perf_hooks';
import {
  type BatchRequestSchema,
  calculate,
  CALC_ROUTE_NAMES,
  type CalcOutcome,
  isCalcRouteName,
  type Problem,
} from '@counterpoise/api';
import type { Response } from 'express';
import type * as z from 'zod';
import type { Clock } from '../clock';
import { sendJsonText } from '../http/json';
import type { UsageSink } from '../http/keyed-request';
import { unknownRouteLabel } from '../http/route-path';

const CALC_ROUTE_PREFIX = 'POST /api/v1/calc/';
const UNKNOWN_ROUTE = unknownRouteLabel('POST');

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
 * Answers every item of a batch on its own, in order, and logs one usage row per item (`batchItem`), as
 * each item is one calculation of the key's limit; the request itself gets its row from the usage
 * middleware, as every keyed request does, so that the report counts requests and calculations apart. An
 * item naming no calculator route is logged under the same fixed label as any unknown route. Each item's
 * JSON is written once and its length is the row's byte count, so the log costs no second serialisation.
 * The rows share the time of the request: its items are answered together. The caller has counted the
 * items against the limit (`takeBatchCalculations`) beforehand.
 */
export function answerBatch(
  res: Response,
  deps: { usage: UsageSink; clock: Clock },
  items: z.output<typeof BatchRequestSchema>['items'],
): void {
  const key = res.locals.apiKey;
  const at = deps.clock.now();
  const parts: string[] = [];
  for (let index = 0; index < items.length; index++) {
    const item = items[index]!;
    const started = performance.now();
    const outcome: CalcOutcome | { status: 404; problem: Problem } = isCalcRouteName(item.route)
      ? calculate(item.route, item.body)
      : { status: 404, problem: unknownRouteProblem(item.route) };
    const id = item.id ?? String(index);
    const json =
      outcome.status === 200
        ? JSON.stringify({ id, status: 200, result: outcome.result })
        : JSON.stringify({ id, status: outcome.status, problem: outcome.problem });
    parts.push(json);
    if (key) {
      deps.usage.record({
        keyId: key.id,
        route: isCalcRouteName(item.route) ? CALC_ROUTE_PREFIX + item.route : UNKNOWN_ROUTE,
        status: outcome.status,
        durationMs: performance.now() - started,
        bytes: Buffer.byteLength(json),
        at,
        batchItem: true,
      });
    }
  }
  sendJsonText(res, `{"items":[${parts.join(',')}]}`);
}
