import { formatDate } from '@angular/common';
import type { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonToggleGroupHarness } from '@angular/material/button-toggle/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import type { Role } from '@counterpoise/api';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../../auth/auth-session';
import { aSession } from '../../auth/testing';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import { JobSession } from '../job-session';
import type { Job } from '../jobs.api';
import { aPhoto, fakeObjectUrls } from '../../photos/photos-testing';
import { JobInspectionStep } from './inspection-step';
import { answered, configureStepTesting, renderStep, text } from './step-testing';
import { JOB_LET_GO_ON, JOB_ON_HOLD, JOB_SAFETY_ACKNOWLEDGED, MULCHER_FAMILY } from './testing-jobs';

/** The step as the job page shows it: the job as the session stores it, so a stored change shows at once. */
@Component({
  imports: [JobInspectionStep],
  template: `@if (session.job(); as job) {
    <app-job-inspection-step [job]="job" [family]="family()" [editable]="editable()" />
  }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class InspectionHost {
  protected readonly session = inject(JobSession);
  readonly family = signal<MachineFamily | undefined>(MULCHER_FAMILY);
  readonly editable = signal(true);
}

/** The same job on a machine without a family: the server judges it by common practice. */
const JOB_WITHOUT_FAMILY: Job = {
  ...JOB_SAFETY_ACKNOWLEDGED,
  machine: { ...JOB_SAFETY_ACKNOWLEDGED.machine, familyId: null, familyName: null },
};

describe('JobInspectionStep', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = configureStepTesting();
  });

  afterEach(() => {
    // The step lists the job's photos of the rotor as found; these specs show none.
    for (const request of http.match((each) => each.url.endsWith('/photos'))) {
      if (!request.cancelled) request.flush({ photos: [], limit: 40 });
    }
    http.verify();
  });

  async function render(job: Job, options: { role?: Role; family?: MachineFamily; editable?: boolean } = {}) {
    TestBed.inject(AuthSession).start(aSession(options.role ?? 'technician'));
    const fixture = await renderStep(InspectionHost, job, ({ componentInstance: host }) => {
      host.family.set('family' in options ? options.family : MULCHER_FAMILY);
      host.editable.set(options.editable ?? true);
    });
    const element = fixture.nativeElement as HTMLElement;
    const loader = TestbedHarnessEnvironment.loader(fixture);
    return {
      fixture,
      element,
      loader,
      overlays: TestbedHarnessEnvironment.documentRootLoader(fixture),
      input: (label: string) => loader.getHarness(MatInputHarness.with({ label })),
      submit: () => element.querySelector<HTMLButtonElement>('app-busy-button button')!.click(),
    };
  }

  async function choose(loader: ReturnType<typeof TestbedHarnessEnvironment.loader>, outcomes: string[]) {
    const groups = await loader.getAllHarnesses(MatButtonToggleGroupHarness);
    for (const [index, group] of groups.entries()) {
      const [toggle] = await group.getToggles({ text: new RegExp(`${outcomes[index]}$`) });
      await toggle!.check();
    }
  }

  it('shows the photos of the rotor as found, which the job’s technician may add to and a viewer may not', async () => {
    const urls = fakeObjectUrls();
    try {
      const job = JOB_SAFETY_ACKNOWLEDGED;
      const photo = aPhoto({
        id: 31,
        machineId: null,
        jobId: job.id,
        caption: 'Wire wrapped round the left hub',
      });
      for (const role of ['technician', 'viewer'] as const) {
        const { fixture, element } = await render(job, { role });
        http.expectOne(`/api/v1/jobs/${job.id}/photos`).flush({ photos: [photo], limit: 40 });
        http.expectOne('/api/v1/photos/31/thumbnail').flush(new Blob(['webp']));
        await new Promise((resolve) => setTimeout(resolve));
        fixture.detectChanges();
        const gallery = element.querySelector('app-photo-gallery')!;
        expect(text(gallery.querySelector('h3'))).toBe('The rotor as found');
        expect(gallery.querySelector('img')?.getAttribute('alt')).toBe('Wire wrapped round the left hub');
        expect(gallery.querySelector('.photos__add-button') !== null).toBe(role === 'technician');
        fixture.destroy();
      }
    } finally {
      urls.restore();
    }
  });

  it('shows each measure beside the family’s limit, and whether what is typed is within it', async () => {
    const { element, input } = await render(JOB_SAFETY_ACKNOWLEDGED);
    const limits = [...element.querySelectorAll('.limit')].map(text);
    expect(limits).toEqual(['Limit 0.3 mm', 'Limit 0.2 mm']);
    expect(text(element.querySelector('fieldset .hint'))).toBe(
      'Judged against the limits of Fixed-tooth mulcher drum, 2.0 m.',
    );
    await (await input('Bearing end play')).setValue('0.42');
    await (await input('Shaft runout')).setValue('0.2');
    expect([...element.querySelectorAll('.limit')].map(text)).toEqual([
      'Limit 0.3 mm: over the limit',
      'Limit 0.2 mm: within',
    ]);
    expect(element.querySelector('.limit')?.classList).toContain('limit--over');
  });

  it('shows the common-practice limits in mm for a machine without a family', async () => {
    const { element } = await render(JOB_WITHOUT_FAMILY, { family: undefined });
    expect([...element.querySelectorAll('.limit')].map(text)).toEqual(['Limit 3.175 mm', 'Limit 0.356 mm']);
    expect(text(element.querySelector('fieldset .hint'))).toBe(
      'Judged against common-practice limits (the machine has no family).',
    );
  });

  it('asks for every measure and check before it sends anything', async () => {
    const { fixture, element, loader, submit } = await render(JOB_SAFETY_ACKNOWLEDGED);
    submit();
    await answered(fixture);
    http.expectNone('/api/v1/jobs/13/inspection');
    const errors = await Promise.all(
      (await loader.getAllHarnesses(MatFormFieldHarness)).map((field) => field.getTextErrors()),
    );
    expect(errors.flat()).toEqual(['Enter the bearing end play in mm.', 'Enter the shaft runout in mm.']);
    expect(document.activeElement).toBe(element.querySelector('input[formcontrolname="bearingEndPlayMm"]'));
    expect([...element.querySelectorAll('.check .field-error')].map(text)).toEqual(
      Array(4).fill('Choose OK, fixed or fault left.'),
    );
  });

  it('sends the measures, the checks and the notes on the stored version', async () => {
    const { fixture, element, loader, input, submit } = await render(JOB_SAFETY_ACKNOWLEDGED);
    await (await input('Bearing end play')).setValue('0.42');
    await (await input('Shaft runout')).setValue('0.12');
    await choose(loader, ['OK', 'Fixed', 'Fault left', 'OK']);
    await (
      await input('Notes (optional)')
    ).setValue('  Crack at the weld of the left end plate, 40 mm long. ');
    submit();
    const request = http.expectOne('/api/v1/jobs/13/inspection');
    expect(request.request.method).toBe('PUT');
    expect(request.request.headers.get('If-Match')).toBe('"2"');
    expect(request.request.body).toEqual({
      bearingEndPlayMm: 0.42,
      shaftRunoutMm: 0.12,
      checks: { teethOrKnives: 'ok', buildUpCleaned: 'fixed', welds: 'fault', beltsAndPulleys: 'ok' },
      notes: 'Crack at the weld of the left end plate, 40 mm long.',
    });
    request.flush(JOB_ON_HOLD, { headers: { ETag: '"3"' } });
    await answered(fixture);
    expect(text(element.querySelector('.hold__heading'))).toBe('The job is on hold');
    expect(localStorage.getItem('counterpoise.job-draft.13.inspection')).toBeNull();
  });

  it('shows a job on hold with its reasons, tells a technician that a manager decides, and keeps the form to re-measure', async () => {
    const { fixture, element, loader, input, submit } = await render(JOB_ON_HOLD);
    expect([...element.querySelectorAll('.hold__reasons li')].map(text)).toEqual([
      'Bearing end play is 0.42 mm, over the limit of 0.3 mm: repair before balancing.',
      'Welds: a fault is left; fix it before balancing.',
    ]);
    expect(text(element.querySelector('.hold__decision'))).toContain(
      'a manager must decide whether the job goes on: it is listed on the manager’s home page',
    );
    expect(element.querySelector('.hold button')).toBeNull();

    // The form starts from the last measure; the technician changes what was repaired.
    expect(await (await input('Bearing end play')).getValue()).toBe('0.42');
    await (await input('Bearing end play')).setValue('0.18');
    const welds = (await loader.getAllHarnesses(MatButtonToggleGroupHarness))[2]!;
    await (await welds.getToggles({ text: /Fixed$/ }))[0]!.check();
    submit();
    const request = http.expectOne('/api/v1/jobs/13/inspection');
    expect(request.request.headers.get('If-Match')).toBe('"3"');
    expect(request.request.body).toEqual({
      bearingEndPlayMm: 0.18,
      shaftRunoutMm: 0.12,
      checks: { teethOrKnives: 'ok', buildUpCleaned: 'fixed', welds: 'fixed', beltsAndPulleys: 'ok' },
      notes: 'Crack at the weld of the left end plate, 40 mm long.',
    });
    const reopened: Job = {
      ...JOB_ON_HOLD,
      version: 4,
      status: 'open',
      nextStep: 'setup',
      inspection: {
        ...JOB_ON_HOLD.inspection!,
        bearingEndPlayMm: 0.18,
        checks: { ...JOB_ON_HOLD.inspection!.checks, welds: 'fixed' },
        passed: true,
        reasons: [],
      },
    };
    request.flush(reopened, { headers: { ETag: '"4"' } });
    await answered(fixture);
    expect(element.querySelector('.hold')).toBeNull();
    expect(element.querySelector('form')).toBeNull();
    expect(text(element.querySelector('.summary__heading'))).toBe('Within the limits');
  });

  it('lets a manager let the job go on, with the reason asked for and sent', async () => {
    const { fixture, element, overlays } = await render(JOB_ON_HOLD, { role: 'manager' });
    expect(text(element.querySelector('.hold__decision'))).not.toContain('a manager must decide');
    const button = [...element.querySelectorAll<HTMLButtonElement>('.hold button')].find(
      (candidate) => text(candidate) === 'Let the job go on',
    )!;
    button.click();
    const dialog = await overlays.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Let the job go on?');
    const reason = await dialog.getHarness(MatInputHarness);
    await reason.setValue(JOB_LET_GO_ON.inspection!.override!.reason);
    const confirm = [...document.querySelectorAll<HTMLButtonElement>('mat-dialog-actions button')].find(
      (candidate) => text(candidate) === 'Let the job go on',
    )!;
    confirm.click();
    await new Promise((resolve) => setTimeout(resolve));

    const request = http.expectOne('/api/v1/jobs/13/inspection/override');
    expect(request.request.method).toBe('POST');
    expect(request.request.headers.get('If-Match')).toBe('"3"');
    expect(request.request.body).toEqual({ reason: JOB_LET_GO_ON.inspection!.override!.reason });
    request.flush(JOB_LET_GO_ON, { headers: { ETag: '"4"' } });
    await answered(fixture);
    expect(element.querySelector('.hold')).toBeNull();
    expect(text(element.querySelector('.decided__reason'))).toBe(
      `“${JOB_LET_GO_ON.inspection!.override!.reason}”`,
    );
  });

  it('shows an overridden inspection with the reason, who and when, and what it had found', async () => {
    const { element } = await render(JOB_LET_GO_ON);
    const override = JOB_LET_GO_ON.inspection!.override!;
    expect(text(element.querySelector('.decided__heading'))).toBe(
      `Let go on by Dagny Fairbrook on ${formatDate(override.at, 'd MMM y, HH:mm', 'en-US')}`,
    );
    expect(text(element.querySelector('.decided__reason'))).toBe(`“${override.reason}”`);
    expect([...element.querySelectorAll('.decided li')].map(text)).toEqual(JOB_LET_GO_ON.inspection!.reasons);
    expect(element.querySelector('form')).toBeNull();
    expect(text(element.querySelector('.details'))).toContain('Bearing end play 0.42 mm (limit 0.3 mm)');
  });

  it('puts the server’s field errors on their fields', async () => {
    const { fixture, element, loader, input, submit } = await render(JOB_SAFETY_ACKNOWLEDGED);
    await (await input('Bearing end play')).setValue('0.2');
    await (await input('Shaft runout')).setValue('0.1');
    await choose(loader, ['OK', 'OK', 'OK', 'OK']);
    submit();
    http.expectOne('/api/v1/jobs/13/inspection').flush(
      {
        title: 'Invalid request',
        status: 400,
        detail: 'Check the highlighted fields.',
        errors: [
          { path: 'shaftRunoutMm', message: 'The runout is at most 10 mm.' },
          { path: 'checks.welds', message: 'A check is ok, fixed or fault.' },
        ],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await answered(fixture);
    const runout = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Shaft runout' }));
    expect(await runout.getTextErrors()).toEqual(['The runout is at most 10 mm.']);
    expect(text(element.querySelector('#check-error-welds'))).toBe('A check is ok, fixed or fault.');
    expect(element.querySelector('app-error-banner')).toBeNull();
  });

  it('restores what was typed on the device', async () => {
    localStorage.setItem(
      'counterpoise.job-draft.13.inspection',
      JSON.stringify({
        bearingEndPlayMm: 0.21,
        shaftRunoutMm: null,
        checks: { teethOrKnives: 'fixed', buildUpCleaned: null, welds: null, beltsAndPulleys: null },
        notes: 'Two teeth replaced',
      }),
    );
    const { loader, input } = await render(JOB_SAFETY_ACKNOWLEDGED);
    expect(await (await input('Bearing end play')).getValue()).toBe('0.21');
    expect(await (await input('Notes (optional)')).getValue()).toBe('Two teeth replaced');
    const [teeth] = await loader.getAllHarnesses(MatButtonToggleGroupHarness);
    const checked = await Promise.all((await teeth!.getToggles()).map((toggle) => toggle.isChecked()));
    expect(checked).toEqual([false, true, false]);
  });
});
