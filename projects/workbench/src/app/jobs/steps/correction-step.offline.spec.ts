import type { HttpTestingController } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { applyJobChange, compareCorrections, type JobCorrection } from '@counterpoise/api';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../../auth/auth-session';
import { aSession } from '../../auth/testing';
import { HEALTH_PROBE } from '../../offline/connection';
import { OFFLINE_STORAGE } from '../../offline/offline-records';
import { type CorrectionDisagreement, MemoryOfflineStorage } from '../../offline/offline-storage';
import { formatDeg, formatNumber } from '../../records/record-labels';
import { JobSession } from '../job-session';
import type { Job } from '../jobs.api';
import { JobCorrectionStep } from './correction-step';
import { configureStepTesting, renderStep, text } from './step-testing';
import { JOB_AFTER_LEFT_TRIAL, MULCHER_FAMILY, MULCHER_MACHINE } from './testing-jobs';

/*
 * The correction step with the device's side of working offline: a correction computed on this device (by
 * the shared rules, as the device does) says so until the server has checked it, and a correction the server
 * computed differently shows both results, which one is stored, and what to do, until the technician has
 * checked the weights.
 */

@Component({
  imports: [JobCorrectionStep],
  template: `
    @if (session.job(); as job) {
      <app-job-correction-step [job]="job" [machine]="machine" [family]="family" [editable]="true" />
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class StepHost {
  readonly session = inject(JobSession);
  readonly machine = MULCHER_MACHINE;
  readonly family = MULCHER_FAMILY;
}

const TECHNICIAN = aSession('technician');

/** The job after JOB_AFTER_LEFT_TRIAL's single-plane correction, as the device's rules compute it. */
function computedOnDevice(): Job {
  return applyJobChange(
    JOB_AFTER_LEFT_TRIAL,
    { kind: 'compute-correction', body: { method: 'single-plane' } },
    { machine: MULCHER_MACHINE, family: MULCHER_FAMILY },
    { actor: JOB_AFTER_LEFT_TRIAL.technician, at: new Date('2026-04-14T10:00:00Z') },
  );
}

/** The same job as the server stored it: its own id, and (for a disagreement) another result. */
function storedByServer(device: Job, scale = 1, turnDeg = 0): Job {
  const correction = device.corrections.at(-1)!;
  const server: JobCorrection = {
    ...correction,
    id: 57,
    plan: correction.plan.map((weight) => ({
      ...weight,
      massGrams: weight.massGrams * scale,
      angleDeg: (weight.angleDeg + turnDeg) % 360,
    })),
  };
  return { ...device, corrections: [...device.corrections.slice(0, -1), server] };
}

describe('JobCorrectionStep with the device working offline', { timeout: 30_000 }, () => {
  let http: HttpTestingController;
  let storage: MemoryOfflineStorage;

  beforeEach(() => {
    storage = new MemoryOfflineStorage();
    http = configureStepTesting([
      { provide: OFFLINE_STORAGE, useValue: storage },
      // The server's health is not asked in these specs: the device is online throughout.
      { provide: HEALTH_PROBE, useValue: async () => true },
    ]);
  });

  afterEach(() => {
    // The step asks for the machine's photos; the device keeps the technician's day once signed in.
    for (const request of http.match((each) => each.url.endsWith('/photos'))) {
      if (!request.cancelled) request.flush({ photos: [], limit: 40 });
    }
    for (const request of http.match((each) => each.url === '/api/v1/jobs/home')) {
      if (!request.cancelled)
        request.flush({ myOpenJobs: [], waitingForManager: [], machinesDue: [], dueAfterDays: 365 });
    }
    http.verify();
  });

  async function render(job: Job) {
    TestBed.inject(AuthSession).start(TECHNICIAN);
    const fixture = await renderStep(StepHost, job);
    await new Promise((resolve) => setTimeout(resolve));
    fixture.detectChanges();
    await fixture.whenStable();
    return { fixture, element: fixture.nativeElement as HTMLElement };
  }

  it('says plainly that a correction was computed on this device and the server will check it', async () => {
    const device = computedOnDevice();
    expect(device.corrections.at(-1)!.id).toBeLessThan(0);
    const { element } = await render(device);
    expect(text(element.querySelector('[data-testid="computed-on-device"]'))).toBe(
      'Computed on this device; the server will check it when the connection returns. The device uses the ' +
        'server’s rules and engine on the readings typed here.',
    );
    const workedOut = [...element.querySelectorAll('.facts div')].find(
      (fact) => text(fact.querySelector('dt')) === 'Worked out',
    );
    expect(text(workedOut?.querySelector('dd'))).toBe(
      'by Tomasz Wrenfield, on this device from the readings typed here',
    );
    expect(element.querySelector('[data-testid="disagreement"]')).toBeNull();
  });

  it('shows a correction the server stored as the server’s, with no note of the device', async () => {
    const { element } = await render(storedByServer(computedOnDevice()));
    expect(element.querySelector('[data-testid="computed-on-device"]')).toBeNull();
    expect(element.querySelector('[data-testid="disagreement"]')).toBeNull();
    expect(text(element.querySelector('.facts'))).toContain('by the server from the stored readings');
  });

  it('shows a disagreement: both results side by side, the server’s stored, what to do, until checked', async () => {
    const device = computedOnDevice();
    const server = storedByServer(device, 1.04, 2);
    const agreement = compareCorrections(device.corrections.at(-1)!, server.corrections.at(-1)!, 2);
    expect(agreement.agrees).toBe(false);
    const disagreement: CorrectionDisagreement = {
      userId: TECHNICIAN.user.id,
      jobId: server.id,
      correctionSequence: 1,
      differences: agreement.differences,
      device: device.corrections.at(-1)!,
      server: server.corrections.at(-1)!,
      foundAt: '2026-04-14T10:05:00.000Z',
    };
    await storage.putDisagreement(disagreement);
    const { fixture, element } = await render(server);

    const shown = element.querySelector<HTMLElement>('[data-testid="disagreement"]')!;
    expect(shown).not.toBeNull();
    const heading = shown.querySelector('h4')!;
    expect(shown.getAttribute('aria-labelledby')).toBe(heading.id);
    expect(text(heading)).toBe('The server computed correction 1 differently');
    expect(text(shown.querySelector('[role="alert"]'))).toBe(
      'The server’s result is stored; this device computed another. Check before fitting.',
    );
    const planned = server.corrections[0]!.plan[0]!;
    const mine = device.corrections[0]!.plan[0]!;
    const rows = [...shown.querySelectorAll('[data-testid="disagreement-row"]')].map((row) =>
      [...row.querySelectorAll('th, td')].map(text),
    );
    expect(rows).toEqual([
      [
        'Left plane',
        `${formatNumber(planned.massGrams, 1)} g at ${formatDeg(planned.angleDeg)}`,
        `${formatNumber(mine.massGrams, 1)} g at ${formatDeg(mine.angleDeg)}`,
      ],
    ]);
    expect([...shown.querySelectorAll('.disagreement__differences li')].map(text)).toEqual(
      agreement.differences,
    );
    expect(text(shown)).toContain('Fit the server’s weights, shown in the plan below.');
    // The plan below is the server's stored correction.
    expect(text(element.querySelector('[data-testid="plan-row"] .strong'))).toBe(
      `${formatNumber(planned.massGrams, 1)} g`,
    );
    expect(element.querySelector('[data-testid="computed-on-device"]')).toBeNull();

    const checked = [...shown.querySelectorAll('button')].find(
      (button) => text(button) === 'I have checked the weights',
    )!;
    checked.click();
    await fixture.whenStable();
    fixture.detectChanges();
    expect(element.querySelector('[data-testid="disagreement"]')).toBeNull();
    expect(await storage.disagreements(TECHNICIAN.user.id)).toEqual([]);
    // The button is gone: the focus goes to the correction's heading, not to the page's start.
    expect(document.activeElement?.id).toBe('correction-heading');
  });
});
