import { InjectionToken, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { CalcRequest, CalcResponse, CalcRouteName } from '@counterpoise/api';
import { LocalBalanceEngine } from './local-balance-engine';

/** Where a calculation runs: the calculator API over the network, or this device. */
export type BalanceEngineKind = 'remote' | 'local';

/**
 * Computes the calculator's routes for the widgets. The remote and the local engine compute through the
 * same route table, so an answer is the same online and offline; they differ only in how they fail.
 */
export interface BalanceEngine {
  /** Where this engine computes. */
  readonly kind: BalanceEngineKind;
  /** Computes one route; fails with a `BalanceEngineError`. */
  calculate<N extends CalcRouteName>(route: N, request: CalcRequest<N>): Observable<CalcResponse<N>>;
}

/**
 * The engine the widgets compute with. `provideCounterpoise()` sets it; without it the widgets compute on
 * the device, which needs no key and no connection.
 */
export const BALANCE_ENGINE = new InjectionToken<BalanceEngine>('BALANCE_ENGINE', {
  providedIn: 'root',
  factory: () => inject(LocalBalanceEngine),
});

/** The on-device engine, offered when the configured remote engine cannot answer. */
export const LOCAL_BALANCE_ENGINE = new InjectionToken<BalanceEngine>('LOCAL_BALANCE_ENGINE', {
  providedIn: 'root',
  factory: () => inject(LocalBalanceEngine),
});
