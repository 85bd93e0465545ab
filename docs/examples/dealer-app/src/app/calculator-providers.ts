import type { EnvironmentProviders } from '@angular/core';
import { provideCounterpoise } from '@counterpoise/ng/solver';

/**
 * The local engine: the calculation runs in the browser. The engine ships inside @counterpoise/ng
 * (`@counterpoise/ng/api`) and loads in the background once the page is idle, so the calculator keeps
 * working when the connection drops.
 */
export function computeOnTheDevice(): EnvironmentProviders {
  return provideCounterpoise({ solver: 'local' });
}

/**
 * The remote engine: the calculation runs on the Counterpoise server, which counts it against the
 * dealer's key. `token` returns a short-lived token that the portal's back end obtained for this visitor
 * (never the secret key itself), or null when the visitor is signed out. When the server cannot be
 * reached, the calculator offers the local engine.
 */
export function computeOnTheServer(apiBaseUrl: string, token: () => string | null): EnvironmentProviders {
  return provideCounterpoise({ solver: 'remote', apiBaseUrl, accessToken: token });
}
