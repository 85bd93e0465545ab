import type { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonToggleGroupHarness } from '@angular/material/button-toggle/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../../auth/auth-session';
import { aSession } from '../../auth/testing';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import type { Machine } from '../../machines/machines.api';
import { JobSession } from '../job-session';
import type { Job } from '../jobs.api';
import { JobSetupStep } from './setup-step';
import { answered, configureStepTesting, renderStep, text } from './step-testing';
import { JOB_AFTER_LEFT_TRIAL, JOB_LET_GO_ON, MULCHER_FAMILY, MULCHER_MACHINE } from './testing-jobs';

/** The step as the job page shows it: the job as the session stores it, the machine and family as they load. */
@Component({
  imports: [JobSetupStep],
  template: `@if (session.job(); as job) {
    <app-job-setup-step [job]="job" [machine]="machine()" [family]="family()" [editable]="editable()" />
  }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class SetupHost {
  protected readonly session = inject(JobSession);
  readonly machine = signal<Machine | undefined>(undefined);
  readonly family = signal<MachineFamily | undefined>(undefined);
  readonly editable = signal(true);
}

/** Job 13 with a set-up stored and no run read yet: the set-up may still change. */
const JOB_WITH_SETUP: Job = {
  ...JOB_LET_GO_ON,
  version: 5,
  nextStep: 'runs',
  setup: JOB_AFTER_LEFT_TRIAL.setup,
};

describe('JobSetupStep', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = configureStepTesting();
    TestBed.inject(AuthSession).start(aSession('technician'));
  });

  afterEach(() => http.verify());

  async function render(
    job: Job,
    options: { machine?: Machine; family?: MachineFamily; editable?: boolean } = {},
  ) {
    const fixture = await renderStep(SetupHost, job, ({ componentInstance: host }) => {
      host.machine.set('machine' in options ? options.machine : MULCHER_MACHINE);
      host.family.set('family' in options ? options.family : MULCHER_FAMILY);
      host.editable.set(options.editable ?? true);
    });
    const host = fixture.componentInstance;
    const element = fixture.nativeElement as HTMLElement;
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const groups = async () => {
      const [rotation, unit, phase, angles] = await loader.getAllHarnesses(MatButtonToggleGroupHarness);
      return { rotation: rotation!, unit: unit!, phase: phase!, angles: angles! };
    };
    return {
      fixture,
      host,
      element,
      loader,
      groups,
      input: (label: string) => loader.getHarness(MatInputHarness.with({ label })),
      sensor: (label: string) => loader.getHarness(MatCheckboxHarness.with({ label })),
      submit: () => element.querySelector<HTMLButtonElement>('app-busy-button button')!.click(),
    };
  }

  async function checkedText(group: MatButtonToggleGroupHarness): Promise<string[]> {
    const toggles = await group.getToggles({ checked: true });
    return Promise.all(toggles.map((toggle) => toggle.getText()));
  }

  it('starts from the machine: its sensors, rotation and speed, and its family’s unit', async () => {
    const { element, groups, input, sensor } = await render(JOB_LET_GO_ON);
    expect(await (await sensor('Left side')).isChecked()).toBe(true);
    expect(await (await sensor('Right side')).isChecked()).toBe(true);
    const { rotation, unit, phase, angles } = await groups();
    expect(await checkedText(rotation)).toEqual(['Counter-clockwise']);
    expect(text(element.querySelector('#setup-rotation-hint'))).toBe(
      'Seen from the right end it turns clockwise.',
    );
    expect(await (await input('Operating speed')).getValue()).toBe('2100');
    expect(await checkedText(unit)).toEqual(['in/s peak']);
    expect(text(element.querySelector('#setup-unit-hint'))).toBe(
      'in/s peak is the unit of the family’s acceptance level.',
    );
    expect(await checkedText(phase)).toEqual(['Lag (the usual)']);
    expect(await checkedText(angles)).toEqual(['Against rotation']);
    expect(element.querySelector('.warning')).toBeNull();
  });

  it('fills in the machine once its record arrives, and takes the unit of its own acceptance level', async () => {
    const { fixture, host, groups, input } = await render(JOB_LET_GO_ON, { machine: undefined });
    expect(await (await input('Operating speed')).getValue()).toBe('');
    host.machine.set({
      ...MULCHER_MACHINE,
      operatingSpeedRpm: 1850,
      acceptance: { kind: 'shop-target', amplitude: 4.5, unit: 'mm/s-rms' },
    });
    await answered(fixture);
    expect(await (await input('Operating speed')).getValue()).toBe('1850');
    expect(await checkedText((await groups()).unit)).toEqual(['mm/s RMS']);
  });

  it('explains how the phase and the weight angles count in plain words as they are chosen', async () => {
    const { element, groups } = await render(JOB_LET_GO_ON);
    expect(text(element.querySelector('#setup-phase-hint'))).toContain(
      'how far the rotor turns from the moment the reference mark passes the tachometer until the vibration peaks',
    );
    const { phase, angles } = await groups();
    await (await phase.getToggles({ text: 'Lead' }))[0]!.check();
    expect(text(element.querySelector('#setup-phase-hint'))).toContain('as a lead on the reference mark');
    await (await angles.getToggles({ text: 'With rotation' }))[0]!.check();
    expect(text(element.querySelector('#setup-angles-hint'))).toBe(
      'A weight at 90° sits a quarter turn from the reference mark, counted the way the rotor turns.',
    );
  });

  it('warns, without refusing, when one sensor is set on a two-plane rotor, and sends the set-up on the stored version', async () => {
    const { fixture, element, groups, input, sensor, submit } = await render(JOB_LET_GO_ON);
    await (await sensor('Right side')).uncheck();
    expect([...element.querySelectorAll('.warning')].map(text)).toEqual([
      'This rotor has two correction planes, and two-plane correction needs a sensor on each side. With the left sensor alone, only one plane can be corrected at a time.',
    ]);
    await (await input('Where on the left side')).setValue(' Left bearing housing, vertical ');
    await (await input('Tachometer')).setValue('Optical, on a magnetic stand at the left skid');
    await (await input('Reference mark')).setValue('Tape on the left end plate at tooth row 1');
    await (await input('Operating speed')).setValue('2080');
    await (await (await groups()).unit.getToggles({ text: 'mm/s RMS' }))[0]!.check();
    submit();
    const request = http.expectOne('/api/v1/jobs/13/setup');
    expect(request.request.method).toBe('PUT');
    expect(request.request.headers.get('If-Match')).toBe('"4"');
    expect(request.request.body).toEqual({
      sensors: [{ side: 'left', position: 'Left bearing housing, vertical' }],
      tachometer: 'Optical, on a magnetic stand at the left skid',
      referenceMark: 'Tape on the left end plate at tooth row 1',
      rotationSeenFromLeft: 'counterClockwise',
      operatingSpeedRpm: 2080,
      amplitudeUnit: 'mm/s-rms',
      phaseSense: 'lag',
      weightAngles: 'againstRotation',
    });
    request.flush(JOB_WITH_SETUP, { headers: { ETag: '"5"' } });
    await answered(fixture);
    expect(localStorage.getItem('counterpoise.job-draft.13.setup')).toBeNull();
  });

  it('notes sensors that differ from the machine’s record on a one-plane rotor', async () => {
    const { element, sensor } = await render(JOB_LET_GO_ON, {
      machine: { ...MULCHER_MACHINE, sensorSides: ['left'], planes: [MULCHER_MACHINE.planes[0]!] },
    });
    expect(element.querySelector('.warning')).toBeNull();
    await (await sensor('Left side')).uncheck();
    await (await sensor('Right side')).check();
    expect([...element.querySelectorAll('.warning')].map(text)).toEqual([
      'The machine’s record has sensors on the left side: check that the readings will match earlier jobs.',
    ]);
  });

  it('asks for a sensor and a speed before it sends anything', async () => {
    const { fixture, element, loader, input, sensor, submit } = await render(JOB_LET_GO_ON);
    await (await sensor('Left side')).uncheck();
    await (await sensor('Right side')).uncheck();
    await (await input('Operating speed')).setValue('');
    submit();
    await answered(fixture);
    http.expectNone('/api/v1/jobs/13/setup');
    expect(text(element.querySelector('#sensors-error'))).toBe('Place at least one sensor.');
    expect(document.activeElement).toBe(element.querySelector('.sensor__used input'));
    const speed = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Operating speed' }));
    expect(await speed.getTextErrors()).toEqual(['Enter the operating speed in rpm.']);
  });

  it('puts the server’s field errors on their fields, a sensor’s on its side', async () => {
    const { fixture, loader, submit } = await render(JOB_LET_GO_ON);
    submit();
    http.expectOne('/api/v1/jobs/13/setup').flush(
      {
        title: 'Invalid request',
        status: 400,
        detail: 'Check the highlighted fields.',
        errors: [
          { path: 'sensors/1/position', message: 'Keep the position to 200 characters.' },
          { path: 'operatingSpeedRpm', message: 'The speed is at most 30000 rpm.' },
        ],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await answered(fixture);
    const right = await loader.getHarness(
      MatFormFieldHarness.with({ floatingLabelText: 'Where on the right side' }),
    );
    expect(await right.getTextErrors()).toEqual(['Keep the position to 200 characters.']);
    const speed = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Operating speed' }));
    expect(await speed.getTextErrors()).toEqual(['The speed is at most 30000 rpm.']);
  });

  it('opens a stored set-up for change until a run is read', async () => {
    const { input, sensor, element } = await render(JOB_WITH_SETUP);
    expect(await (await input('Where on the right side')).getValue()).toBe(
      'Right bearing housing, horizontal',
    );
    expect(await (await input('Reference mark')).getValue()).toBe(
      'Reflective tape on the left end plate, in line with tooth row 1',
    );
    expect(await (await sensor('Right side')).isChecked()).toBe(true);
    expect(text(element.querySelector('app-busy-button'))).toBe('Store the changed set-up');
  });

  it('shows the set-up read-only once a run is read, and says why', async () => {
    const { element, loader } = await render(JOB_AFTER_LEFT_TRIAL);
    expect(element.querySelector('form')).toBeNull();
    expect(await loader.getAllHarnesses(MatInputHarness)).toEqual([]);
    expect(text(element.querySelector('.fixed'))).toBe(
      'The runs are read with this set-up, so it can no longer change. Another set-up needs a new job.',
    );
    expect([...element.querySelectorAll('.details__list li')].map(text)).toEqual([
      'Left side: Left bearing housing, horizontal',
      'Right side: Right bearing housing, horizontal',
    ]);
    const details = Object.fromEntries(
      [...element.querySelectorAll('.details > div:not(.wide)')].map((item) => [
        text(item.querySelector('dt')),
        text(item.querySelector('dd')),
      ]),
    );
    expect(details).toEqual({
      Tachometer: 'Magnetic stand on the left skid, aimed at the end plate',
      'Reference mark': 'Reflective tape on the left end plate, in line with tooth row 1',
      Rotation: 'Counter-clockwise seen from the left end',
      'Operating speed': '2,100 rpm',
      'Amplitude unit': 'in/s peak',
      'Phase counts as': 'Lag (the usual)',
      'Weight angles': 'Against rotation',
    });
  });

  it('restores what was typed on the device over the machine’s values', async () => {
    localStorage.setItem(
      'counterpoise.job-draft.13.setup',
      JSON.stringify({
        sensors: {
          left: { used: true, position: 'Left housing, top' },
          right: { used: false, position: '' },
        },
        tachometer: 'Laser tach on a tripod',
        referenceMark: '',
        rotationSeenFromLeft: 'clockwise',
        operatingSpeedRpm: 1990,
        amplitudeUnit: 'mm/s-rms',
        phaseSense: 'lead',
        weightAngles: 'withRotation',
      }),
    );
    const { groups, input, sensor } = await render(JOB_LET_GO_ON);
    expect(await (await sensor('Right side')).isChecked()).toBe(false);
    expect(await (await input('Where on the left side')).getValue()).toBe('Left housing, top');
    expect(await (await input('Operating speed')).getValue()).toBe('1990');
    const { rotation, phase } = await groups();
    expect(await checkedText(rotation)).toEqual(['Clockwise']);
    expect(await checkedText(phase)).toEqual(['Lead']);
  });
});
