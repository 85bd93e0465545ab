import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { DeferBlockBehavior, DeferBlockState, TestBed } from '@angular/core/testing';
import { MatSidenavHarness } from '@angular/material/sidenav/testing';
import { provideRouter } from '@angular/router';
import { BehaviorSubject, map } from 'rxjs';
import { beforeEach, describe, expect, it } from 'vitest';
import { AppShell } from './app-shell';
import type { Role } from '@counterpoise/api';
import { AuthSession } from '../auth/auth-session';
import { aSession } from '../auth/testing';
import { NAVIGATION } from './navigation';

/** The entries that need no permission, shown signed out and to every role. */
const OPEN_TO_ALL = NAVIGATION.filter((item) => item.permission === undefined).map((item) => item.label);

describe('AppShell', () => {
  const wide = new BehaviorSubject(true);

  beforeEach(async () => {
    TestBed.configureTestingModule({
      // The navigation's list and the toolbar's menus are deferred blocks: each test draws them.
      deferBlockBehavior: DeferBlockBehavior.Manual,
      imports: [AppShell],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        {
          provide: BreakpointObserver,
          useValue: {
            observe: () => wide.pipe(map((matches): BreakpointState => ({ matches, breakpoints: {} }))),
          },
        },
      ],
    });
    await TestBed.compileComponents();
  });

  async function render(isWide: boolean, role?: Role) {
    wide.next(isWide);
    if (role) TestBed.inject(AuthSession).start(aSession(role));
    const fixture = TestBed.createComponent(AppShell);
    await fixture.whenStable();
    for (const block of await fixture.getDeferBlocks()) await block.render(DeferBlockState.Complete);
    await fixture.whenStable();
    const sidenav = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatSidenavHarness);
    return { fixture, sidenav, element: fixture.nativeElement as HTMLElement };
  }

  it('keeps the navigation open beside the page on a wide screen', async () => {
    const { sidenav, element } = await render(true);
    expect(await sidenav.isOpen()).toBe(true);
    expect(await sidenav.getMode()).toBe('side');
    expect(element.querySelector('[aria-label="Open the navigation"]')).toBeNull();
    expect(navigationLabels(element)).toEqual(OPEN_TO_ALL);
  });

  it('lists the pages of the signed-in person’s role', async () => {
    const labels = navigationLabels((await render(true, 'owner')).element);
    expect(labels).toEqual(NAVIGATION.map((item) => item.label));
    expect(labels).toEqual(expect.arrayContaining(['People', 'API keys', 'Outbox']));
  });

  it('leaves out what a role does not open', async () => {
    expect(navigationLabels((await render(true, 'technician')).element)).toEqual([
      'Home',
      'Jobs',
      'Safety',
      'Customers',
      'Machines',
      'Machine families',
      'Widgets',
      'Docs and guides',
      'API reference',
    ]);
    TestBed.inject(AuthSession).start(aSession('developer'));
    const labels = navigationLabels((await render(true)).element);
    expect(labels).toContain('API keys');
    expect(labels).not.toContain('People');
    expect(labels).not.toContain('Outbox');
    expect(labels).not.toContain('Customers');
    // Developers hold no jobs' permission.
    expect(labels).not.toContain('Jobs');
  });

  it('shows the account menu in the toolbar once someone is signed in', async () => {
    const { element } = await render(true, 'manager');
    expect(element.querySelector('.toolbar app-user-menu button')?.getAttribute('aria-label')).toBe(
      'Your account: Dario Lindqvist',
    );
  });

  function navigationLabels(element: HTMLElement): (string | undefined)[] {
    return [...element.querySelectorAll('nav a [matListItemTitle]')].map((link) => link.textContent?.trim());
  }

  it('opens the navigation as a drawer on a phone and closes it once a page is chosen', async () => {
    const { fixture, sidenav, element } = await render(false);
    expect(await sidenav.isOpen()).toBe(false);
    expect(await sidenav.getMode()).toBe('over');

    const menu = element.querySelector<HTMLButtonElement>('[aria-label="Open the navigation"]');
    menu?.click();
    await fixture.whenStable();
    expect(await sidenav.isOpen()).toBe(true);
    expect(menu?.getAttribute('aria-expanded')).toBe('true');

    element.querySelector<HTMLAnchorElement>('nav a')?.click();
    await fixture.whenStable();
    expect(await sidenav.isOpen()).toBe(false);
  });

  it('draws the toolbar, the connection’s status and the page before the navigation and the menus are loaded', async () => {
    wide.next(true);
    const fixture = TestBed.createComponent(AppShell);
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    expect(element.querySelector('.brand')?.textContent).toContain('Counterpoise');
    expect(element.querySelector('main#main')).not.toBeNull();
    expect(element.querySelector('nav a')).toBeNull();
    expect(element.querySelector('.toolbar app-connection-status [role="status"]')?.textContent).toBeTruthy();
    expect(element.querySelector('app-scheme-switch')).toBeNull();
    expect(element.querySelector('app-user-menu')).toBeNull();
    // Nothing follows them in the toolbar, so nothing moves when they come.
    expect(element.querySelector('.toolbar')?.lastElementChild?.tagName).toBe('APP-CONNECTION-STATUS');

    for (const block of await fixture.getDeferBlocks()) await block.render(DeferBlockState.Complete);
    expect(navigationLabels(element)).toEqual(OPEN_TO_ALL);
    expect(element.querySelector('.toolbar app-scheme-switch button')).not.toBeNull();
  });

  it('offers a skip link that moves focus to the page', async () => {
    const { element } = await render(true);
    const skip = element.querySelector<HTMLAnchorElement>('.skip-link');
    skip?.click();
    expect(document.activeElement?.id).toBe('main');
  });
});
