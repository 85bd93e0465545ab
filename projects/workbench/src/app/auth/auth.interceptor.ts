import { HttpErrorResponse, type HttpInterceptorFn, type HttpRequest } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, map, type Observable, of, switchMap, throwError } from 'rxjs';
import { AUTH_URLS, AuthSession } from './auth-session';

/**
 * Routes where a 401 speaks of what was sent (a wrong password, a spent link), not of an expired access
 * token, so that refreshing and retrying would only repeat the refusal.
 */
const CREDENTIAL_ROUTES: readonly string[] = [
  AUTH_URLS.signIn,
  AUTH_URLS.refresh,
  AUTH_URLS.passwordReset,
  AUTH_URLS.passwordResetConfirm,
];

/**
 * Sends the access token with the workbench's own API requests and keeps the session alive: a request
 * refused with 401 waits for one refresh, shared with every other request refused at the same moment, and
 * is sent once more. When the refresh itself is refused the session has ended: it is forgotten here and the
 * person is taken to the sign-in page, which brings them back afterwards.
 *
 * Only relative `/api/` addresses carry the token, so that it never travels to another origin, and the
 * refresh request goes without it: the refresh cookie is its credential.
 */
export const authInterceptor: HttpInterceptorFn = (request, next) => {
  const path = request.url.split('?')[0] ?? '';
  if (!path.startsWith('/api/') || path === AUTH_URLS.refresh) return next(request);

  const session = inject(AuthSession);
  const router = inject(Router);

  // A request leaving while a refresh is under way would carry a token about to be replaced.
  const pending = session.pendingRefresh();
  const ready: Observable<unknown> = pending ? pending.pipe(catchError(() => of(null))) : of(null);

  return ready.pipe(
    switchMap(() => {
      const sentWith = session.accessToken();
      return next(withToken(request, sentWith)).pipe(
        catchError((error: unknown) => {
          if (!(error instanceof HttpErrorResponse) || error.status !== 401) return throwError(() => error);
          if (CREDENTIAL_ROUTES.includes(path) || path.startsWith('/api/v1/invitations/')) {
            return throwError(() => error);
          }
          // Another request may already have refreshed while this one was on its way.
          const current = session.accessToken();
          const renewed =
            current !== null && current !== sentWith
              ? of(current)
              : session.refresh().pipe(map((fresh) => fresh.accessToken));
          return renewed.pipe(
            catchError((refreshError: unknown) => {
              // With no connection the session is not refused, only unreachable: it goes on (offline).
              if (refreshError instanceof HttpErrorResponse && refreshError.status === 0) {
                return throwError(() => refreshError);
              }
              endSession(session, router);
              return throwError(() => error);
            }),
            // Retried once: a second 401 goes to the caller as it is.
            switchMap((token) => next(withToken(request, token))),
          );
        }),
      );
    }),
  );
};

function withToken<T>(request: HttpRequest<T>, token: string | null): HttpRequest<T> {
  return token ? request.clone({ setHeaders: { Authorization: `Bearer ${token}` } }) : request;
}

function endSession(session: AuthSession, router: Router): void {
  const wasSignedIn = session.signedIn();
  session.clear();
  if (router.url.startsWith('/sign-in')) return;
  void router.navigate(['/sign-in'], {
    queryParams: { returnUrl: router.url, ...(wasSignedIn ? { ended: 1 } : {}) },
  });
}
