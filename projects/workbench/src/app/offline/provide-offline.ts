import {
  type EnvironmentProviders,
  inject,
  isDevMode,
  makeEnvironmentProviders,
  provideAppInitializer,
} from '@angular/core';
import { provideServiceWorker } from '@angular/service-worker';
import { AppUpdates } from './app-updates';
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
      inject(AppUpdates).watch();
      inject(OfflineJobs).keepTodayOnDevice();
    }),
  ]);
}
