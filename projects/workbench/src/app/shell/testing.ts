import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import type { Provider } from '@angular/core';
import { TestBed } from '@angular/core/testing';
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
