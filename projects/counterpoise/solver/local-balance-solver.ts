import { Injectable, inject } from '@angular/core';
import { defer, from, of, switchMap, throwError, type Observable } from 'rxjs';
import type { CalcRequest, CalcResponse, CalcRouteName } from '@counterpoise/ng/api';
import { API_RUNTIME_LOADER, preloadApiRuntime, requireApiRuntime } from './api-runtime';
import type { BalanceSolver } from './balance-solver';
import { BalanceSolverError } from './balance-solver-error';
import { solverErrorFromProblem } from './solver-errors';

/**
 * Computes on the device, through the same route table and schemas as the calculator API, so that an
 * answer is the same with and without a connection. The table, the schemas and the engine load in the
 * background once the page is idle (see `loadApiRuntime`), not with the widgets.
 */
@Injectable({ providedIn: 'root' })
export class LocalBalanceSolver implements BalanceSolver {
  /** Always `local`. */
  readonly kind = 'local' as const;

  private readonly _load = inject(API_RUNTIME_LOADER);

  constructor() {
    preloadApiRuntime();
  }

  /** Validates and computes one route on the device, when subscribed. */
  calculate<N extends CalcRouteName>(route: N, request: CalcRequest<N>): Observable<CalcResponse<N>> {
    return defer(() => from(requireApiRuntime(this._load))).pipe(
      switchMap((api) => {
        let outcome: ReturnType<typeof api.calculate<N>>;
        try {
          outcome = api.calculate(route, request);
        } catch (cause) {
          return throwError(
            () =>
              new BalanceSolverError(
                'server',
                'The calculation failed on this device. Note the values and report it to the portal administrator.',
                { cause },
              ),
          );
        }
        return outcome.status === 200
          ? of(outcome.result)
          : throwError(() => solverErrorFromProblem(outcome.problem));
      }),
    );
  }
}
