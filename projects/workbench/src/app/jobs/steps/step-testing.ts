import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import type { Provider, Type } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import { JobSession } from '../job-session';
import type { Job } from '../jobs.api';

/*
 * What the specs of the job's steps share: a TestBed whose requests the spec answers, a host whose JobSession
 * holds the job as the job page's does, and the text of what a step shows.
 */

/**
 * Sets up the TestBed of a step's spec: requests answered by the spec, a router for the steps' links, no
 * animations, a JobSession (unless the host provides its own) and an empty local store, so no draft of an
 * earlier spec carries over. Returns the controller that answers the requests.
 */
export function configureStepTesting(providers: Provider[] = []): HttpTestingController {
  localStorage.clear();
  TestBed.configureTestingModule({
    providers: [
      provideHttpClient(),
      provideHttpClientTesting(),
      provideRouter([]),
      JobSession,
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ...providers,
    ],
  });
  return TestBed.inject(HttpTestingController);
}

/** Loads a job into a session as the server answers it: the job, with its version as the ETag. */
export async function loadJob(session: JobSession, job: Job): Promise<void> {
  const loading = session.load(job.id);
  TestBed.inject(HttpTestingController)
    .expectOne(`/api/v1/jobs/${job.id}`)
    .flush(job, { headers: { ETag: `"${job.version}"` } });
  await loading;
}

/**
 * Creates a step's host, lets `prepare` set its inputs, loads the job into the session the host sees (its own
 * or the TestBed's) and waits until the step shows it.
 */
export async function renderStep<T>(
  host: Type<T>,
  job: Job,
  prepare: (fixture: ComponentFixture<T>) => void = () => undefined,
): Promise<ComponentFixture<T>> {
  const fixture = TestBed.createComponent(host);
  prepare(fixture);
  await loadJob(fixture.debugElement.injector.get(JobSession), job);
  fixture.detectChanges();
  await fixture.whenStable();
  return fixture;
}

/** Waits for the server's answer to be taken in, then shows what it changed. */
export async function answered(fixture: ComponentFixture<unknown>): Promise<void> {
  await fixture.whenStable();
  fixture.detectChanges();
}

/** An element's text on one line, as read (icons are SVG and add no words). */
export function text(element: Element | null | undefined): string {
  return element?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
}
