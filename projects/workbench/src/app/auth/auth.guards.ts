import { inject } from '@angular/core';
import { type CanActivateFn, RedirectCommand, Router, type UrlTree } from '@angular/router';
import type { Permission } from '@counterpoise/api';
import { AuthSession } from './auth-session';

/** Lets signed-in people through; sends anyone else to sign in, and back here afterwards. */
export const requireSignIn: CanActivateFn = async (_route, state) => {
  const session = inject(AuthSession);
  const router = inject(Router);
  await session.restore();
  return session.signedIn() ? true : signInFirst(router, state.url);
};

/**
 * Lets through signed-in people whose role holds `permission`. Someone signed in without it sees the
 * "not available for your role" page while the address bar keeps the address they asked for, so that the
 * way back and a shared link still read as what they are.
 */
export function requirePermission(permission: Permission): CanActivateFn {
  return async (_route, state) => {
    const session = inject(AuthSession);
    const router = inject(Router);
    await session.restore();
    if (!session.signedIn()) return signInFirst(router, state.url);
    if (session.can(permission)) return true;
    return new RedirectCommand(
      router.createUrlTree(['/not-available'], { queryParams: { need: permission } }),
      { browserUrl: state.url },
    );
  };
}

/**
 * Keeps the sign-in page for the signed out: someone whose session was restored goes where they meant to.
 *
 * A device that keeps no profile has no session to resume in nearly every case (a new device, or after
 * signing out), so the page is let through at once and draws in the app's first frame, without waiting a
 * round trip for the refresh, which is made once the page is painted; should it still find a session (the
 * site's storage cleared while the cookie lived), the person is taken on as soon as it answers.
 */
export const requireSignedOut: CanActivateFn = async (route) => {
  const session = inject(AuthSession);
  const router = inject(Router);
  const returnUrl = safeReturnUrl(route.queryParamMap.get('returnUrl'));
  if (!session.restored() && !session.keepsProfile()) {
    void session.restoreInBackground().then(() => {
      if (session.signedIn() && router.url.startsWith('/sign-in')) void router.navigateByUrl(returnUrl);
    });
    return true;
  }
  await session.restore();
  if (!session.signedIn()) return true;
  return router.parseUrl(returnUrl);
};

/**
 * An address inside the workbench to return to after signing in, or the start page. Anything that could
 * leave the app (`//elsewhere`, `https://…`, `/\elsewhere`) is refused, so that a crafted sign-in link
 * cannot send a person to another site.
 */
export function safeReturnUrl(value: string | null | undefined): string {
  if (!value?.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return '/';
  if (value.startsWith('/sign-in')) return '/';
  return value;
}

function signInFirst(router: Router, returnUrl: string): UrlTree {
  return router.createUrlTree(['/sign-in'], { queryParams: { returnUrl } });
}
