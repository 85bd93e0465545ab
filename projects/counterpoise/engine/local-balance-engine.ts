import { Injectable } from '@angular/core';
import { defer, of, throwError, type Observable } from 'rxjs';
import { calculate, type CalcRequest, type CalcResponse, type CalcRouteName } from '@counterpoise/api';
import type { BalanceEngine } from './balance-engine';
import { BalanceEngineError } from './balance-engine-error';
import { engineErrorFromProblem } from './engine-errors';

/**
 * Computes on the device, through the same route table and schemas as the calculator API, so that an
 * answer is the same with and without a connection.
 */
@Injectable({ providedIn: 'root' })
export class LocalBalanceEngine implements BalanceEngine {
  /** Always `local`. */
  readonly kind = 'local' as const;

  /** Validates and computes one route on the device, when subscribed. */
  calculate<N extends CalcRouteName>(route: N, request: CalcRequest<N>): Observable<CalcResponse<N>> {
    return defer(() => {
      let outcome: ReturnType<typeof calculate<N>>;
      try {
        outcome = calculate(route, request);
      } catch (cause) {
        return throwError(
          () =>
            new BalanceEngineError(
              'server',
              'The calculation failed on this device. Note the values and report it to the portal administrator.',
              { cause },
            ),
        );
      }
      return outcome.status === 200
        ? of(outcome.result)
        : throwError(() => engineErrorFromProblem(outcome.problem));
    });
  }
}
