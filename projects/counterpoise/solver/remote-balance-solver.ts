import { isPlatformBrowser } from '@angular/common';
import { EnvironmentInjector, Injectable, PLATFORM_ID, inject } from '@angular/core';
import { defer, from, switchMap, type Observable } from 'rxjs';
import type { CalcRequest, CalcResponse, CalcRouteName } from '@counterpoise/ng/api';
import type { BalanceSolver, BalanceSolverOutcome } from './balance-solver';
import { BalanceSolverError } from './balance-solver-error';
import { COUNTERPOISE_CONFIG, checkCounterpoiseConfig, type CounterpoiseConfig } from './counterpoise-config';
import type * as RemoteCallsEntry from './remote-calls';
import type { RemoteCalls } from './remote-calls';

/** How the remote solver's requests are loaded: `./remote-calls`, a chunk of its own. */
export type RemoteCallsModule = typeof RemoteCallsEntry;

let loading: Promise<RemoteCallsModule> | undefined;

/**
 * Loads the remote solver's requests (HttpClient and the error mapping) on first use; a load that fails
 * (no connection before the chunk ever came) is forgotten, so that the next calculation tries again.
 */
export function loadRemoteCalls(): Promise<RemoteCallsModule> {
  loading ??= import('./remote-calls').catch((error: unknown) => {
    loading = undefined;
    throw error;
  });
  return loading;
}

/** The error of a calculation whose requests could not be loaded onto the device. */
export const REMOTE_LOAD_MESSAGE =
  'The calculation service could not be reached: this page could not load what it needs to ask it. ' +
  'Check the connection, or compute on this device.';

/**
 * Computes through the calculator API (`POST <apiBaseUrl>/api/v1/calc/<route>`, several requests as one
 * `POST …/batch`) with the portal's key or the signed-in user's token. It trusts the API's answers to
 * have their documented types, and loads nothing of the engine or its schemas. The code that sends the
 * requests (and Angular's HttpClient with it) loads once the page is idle, not with the widgets; it
 * goes through the application's HttpClient when there is one (`provideHttpClient(...)`, whose
 * interceptors apply). Every failure becomes a `BalanceSolverError` whose reason says whether the values,
 * the sign-in or the connection is at fault.
 */
@Injectable()
export class RemoteBalanceSolver implements BalanceSolver {
  /** Always `remote`. */
  readonly kind = 'remote' as const;

  private readonly _injector = inject(EnvironmentInjector);
  private readonly _config: CounterpoiseConfig = checkCounterpoiseConfig(
    inject(COUNTERPOISE_CONFIG, { optional: true }) ?? { solver: 'remote' },
  );
  private _calls: RemoteCalls | undefined;

  constructor() {
    // Load the requests' code while the page is idle, so that it is there for the first calculation.
    if (!isPlatformBrowser(inject(PLATFORM_ID))) return;
    const load = () => void loadRemoteCalls().catch(() => undefined);
    if (typeof requestIdleCallback === 'function') requestIdleCallback(load, { timeout: 2000 });
    else setTimeout(load, 0);
  }

  /** Sends one route's request and passes the API's answer on. */
  calculate<N extends CalcRouteName>(route: N, request: CalcRequest<N>): Observable<CalcResponse<N>> {
    return this._withCalls((calls) => calls.calculate(route, request));
  }

  /** Sends several requests of one route as one batch request; each item answers or fails on its own. */
  calculateAll<N extends CalcRouteName>(
    route: N,
    requests: readonly CalcRequest<N>[],
  ): Observable<BalanceSolverOutcome<CalcResponse<N>>[]> {
    return this._withCalls((calls) => calls.calculateAll(route, requests));
  }

  private _withCalls<T>(send: (calls: RemoteCalls) => Observable<T>): Observable<T> {
    return defer(() => from(this._loadedCalls())).pipe(switchMap(send));
  }

  private async _loadedCalls(): Promise<RemoteCalls> {
    if (this._calls !== undefined) return this._calls;
    let module: RemoteCallsModule;
    try {
      module = await loadRemoteCalls();
    } catch (cause) {
      throw new BalanceSolverError('unreachable', REMOTE_LOAD_MESSAGE, { status: 0, cause });
    }
    this._calls ??= new module.RemoteCalls(this._injector, this._config);
    return this._calls;
  }
}
