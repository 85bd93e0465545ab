import { type ApplicationConfig, provideBrowserGlobalErrorListeners } from '@angular/core';
import { provideHttpClient, withFetch } from '@angular/common/http';
import { computeOnTheDevice } from './calculator-providers';

/** The portal's providers: HTTP for the remote solver, and where the calculator computes. */
export const appConfig: ApplicationConfig = {
  providers: [provideBrowserGlobalErrorListeners(), provideHttpClient(withFetch()), computeOnTheDevice()],
};
