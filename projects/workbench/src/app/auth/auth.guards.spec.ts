import { Location } from '@angular/common';
import { provideHttpClient } from '@angular/common/http';
import { provideLocationMocks } from '@angular/common/testing';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { requirePermission, requireSignedOut, requireSignIn, safeReturnUrl } from './auth.guards';
import { AUTH_URLS } from './auth-session';
import { aSession, RouteStandIn } from './testing';
import { afterNextPaint } from '../shell/after-next-paint';

describe('route guards', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideLocationMocks(),
        provideRouter([
          { path: '', component: RouteStandIn, data: { heading: 'Start' } },
          {
            path: 'people',
            canActivate: [requirePermission('people:read')],
            component: RouteStandIn,
            data: { heading: 'People' },
          },
          {
            path: 'account',
            canActivate: [requireSignIn],
            component: RouteStandIn,
            data: { heading: 'Account' },
          },
          {
            path: 'sign-in',
            canActivate: [requireSignedOut],
            component: RouteStandIn,
            data: { heading: 'Sign in' },
          },
          { path: 'not-available', component: RouteStandIn, data: { heading: 'Not available' } },
        ]),
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  /** What a device keeps once someone has signed in on it (AuthSession.start). */
  function keepProfileOf(role: Parameters<typeof aSession>[0]) {
    const { user, permissions } = aSession(role);
    localStorage.setItem('counterpoise.profile', JSON.stringify({ user, permissions }));
  }

  /** Navigates while the session is restored with the given answer to the refresh. */
  async function visit(url: string, refresh: 'none' | Parameters<typeof aSession>[0]) {
    const harness = await RouterTestingHarness.create();
    const navigation = harness.navigateByUrl(url);
    await new Promise((resolve) => setTimeout(resolve));
    const request = http.expectOne(AUTH_URLS.refresh);
    if (refresh === 'none') request.flush(null, { status: 401, statusText: 'Unauthorized' });
    else request.flush(aSession(refresh));
    await navigation;
    const router = TestBed.inject(Router);
    return {
      heading: harness.routeNativeElement?.querySelector('h1')?.textContent,
      url: router.url,
      // What the address bar shows, which may differ from the router's own state.
      location: TestBed.inject(Location).path(),
    };
  }

  it('waits for the session to be restored, then opens the page for a role that holds the permission', async () => {
    const page = await visit('/people', 'manager');
    expect(page.heading).toBe('People');
    expect(page.url).toBe('/people');
  });

  it('sends a signed-out person to sign in, with the address to come back to', async () => {
    const page = await visit('/people?filter=tech', 'none');
    expect(page.heading).toBe('Sign in');
    expect(page.url).toBe('/sign-in?returnUrl=%2Fpeople%3Ffilter%3Dtech');
  });

  it('shows a role without the permission the "not available" page at the address asked for', async () => {
    const page = await visit('/people', 'technician');
    expect(page.heading).toBe('Not available');
    expect(page.url).toBe('/not-available?need=people:read');
    expect(page.location).toBe('/people');
  });

  it('opens pages that need only a sign-in to every role', async () => {
    expect((await visit('/account', 'viewer')).heading).toBe('Account');
  });

  it('sends the signed out from a signed-in page to sign in', async () => {
    const page = await visit('/account', 'none');
    expect(page.heading).toBe('Sign in');
    expect(page.url).toBe('/sign-in?returnUrl=%2Faccount');
  });

  it('sends someone whose session was restored from the sign-in page to where they were going', async () => {
    keepProfileOf('owner');
    const page = await visit('/sign-in?returnUrl=%2Fpeople', 'owner');
    expect(page.heading).toBe('People');
  });

  it('keeps the sign-in page for the signed out', async () => {
    keepProfileOf('owner');
    const page = await visit('/sign-in?returnUrl=%2Fpeople', 'none');
    expect(page.heading).toBe('Sign in');
  });

  it('opens the sign-in page at once on a device that keeps no profile, before the refresh answers', async () => {
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/sign-in?returnUrl=%2Fpeople');
    expect(harness.routeNativeElement?.querySelector('h1')?.textContent).toBe('Sign in');
    // The refresh waits until the page is painted, out of the way of the first page's own downloads.
    http.expectNone(AUTH_URLS.refresh);
    await afterNextPaint();
    http.expectOne(AUTH_URLS.refresh).flush(null, { status: 401, statusText: 'Unauthorized' });
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/sign-in?returnUrl=%2Fpeople');
  });

  it('takes on someone whose refresh still finds a session though the device kept no profile', async () => {
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/sign-in?returnUrl=%2Fpeople');
    expect(harness.routeNativeElement?.querySelector('h1')?.textContent).toBe('Sign in');
    await afterNextPaint();
    http.expectOne(AUTH_URLS.refresh).flush(aSession('manager'));
    await new Promise((resolve) => setTimeout(resolve));
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/people');
    expect(harness.routeNativeElement?.querySelector('h1')?.textContent).toBe('People');
  });
});

describe('safeReturnUrl', () => {
  it('keeps addresses inside the workbench', () => {
    expect(safeReturnUrl('/people?filter=tech')).toBe('/people?filter=tech');
    expect(safeReturnUrl('/outbox?message=3')).toBe('/outbox?message=3');
  });

  it('refuses anything that could leave the workbench, or loop back to sign-in', () => {
    for (const unsafe of [
      'https://elsewhere.example.com/',
      '//elsewhere.example.com',
      '/\\elsewhere',
      'people',
    ]) {
      expect(safeReturnUrl(unsafe)).toBe('/');
    }
    expect(safeReturnUrl('/sign-in?returnUrl=/people')).toBe('/');
    expect(safeReturnUrl(undefined)).toBe('/');
    expect(safeReturnUrl(null)).toBe('/');
  });
});
