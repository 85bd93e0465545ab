import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatSidenavHarness } from '@angular/material/sidenav/testing';
import { provideRouter } from '@angular/router';
import { BehaviorSubject, map } from 'rxjs';
import { beforeEach, describe, expect, it } from 'vitest';
import { AppShell } from './app-shell';
import { NAVIGATION } from './navigation';

describe('AppShell', () => {
  const wide = new BehaviorSubject(true);

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        {
          provide: BreakpointObserver,
          useValue: {
            observe: () => wide.pipe(map((matches): BreakpointState => ({ matches, breakpoints: {} }))),
          },
        },
      ],
    });
  });

  async function render(isWide: boolean) {
    wide.next(isWide);
    const fixture = TestBed.createComponent(AppShell);
    await fixture.whenStable();
    const sidenav = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatSidenavHarness);
    return { fixture, sidenav, element: fixture.nativeElement as HTMLElement };
  }

  it('keeps the navigation open beside the page on a wide screen', async () => {
    const { sidenav, element } = await render(true);
    expect(await sidenav.isOpen()).toBe(true);
    expect(await sidenav.getMode()).toBe('side');
    expect(element.querySelector('[aria-label="Open the navigation"]')).toBeNull();
    const labels = [...element.querySelectorAll('nav a [matListItemTitle]')].map((link) =>
      link.textContent?.trim(),
    );
    expect(labels).toEqual(NAVIGATION.map((item) => item.label));
  });

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

  it('offers a skip link that moves focus to the page', async () => {
    const { element } = await render(true);
    const skip = element.querySelector<HTMLAnchorElement>('.skip-link');
    skip?.click();
    expect(document.activeElement?.id).toBe('main');
  });
});
