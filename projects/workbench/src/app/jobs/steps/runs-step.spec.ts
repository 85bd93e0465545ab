import type { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { CpPolarPlotHarness } from '@counterpoise/ng/polar-plot/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { JobSession } from '../job-session';
import type { Job, JobRun } from '../jobs.api';
import { JobRunsStep } from './runs-step';
import { configureStepTesting, renderStep, text } from './step-testing';
import { JOB_AFTER_LEFT_TRIAL, JOB_WITH_CORRECTION, MULCHER_MACHINE } from './testing-jobs';

@Component({
  imports: [JobRunsStep],
  providers: [JobSession],
  template: `
    @if (session.job(); as job) {
      <app-job-runs-step [job]="job" [machine]="machine" [editable]="editable()" />
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly session = inject(JobSession);
  readonly editable = input(true);
  readonly machine = MULCHER_MACHINE;
}

describe('JobRunsStep', { timeout: 30_000 }, () => {
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
    return {
      fixture,
      element: fixture.nativeElement as HTMLElement,
      loader: TestbedHarnessEnvironment.loader(fixture),
    };
  }

  function values(element: HTMLElement, run: number, side: 'left' | 'right'): Record<string, string> {
    const section = element.querySelector(`.run[data-run="${run}"] .sensor-reading[data-side="${side}"]`);
    return Object.fromEntries(
      [...(section?.querySelectorAll('.sensor-reading__values > div') ?? [])].map((item) => [
        text(item.querySelector('dt')),
        text(item.querySelector('dd')),
      ]),
    );
  }

  function button(element: HTMLElement, label: string): HTMLButtonElement | undefined {
    return [...element.querySelectorAll<HTMLButtonElement>('button')].find((candidate) =>
      text(candidate).includes(label),
    );
  }

  async function press(fixture: ComponentFixture<Host>, target: HTMLElement | undefined) {
    if (!target) throw new Error('No such button');
    target.click();
    fixture.detectChanges();
    await fixture.whenStable();
  }

  it('lists every run in order: its kind, trial weight, the weights on the rotor and each sensor’s average', async () => {
    const { element } = await render(JOB_AFTER_LEFT_TRIAL);
    expect([...element.querySelectorAll('.run__title')].map((title) => text(title))).toEqual([
      'Run 1 · Initial run Tomasz Wrenfield',
      'Run 2 · Trial run Tomasz Wrenfield',
    ]);
    expect(element.querySelector('.run[data-run="1"] .run__trial')).toBeNull();
    expect(text(element.querySelector('.run[data-run="2"] .run__trial'))).toBe(
      'Trial weight: 120 g at 0° in the left plane',
    );
    expect(text(element.querySelector('.run[data-run="2"] .run__weights'))).toContain(
      'No weights of this job on the rotor.',
    );
    // The server's averages, rounded for reading: 0.56548 → 0.565, 299.504° → 299.5°, 2098.5 rpm → 2,099,
    // spread 0.00668 → 0.007, 0.0118 of the average → 1 %.
    expect(values(element, 1, 'left')).toEqual({
      Amplitude: '0.565 in/s peak',
      Phase: '299.5°',
      Speed: '2,099 rpm',
      Repeats: '2',
      Spread: '0.007 (1 %)',
    });
    expect(values(element, 2, 'right')).toEqual({
      Amplitude: '0.401 in/s peak',
      Phase: '106.5°',
      Speed: '2,100 rpm',
      Repeats: '2',
      Spread: '0.004 (1 %)',
    });
    expect(text(element.querySelector('.run[data-run="1"] .sensor-reading__trust'))).toContain(
      'Trusted: the repeats agree.',
    );
    expect(element.querySelector('.run__warnings')).toBeNull();
  });

  it('shows a run’s warnings and the readings it does not trust, and the weights on the rotor', async () => {
    const trial = JOB_AFTER_LEFT_TRIAL.runs[1]!;
    const shaky: JobRun = {
      ...trial,
      weightsOnRotor: [{ planeIndex: 1, massGrams: 85, angleDeg: 200 }],
      readings: [{ ...trial.readings[0]!, trusted: false, spreadRatio: 0.34 }, trial.readings[1]!],
      warnings: [
        'Left sensor: the readings spread by 34 % of their average (limit 20 %).',
        'The speed drifted 3.1 % from the initial run’s.',
      ],
    };
    const { element } = await render({
      ...JOB_AFTER_LEFT_TRIAL,
      runs: [JOB_AFTER_LEFT_TRIAL.runs[0]!, shaky],
    });
    expect(
      [...element.querySelectorAll('.run[data-run="2"] .run__warnings li span')].map((item) => text(item)),
    ).toEqual([
      'Left sensor: the readings spread by 34 % of their average (limit 20 %).',
      'The speed drifted 3.1 % from the initial run’s.',
    ]);
    const left = element.querySelector('.run[data-run="2"] .sensor-reading[data-side="left"]');
    expect(left?.classList).toContain('sensor-reading--untrusted');
    expect(text(left?.querySelector('.sensor-reading__trust'))).toBe('Not trusted: the repeats disagree.');
    expect(values(element, 2, 'left')['Spread']).toBe('0.007 (34 %)');
    expect(text(element.querySelector('.run[data-run="2"] .run__weights'))).toBe(
      'On the rotor: 85 g at 200° in the right plane',
    );
  });

  it('draws every run of the job on one polar plot per sensor, as seen from that sensor’s end', async () => {
    const { loader } = await render(JOB_AFTER_LEFT_TRIAL);
    const plots = await loader.getAllHarnesses(CpPolarPlotHarness);
    expect(await Promise.all(plots.map((plot) => plot.getCaption()))).toEqual([
      'Left sensor: every run',
      'Right sensor: every run',
    ]);
    expect(await plots[0]!.getPointDescriptions()).toEqual([
      'Run 1, Left sensor: 0.565 in/s peak at 299.5 degrees',
      'Run 2, Left sensor: 0.563 in/s peak at 319.5 degrees',
    ]);
    expect(await plots[1]!.getPointDescriptions()).toEqual([
      'Run 1, Right sensor: 0.349 in/s peak at 105 degrees',
      'Run 2, Right sensor: 0.401 in/s peak at 106.5 degrees',
    ]);
    // The rotor turns counter-clockwise seen from the left, so clockwise seen from the right.
    expect(await plots[0]!.getNote()).toContain('counter-clockwise');
    expect(await plots[1]!.getNote()).toMatch(/turns clockwise/);
  });

  it('offers the initial run’s entry while there is none, and no entry to someone who may not change the job', async () => {
    const before: Job = { ...JOB_AFTER_LEFT_TRIAL, runs: [], nextStep: 'runs', verification: null };
    const { element } = await render(before);
    expect(element.querySelector('.run')).toBeNull();
    expect(text(element.querySelector('#initial-run-heading'))).toBe('Readings of the initial run');
    expect(element.querySelector('app-run-entry #run-initial-s0-r0-amplitude')).not.toBeNull();
    expect(button(element, 'Add a trial run')).toBeUndefined();

    TestBed.resetTestingModule();
    http = configureStepTesting();
    const viewer = await render(before, false);
    expect(viewer.element.querySelector('app-run-entry')).toBeNull();
  });

  it('opens a trial run’s entry on “Add a trial run”, once the initial run is there', async () => {
    const { fixture, element } = await render(JOB_AFTER_LEFT_TRIAL);
    expect(element.querySelector('app-run-entry')).toBeNull();
    await press(fixture, button(element, 'Add a trial run'));
    expect(text(element.querySelector('#trial-run-heading'))).toBe('Readings of a trial run');
    expect(element.querySelector('.run-entry__trial')).not.toBeNull();
    await press(fixture, button(element, 'Close'));
    expect(element.querySelector('app-run-entry')).toBeNull();
  });

  it('types the latest run’s readings again, prefilled, and sends them in its place on the stored ETag', async () => {
    const { fixture, element } = await render(JOB_AFTER_LEFT_TRIAL);
    // Only the latest run, which no correction rests on, can be corrected.
    expect(element.querySelector('.run[data-run="1"] .run__correct-button')).toBeNull();
    await press(
      fixture,
      element.querySelector<HTMLElement>('.run[data-run="2"] .run__correct-button') ?? undefined,
    );

    const field = (id: string) => element.querySelector<HTMLInputElement>(`#run-30-retyped-${id}`)!;
    expect(field('s0-r0-amplitude').value).toBe('0.568');
    expect(field('s0-r1-phaseDeg').value).toBe('319');
    expect(field('s1-r1-speedRpm').value).toBe('2099');
    expect(field('mass').value).toBe('120');
    // The meter showed 108° for the right sensor's second repeat, not the 106° typed.
    field('s1-r1-phaseDeg').value = '108';
    field('s1-r1-phaseDeg').dispatchEvent(new Event('input'));
    await press(fixture, button(element, 'Save the corrected readings'));

    const request = http.expectOne('/api/v1/jobs/8/runs/30/readings');
    expect(request.request.method).toBe('PUT');
    expect(request.request.headers.get('If-Match')).toBe('"6"');
    expect(request.request.body).toEqual({
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            { amplitude: 0.568, phaseDeg: 320, speedRpm: 2100 },
            { amplitude: 0.559, phaseDeg: 319, speedRpm: 2097 },
          ],
        },
        {
          sensorSide: 'right',
          repeats: [
            { amplitude: 0.402, phaseDeg: 107, speedRpm: 2100 },
            { amplitude: 0.4, phaseDeg: 108, speedRpm: 2099 },
          ],
        },
      ],
      trialWeight: { planeIndex: 0, massGrams: 120, angleDeg: 0 },
    });
    request.flush({ ...JOB_AFTER_LEFT_TRIAL, version: 7 }, { headers: { ETag: '"7"' } });
    await fixture.whenStable();
    await new Promise((resolve) => setTimeout(resolve));
    fixture.detectChanges();
    expect(element.querySelector('app-run-entry')).toBeNull();
  });

  it('offers no correction of a run a correction was computed from', async () => {
    const { element } = await render(JOB_WITH_CORRECTION);
    expect(element.querySelector('.run__correct-button')).toBeNull();
  });

  it('offers “Import readings from a file” beside the entries, and opens its dialog; not to someone who may not change the job', async () => {
    const before: Job = { ...JOB_AFTER_LEFT_TRIAL, runs: [], nextStep: 'runs', verification: null };
    const { fixture, element } = await render(before);
    await press(fixture, button(element, 'Import readings from a file'));
    expect(text(document.querySelector('mat-dialog-container h2'))).toBe('Import readings from a file');
    document.querySelector<HTMLButtonElement>('mat-dialog-container [mat-dialog-close]')!.click();
    await fixture.whenStable();

    TestBed.resetTestingModule();
    http = configureStepTesting();
    const viewer = await render(JOB_AFTER_LEFT_TRIAL, false);
    expect(button(viewer.element, 'Import readings from a file')).toBeUndefined();
  });
});
