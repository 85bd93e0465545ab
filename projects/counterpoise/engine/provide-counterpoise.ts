import { type EnvironmentProviders, makeEnvironmentProviders } from '@angular/core';
import { BALANCE_ENGINE, LOCAL_BALANCE_ENGINE } from './balance-engine';
import { COUNTERPOISE_CONFIG, checkCounterpoiseConfig, type CounterpoiseConfig } from './counterpoise-config';
import { LocalBalanceEngine } from './local-balance-engine';
import { RemoteBalanceEngine } from './remote-balance-engine';

/**
 * Configures how the Counterpoise widgets compute, in the application's providers:
 *
 *   provideHttpClient(),
 *   provideCounterpoise({ engine: 'remote', apiBaseUrl: 'https://calc.example.net', accessToken: () => auth.token() }),
 *
 * The local engine stays reachable through `LOCAL_BALANCE_ENGINE`, for work without a connection.
 * A configuration mistake throws here, when the application starts.
 */
export function provideCounterpoise(config: CounterpoiseConfig): EnvironmentProviders {
  const checked = checkCounterpoiseConfig(config);
  return makeEnvironmentProviders([
    { provide: COUNTERPOISE_CONFIG, useValue: checked },
    { provide: LOCAL_BALANCE_ENGINE, useExisting: LocalBalanceEngine },
    checked.engine === 'remote'
      ? [RemoteBalanceEngine, { provide: BALANCE_ENGINE, useExisting: RemoteBalanceEngine }]
      : { provide: BALANCE_ENGINE, useExisting: LocalBalanceEngine },
  ]);
}
