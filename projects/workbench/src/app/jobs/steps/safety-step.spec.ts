import { formatDate } from '@angular/common';
import type { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { CpSafetyNoticeHarness } from '@counterpoise/ng/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../../auth/auth-session';
import { aSession } from '../../auth/testing';
import { JobSession } from '../job-session';
import type { Job } from '../jobs.api';
import { JobSafetyStep } from './safety-step';
import { configureStepTesting, renderStep } from './step-testing';
import { JOB_NEW, JOB_SAFETY_ACKNOWLEDGED } from './testing-jobs';

/** The step as the job page shows it: the job as the session stores it, so a stored change shows at once. */
@Component({
  imports: [JobSafetyStep],
  template: `@if (session.job(); as job) {
    <app-job-safety-step [job]="job" [editable]="editable()" />
  }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class SafetyHost {
  protected readonly session = inject(JobSession);
  readonly editable = signal(true);
}

const ALL_TOPICS = ['lockout', 'running', 'hot-work', 'weights', 'protection'];

describe('JobSafetyStep', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = configureStepTesting();
    TestBed.inject(AuthSession).start(aSession('technician'));
  });

  afterEach(() => http.verify());

  async function render(job: Job, editable = true) {
    const fixture = await renderStep(SafetyHost, job, (host) =>
      host.componentInstance.editable.set(editable),
    );
    const element = fixture.nativeElement as HTMLElement;
    return {
      fixture,
      element,
      loader: TestbedHarnessEnvironment.loader(fixture),
      submit: () => element.querySelector<HTMLButtonElement>('app-busy-button button')!.click(),
    };
  }

  it('shows the library’s cautions, deferring to the manual, with one tick per topic', async () => {
    const { element, loader } = await render(JOB_NEW);
    const notice = await loader.getHarness(CpSafetyNoticeHarness);
    expect(await notice.getHeading()).toBe('The cautions of this work');
    expect((await notice.getCautionTitles()).length).toBe(6);
    expect(element.querySelector('cp-safety-notice')?.textContent).toContain(
      "manufacturer's manual, the site's rules and local codes",
    );
    const boxes = await loader.getAllHarnesses(MatCheckboxHarness);
    expect(await Promise.all(boxes.map((box) => box.getLabelText()))).toEqual([
      'Lock out and tag out',
      'Guards on, people clear; hands off a turning rotor',
      'Hot work near fuel and debris',
      'Check every weight before the run',
      'Protect eyes and ears',
    ]);
  });

  it('stores nothing until every topic is ticked, and says so', async () => {
    const { fixture, element, loader, submit } = await render(JOB_NEW);
    const boxes = await loader.getAllHarnesses(MatCheckboxHarness);
    for (const box of boxes.slice(0, 4)) await box.check();
    submit();
    await fixture.whenStable();
    http.expectNone('/api/v1/jobs/13/safety');
    expect(element.querySelector('.field-error')?.textContent).toContain('Tick each caution');
  });

  it('sends every topic on the stored version, then shows who acknowledged it and when, read-only', async () => {
    const { fixture, element, loader, submit } = await render(JOB_NEW);
    for (const box of await loader.getAllHarnesses(MatCheckboxHarness)) await box.check();
    submit();
    const request = http.expectOne('/api/v1/jobs/13/safety');
    expect(request.request.method).toBe('PUT');
    expect(request.request.headers.get('If-Match')).toBe('"1"');
    expect(request.request.body).toEqual({ topicIds: ALL_TOPICS });
    request.flush(JOB_SAFETY_ACKNOWLEDGED, { headers: { ETag: '"2"' } });
    await fixture.whenStable();
    fixture.detectChanges();

    const when = formatDate(JOB_SAFETY_ACKNOWLEDGED.safety!.acknowledgedAt, 'd MMM y, HH:mm', 'en-US');
    expect(element.querySelector('.stored__heading')?.textContent?.trim()).toBe(
      `Acknowledged by Tomasz Wrenfield on ${when}`,
    );
    expect(element.querySelectorAll('.stored__list li').length).toBe(5);
    // The cautions stay on the step, as titles with their detail one tap away.
    expect(await (await loader.getHarness(CpSafetyNoticeHarness)).isCompact()).toBe(true);
    expect(await loader.getAllHarnesses(MatCheckboxHarness)).toEqual([]);
    expect(element.querySelector('form')).toBeNull();
    expect(localStorage.getItem('counterpoise.job-draft.13.safety')).toBeNull();
  });

  it('shows a refusal of the server above the button', async () => {
    const { fixture, element, loader, submit } = await render(JOB_NEW);
    for (const box of await loader.getAllHarnesses(MatCheckboxHarness)) await box.check();
    submit();
    http.expectOne('/api/v1/jobs/13/safety').flush(
      {
        title: 'Job not open',
        status: 409,
        code: 'JOB_NOT_OPEN',
        detail: 'The job is abandoned: this step needs it open or on-hold.',
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    fixture.detectChanges();
    expect(element.querySelector('app-error-banner')?.textContent).toContain(
      'The acknowledgement was not stored. The job is abandoned: this step needs it open or on-hold.',
    );
    expect(element.querySelector('form')).not.toBeNull();
  });

  it('keeps the ticks on the device, so a reload loses none', async () => {
    localStorage.setItem(
      'counterpoise.job-draft.13.safety',
      JSON.stringify({ lockout: true, running: true, 'hot-work': false, weights: true, protection: false }),
    );
    const { loader } = await render(JOB_NEW);
    const boxes = await loader.getAllHarnesses(MatCheckboxHarness);
    expect(await Promise.all(boxes.map((box) => box.isChecked()))).toEqual([true, true, false, true, false]);
    await boxes[4]!.check();
    expect(JSON.parse(localStorage.getItem('counterpoise.job-draft.13.safety')!)).toMatchObject({
      protection: true,
    });
  });

  it('shows someone who may not change the job the cautions, without the ticks', async () => {
    const { element, loader } = await render(JOB_NEW, false);
    expect(await loader.getAllHarnesses(MatCheckboxHarness)).toEqual([]);
    expect(element.querySelector('.muted')?.textContent).toContain(
      'Not acknowledged yet: Tomasz Wrenfield ticks the cautions before the work.',
    );
  });
});
