import { HttpClient, HttpErrorResponse, HttpHeaders } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { catchError, defer, map, throwError, timeout, TimeoutError, type Observable } from 'rxjs';
import {
  API_KEY_HEADER,
  CALC_ROUTES,
  type CalcRequest,
  type CalcResponse,
  type CalcRouteName,
} from '@counterpoise/api';
import type { BalanceEngine } from './balance-engine';
import { BalanceEngineError } from './balance-engine-error';
import {
  COUNTERPOISE_CONFIG,
  DEFAULT_TIMEOUT_MS,
  calcRouteUrl,
  checkCounterpoiseConfig,
  type CounterpoiseConfig,
} from './counterpoise-config';
import { engineErrorFromResponse } from './engine-errors';

/**
 * Computes through the calculator API (`POST <apiBaseUrl>/api/v1/calc/<route>`) with the portal's key
 * or the signed-in user's token. Every failure becomes a `BalanceEngineError` whose reason says whether
 * the values, the sign-in or the connection is at fault. It goes through the application's HttpClient,
 * so the portal's interceptors (`provideHttpClient(withInterceptors(...))`) apply.
 */
@Injectable()
export class RemoteBalanceEngine implements BalanceEngine {
  /** Always `remote`. */
  readonly kind = 'remote' as const;

  private readonly _http = inject(HttpClient);
  private readonly _config: CounterpoiseConfig = checkCounterpoiseConfig(
    inject(COUNTERPOISE_CONFIG, { optional: true }) ?? { engine: 'remote' },
  );

  /** Sends one route's request and checks that the answer has the route's shape. */
  calculate<N extends CalcRouteName>(route: N, request: CalcRequest<N>): Observable<CalcResponse<N>> {
    return defer(() => {
      const headers = this._headers();
      const url = calcRouteUrl(this._config.apiBaseUrl ?? '', route);
      return this._http.post<unknown>(url, request, { headers }).pipe(
        timeout({ first: this._config.timeoutMs ?? DEFAULT_TIMEOUT_MS }),
        map((body) => this._checked(route, body)),
        catchError((error: unknown) => throwError(() => this._engineError(error))),
      );
    });
  }

  private _headers(): HttpHeaders {
    const headers = new HttpHeaders({ Accept: 'application/json, application/problem+json' });
    if (this._config.apiKey !== undefined) return headers.set(API_KEY_HEADER, this._config.apiKey);
    const token = this._config.accessToken?.() ?? null;
    if (token === null || token === '') {
      throw new BalanceEngineError(
        'unauthorized',
        'You are signed out of the portal. Sign in again to compute with the calculation service.',
      );
    }
    return headers.set('Authorization', `Bearer ${token}`);
  }

  private _checked<N extends CalcRouteName>(route: N, body: unknown): CalcResponse<N> {
    const parsed = CALC_ROUTES[route].response.safeParse(body);
    if (parsed.success) return parsed.data as CalcResponse<N>;
    throw new BalanceEngineError(
      'server',
      'The calculation service answered in a form this portal does not know; it may run another version. ' +
        'Tell the portal administrator, and compute on this device meanwhile.',
      { status: 200, cause: parsed.error },
    );
  }

  private _engineError(error: unknown): BalanceEngineError {
    if (error instanceof BalanceEngineError) return error;
    if (error instanceof TimeoutError) {
      return new BalanceEngineError(
        'unreachable',
        'The calculation service did not answer in time. Check the connection, or compute on this device.',
        { status: 0, cause: error },
      );
    }
    if (error instanceof HttpErrorResponse) {
      const parsingFailed = error.status >= 200 && error.status < 300;
      return engineErrorFromResponse({
        status: error.status,
        body: parsingFailed ? undefined : error.error,
        retryAfter: error.headers?.get('Retry-After') ?? null,
      });
    }
    return new BalanceEngineError(
      'server',
      'The request to the calculation service failed. Try again, or compute on this device.',
      { cause: error },
    );
  }
}
