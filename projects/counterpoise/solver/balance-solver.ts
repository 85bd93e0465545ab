import { InjectionToken, inject } from '@angular/core';
import { type Observable, catchError, forkJoin, map, of } from 'rxjs';
import type { CalcRequest, CalcResponse, CalcRouteName } from '@counterpoise/ng/api';
import { BalanceSolverError } from './balance-solver-error';
import { LocalBalanceSolver } from './local-balance-solver';

/** Where a calculation runs: the calculator API over the network, or this device. */
export type BalanceSolverKind = 'remote' | 'local';

/** One request's outcome among several computed together: its answer, or the error it alone met. */
export type BalanceSolverOutcome<T> =
  { readonly ok: true; readonly result: T } | { readonly ok: false; readonly error: BalanceSolverError };

/**
 * Computes the calculator's routes for the widgets. The remote and the local solver compute through the
 * same route table, so an answer is the same online and offline; they differ only in how they fail.
 */
export interface BalanceSolver {
  /** Where this solver computes. */
  readonly kind: BalanceSolverKind;
  /** Computes one route; fails with a `BalanceSolverError`. */
  calculate<N extends CalcRouteName>(route: N, request: CalcRequest<N>): Observable<CalcResponse<N>>;
  /**
   * Computes several requests of one route together, each answered on its own, in order (the remote
   * solver sends them as one batch request). Fails whole, with a `BalanceSolverError`, only when none
   * could be computed (no connection, a refused key). Optional: without it, the widgets compute each
   * request with `calculate()`.
   */
  calculateAll?<N extends CalcRouteName>(
    route: N,
    requests: readonly CalcRequest<N>[],
  ): Observable<BalanceSolverOutcome<CalcResponse<N>>[]>;
}

/** A thrown value as a `BalanceSolverError`: the error itself when it is one. */
export function asSolverError(error: unknown): BalanceSolverError {
  return error instanceof BalanceSolverError
    ? error
    : new BalanceSolverError('server', 'The calculation failed. Try again, or compute on this device.', {
        cause: error,
      });
}

/**
 * Computes several requests of one route with `solver`: through its `calculateAll` (one batch request
 * for the remote solver), or each with `calculate()` when it has none. Internal to the library.
 */
export function calculateAll<N extends CalcRouteName>(
  solver: BalanceSolver,
  route: N,
  requests: readonly CalcRequest<N>[],
): Observable<BalanceSolverOutcome<CalcResponse<N>>[]> {
  if (requests.length === 0) return of([]);
  if (solver.calculateAll !== undefined) return solver.calculateAll(route, requests);
  return forkJoin(
    requests.map((request) =>
      solver.calculate(route, request).pipe(
        map((result): BalanceSolverOutcome<CalcResponse<N>> => ({ ok: true, result })),
        catchError((error: unknown) => of({ ok: false, error: asSolverError(error) } as const)),
      ),
    ),
  );
}

/**
 * The solver the widgets compute with. `provideCounterpoise()` sets it; without it the widgets compute on
 * the device, which needs no key and no connection.
 */
export const BALANCE_SOLVER = new InjectionToken<BalanceSolver>('BALANCE_SOLVER', {
  providedIn: 'root',
  factory: () => inject(LocalBalanceSolver),
});

/**
 * The on-device solver, offered when the configured remote solver cannot answer. Ask for it only when it
 * is needed: the on-device solver starts loading the engine as it is made.
 */
export const LOCAL_BALANCE_SOLVER = new InjectionToken<BalanceSolver>('LOCAL_BALANCE_SOLVER', {
  providedIn: 'root',
  factory: () => inject(LocalBalanceSolver),
});
