import { HttpClient, HttpErrorResponse, HttpHeaders } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  catchError,
  defer,
  from,
  map,
  switchMap,
  throwError,
  timeout,
  TimeoutError,
  type Observable,
} from 'rxjs';
import type { CalcRequest, CalcResponse, CalcRouteName } from '@counterpoise/ng/api';
import { API_RUNTIME_LOADER, type ApiRuntime, preloadApiRuntime, requireApiRuntime } from './api-runtime';
import type { BalanceSolver } from './balance-solver';
import { BalanceSolverError } from './balance-solver-error';
import {
  COUNTERPOISE_CONFIG,
  DEFAULT_TIMEOUT_MS,
  calcRouteUrl,
  checkCounterpoiseConfig,
  type CounterpoiseConfig,
} from './counterpoise-config';
import { solverErrorFromResponse, parseProblem } from './solver-errors';

/**
 * The header of the API key. The same name as `API_KEY_HEADER` of `@counterpoise/ng/api` (a spec checks
 * it), written here so that sending a request needs nothing of the API runtime.
 */
export const API_KEY_HEADER_NAME = 'X-Api-Key';

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

/**
 * Computes through the calculator API (`POST <apiBaseUrl>/api/v1/calc/<route>`) with the portal's key
 * or the signed-in user's token. Every failure becomes a `BalanceSolverError` whose reason says whether
 * the values, the sign-in or the connection is at fault. It goes through the application's HttpClient,
 * so the portal's interceptors (`provideHttpClient(withInterceptors(...))`) apply.
 */
@Injectable()
export class RemoteBalanceSolver implements BalanceSolver {
  /** Always `remote`. */
  readonly kind = 'remote' as const;

  private readonly _http = inject(HttpClient);
  private readonly _load = inject(API_RUNTIME_LOADER);
  private readonly _config: CounterpoiseConfig = checkCounterpoiseConfig(
    inject(COUNTERPOISE_CONFIG, { optional: true }) ?? { solver: 'remote' },
  );

  constructor() {
    preloadApiRuntime();
  }

  /**
   * Sends one route's request and checks that the answer has the route's shape (with the route's schema,
   * from the API runtime: loaded in the background, and awaited here if it has not come yet).
   */
  calculate<N extends CalcRouteName>(route: N, request: CalcRequest<N>): Observable<CalcResponse<N>> {
    return defer(() => {
      const headers = this._headers();
      const url = calcRouteUrl(this._config.apiBaseUrl ?? '', route);
      return this._http.post<unknown>(url, request, { headers }).pipe(
        timeout({ first: this._config.timeoutMs ?? DEFAULT_TIMEOUT_MS }),
        switchMap((body) =>
          from(requireApiRuntime(this._load)).pipe(map((api) => this._checked(api, route, body))),
        ),
        catchError((error: unknown) =>
          from(this._solverError(error)).pipe(switchMap((failure) => throwError(() => failure))),
        ),
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

  private _checked<N extends CalcRouteName>(api: ApiRuntime, route: N, body: unknown): CalcResponse<N> {
    const parsed = api.CALC_ROUTES[route].response.safeParse(body);
    if (parsed.success) return parsed.data as CalcResponse<N>;
    throw new BalanceSolverError(
      'server',
      'The calculation service answered in a form this portal does not know; it may run another version. ' +
        'Tell the portal administrator, and compute on this device meanwhile.',
      { status: 200, cause: parsed.error },
    );
  }

  private async _solverError(error: unknown): Promise<BalanceSolverError> {
    if (error instanceof BalanceSolverError) return error;
    if (error instanceof TimeoutError) {
      return new BalanceSolverError(
        'unreachable',
        'The calculation service did not answer in time. Check the connection, or compute on this device.',
        { status: 0, cause: error },
      );
    }
    if (error instanceof HttpErrorResponse) {
      if (error.status === 0) explainNoAnswer(error.url ?? calcRouteUrl(this._config.apiBaseUrl ?? '', ''));
      const parsingFailed = error.status >= 200 && error.status < 300;
      const problem = parsingFailed ? undefined : await parseProblem(error.error, this._load);
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
