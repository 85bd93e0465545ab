import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import type { Machine } from '../../machines/machines.api';
import { JobSession } from '../job-session';
import type { Job, JobRun } from '../jobs.api';
import { aPhoto, fakeObjectUrls } from '../../photos/photos-testing';
import { JobCorrectionStep } from './correction-step';
import {
  JOB_AFTER_LEFT_TRIAL,
  JOB_VERIFIED_RIGHT_ABOVE,
  JOB_WITH_CORRECTION,
  JOB_WITH_INSTALLED,
  MULCHER_FAMILY,
  MULCHER_MACHINE,
} from './testing-jobs';

/** The step as the job page renders it: bound to the job the page's session holds. */
@Component({
  imports: [JobCorrectionStep],
  providers: [JobSession],
  template: `
    @if (session.job(); as job) {
      <app-job-correction-step [job]="job" [machine]="machine()" [family]="family()" [editable]="true" />
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class StepHost {
  readonly session = inject(JobSession);
  readonly machine = input<Machine | undefined>(MULCHER_MACHINE);
  readonly family = input<MachineFamily | undefined>(MULCHER_FAMILY);
}

describe('JobCorrectionStep', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    // The step asks for the machine's photos (its overlay background); these specs draw without one.
    for (const request of http.match((each) => each.url.endsWith('/photos'))) {
      if (!request.cancelled) request.flush({ photos: [], limit: 40 });
    }
    http.verify();
    localStorage.clear();
  });

  async function render(
    job: Job,
    options: { machine?: Machine | undefined; family?: MachineFamily | undefined } = {},
  ) {
    const fixture = TestBed.createComponent(StepHost);
    if ('machine' in options) fixture.componentRef.setInput('machine', options.machine);
    if ('family' in options) fixture.componentRef.setInput('family', options.family);
    const loading = fixture.componentInstance.session.load(job.id);
    http.expectOne(`/api/v1/jobs/${job.id}`).flush(job, { headers: { ETag: `"${job.version}"` } });
    await loading;
    await fixture.whenStable();
    return { fixture, element: fixture.nativeElement as HTMLElement };
  }

  function text(element: Element | null | undefined): string {
    return element?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  }

  /** A table row's cells, or a list item's text, as one line. */
  function rows(element: HTMLElement, testId: string): string[] {
    return [...element.querySelectorAll(`[data-testid="${testId}"]`)].map((row) => {
      const cells = [...row.querySelectorAll('th, td')];
      return cells.length > 0 ? cells.map(text).join(' ') : text(row);
    });
  }

  function methods(element: HTMLElement) {
    return [...element.querySelectorAll('.method')].map((method) => ({
      method: method.getAttribute('data-method'),
      label: text(method.querySelector('.method__label')),
      status: text(method.querySelector('.method__status')),
    }));
  }

  function button(element: HTMLElement, name: string): HTMLButtonElement {
    const found = [...element.querySelectorAll('button')].find((one) => text(one) === name);
    if (!found) throw new Error(`No button "${name}"`);
    return found;
  }

  async function settle(fixture: ComponentFixture<unknown>) {
    await new Promise((resolve) => setTimeout(resolve));
    fixture.detectChanges();
    await fixture.whenStable();
  }

  it('offers the methods simplest first, each with what this job has for it', async () => {
    const { element } = await render(JOB_AFTER_LEFT_TRIAL);
    expect(methods(element)).toEqual([
      {
        method: 'one-run',
        label: 'Stored sensitivity, one run',
        status: 'This job has it: the left sensor and left plane, 619 g per in/s peak, from 4 jobs.',
      },
      {
        method: 'single-plane',
        label: 'Trial weight, one plane',
        status: 'This job has it: trial run 2 in the left plane, read by the left sensor.',
      },
      {
        method: 'multi-plane',
        label: 'Two planes',
        status: 'Missing: a trial run in the right plane (run 2 is in the other).',
      },
      {
        method: 'four-run',
        label: 'Amplitude only, trial at three positions',
        status:
          'The initial run (run 1) was read with phase: amplitude only needs it read without phase. Use a method with phase.',
      },
    ]);
    expect(text(element.querySelector('[data-method="four-run"] .method__needs'))).toBe(
      'Needs runs read without phase: the initial run, then the same trial weight at three positions in the worse side’s plane (0°, 120°, 240°).',
    );
    // Nothing to type for it here: this job's runs were read with phase.
    expect(element.querySelector('[data-testid="amplitude-only"]')).toBeNull();
  });

  it('says the stored sensitivity is missing on a machine without a family', async () => {
    const { element } = await render(JOB_AFTER_LEFT_TRIAL, { family: undefined });
    expect(methods(element)[0]?.status).toBe('The machine has no family, so no stored sensitivity.');
  });

  it('offers no method while fitted weights wait for their verification run', async () => {
    const { element } = await render(JOB_WITH_INSTALLED);
    expect(methods(element).map((method) => method.status)).toEqual(
      Array(4).fill('Weights were fitted since the last run: take a verification run with them on first.'),
    );
  });

  it('after a verification, works the worse side: no trim where no weight went in its plane', async () => {
    const { element } = await render(JOB_VERIFIED_RIGHT_ABOVE);
    expect(methods(element).map((method) => method.status)).toEqual([
      'This job has it: the right sensor and right plane, 668 g per in/s peak, from 4 jobs.',
      'A trim needs weights fitted in the right plane between run 1 and verification run 3; none were. Work the right side with two planes.',
      'Missing: a trial run in the right plane (run 2 is in the other).',
      'Run 3 was read with phase: amplitude only needs it read without phase. Use a method with phase.',
    ]);
  });

  it('after a verification above the level, says why and which side to work next, and picks a method that can', async () => {
    const { element } = await render(JOB_VERIFIED_RIGHT_ABOVE);
    const verdict = element.querySelector('[data-testid="not-yet-accepted"]');
    expect(text(verdict?.querySelector('h3'))).toBe(
      'Run 3 is above the acceptance level: work the right side next',
    );
    expect(text(verdict)).toContain(
      'The right side reads 0.32 in/s-pk, above its limit of 0.15 in/s-pk; the left side is within its limit.',
    );
    // No trim is possible on the right (no weight went in its plane) and two planes lack a trial run: the
    // family's stored figure for the right side is the method that can be worked out now.
    const checked = element.querySelector('mat-radio-button.mat-mdc-radio-checked');
    expect(checked?.getAttribute('data-method')).toBe('one-run');
  });

  it('shows no verdict before any verification run', async () => {
    const { element } = await render(JOB_WITH_INSTALLED);
    expect(element.querySelector('[data-testid="not-yet-accepted"]')).toBeNull();
  });

  it('embeds the form of the missing trial run when the method chosen needs it', async () => {
    const { fixture, element } = await render(JOB_AFTER_LEFT_TRIAL);
    expect(element.querySelector('[data-testid="trial-entry"]')).toBeNull();
    (element.querySelector('[data-method="multi-plane"] input') as HTMLInputElement).click();
    await fixture.whenStable();
    const entry = element.querySelector('[data-testid="trial-entry"]');
    expect(text(entry?.querySelector('h4'))).toBe('Trial run in the right plane');
    expect(entry?.querySelector('app-run-entry')).not.toBeNull();
  });

  it('gives each missing trial run a form of its own: the next plane does not inherit what was typed', async () => {
    const initialOnly: Job = {
      ...JOB_AFTER_LEFT_TRIAL,
      version: 5,
      runs: JOB_AFTER_LEFT_TRIAL.runs.slice(0, 1),
    };
    const { fixture, element } = await render(initialOnly);
    (element.querySelector('[data-method="multi-plane"] input') as HTMLInputElement).click();
    await fixture.whenStable();
    const entry = () => element.querySelector('[data-testid="trial-entry"]');
    const mass = () => entry()?.querySelector<HTMLInputElement>('input[id$="-mass"]');
    expect(text(entry()?.querySelector('h4'))).toBe('Trial run in the left plane');
    mass()!.value = '120';
    mass()!.dispatchEvent(new Event('input'));
    // The left plane's trial run is stored (its draft cleared), and the job now needs the right plane's.
    localStorage.clear();
    const loading = fixture.componentInstance.session.load(8);
    http.expectOne('/api/v1/jobs/8').flush(JOB_AFTER_LEFT_TRIAL, { headers: { ETag: '"6"' } });
    await loading;
    await fixture.whenStable();
    expect(text(entry()?.querySelector('h4'))).toBe('Trial run in the right plane');
    expect(mass()?.value).toBe('');
  });

  it('asks the server for the method chosen on the stored ETag, and shows the plan it stored', async () => {
    const { fixture, element } = await render(JOB_AFTER_LEFT_TRIAL);
    (element.querySelector('[data-method="single-plane"] input') as HTMLInputElement).click();
    await fixture.whenStable();
    button(element, 'Work it out').click();
    const request = http.expectOne('/api/v1/jobs/8/corrections');
    expect(request.request.method).toBe('POST');
    expect(request.request.headers.get('If-Match')).toBe('"6"');
    expect(request.request.body).toEqual({ method: 'single-plane' });
    request.flush(JOB_WITH_CORRECTION, { headers: { ETag: '"7"' } });
    await settle(fixture);

    const correction = element.querySelector('[data-testid="correction"]');
    expect(text(correction?.querySelector('h3'))).toBe('Correction 1: Trial weight, one plane');
    const facts = Object.fromEntries(
      [...(correction?.querySelectorAll('.facts > div') ?? [])].map((item) => [
        text(item.querySelector('dt')),
        text(item.querySelector('dd')),
      ]),
    );
    expect(facts).toEqual({
      Basis: 'From the trial runs',
      'Runs used': 'run 1 (initial), run 2 (trial, 120 g at 0° in the left plane)',
      'Worked out': 'by Tomasz Wrenfield, by the server from the stored readings',
    });
    expect(rows(element, 'plan-row')).toEqual(['Left plane 346.1 g 79.4° 210 mm']);
    // 79.4° lies between the tooth rows at 75° and 105°: the plan is split onto them, from the stock sizes.
    expect([...element.querySelectorAll('[data-testid="part"]')].map(text)).toEqual([
      'Part A: 298.8 g at 75° from stock: 100 g + 200 g (1.2 g over)',
      'Part B: 53.4 g at 105° from stock: 50 g (3.4 g under)',
    ]);
    // The pick stays on the method the technician chose.
    expect((element.querySelector('[data-method="single-plane"] input') as HTMLInputElement).checked).toBe(
      true,
    );
  });

  it('says in plain words why the engine refused the readings', async () => {
    const { fixture, element } = await render(JOB_AFTER_LEFT_TRIAL);
    button(element, 'Work it out').click();
    http.expectOne('/api/v1/jobs/8/corrections').flush(
      {
        type: 'about:blank',
        title: 'Conflict',
        status: 409,
        code: 'ZERO_TRIAL_EFFECT',
        detail:
          'The stored readings do not give a correction: the trial weight changed the reading by 0.1 %.',
      },
      { status: 409, statusText: 'Conflict' },
    );
    await settle(fixture);
    expect(text(element.querySelector('app-error-banner'))).toContain(
      'The trial weight changed nothing the meter could tell. Fit a heavier trial weight, or move it, and take the trial run again. The stored readings do not give a correction',
    );
  });

  it('prefills what was fitted from the split, and sends what was typed on the stored ETag', async () => {
    const { fixture, element } = await render(JOB_WITH_CORRECTION);
    const rows = [...element.querySelectorAll('[data-testid="installed-weight"]')];
    const values = (row: Element) =>
      [...row.querySelectorAll('input[inputmode="decimal"]')].map(
        (input) => (input as HTMLInputElement).value,
      );
    expect(rows.map(values)).toEqual([
      ['298.8', '75', '210'],
      ['53.4', '105', '210'],
    ]);

    // The technician fitted 300 g and 50 g plates from stock.
    const [first, second] = rows.map(
      (row) => row.querySelector('input[inputmode="decimal"]') as HTMLInputElement,
    );
    first!.value = '300';
    first!.dispatchEvent(new Event('input'));
    second!.value = '50';
    second!.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    button(element, 'Record what was fitted').click();

    const request = http.expectOne('/api/v1/jobs/8/corrections/8/installed');
    expect(request.request.method).toBe('PUT');
    expect(request.request.headers.get('If-Match')).toBe('"7"');
    expect(request.request.body).toEqual({
      weights: [
        { planeIndex: 0, massGrams: 300, angleDeg: 75, radiusMm: 210, fixing: 'welded' },
        { planeIndex: 0, massGrams: 50, angleDeg: 105, radiusMm: 210, fixing: 'welded' },
      ],
    });
    request.flush(JOB_WITH_INSTALLED, { headers: { ETag: '"8"' } });
    await settle(fixture);

    expect(text(element.querySelector('[data-testid="installed-stored"] .stored__list'))).toBe(
      'Left plane: 300 g at 75°, radius 210 mm, welded Left plane: 50 g at 105°, radius 210 mm, welded',
    );
    expect([...element.querySelectorAll('[data-testid="predicted"]')].map(text)).toEqual([
      'Left sensor: 0.004 in/s peak at 338.7°',
    ]);
    expect(localStorage.getItem('counterpoise.job-draft.8.installed-8')).toBeNull();
  });

  it('draws the first plane over the machine’s calibrated background photo', async () => {
    const urls = fakeObjectUrls();
    try {
      const { fixture, element } = await render(JOB_WITH_CORRECTION);
      const calibration = {
        centre: { x: 0.5, y: 0.51 },
        rim: { x: 0.75, y: 0.51 },
        referenceMark: { x: 0.56, y: 0.19 },
      };
      const machineId = JOB_WITH_CORRECTION.machine.id;
      http.expectOne(`/api/v1/machines/${machineId}/photos`).flush({
        photos: [
          aPhoto({ id: 4, machineId }),
          aPhoto({ id: 5, machineId, overlayBackground: true, calibration }),
        ],
        limit: 40,
      });
      http.expectOne('/api/v1/photos/5').flush(new Blob(['jpeg']));
      await settle(fixture);
      const views = [...element.querySelectorAll('cp-correction-overlay.plane__view')];
      expect(views.length).toBeGreaterThan(0);
      expect(views[0]!.classList).toContain('cp-correction-overlay--on-photo');
      expect(views[0]!.querySelector('image')?.getAttribute('href')).toBe('blob:photo-1');
    } finally {
      urls.restore();
    }
  });

  it('keeps typed weights on the device until they are stored', async () => {
    const first = await render(JOB_WITH_CORRECTION);
    const mass = first.element.querySelector('[data-testid="installed-weight"] input') as HTMLInputElement;
    mass.value = '310';
    mass.dispatchEvent(new Event('input'));
    first.fixture.destroy();

    const again = await render(JOB_WITH_CORRECTION);
    const restored = again.element.querySelector(
      '[data-testid="installed-weight"] input',
    ) as HTMLInputElement;
    expect(restored.value).toBe('310');
  });

  it('puts the server’s field errors on the weight at fault', async () => {
    const { fixture, element } = await render(JOB_WITH_CORRECTION);
    button(element, 'Record what was fitted').click();
    http.expectOne('/api/v1/jobs/8/corrections/8/installed').flush(
      {
        type: 'about:blank',
        title: 'Bad Request',
        status: 400,
        detail: 'weights[1].radiusMm: The radius is at most 5000 mm.',
        errors: [{ path: 'weights[1].radiusMm', message: 'The radius is at most 5000 mm.' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle(fixture);
    const second = element.querySelectorAll('[data-testid="installed-weight"]')[1];
    expect(text(second?.querySelector('mat-error'))).toBe('The radius is at most 5000 mm.');
  });

  describe('amplitude only', () => {
    /** A run of job 8 as read without phase: the amplitudes alone, their plain mean. */
    function withoutPhase(run: JobRun, changes: Partial<JobRun> = {}): JobRun {
      return {
        ...run,
        amplitudeOnly: true,
        readings: run.readings.map((reading) => ({
          ...reading,
          repeats: reading.repeats.map(({ amplitude, speedRpm }) => ({ amplitude, speedRpm })),
          average: { amplitude: reading.average.amplitude, phaseDeg: null },
        })),
        ...changes,
      };
    }

    /** Job 8 read without phase: the initial run, then 40 g trial runs at `anglesDeg` in the left plane. */
    function amplitudeOnlyJob(anglesDeg: readonly number[]): Job {
      const [initial, trial] = JOB_AFTER_LEFT_TRIAL.runs as [JobRun, JobRun];
      return {
        ...JOB_AFTER_LEFT_TRIAL,
        runs: [
          withoutPhase(initial),
          ...anglesDeg.map((angleDeg, index) =>
            withoutPhase(trial, {
              id: 40 + index,
              sequence: 2 + index,
              trialWeight: { planeIndex: 0, massGrams: 40, angleDeg },
            }),
          ),
        ],
      };
    }

    it('picks amplitude only for runs read without phase, and asks for the trial at 0° with its mass typed once', async () => {
      const { fixture, element } = await render(amplitudeOnlyJob([]));
      expect(methods(element).map((method) => method.status)).toEqual([
        ...Array(3).fill('The initial run (run 1) was read without phase: this method needs the phase.'),
        'The initial run (run 1); no trial run read without phase yet. Missing: 3 more trial runs in the left plane.',
      ]);
      const checked = element.querySelector('mat-radio-button.mat-mdc-radio-checked');
      expect(checked?.getAttribute('data-method')).toBe('four-run');
      const entry = element.querySelector('[data-testid="amplitude-only"]');
      expect(text(entry?.querySelector('h4'))).toBe('Trial run at 0° (1 of 3), amplitude only');
      expect(text(entry?.querySelector('.hint'))).toContain('Type its mass once');
      // No choice of phase and no phase field: the step says this run is amplitude only.
      expect(entry?.querySelector('[data-testid="phase-mode"]')).toBeNull();
      expect(entry?.querySelector('[id$="-phaseDeg"]')).toBeNull();
      const angle = entry?.querySelector<HTMLInputElement>('[id$="-angle"]');
      expect(angle?.value).toBe('0');
      expect(entry?.querySelector<HTMLInputElement>('[id$="-mass"]')?.value).toBe('');

      const typeInto = async (selector: string, value: string) => {
        const input = entry!.querySelector<HTMLInputElement>(selector)!;
        input.value = value;
        input.dispatchEvent(new Event('input'));
        fixture.detectChanges();
        await fixture.whenStable();
      };
      await typeInto('[id$="-mass"]', '40');
      await typeInto('[id$="-s0-r0-amplitude"]', '0.61');
      await typeInto('[id$="-s0-r0-speedRpm"]', '2100');
      await typeInto('[id$="-s1-r0-amplitude"]', '0.33');
      await typeInto('[id$="-s1-r0-speedRpm"]', '2100');
      button(entry as HTMLElement, 'Save the trial run at 0° (1 of 3)').click();
      await settle(fixture);
      const request = http.expectOne('/api/v1/jobs/8/runs');
      expect(request.request.body).toEqual({
        kind: 'trial',
        trialWeight: { planeIndex: 0, massGrams: 40, angleDeg: 0 },
        readings: [
          { sensorSide: 'left', repeats: [{ amplitude: 0.61, speedRpm: 2100 }] },
          { sensorSide: 'right', repeats: [{ amplitude: 0.33, speedRpm: 2100 }] },
        ],
      });
      request.flush({ ...amplitudeOnlyJob([0]), version: 7 }, { headers: { ETag: '"7"' } });
      await settle(fixture);

      // The next position comes with the same mass: the technician typed it once.
      const next = element.querySelector('[data-testid="amplitude-only"]');
      expect(text(next?.querySelector('h4'))).toBe('Trial run at 120° (2 of 3), amplitude only');
      expect(next?.querySelector<HTMLInputElement>('[id$="-mass"]')?.value).toBe('40');
      expect(next?.querySelector<HTMLInputElement>('[id$="-angle"]')?.value).toBe('120');
      expect(text(next?.querySelector('.hint'))).toContain(
        'Move the same 40 g trial weight from its last position to 120°',
      );
    });

    it('says what the job has, and works it out once the three positions are stored', async () => {
      const { fixture, element } = await render(amplitudeOnlyJob([0, 120]));
      expect(methods(element)[3]?.status).toBe(
        'The initial run (run 1) and 40 g at 0° (run 2), 120° (run 3). Missing: 1 more trial run in the left plane.',
      );
      expect(text(element.querySelector('[data-testid="amplitude-only"] h4'))).toBe(
        'Trial run at 240° (3 of 3), amplitude only',
      );

      await render(amplitudeOnlyJob([0, 120, 240])).then(async ({ fixture: ready, element: page }) => {
        expect(methods(page)[3]?.status).toBe(
          'This job has it: the initial run (run 1) and 40 g at 0° (run 2), 120° (run 3), 240° (run 4) in the left plane.',
        );
        expect(page.querySelector('[data-testid="amplitude-only"]')).toBeNull();
        button(page, 'Work it out').click();
        const request = http.expectOne('/api/v1/jobs/8/corrections');
        expect(request.request.body).toEqual({ method: 'four-run' });
        request.flush(
          {
            type: 'about:blank',
            title: 'Conflict',
            status: 409,
            code: 'METHOD_NOT_POSSIBLE',
            detail:
              'Amplitude only needs the initial run (run 1) and the same trial weight at three positions.',
          },
          { status: 409, statusText: 'Conflict' },
        );
        await settle(ready);
        expect(text(page.querySelector('app-error-banner'))).toContain(
          'This job’s runs do not allow this method yet. Amplitude only needs the initial run (run 1)',
        );
      });
      fixture.destroy();
    });
  });
});
