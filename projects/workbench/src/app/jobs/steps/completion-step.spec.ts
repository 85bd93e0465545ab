import type { HttpTestingController } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import type { ComponentFixture } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { JobSession } from '../job-session';
import type { Job } from '../jobs.api';
import { signedReports, unsignedReports } from '../../reports/reports-testing';
import { JobCompletionStep } from './completion-step';
import { configureStepTesting, renderStep, text } from './step-testing';
import {
  COMPLETED_MULCHER_JOB,
  JOB_8_COMPLETED,
  JOB_VERIFIED_RIGHT_ABOVE,
  JOB_WITH_INSTALLED,
  MULCHER_FAMILY,
  MULCHER_MACHINE,
} from './testing-jobs';

/** The step as the job page renders it: bound to the job the page's session holds. */
@Component({
  imports: [JobCompletionStep],
  providers: [JobSession],
  template: `
    @if (session.job(); as job) {
      <app-job-completion-step [job]="job" [machine]="machine" [family]="family" [editable]="editable()" />
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class StepHost {
  readonly session = inject(JobSession);
  readonly machine = MULCHER_MACHINE;
  readonly family = MULCHER_FAMILY;
  readonly editable = input(true);
}

describe('JobCompletionStep', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = configureStepTesting();
  });

  afterEach(() => http.verify());

  async function render(job: Job, editable = true) {
    const fixture = await renderStep(StepHost, job, ({ componentRef }) =>
      componentRef.setInput('editable', editable),
    );
    return { fixture, element: fixture.nativeElement as HTMLElement };
  }

  /** A table row's cells, or a list item's text, as one line. */
  function rows(element: HTMLElement, testId: string): string[] {
    return [...element.querySelectorAll(`[data-testid="${testId}"]`)].map((row) => {
      const cells = [...row.querySelectorAll('th, td')];
      return cells.length > 0 ? cells.map(text).join(' ') : text(row);
    });
  }

  function completeButton(element: HTMLElement): HTMLButtonElement | undefined {
    return [...element.querySelectorAll('button')].find((one) => text(one).endsWith('Complete the job'));
  }

  async function settle(fixture: ComponentFixture<unknown>) {
    await new Promise((resolve) => setTimeout(resolve));
    fixture.detectChanges();
    await fixture.whenStable();
  }

  it('sums up what completion records, and says a job above its level can still be completed', async () => {
    const { element } = await render(JOB_VERIFIED_RIGHT_ABOVE);
    expect(rows(element, 'summary-side')).toEqual([
      'Left 0.565 in/s peak at 299.5° 0.06 in/s peak at 213°',
      'Right 0.349 in/s peak at 105° 0.32 in/s peak at 102°',
    ]);
    expect(text(element.querySelector('.records'))).toContain('The 2 weights this job fitted');
    expect(text(element.querySelector('[data-testid="acceptance"] span'))).toBe(
      'Shop target 0.15 in/s peak: The right side reads 0.32 in/s-pk, above its limit of 0.15 in/s-pk; ' +
        'the left side is within its limit. The job can still be completed: it is then recorded as not within ' +
        'its acceptance level, and the machine shows as due.',
    );
    expect(completeButton(element)).toBeDefined();
  });

  it('says what is missing while fitted weights wait for a verification run, and offers no completion', async () => {
    const { element } = await render(JOB_WITH_INSTALLED);
    expect(text(element.querySelector('[data-testid="missing"] span'))).toBe(
      'Not yet: Weights were fitted after the last run (2 in all): take a verification run with them on first.',
    );
    expect(completeButton(element)).toBeUndefined();
  });

  it('completes the job on the stored ETag and shows the record the server kept', async () => {
    const { fixture, element } = await render(JOB_VERIFIED_RIGHT_ABOVE);
    completeButton(element)!.click();
    const request = http.expectOne('/api/v1/jobs/8/complete');
    expect(request.request.method).toBe('POST');
    expect(request.request.headers.get('If-Match')).toBe('"9"');
    request.flush(JOB_8_COMPLETED, { headers: { ETag: `"${JOB_8_COMPLETED.version}"` } });
    await settle(fixture);
    // The completed job shows its service report, not signed yet.
    http.expectOne('/api/v1/jobs/8/reports').flush(unsignedReports(8));
    await settle(fixture);
    expect(text(element.querySelector('[data-testid="report-state"]'))).toContain('Not signed yet');

    expect(text(element.querySelector('[data-testid="verdict"] span'))).toContain(
      'not within its acceptance level. The machine shows as due on the home page.',
    );
    expect(rows(element, 'before-after')).toEqual([
      'Left 0.565 in/s peak at 299.5° 0.06 in/s peak at 213° −89 %',
      'Right 0.349 in/s peak at 105° 0.32 in/s peak at 102° −8 %',
    ]);
  });

  it('shows a refusal of the completion in words', async () => {
    const { fixture, element } = await render(JOB_VERIFIED_RIGHT_ABOVE);
    completeButton(element)!.click();
    http.expectOne('/api/v1/jobs/8/complete').flush(
      {
        type: 'about:blank',
        title: 'Conflict',
        status: 409,
        code: 'STEP_MISSING',
        detail: 'Weights were fitted since the last run: take a verification run with them on first.',
      },
      { status: 409, statusText: 'Conflict' },
    );
    await settle(fixture);
    expect(text(element.querySelector('app-error-banner'))).toContain(
      'Weights were fitted since the last run: take a verification run with them on first.',
    );
  });

  it('shows a completed job: before and after, weights on the rotor, coefficients and the refined family', async () => {
    const { fixture, element } = await render(COMPLETED_MULCHER_JOB, false);
    http.expectOne('/api/v1/jobs/6/reports').flush(signedReports(6));
    await settle(fixture);
    expect(text(element.querySelector('[data-testid="report-state"]'))).toContain(
      'Signed by Juno Hartwell on 5 Dec 2026',
    );
    expect(text(element.querySelector('[data-testid="verdict"] span'))).toBe(
      'Completed by Tomasz Wrenfield on 5 Nov 2026, 08:30: within its acceptance level.',
    );
    expect(rows(element, 'before-after')).toEqual([
      'Left 0.39 in/s peak at 250° 0.001 in/s peak at 30° −100 %',
      'Right 0.362 in/s peak at 30.5° 0.012 in/s peak at 331.5° −97 %',
    ]);
    expect(rows(element, 'on-rotor')).toEqual([
      'Left plane 294 g 34° 210 mm Welded this job',
      'Right plane 201 g 198° 210 mm Welded this job',
    ]);
    expect(rows(element, 'coefficient')).toEqual([
      'Left sensor Left plane 0.159 in/s peak 39.4°',
      'Left sensor Right plane 0.04 in/s peak 70°',
      'Right sensor Left plane 0.047 in/s peak 121.2°',
      'Right sensor Right plane 0.152 in/s peak 34.5°',
    ]);
    expect(rows(element, 'family-figure')).toEqual([
      'Left sensor Left plane 619 g per in/s peak 40° 4 ±3.6 % · ±2°',
      'Right sensor Left plane 2,197 g per in/s peak 121.3° 4 ±6.2 % · ±3.6°',
      'Left sensor Right plane 2,487 g per in/s peak 73.5° 4 ±4.4 % · ±2.6°',
      'Right sensor Right plane 668 g per in/s peak 34.9° 4 ±1.9 % · ±1.1°',
    ]);
    const links = [...element.querySelectorAll('.links a')].map((link) => [
      text(link),
      link.getAttribute('href'),
    ]);
    expect(links).toEqual([
      ['Quernstone QS-180 · QS180-0457', '/machines/3'],
      ['Fixed-tooth mulcher drum, 2.0 m', '/machine-families/1'],
    ]);
    expect(completeButton(element)).toBeUndefined();
  });
});
