import { InjectionToken } from '@angular/core';

/**
 * How the widgets compute. A key written into a web page can be read by anyone who opens the page: give
 * `apiKey` only to a portal whose key is limited to it (by origin and rate), and prefer `accessToken` with
 * a short-lived token from the portal's own back end.
 */
export interface CounterpoiseConfig {
  /** `remote`: the calculator API over HTTP; `local`: on the device, no connection needed. */
  readonly solver: 'remote' | 'local';
  /** Where the API is served from, e.g. `https://calc.example.net`, or `''` for the page's own origin. */
  readonly apiBaseUrl?: string;
  /** The portal's API key, sent as `X-Api-Key`. */
  readonly apiKey?: string;
  /** Returns the current token, sent as `Authorization: Bearer <token>`; null when signed out. */
  readonly accessToken?: () => string | null;
  /** How long to wait for an answer before offering the device instead, in milliseconds (default 15000). */
  readonly timeoutMs?: number;
}

/** The default wait for an answer: long enough for a weak mobile signal, short enough to stand beside a machine. */
export const DEFAULT_TIMEOUT_MS = 15_000;

/** The configuration given to `provideCounterpoise()`. */
export const COUNTERPOISE_CONFIG = new InjectionToken<CounterpoiseConfig>('COUNTERPOISE_CONFIG');

/**
 * The configuration, checked so that a mistake fails when the application starts with a message that
 * says what to change, rather than at the first calculation beside a machine.
 */
export function checkCounterpoiseConfig(config: CounterpoiseConfig): CounterpoiseConfig {
  const fail = (what: string): never => {
    throw new Error(`provideCounterpoise(): ${what}`);
  };
  if (config === null || typeof config !== 'object') fail("give a configuration, e.g. { solver: 'local' }.");
  if (config.solver !== 'remote' && config.solver !== 'local') {
    fail(`solver is 'remote' or 'local' (got ${JSON.stringify(config.solver)}).`);
  }
  if (config.timeoutMs !== undefined && !(Number.isFinite(config.timeoutMs) && config.timeoutMs > 0)) {
    fail('timeoutMs is a number of milliseconds greater than zero.');
  }
  if (config.solver === 'local') return config;
  if (typeof config.apiBaseUrl !== 'string') {
    fail("the remote solver needs apiBaseUrl, e.g. 'https://calc.example.net' ('' for this page's origin).");
  }
  const apiBaseUrl = config.apiBaseUrl ?? '';
  if (apiBaseUrl !== '' && !isWebAddress(apiBaseUrl)) {
    fail(
      `apiBaseUrl ${JSON.stringify(apiBaseUrl)} is not a whole web address: write it with its scheme, ` +
        "e.g. 'https://calc.example.net' ('' for this page's origin).",
    );
  }
  const hasKey = config.apiKey !== undefined;
  const hasToken = config.accessToken !== undefined;
  if (!hasKey && !hasToken) {
    fail('the remote solver needs apiKey or accessToken, and neither was given.');
  }
  if (hasKey && hasToken) fail('the remote solver takes apiKey or accessToken, not both.');
  if (hasKey && (typeof config.apiKey !== 'string' || config.apiKey.trim() === '')) {
    fail('apiKey is empty; give the key the portal was issued.');
  }
  if (hasToken && typeof config.accessToken !== 'function') {
    fail('accessToken is a function that returns the current token, or null when signed out.');
  }
  return config;
}

/** Whether `text` is an absolute http(s) address (`calc.example.net` and `localhost:4300` are not). */
function isWebAddress(text: string): boolean {
  try {
    const { protocol } = new URL(text);
    return protocol === 'https:' || protocol === 'http:';
  } catch {
    return false;
  }
}

/** The address of a calculator route under the API's base address. */
export function calcRouteUrl(apiBaseUrl: string, route: string): string {
  return `${apiBaseUrl.replace(/\/+$/, '')}/api/v1/calc/${encodeURIComponent(route)}`;
}
