import { isPlatformBrowser } from '@angular/common';
import { InjectionToken, PLATFORM_ID, inject } from '@angular/core';
import type * as CounterpoiseApi from '@counterpoise/ng/api';
import { BalanceSolverError } from './balance-solver-error';

/** `@counterpoise/ng/api` at run time: its zod schemas, the route table and the balancing engine. */
export type ApiRuntime = typeof CounterpoiseApi;

let loading: Promise<ApiRuntime> | undefined;

/**
 * Loads `@counterpoise/ng/api` on first use. It is imported dynamically, so that a dealer's bundler puts it
 * in a chunk of its own: the widgets render without it, and it arrives while the page is idle (see
 * `preloadApiRuntime`). A load that fails (a device that went offline before the chunk ever came) is
 * forgotten, so that the next calculation tries again.
 */
export function loadApiRuntime(): Promise<ApiRuntime> {
  loading ??= import('@counterpoise/ng/api').catch((error: unknown) => {
    loading = undefined;
    throw error;
  });
  return loading;
}

/**
 * How the engines get the API runtime: `loadApiRuntime` unless a test provides another. Internal to the
 * library (not exported by the entry point).
 */
export const API_RUNTIME_LOADER = new InjectionToken<() => Promise<ApiRuntime>>('API_RUNTIME_LOADER', {
  providedIn: 'root',
  factory: () => loadApiRuntime,
});

/**
 * Starts loading the API runtime once the browser is idle, so that it is there before the first
 * calculation, and there for work without a connection later. Call it in an injection context; it does
 * nothing on a server, and nothing after the first call.
 */
export function preloadApiRuntime(): void {
  const loader = inject(API_RUNTIME_LOADER);
  if ((loader === loadApiRuntime && loading !== undefined) || !isPlatformBrowser(inject(PLATFORM_ID))) return;
  const load = () => void loader().catch(() => undefined);
  if (typeof requestIdleCallback === 'function') requestIdleCallback(load, { timeout: 2000 });
  else setTimeout(load, 0);
}

/** The error of a calculation whose code could not be loaded onto the device. */
export const RUNTIME_LOAD_MESSAGE =
  'The calculator could not be loaded onto this device. Connect once so that it can load, then try again.';

/** The runtime from `load`; when it cannot load, an `unreachable` error the technician can act on. */
export async function requireApiRuntime(load: () => Promise<ApiRuntime>): Promise<ApiRuntime> {
  try {
    return await load();
  } catch (cause) {
    throw new BalanceSolverError('unreachable', RUNTIME_LOAD_MESSAGE, { cause });
  }
}
