import type { HttpTestingController } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import type { ComponentFixture } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { JobSession } from '../job-session';
import type { ImportedRun, Job, ReadingsImportPreview } from '../jobs.api';
import { JobRunsStep } from '../steps/runs-step';
import { configureStepTesting, renderStep, text } from '../steps/step-testing';
import { JOB_AFTER_LEFT_TRIAL, MULCHER_MACHINE } from '../steps/testing-jobs';
import { describeImportError, describeLines, FORMAT_SUMMARY } from './readings-import-dialog';

/** The runs step, as the job page shows it, with its own session: the dialog opens from it. */
@Component({
  imports: [JobRunsStep],
  providers: [JobSession],
  template: `
    @if (session.job(); as job) {
      <app-job-runs-step [job]="job" [machine]="machine" [editable]="true" />
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly session = inject(JobSession);
  readonly machine = MULCHER_MACHINE;
}

const JOB = JOB_AFTER_LEFT_TRIAL;
const PREVIEW_URL = `/api/v1/jobs/${JOB.id}/runs/import/preview`;
const IMPORT_URL = `/api/v1/jobs/${JOB.id}/runs/import`;

/** A trial run in the right plane as the server previews it, from the file's lines 3 to 6. */
const RIGHT_TRIAL: ImportedRun = {
  fileRun: 1,
  rows: [3, 4, 5, 6],
  sequence: 3,
  kind: 'trial',
  amplitudeOnly: false,
  trialWeight: { planeIndex: 1, massGrams: 120, angleDeg: 0 },
  weightsOnRotor: [],
  readings: [
    {
      sensorSide: 'left',
      repeats: [
        { amplitude: 0.59, phaseDeg: 302, speedRpm: 2099 },
        { amplitude: 0.58, phaseDeg: 303, speedRpm: 2100 },
      ],
      average: { amplitude: 0.585, phaseDeg: 302.5 },
      spread: 0.006,
      spreadRatio: 0.01,
      trusted: true,
      speedRpm: 2099.5,
    },
    {
      sensorSide: 'right',
      repeats: [
        { amplitude: 0.31, phaseDeg: 126, speedRpm: 2099 },
        { amplitude: 0.42, phaseDeg: 150, speedRpm: 2100 },
      ],
      average: { amplitude: 0.36, phaseDeg: 140 },
      spread: 0.09,
      spreadRatio: 0.25,
      trusted: false,
      speedRpm: 2099.5,
    },
  ],
  warnings: ['Right sensor: the readings spread by 25 % of their average (limit 20 %).'],
};

function preview(overrides: Partial<ReadingsImportPreview> = {}): ReadingsImportPreview {
  return {
    jobId: JOB.id,
    jobVersion: JOB.version,
    amplitudeUnit: 'in/s-pk',
    rowCount: 4,
    runs: [RIGHT_TRIAL],
    errors: [],
    ...overrides,
  };
}

/** The job as stored after the import: the run added, one version on. */
const IMPORTED: Job = {
  ...JOB,
  version: JOB.version + 1,
  runs: [
    ...JOB.runs,
    {
      ...JOB.runs[1]!,
      id: 903,
      sequence: 3,
      trialWeight: RIGHT_TRIAL.trialWeight,
      readings: RIGHT_TRIAL.readings,
      warnings: RIGHT_TRIAL.warnings,
    },
  ],
};

describe('ReadingsImportDialog', { timeout: 30_000 }, () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<Host>;

  beforeEach(async () => {
    http = configureStepTesting();
    fixture = await renderStep(Host, JOB);
  });

  afterEach(() => {
    http.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((container) => (container.innerHTML = ''));
  });

  const dialog = () => document.querySelector<HTMLElement>('mat-dialog-container');
  const buttonIn = (root: ParentNode | null, label: string) =>
    [...(root?.querySelectorAll<HTMLButtonElement>('button') ?? [])].find((button) =>
      text(button).includes(label),
    );

  async function settle(): Promise<void> {
    fixture.detectChanges();
    await fixture.whenStable();
    fixture.detectChanges();
  }

  async function open(): Promise<void> {
    buttonIn(fixture.nativeElement as HTMLElement, 'Import readings from a file')!.click();
    await settle();
    expect(dialog()).not.toBeNull();
  }

  /** Chooses a file in the dialog as the system's chooser would, and answers nothing yet. */
  async function choose(file: File): Promise<void> {
    const input = dialog()!.querySelector<HTMLInputElement>('input[type=file]')!;
    Object.defineProperty(input, 'files', { value: [file], configurable: true });
    input.dispatchEvent(new Event('change'));
    await settle();
  }

  const csv = (name = 'right-trial.csv') =>
    new File(['run,kind,sensorSide,amplitude,phaseDeg,speedRpm,amplitudeUnit\n'], name, { type: 'text/csv' });

  it('opens from the runs step with the file button, a summary of the columns and the sample file', async () => {
    await open();
    expect(text(dialog()!.querySelector('h2'))).toBe('Import readings from a file');
    expect(text(dialog()!.querySelector('.readings-import__file'))).toBe('No file chosen');
    const columns = [...dialog()!.querySelectorAll('.readings-import__columns dt')].map((dt) => text(dt));
    expect(columns).toEqual(FORMAT_SUMMARY.map((item) => item.column));
    // The sample offered is the documentation's sample file itself, embedded at build time.
    const sample = dialog()!.querySelector<HTMLAnchorElement>('a.readings-import__sample')!;
    expect(sample.getAttribute('download')).toBe('readings-sample.csv');
    const content = decodeURIComponent(sample.href.replace(/^data:text\/csv;charset=utf-8,/, ''));
    expect(content).toContain(
      'run,kind,sensorSide,amplitude,phaseDeg,speedRpm,amplitudeUnit,trialPlaneIndex,trialMassGrams,trialAngleDeg',
    );
    expect(content).toContain('2,trial,left,0.29,207,2151,in/s-pk,0,120,0');
    expect(buttonIn(dialog(), 'Import')!.getAttribute('aria-disabled')).toBe('true');
  });

  it('previews a good file: the runs as the server averages them, and Import stores them through the session', async () => {
    await open();
    const file = csv();
    await choose(file);
    const sent = http.expectOne({ method: 'POST', url: PREVIEW_URL });
    expect(sent.request.body).toBe(file);
    expect(sent.request.headers.get('Content-Type')).toBe('text/csv');
    expect(sent.request.headers.has('If-Match')).toBe(false);
    sent.flush(preview());
    await settle();

    expect(text(dialog()!.querySelector('[role=status]'))).toBe(
      '1 run to add from 4 rows. Nothing is saved until you import.',
    );
    expect(text(dialog()!.querySelector('.readings-import__file'))).toBe('right-trial.csv');
    const run = dialog()!.querySelector('tbody[data-run="3"]')!;
    expect([...run.querySelectorAll('.run-cell > span')].map((line) => text(line))).toEqual([
      'Run 3 · Trial run',
      '120 g at 0° in the right plane',
      'File run 1, lines 3–6',
    ]);
    const rows = [...run.querySelectorAll('tr:not(.run-row):not(.warnings)')].map((row) =>
      [...row.querySelectorAll('td')].map((cell) => text(cell)),
    );
    expect(rows).toEqual([
      ['Left', '0.585 in/s peak at 302.5°', '2', '1 %'],
      ['Right', '0.36 in/s peak at 140°', '2', '25 % not trusted'],
    ]);
    expect(text(run.querySelector('.warnings'))).toBe(
      'Right sensor: the readings spread by 25 % of their average (limit 20 %).',
    );
    expect(dialog()!.querySelector('.readings-import__problems')).toBeNull();

    const importButton = buttonIn(dialog(), 'Import 1 run')!;
    expect(importButton.getAttribute('aria-disabled')).toBeNull();
    importButton.click();
    await settle();
    const stored = http.expectOne({ method: 'POST', url: IMPORT_URL });
    expect(stored.request.body).toBe(file);
    expect(stored.request.headers.get('If-Match')).toBe(`"${JOB.version}"`);
    expect(stored.request.headers.get('Content-Type')).toBe('text/csv');
    stored.flush(IMPORTED, {
      status: 201,
      statusText: 'Created',
      headers: { ETag: `"${IMPORTED.version}"` },
    });
    await settle();
    await new Promise((resolve) => setTimeout(resolve, 0));
    await settle();

    const session = fixture.componentInstance.session;
    expect(session.versioned()?.etag).toBe(`"${IMPORTED.version}"`);
    expect(session.job()?.runs).toHaveLength(3);
    expect(session.saveState()).toMatchObject({ kind: 'saved', what: 'Readings from right-trial.csv' });
    expect(dialog()).toBeNull();
    // The runs step shows the job as stored, the imported run with it.
    expect(text((fixture.nativeElement as HTMLElement).querySelector('.run[data-run="3"] .run__trial'))).toBe(
      'Trial weight: 120 g at 0° in the right plane',
    );
  });

  it('names every bad row and offers no import until the file is fixed and chosen again', async () => {
    await open();
    await choose(csv('bad.csv'));
    http.expectOne(PREVIEW_URL).flush(
      preview({
        rowCount: 9,
        runs: [{ ...RIGHT_TRIAL, fileRun: 4, rows: [10, 11, 12, 13] }],
        errors: [
          { path: 'columns', row: null, column: null, value: 'phase', message: '“phase” is not a column.' },
          {
            path: 'rows[2].phaseDeg',
            row: 2,
            column: 'phaseDeg',
            value: '412',
            message: 'The phase is from 0 to 359.9 degrees.',
          },
          {
            path: 'rows[9].kind',
            row: 9,
            column: 'kind',
            value: 'initial',
            message: 'The job cannot take run 3 of the file: The job has its initial run already.',
          },
        ],
      }),
    );
    await settle();
    expect(text(dialog()!.querySelector('[role=status]'))).toBe(
      '3 problems in the file: nothing can be imported until they are fixed.',
    );
    expect(
      [...dialog()!.querySelectorAll('.readings-import__problems li')].map((item) => text(item)),
    ).toEqual([
      'Header: “phase” is not a column. Found “phase”.',
      'Row 2, phase: The phase is from 0 to 359.9 degrees. Found “412”.',
      'Row 9, kind: The job cannot take run 3 of the file: The job has its initial run already. Found “initial”.',
    ]);
    expect(text(dialog()!.querySelector('#readings-import-runs'))).toBe('Runs without a bad row');
    const importButton = buttonIn(dialog(), 'Import')!;
    expect(importButton.getAttribute('aria-disabled')).toBe('true');
    importButton.click();
    await settle();
    http.expectNone(IMPORT_URL);

    // Fixed and chosen again: previewed again, and now it may be imported.
    await choose(csv('bad.csv'));
    http.expectOne(PREVIEW_URL).flush(preview());
    await settle();
    expect(dialog()!.querySelector('.readings-import__problems')).toBeNull();
    expect(buttonIn(dialog(), 'Import 1 run')!.getAttribute('aria-disabled')).toBeNull();
  });

  it('after a 412 shows the job as stored and previews the file again against it', async () => {
    await open();
    await choose(csv());
    http.expectOne(PREVIEW_URL).flush(preview());
    await settle();
    buttonIn(dialog(), 'Import 1 run')!.click();
    await settle();
    const changed: Job = { ...JOB, version: JOB.version + 1 };
    http.expectOne(IMPORT_URL).flush(
      {
        type: 'about:blank',
        title: 'Precondition Failed',
        status: 412,
        code: 'CHANGED_MEANWHILE',
        detail: 'The job was changed by someone else since you read it.',
        current: changed,
      },
      { status: 412, statusText: 'Precondition Failed', headers: { ETag: `"${changed.version}"` } },
    );
    await settle();
    expect(fixture.componentInstance.session.versioned()?.etag).toBe(`"${changed.version}"`);
    http.expectOne(PREVIEW_URL).flush(preview({ jobVersion: changed.version }));
    await settle();
    expect(text(dialog()!.querySelector('.readings-import__note'))).toContain(
      'The job was changed meanwhile',
    );
    expect(buttonIn(dialog(), 'Import 1 run')!.getAttribute('aria-disabled')).toBeNull();
    buttonIn(dialog(), 'Import 1 run')!.click();
    await settle();
    const again = http.expectOne(IMPORT_URL);
    expect(again.request.headers.get('If-Match')).toBe(`"${changed.version}"`);
    again.flush(IMPORTED, { status: 201, statusText: 'Created', headers: { ETag: `"${IMPORTED.version}"` } });
    await settle();
  });

  it('says why a preview failed (the job not open), and offers no import', async () => {
    await open();
    await choose(csv());
    http.expectOne(PREVIEW_URL).flush(
      {
        type: 'about:blank',
        title: 'Conflict',
        status: 409,
        detail: 'The job is completed: this step needs it open.',
      },
      { status: 409, statusText: 'Conflict' },
    );
    await settle();
    expect(text(dialog()!.querySelector('app-error-banner'))).toContain(
      'The job is completed: this step needs it open.',
    );
    expect(buttonIn(dialog(), 'Import')!.getAttribute('aria-disabled')).toBe('true');
  });
});

describe('the words of the dialog', () => {
  it('names a bad row, the header or the file as a whole', () => {
    expect(
      describeImportError({
        path: 'rows[12].phaseDeg',
        row: 12,
        column: 'phaseDeg',
        value: '412',
        message: 'The phase is from 0 to 359.9 degrees.',
      }),
    ).toBe('Row 12, phase: The phase is from 0 to 359.9 degrees. Found “412”.');
    expect(
      describeImportError({ path: 'rows[7]', row: 7, column: null, value: null, message: 'Too few cells.' }),
    ).toBe('Row 7: Too few cells.');
    expect(
      describeImportError({
        path: 'file',
        row: null,
        column: null,
        value: null,
        message: 'The file is empty.',
      }),
    ).toBe('File: The file is empty.');
  });

  it('writes the lines of a run as spans', () => {
    expect(describeLines([4])).toBe('line 4');
    expect(describeLines([4, 5, 6, 7])).toBe('lines 4–7');
    expect(describeLines([4, 5, 9, 11, 12])).toBe('lines 4–5, 9, 11–12');
  });
});
