import type { HttpTestingController } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { JobSession } from '../job-session';
import type { Job } from '../jobs.api';
import { JobVerificationStep } from './verification-step';
import { configureStepTesting, renderStep, text } from './step-testing';
import {
  COMPLETED_MULCHER_JOB,
  JOB_AFTER_LEFT_TRIAL,
  JOB_VERIFIED_RIGHT_ABOVE,
  JOB_WITH_INSTALLED,
  MULCHER_MACHINE,
} from './testing-jobs';

@Component({
  imports: [JobVerificationStep],
  providers: [JobSession],
  template: `
    @if (session.job(); as job) {
      <app-job-verification-step [job]="job" [machine]="machine" [editable]="editable()" />
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly session = inject(JobSession);
  readonly editable = input(true);
  readonly machine = MULCHER_MACHINE;
}

describe('JobVerificationStep', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = configureStepTesting();
  });

  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  async function render(job: Job, editable = true) {
    const fixture = await renderStep(Host, job, ({ componentRef }) =>
      componentRef.setInput('editable', editable),
    );
    return { fixture, element: fixture.nativeElement as HTMLElement };
  }

  function verdictRows(element: HTMLElement): string[][] {
    return [...element.querySelectorAll('.verdict__table tbody tr')].map((row) =>
      [...row.querySelectorAll('th, td')].map((cell) => text(cell)),
    );
  }

  it('asks for the verification run once the weights are fitted, with what the model predicts beside it', async () => {
    const { element } = await render(JOB_WITH_INSTALLED);
    expect([...element.querySelectorAll('.predicted__readings li')].map(text)).toEqual([
      'Left sensor: 0.004 in/s peak at 338.7°',
    ]);
    expect(text(element.querySelector('.predicted__list'))).toMatch(
      /^\d+ g at [\d.]+° in the left plane, welded at 210 mm/,
    );
    expect(text(element.querySelector('#verification-run-heading'))).toBe('Readings of the verification run');
    expect(element.querySelector('app-run-entry #run-verification-s1-r0-amplitude')).not.toBeNull();
    expect(element.querySelector('.run-entry__trial')).toBeNull();
    // The verdict the job carries judges the initial run, before any weight: not shown as this step's.
    expect(element.querySelector('.verdict')).toBeNull();
  });

  it('sends the verification run without a trial weight', async () => {
    const { fixture, element } = await render(JOB_WITH_INSTALLED);
    const type = (id: string, value: string) => {
      const input = element.querySelector<HTMLInputElement>(`#run-verification-${id}`)!;
      input.value = value;
      input.dispatchEvent(new Event('input'));
    };
    type('s0-r0-amplitude', '0.06');
    type('s0-r0-phaseDeg', '213');
    type('s0-r0-speedRpm', '2100');
    type('s1-r0-amplitude', '0.32');
    type('s1-r0-phaseDeg', '102');
    type('s1-r0-speedRpm', '2099');
    fixture.detectChanges();
    element.querySelector<HTMLButtonElement>('.run-entry__actions button')!.click();
    fixture.detectChanges();
    await fixture.whenStable();

    const request = http.expectOne('/api/v1/jobs/8/runs');
    expect(request.request.headers.get('If-Match')).toBe(`"${JOB_WITH_INSTALLED.version}"`);
    expect(request.request.body).toEqual({
      kind: 'verification',
      readings: [
        { sensorSide: 'left', repeats: [{ amplitude: 0.06, phaseDeg: 213, speedRpm: 2100 }] },
        { sensorSide: 'right', repeats: [{ amplitude: 0.32, phaseDeg: 102, speedRpm: 2099 }] },
      ],
    });
    request.flush(JOB_VERIFIED_RIGHT_ABOVE, { headers: { ETag: `"${JOB_VERIFIED_RIGHT_ABOVE.version}"` } });
    await fixture.whenStable();
  });

  it('shows each side against its limit and, when one is above, the side to work next and why', async () => {
    const { element } = await render(JOB_VERIFIED_RIGHT_ABOVE);
    expect(element.querySelector('app-run-entry')).toBeNull();
    expect(text(element.querySelector('.verdict__heading'))).toBe(
      'Run 3 is not yet within the acceptance level',
    );
    expect(text(element.querySelector('.verdict__level'))).toBe(
      'Acceptance level: Shop target 0.15 in/s peak',
    );
    // 0.05999 → 0.06 and 0.31995 → 0.32 at three decimals.
    expect(verdictRows(element)).toEqual([
      ['Left', '0.06', '0.15', 'Within'],
      ['Right', '0.32', '0.15', 'Above'],
    ]);
    expect(text(element.querySelector('.verdict__next'))).toBe('Work the right side next.');
    expect(text(element.querySelector('.verdict__why'))).toBe(JOB_VERIFIED_RIGHT_ABOVE.verification!.why);
    expect(text(element.querySelector('.verdict__trim'))).toContain(
      'the weights now fitted act as a trim run against the run before them',
    );
  });

  it('says when every side is within the acceptance level', async () => {
    const { element } = await render(COMPLETED_MULCHER_JOB);
    expect(text(element.querySelector('.verdict__heading'))).toBe('Run 4 is within the acceptance level');
    expect(verdictRows(element)).toEqual([
      ['Left', '0.001', '0.12', 'Within'],
      ['Right', '0.012', '0.12', 'Within'],
    ]);
    expect(text(element.querySelector('.verdict__next'))).toBe(
      'The job is completed with this run as its after.',
    );
    expect(element.querySelector('.verdict__trim')).toBeNull();
  });

  it('says a side without a limit is not judged, and why', async () => {
    const verification = JOB_VERIFIED_RIGHT_ABOVE.verification!;
    const { element } = await render({
      ...JOB_VERIFIED_RIGHT_ABOVE,
      verification: {
        ...verification,
        acceptance: { kind: 'balance-grade', grade: 'G16' },
        sides: [{ ...verification.sides[0]!, limit: null, accepted: false }, verification.sides[1]!],
      },
    });
    expect(verdictRows(element)[0]).toEqual(['Left', '0.06', 'None', 'Not judged']);
    expect(text(element.querySelector('.verdict__not-judged'))).toBe(
      'The left side is not judged. A balance grade is a permissible unbalance, read as an amplitude through ' +
        'the influence coefficient of the side: that needs the rotor’s mass on the machine and a coefficient ' +
        'this job measured with a trial weight in the side’s plane.',
    );
  });

  it('waits for the weights before asking for a verification run', async () => {
    const { element } = await render(JOB_AFTER_LEFT_TRIAL);
    expect(text(element.querySelector('.verification-step__note'))).toContain(
      'Fit the weights of a correction first',
    );
    expect(element.querySelector('app-run-entry')).toBeNull();
    expect(element.querySelector('.verdict')).toBeNull();
  });
});
