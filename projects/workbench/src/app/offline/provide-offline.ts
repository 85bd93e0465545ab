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
import { OfflineJobs } from './offline-jobs';

/**
 * Working with no connection: Angular's service worker keeps the app's files (ngsw-config.json; off in
 * development builds), a new version is offered for a reload and never forced, and the device's queue of job
 * changes starts listening for the connection at once. The kept reads need `offlineRecordsInterceptor` in the
 * HTTP client's interceptors, after the session's.
 */
export function provideOffline(): EnvironmentProviders {
  return makeEnvironmentProviders([
    provideServiceWorker('ngsw-worker.js', {
      enabled: !isDevMode(),
      registrationStrategy: 'registerWhenStable:30000',
    }),
    provideAppInitializer(() => {
      // The offer of a new version (with Material's snack bar) is loaded once the first page is painted:
      // the worker registers only when the app is stable, so no version can be ready before.
      const injector = inject(Injector);
      void afterNextPaint()
        .then(() => import('./app-updates'))
        .then(({ AppUpdates }) => injector.get(AppUpdates).watch());
      inject(OfflineJobs).keepTodayOnDevice();
    }),
  ]);
}
