import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import { provideRouter, Router } from '@angular/router';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { AUTH_URLS, AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { UserMenu } from './user-menu';

describe('UserMenu', () => {
  let http: HttpTestingController;
  let session: AuthSession;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([{ path: '**', component: RouteStandIn, data: { heading: 'Blank' } }]),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    session = TestBed.inject(AuthSession);
  });

  afterEach(() => http.verify());

  async function render() {
    const fixture = TestBed.createComponent(UserMenu);
    await fixture.whenStable();
    return {
      fixture,
      element: fixture.nativeElement as HTMLElement,
      loader: TestbedHarnessEnvironment.loader(fixture),
      overlays: TestbedHarnessEnvironment.documentRootLoader(fixture),
    };
  }

  it('offers to sign in once it is known that no one is signed in, and nothing before', async () => {
    const { fixture, element } = await render();
    expect(element.textContent?.trim()).toBe('');
    session.restore();
    http.expectOne(AUTH_URLS.refresh).flush(null, { status: 401, statusText: 'Unauthorized' });
    await session.restore();
    await fixture.whenStable();
    expect(element.querySelector('a')?.getAttribute('href')).toBe('/sign-in');
  });

  it('names the person, their role and organisation', async () => {
    session.start(aSession('technician'));
    const { loader } = await render();
    const menu = await loader.getHarness(MatMenuHarness);
    expect(await (await menu.host()).getAttribute('aria-label')).toBe('Your account: Suvi Achterberg');
    await menu.open();
    const panel = await (await menu.host()).getAttribute('aria-controls');
    const text = document.getElementById(panel ?? '')?.textContent ?? '';
    expect(text).toContain('Technician · Alder Ridge Rotor Service');
    expect(text).toContain('suvi@example.com');
    expect(await Promise.all((await menu.getItems()).map((item) => item.getText()))).toEqual([
      'Your account',
      'Sign out',
    ]);
  });

  it('signs out on the server, forgets the session and says so on the sign-in page', async () => {
    session.start(aSession('owner'));
    const { loader, fixture } = await render();
    const menu = await loader.getHarness(MatMenuHarness);
    await menu.clickItem({ text: /Sign out/ });
    http.expectOne(AUTH_URLS.signOut).flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    expect(session.signedIn()).toBe(false);
    expect(TestBed.inject(Router).url).toBe('/sign-in?signedOut=1');
  });

  it('stays signed in and says why when the server cannot be told', async () => {
    session.start(aSession('owner'));
    const { loader, overlays, fixture } = await render();
    await (await loader.getHarness(MatMenuHarness)).clickItem({ text: /Sign out/ });
    http.expectOne(AUTH_URLS.signOut).error(new ProgressEvent('error'));
    await fixture.whenStable();
    expect(session.signedIn()).toBe(true);
    // The snack bar's code is imported for the message.
    const snackBar = await vi.waitFor(() => overlays.getHarness(MatSnackBarHarness));
    expect(await snackBar.getMessage()).toContain('Not signed out. The server cannot be reached');
  });
});
