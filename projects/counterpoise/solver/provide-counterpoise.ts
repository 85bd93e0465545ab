import { type EnvironmentProviders, makeEnvironmentProviders } from '@angular/core';
import { BALANCE_SOLVER, LOCAL_BALANCE_SOLVER } from './balance-solver';
import { COUNTERPOISE_CONFIG, checkCounterpoiseConfig, type CounterpoiseConfig } from './counterpoise-config';
import { LocalBalanceSolver } from './local-balance-solver';
import { RemoteBalanceSolver } from './remote-balance-solver';

/**
 * Configures how the Counterpoise widgets compute, in the application's providers:
 *
 *   provideHttpClient(),
 *   provideCounterpoise({ solver: 'remote', apiBaseUrl: 'https://calc.example.net', accessToken: () => auth.token() }),
 *
 * The local solver stays reachable through `LOCAL_BALANCE_SOLVER`, for work without a connection.
 * A configuration mistake throws here, when the application starts.
 */
export function provideCounterpoise(config: CounterpoiseConfig): EnvironmentProviders {
  const checked = checkCounterpoiseConfig(config);
  return makeEnvironmentProviders([
    { provide: COUNTERPOISE_CONFIG, useValue: checked },
    { provide: LOCAL_BALANCE_SOLVER, useExisting: LocalBalanceSolver },
    checked.solver === 'remote'
      ? [RemoteBalanceSolver, { provide: BALANCE_SOLVER, useExisting: RemoteBalanceSolver }]
      : { provide: BALANCE_SOLVER, useExisting: LocalBalanceSolver },
  ]);
}
