import { InjectionToken, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { CalcRequest, CalcResponse, CalcRouteName } from '@counterpoise/ng/api';
import { LocalBalanceSolver } from './local-balance-solver';

/** Where a calculation runs: the calculator API over the network, or this device. */
export type BalanceSolverKind = 'remote' | 'local';

/**
 * Computes the calculator's routes for the widgets. The remote and the local solver compute through the
 * same route table, so an answer is the same online and offline; they differ only in how they fail.
 */
export interface BalanceSolver {
  /** Where this solver computes. */
  readonly kind: BalanceSolverKind;
  /** Computes one route; fails with a `BalanceSolverError`. */
  calculate<N extends CalcRouteName>(route: N, request: CalcRequest<N>): Observable<CalcResponse<N>>;
}

/**
 * The solver the widgets compute with. `provideCounterpoise()` sets it; without it the widgets compute on
 * the device, which needs no key and no connection.
 */
export const BALANCE_SOLVER = new InjectionToken<BalanceSolver>('BALANCE_SOLVER', {
  providedIn: 'root',
  factory: () => inject(LocalBalanceSolver),
});

/** The on-device solver, offered when the configured remote solver cannot answer. */
export const LOCAL_BALANCE_SOLVER = new InjectionToken<BalanceSolver>('LOCAL_BALANCE_SOLVER', {
  providedIn: 'root',
  factory: () => inject(LocalBalanceSolver),
});
