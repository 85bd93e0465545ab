import {
  type EnvironmentProviders,
  inject,
  Injector,
  isDevMode,
  makeEnvironmentProviders,
  provideAppInitializer,
} from '@angular/core';
import { provideServiceWorker } from '@angular/service-worker';
import { afterNextPaint } from '../shell/after-next-paint';

/**
 * Working with no connection: Angular's service worker keeps the app's files (ngsw-config.json; off in
 * development builds), a new version is offered for a reload and never forced, and the device's queue of job
 * changes starts listening for the connection once the first page is painted. The kept reads need `offlineRecordsInterceptor` in the
 * HTTP client's interceptors, after the session's.
 */
export function provideOffline(): EnvironmentProviders {
  return makeEnvironmentProviders([
    provideServiceWorker('ngsw-worker.js', {
      enabled: !isDevMode(),
      registrationStrategy: 'registerWhenStable:30000',
    }),
    provideAppInitializer(() => {
      // Both are loaded once the first page is painted, out of its way on a slow phone: the offer of a new
      // version (with Material's snack bar; the worker registers only when the app is stable, so no version
      // can be ready before), and the device's queue of job changes, which then keeps today's jobs here.
      const injector = inject(Injector);
      void afterNextPaint().then(async () => {
        const [{ AppUpdates }, { OfflineJobs }] = await Promise.all([
          import('./app-updates'),
          import('./offline-jobs'),
        ]);
        injector.get(AppUpdates).watch();
        injector.get(OfflineJobs).keepTodayOnDevice();
      });
    }),
  ]);
}
