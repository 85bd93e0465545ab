import { HttpClient, HttpErrorResponse, HttpHeaders } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { catchError, defer, map, throwError, timeout, TimeoutError, type Observable } from 'rxjs';
import type { BatchItemResult, CalcRequest, CalcResponse, CalcRouteName } from '@counterpoise/ng/api';
import type { BalanceSolver, BalanceSolverOutcome } from './balance-solver';
import { BalanceSolverError } from './balance-solver-error';
import {
  COUNTERPOISE_CONFIG,
  DEFAULT_TIMEOUT_MS,
  calcRouteUrl,
  checkCounterpoiseConfig,
  type CounterpoiseConfig,
} from './counterpoise-config';
import { readProblem, solverErrorFromResponse } from './solver-errors';

/**
 * The header of the API key. The same name as `API_KEY_HEADER` of `@counterpoise/ng/api` (a spec checks
 * it), written here so that sending a request needs nothing of the API runtime.
 */
export const API_KEY_HEADER_NAME = 'X-Api-Key';

/** The batch route, as the calculator's routes are named under `/api/v1/calc/`. */
const BATCH_ROUTE = 'batch';

/**
 * Tells the developer, in the console, what a request with no answer at all (status 0) most often means
 * while a portal is being set up: the browser blocked it because the API does not allow the page's origin.
 * The technician's message stays the plain "could not be reached".
 */
function explainNoAnswer(url: string): void {
  const origin = typeof location === 'undefined' ? 'this page’s origin' : location.origin;
  console.error(
    `Counterpoise: the request to ${url} got no answer (status 0). If the calculation service is up, the ` +
      `browser may have blocked it: the service must allow ${origin}, listed in the server's CORS_ORIGINS ` +
      'or among the web origins of the API key.',
  );
}

/** The error of an answer that is not JSON of the API: a network's sign-in page, a proxy's notice. */
function notFromTheService(cause?: unknown): BalanceSolverError {
  return new BalanceSolverError(
    'unreachable',
    'The answer did not come from the calculation service (perhaps a sign-in page of the network). ' +
      'Check the connection, or compute on this device.',
    { status: 200, ...(cause === undefined ? {} : { cause }) },
  );
}

/**
 * Computes through the calculator API (`POST <apiBaseUrl>/api/v1/calc/<route>`, several requests of one
 * route as one `POST …/batch`) with the portal's key or the signed-in user's token. It trusts the API's
 * answers to have their documented types and reads its problems with a small type guard, so it loads
 * nothing of the engine or its schemas (`@counterpoise/ng/api`). It goes through the application's
 * HttpClient, so the portal's interceptors (`provideHttpClient(withInterceptors(...))`) apply; without
 * `provideHttpClient()`, through the HttpClient Angular provides in root. Every failure becomes a
 * `BalanceSolverError` whose reason says whether the values, the sign-in or the connection is at fault.
 */
@Injectable()
export class RemoteBalanceSolver implements BalanceSolver {
  /** Always `remote`. */
  readonly kind = 'remote' as const;

  private readonly _http = inject(HttpClient);
  private readonly _config: CounterpoiseConfig = checkCounterpoiseConfig(
    inject(COUNTERPOISE_CONFIG, { optional: true }) ?? { solver: 'remote' },
  );

  /** Sends one route's request and passes its answer on, as the API documents it. */
  calculate<N extends CalcRouteName>(route: N, request: CalcRequest<N>): Observable<CalcResponse<N>> {
    return this._post<CalcResponse<N>>(route, request);
  }

  /**
   * Sends several requests of one route as one batch request and gives each item's answer, or its own
   * error, in the order of the requests.
   */
  calculateAll<N extends CalcRouteName>(
    route: N,
    requests: readonly CalcRequest<N>[],
  ): Observable<BalanceSolverOutcome<CalcResponse<N>>[]> {
    const items = requests.map((body, index) => ({ id: String(index), route, body }));
    return this._post<{ items?: unknown }>(BATCH_ROUTE, { items }).pipe(
      map((answer) => {
        const answered = answer.items;
        if (!Array.isArray(answered) || answered.length !== requests.length) throw notFromTheService();
        return (answered as BatchItemResult[]).map((item): BalanceSolverOutcome<CalcResponse<N>> =>
          item.status === 200
            ? { ok: true, result: item.result as CalcResponse<N> }
            : { ok: false, error: this._itemError(item) },
        );
      }),
    );
  }

  private _itemError(item: BatchItemResult): BalanceSolverError {
    const problem = readProblem(item.problem);
    return solverErrorFromResponse({ status: item.status, ...(problem === undefined ? {} : { problem }) });
  }

  private _post<T>(route: string, body: unknown): Observable<T> {
    return defer(() => {
      const headers = this._headers();
      const url = calcRouteUrl(this._config.apiBaseUrl ?? '', route);
      return this._http.post<unknown>(url, body, { headers }).pipe(
        timeout({ first: this._config.timeoutMs ?? DEFAULT_TIMEOUT_MS }),
        map((answer) => {
          // Every answer of the calculator is a JSON object; anything else did not come from it.
          if (answer === null || typeof answer !== 'object' || Array.isArray(answer))
            throw notFromTheService();
          return answer as T;
        }),
        catchError((error: unknown) => throwError(() => this._solverError(error, url))),
      );
    });
  }

  private _headers(): HttpHeaders {
    const headers = new HttpHeaders({ Accept: 'application/json, application/problem+json' });
    if (this._config.apiKey !== undefined) return headers.set(API_KEY_HEADER_NAME, this._config.apiKey);
    const token = this._config.accessToken?.() ?? null;
    if (token === null || token === '') {
      throw new BalanceSolverError(
        'unauthorized',
        'You are signed out of the portal. Sign in again to compute with the calculation service.',
      );
    }
    return headers.set('Authorization', `Bearer ${token}`);
  }

  private _solverError(error: unknown, url: string): BalanceSolverError {
    if (error instanceof BalanceSolverError) return error;
    if (error instanceof TimeoutError) {
      return new BalanceSolverError(
        'unreachable',
        'The calculation service did not answer in time. Check the connection, or compute on this device.',
        { status: 0, cause: error },
      );
    }
    if (error instanceof HttpErrorResponse) {
      if (error.status === 0) explainNoAnswer(error.url ?? url);
      // A 2xx whose body could not be read as JSON: not the service's answer.
      const parsingFailed = error.status >= 200 && error.status < 300;
      const problem = parsingFailed ? undefined : readProblem(error.error);
      return solverErrorFromResponse({
        status: error.status,
        ...(problem === undefined ? {} : { problem }),
        retryAfter: error.headers?.get('Retry-After') ?? null,
      });
    }
    return new BalanceSolverError(
      'server',
      'The request to the calculation service failed. Try again, or compute on this device.',
      { cause: error },
    );
  }
}
