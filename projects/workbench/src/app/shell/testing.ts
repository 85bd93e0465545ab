import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import type { Provider, Type } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter, type Routes, withComponentInputBinding } from '@angular/router';

/**
 * The test bed of a page reached through the router: HTTP on a testing backend, the given routes with
 * route and query parameters bound to the pages' inputs, Material's animations off, and any further
 * providers (a stand-in BreakpointObserver). Answers the backend, for the spec's requests and its
 * `verify()`.
 */
export function routedPageTestBed(routes: Routes, providers: Provider[] = []): HttpTestingController {
  TestBed.configureTestingModule({
    providers: [
      provideHttpClient(),
      provideHttpClientTesting(),
      provideRouter(routes, withComponentInputBinding()),
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ...providers,
    ],
  });
  return TestBed.inject(HttpTestingController);
}

/**
 * Creates a page that asks for its list as it starts, answers that request with `answer`, and hands the
 * spec the page and its harness loaders (the page's own, and the document's for dialogs and menus).
 */
export async function renderAnswered<T>(
  page: Type<T>,
  http: HttpTestingController,
  url: string,
  answer: object,
): Promise<{
  fixture: ComponentFixture<T>;
  element: HTMLElement;
  loader: HarnessLoader;
  overlays: HarnessLoader;
}> {
  const fixture = TestBed.createComponent(page);
  fixture.detectChanges();
  http.expectOne(url).flush(answer);
  await fixture.whenStable();
  return {
    fixture,
    element: fixture.nativeElement as HTMLElement,
    loader: TestbedHarnessEnvironment.loader(fixture),
    overlays: TestbedHarnessEnvironment.documentRootLoader(fixture),
  };
}

/**
 * Lets a page act on what just happened: a dialog reports its closing after the current task, and a
 * reloaded resource sends its request from an effect. (Harnesses cannot wait for this: they wait for the
 * page to be stable, which the pending request of a resource prevents.)
 */
export async function settle(fixture: ComponentFixture<unknown>): Promise<void> {
  await new Promise((resolve) => setTimeout(resolve));
  fixture.detectChanges();
}
