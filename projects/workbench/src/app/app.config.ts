import { provideHttpClient, withFetch, withInterceptors } from '@angular/common/http';
import {
  type ApplicationConfig,
  inject,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import {
  provideRouter,
  withComponentInputBinding,
  withEnabledBlockingInitialNavigation,
  withInMemoryScrolling,
} from '@angular/router';
import { routes } from './app.routes';
import { authInterceptor } from './auth/auth.interceptor';
import { AuthSession } from './auth/auth-session';
import { provideAppIcons } from './icons/app-icons';
import { offlineRecordsInterceptor } from './offline/offline-records';
import { provideOffline } from './offline/provide-offline';

export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideZonelessChangeDetection(),
    provideHttpClient(withFetch(), withInterceptors([authInterceptor, offlineRecordsInterceptor])),
    provideRouter(
      routes,
      withComponentInputBinding(),
      // The first page is routed before the shell draws, so that the first paint holds the whole page (on
      // a new device the sign-in page, whose guard answers at once) instead of the frame, then the page.
      withEnabledBlockingInitialNavigation(),
      withInMemoryScrolling({ scrollPositionRestoration: 'enabled', anchorScrolling: 'enabled' }),
    ),
    // The icons the templates name, as SVG from npm (icons/app-icons.ts): no icon font to download.
    provideAppIcons(),
    // The service worker, the kept reads and the queue of changes made with no connection (docs/offline.md).
    provideOffline(),
    // The session survives a reload only as the refresh cookie: trade it for a token once, at start (after
    // the first paint on a device that keeps no profile). Not awaited, so that public pages draw at once; the
    // guards that need the answer wait for it.
    provideAppInitializer(() => {
      void inject(AuthSession).restoreInBackground();
    }),
  ],
};
