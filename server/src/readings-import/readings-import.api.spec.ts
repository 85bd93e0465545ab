/*
 * Importing a job's run readings from a CSV file through the real app: the documented samples import, a
 * preview saves nothing and shows exactly what the import stores, every bad file is refused with a problem
 * naming its rows and nothing stored, the version rules hold under parallel imports of one file, and only
 * those who may add a run to the job may import one (another organisation's job is not found).
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import {
  type Job,
  ProblemSchema,
  READINGS_CSV_MAX_BYTES,
  ReadingsImportPreviewSchema,
} from '@counterpoise/api';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type RecordsTestApp, rowCount, startRecordsTestApp } from '../records/records.test-app';
import {
  type JobBody,
  jobsAs,
  machineOfFamily,
  modelReadings,
  type ModelRotor,
  readyForRuns,
  runReadings,
} from '../jobs/jobs.test-app';

let test: RecordsTestApp;
let onePlane: number;
let twoPlanes: number;
beforeAll(async () => {
  test = await startRecordsTestApp();
  onePlane = (await machineOfFamily(test, test.tokens.owner)).machineId;
  twoPlanes = (await machineOfFamily(test, test.tokens.owner, { planeCount: 2 })).machineId;
});
afterAll(async () => test.close());

const HEADER =
  'run,kind,sensorSide,amplitude,phaseDeg,speedRpm,amplitudeUnit,trialPlaneIndex,trialMassGrams,trialAngleDeg';
const sample = (name: string) => readFileSync(resolve(__dirname, '../../../docs/samples', name));
const jobPath = (id: number) => `/api/v1/jobs/${id}`;

/** A one-plane rotor read by one sensor: initial 0.5 in/s at 60°, 0.004 in/s per gram at 30°. */
const SINGLE: ModelRotor = {
  initial: [{ amplitude: 0.5, phaseDeg: 60 }],
  coefficients: [[{ amplitudePerMass: 0.004, phaseDeg: 30 }]],
};

/** A job of the technician's ready for runs, on `machineId`, read by `sides`; with its initial run if asked. */
async function readyJob(
  machineId: number,
  sides: ('left' | 'right')[] = ['left'],
  options: { initial?: boolean; token?: string } = {},
): Promise<JobBody> {
  const token = options.token ?? test.tokens.technician;
  const created = await jobsAs(test, token).create({ machineId, scheduledFor: '2026-05-04' });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const ready = await readyForRuns(test, token, created.body.id, created.body.version, sides);
  if (!options.initial) return ready;
  const run = await jobsAs(test, token).post(
    `${jobPath(ready.id)}/runs`,
    { kind: 'initial', readings: runReadings(sides, SINGLE.initial) },
    ready.version,
  );
  expect(run.status, JSON.stringify(run.body)).toBe(201);
  return run.body as JobBody;
}

/** Posts a file as text/csv (or as `type`), to the preview or the import with `version` in If-Match. */
function send(
  jobId: number,
  file: string | Buffer,
  options: { token?: string; version?: number; preview?: boolean; type?: string } = {},
) {
  const path = `${jobPath(jobId)}/runs/import${options.preview ? '/preview' : ''}`;
  const call = request(test.app)
    .post(path)
    .set('Authorization', `Bearer ${options.token ?? test.tokens.technician}`)
    .set('Content-Type', options.type ?? 'text/csv');
  if (options.version !== undefined) call.set('If-Match', `"${options.version}"`);
  return call.send(typeof file === 'string' ? Buffer.from(file) : file);
}

const preview = (jobId: number, file: string | Buffer, token?: string) =>
  send(jobId, file, { preview: true, ...(token === undefined ? {} : { token }) });

async function storedJob(jobId: number): Promise<JobBody> {
  const read = await jobsAs(test, test.tokens.technician).get(jobPath(jobId));
  expect(read.status).toBe(200);
  return read.body as JobBody;
}

/** The rows of a trial run of the modelled rotor, `repeats` per sensor, with a small scatter. */
function trialRows(
  run: number,
  weight: { planeIndex: number; massGrams: number; angleDeg: number },
): string[] {
  const [reading] = modelReadings(SINGLE, [weight]);
  return [0, 1, 2].map(
    (repeat) =>
      `${run},trial,left,${(reading!.amplitude + 0.004 * (repeat - 1)).toFixed(3)},` +
      `${(reading!.phaseDeg + repeat - 1).toFixed(1)},${2150 + repeat},in/s-pk,` +
      `${weight.planeIndex},${weight.massGrams},${weight.angleDeg}`,
  );
}

describe('the samples of docs/readings-csv.md', () => {
  it('readings.csv: previewed, then imported into a two-plane job, as the preview showed', async () => {
    const job = await readyJob(twoPlanes, ['left', 'right']);
    const seen = await preview(job.id, sample('readings.csv'));
    expect(seen.status, JSON.stringify(seen.body)).toBe(200);
    const shown = ReadingsImportPreviewSchema.parse(seen.body);
    expect(shown.errors).toEqual([]);
    expect(shown).toMatchObject({
      jobId: job.id,
      jobVersion: job.version,
      amplitudeUnit: 'in/s-pk',
      rowCount: 18,
    });
    expect(shown.runs.map((run) => [run.sequence, run.kind, run.trialWeight?.planeIndex ?? null])).toEqual([
      [1, 'initial', null],
      [2, 'trial', 0],
      [3, 'trial', 1],
    ]);
    // The server's own averaging: the initial run's left sensor is the vector mean of 0.48/212, 0.47/213, 0.49/211.
    const left = shown.runs[0]!.readings.find((reading) => reading.sensorSide === 'left')!;
    expect(left.average.amplitude).toBeCloseTo(0.48, 3);
    expect(left.average.phaseDeg).toBeCloseTo(212, 1);
    expect(left.trusted).toBe(true);
    expect((await storedJob(job.id)).runs).toEqual([]);

    const imported = await send(job.id, sample('readings.csv'), { version: shown.jobVersion });
    expect(imported.status, JSON.stringify(imported.body)).toBe(201);
    expect(imported.headers['etag']).toBe(`"${job.version + 1}"`);
    const stored = imported.body as Job;
    expect(stored.version).toBe(job.version + 1);
    expect(
      stored.runs.map(
        ({ sequence, kind, amplitudeOnly, trialWeight, weightsOnRotor, readings, warnings }) => ({
          sequence,
          kind,
          amplitudeOnly,
          trialWeight,
          weightsOnRotor,
          readings,
          warnings,
        }),
      ),
    ).toEqual(shown.runs.map(({ fileRun: _fileRun, rows: _rows, ...run }) => run));
    // The runs it stored are a job's runs like typed ones: a two-plane correction computes from them.
    const correction = await jobsAs(test, test.tokens.technician).post(
      `${jobPath(job.id)}/corrections`,
      { method: 'multi-plane' },
      stored.version,
    );
    expect(correction.status, JSON.stringify(correction.body)).toBe(201);
  });

  it('readings-amplitude-only.csv: four runs without phase, from which the four-run method computes', async () => {
    const job = await readyJob(onePlane);
    const seen = ReadingsImportPreviewSchema.parse(
      (await preview(job.id, sample('readings-amplitude-only.csv'))).body,
    );
    expect(seen.errors).toEqual([]);
    expect(seen.runs.map((run) => run.amplitudeOnly)).toEqual([true, true, true, true]);
    const imported = await send(job.id, sample('readings-amplitude-only.csv'), { version: seen.jobVersion });
    expect(imported.status, JSON.stringify(imported.body)).toBe(201);
    const correction = await jobsAs(test, test.tokens.technician).post(
      `${jobPath(job.id)}/corrections`,
      { method: 'four-run' },
      imported.body.version,
    );
    expect(correction.status, JSON.stringify(correction.body)).toBe(201);
  });
});

describe('readings of a modelled rotor after a typed initial run', () => {
  it('two trial runs import on the job as it stands; the server’s averages and warnings are the preview’s', async () => {
    const job = await readyJob(onePlane, ['left'], { initial: true });
    const file = [
      HEADER,
      ...trialRows(1, { planeIndex: 0, massGrams: 50, angleDeg: 0 }),
      ...trialRows(2, { planeIndex: 0, massGrams: 50, angleDeg: 90 }).map((row) =>
        // The second trial run read 4 % slower: the speed-drift warning of a typed run.
        row.replace(/,215(\d),in/, ',206$1,in'),
      ),
    ].join('\n');
    const seen = ReadingsImportPreviewSchema.parse((await preview(job.id, file)).body);
    expect(seen.errors).toEqual([]);
    expect(seen.runs.map((run) => run.sequence)).toEqual([2, 3]);
    expect(seen.runs[0]!.warnings).toEqual([]);
    expect(seen.runs[1]!.warnings.join(' ')).toMatch(/speed/i);
    const expected = modelReadings(SINGLE, [{ planeIndex: 0, massGrams: 50, angleDeg: 0 }])[0]!;
    expect(seen.runs[0]!.readings[0]!.average.amplitude).toBeCloseTo(expected.amplitude, 2);

    const imported = await send(job.id, file, { version: seen.jobVersion });
    expect(imported.status).toBe(201);
    const stored = imported.body as Job;
    expect(
      stored.runs.slice(1).map(({ sequence, readings, warnings }) => ({ sequence, readings, warnings })),
    ).toEqual(seen.runs.map(({ sequence, readings, warnings }) => ({ sequence, readings, warnings })));
  });

  it('a run the job refuses is a bad row of the file: a second initial run, a plane the machine lacks, a sensor the set-up lacks', async () => {
    const job = await readyJob(onePlane, ['left'], { initial: true });
    const file = [
      HEADER,
      '1,initial,left,0.5,60,2150,in/s-pk,,,',
      '2,trial,left,0.4,50,2150,in/s-pk,1,50,0',
      '3,trial,right,0.4,50,2150,in/s-pk,0,50,0',
      ...trialRows(4, { planeIndex: 0, massGrams: 50, angleDeg: 0 }),
    ].join('\n');
    const seen = ReadingsImportPreviewSchema.parse((await preview(job.id, file)).body);
    expect(seen.errors.map((error) => [error.path, error.value, error.message])).toEqual([
      [
        'rows[2].kind',
        'initial',
        'The job cannot take run 1 of the file: The job has its initial run already.',
      ],
      ['rows[3].trialPlaneIndex', '1', 'The job cannot take run 2 of the file: The machine has 1 plane(s).'],
      [
        'rows[4].sensorSide',
        'right',
        'The job cannot take run 3 of the file: The set-up has no sensor on the right side.',
      ],
    ]);
    // The good run is still shown, as the job would number it.
    expect(seen.runs.map((run) => [run.fileRun, run.sequence])).toEqual([[4, 2]]);
    const refused = await send(job.id, file, { version: seen.jobVersion });
    expect(refused.status).toBe(400);
    expect(refused.body.errors).toEqual(seen.errors);
    expect((await storedJob(job.id)).version).toBe(job.version);
  });
});

describe('a bad file is refused with a problem naming its rows, and nothing is stored', () => {
  const good = '1,initial,left,0.5,60,2150,in/s-pk,,,';
  const cases: [string, string | Buffer, number, string[]][] = [
    [
      'a phase out of range',
      [HEADER, good, '1,initial,left,0.5,412,2150,in/s-pk,,,'].join('\n'),
      400,
      ['rows[3].phaseDeg'],
    ],
    [
      'text in an amplitude',
      [HEADER, '1,initial,left,high,60,2150,in/s-pk,,,', good].join('\n'),
      400,
      ['rows[2].amplitude'],
    ],
    [
      'a missing column',
      'run,kind,sensorSide,amplitude,phaseDeg,amplitudeUnit\n1,initial,left,0.5,60,in/s-pk\n',
      400,
      ['columns'],
    ],
    [
      'an unknown side',
      [HEADER, good, '1,initial,centre,0.5,60,2150,in/s-pk,,,'].join('\n'),
      400,
      ['rows[3].sensorSide'],
    ],
    [
      'a unit other than the set-up’s',
      [HEADER, '1,initial,left,12.2,60,2150,mm/s-rms,,,'].join('\n'),
      400,
      ['rows[2].amplitudeUnit'],
    ],
    ['an empty file', '', 400, ['file']],
    ['a binary file', Buffer.from([0x4d, 0x5a, 0x90, 0x00, 0x03, 0x00, 0xff, 0xff, 0xb8]), 400, ['file']],
    [
      'an oversized file',
      `${HEADER}\n${`${good}\n`.repeat(Math.ceil(READINGS_CSV_MAX_BYTES / good.length) + 10)}`,
      413,
      ['file'],
    ],
  ];

  it.each(cases)('%s', async (_case, file, status, paths) => {
    const job = await readyJob(onePlane);
    const runsBefore = rowCount(test, 'job_runs');
    const response = await send(job.id, file, { version: job.version });
    expect(response.status, JSON.stringify(response.body)).toBe(status);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    const problem = ProblemSchema.parse(response.body);
    expect(problem.errors?.map((error) => error.path)).toEqual(paths);
    expect(problem.errors?.every((error) => error.message.length > 10)).toBe(true);
    if (status === 400) {
      expect(problem.code).toBe('READINGS_FILE_REFUSED');
      expect(problem.detail).toMatch(/nothing was imported/);
      // The preview names the same errors.
      const seen = await preview(job.id, file);
      expect(seen.status).toBe(200);
      expect(seen.body.errors).toEqual(response.body.errors);
    }
    const after = await storedJob(job.id);
    expect(after.version).toBe(job.version);
    expect(after.runs).toEqual([]);
    expect(rowCount(test, 'job_runs')).toBe(runsBefore);
  });

  it('a body not sent as text/csv in UTF-8 is a 415', async () => {
    const job = await readyJob(onePlane);
    const file = [HEADER, good].join('\n');
    for (const type of ['application/json', 'text/csv; charset=latin1', 'multipart/form-data; boundary=x']) {
      const response = await send(job.id, file, { version: job.version, type });
      expect(response.status, type).toBe(415);
      expect(response.body.detail).toMatch(/text\/csv/);
    }
    expect((await send(job.id, file, { version: job.version, type: 'text/csv; charset=utf-8' })).status).toBe(
      201,
    );
  });
});

describe('versions', () => {
  const file = [
    HEADER,
    '1,initial,left,0.5,60,2150,in/s-pk,,,',
    '1,initial,left,0.51,61,2151,in/s-pk,,,',
  ].join('\n');

  it('the preview saves nothing and changes no version', async () => {
    const job = await readyJob(onePlane);
    for (let i = 0; i < 3; i++) expect((await preview(job.id, file)).status).toBe(200);
    const after = await storedJob(job.id);
    expect(after.version).toBe(job.version);
    expect(after.runs).toEqual([]);
  });

  it('428 without If-Match; 412 with the job as stored when it changed since the preview', async () => {
    const job = await readyJob(onePlane);
    const seen = ReadingsImportPreviewSchema.parse((await preview(job.id, file)).body);
    const without = await send(job.id, file);
    expect(without.status).toBe(428);
    // Meanwhile, the initial run is typed on another screen.
    const typed = await jobsAs(test, test.tokens.technician).post(
      `${jobPath(job.id)}/runs`,
      { kind: 'initial', readings: runReadings(['left'], SINGLE.initial) },
      job.version,
    );
    expect(typed.status).toBe(201);
    const stale = await send(job.id, file, { version: seen.jobVersion });
    expect(stale.status).toBe(412);
    expect(stale.body.code).toBe('CHANGED_MEANWHILE');
    expect(stale.body.current.version).toBe(typed.body.version);
    expect(stale.headers['etag']).toBe(`"${typed.body.version}"`);
    expect((await storedJob(job.id)).runs).toHaveLength(1);
  });

  it('the same file imported many times at once on one version: one lands, the others are 412', async () => {
    const job = await readyJob(onePlane, ['left'], { initial: true });
    const trials = [HEADER, ...trialRows(1, { planeIndex: 0, massGrams: 50, angleDeg: 0 })].join('\n');
    const answers = await Promise.all(
      Array.from({ length: 8 }, () => send(job.id, trials, { version: job.version })),
    );
    expect(answers.map((answer) => answer.status).sort()).toEqual([201, 412, 412, 412, 412, 412, 412, 412]);
    const stored = await storedJob(job.id);
    expect(stored.version).toBe(job.version + 1);
    expect(stored.runs.map((run) => run.kind)).toEqual(['initial', 'trial']);
  });
});

describe('who may import', () => {
  const file = [HEADER, '1,initial,left,0.5,60,2150,in/s-pk,,,'].join('\n');

  it('viewers and developers may not (403); a technician not on another’s job (403 NOT_YOUR_JOB); a manager may', async () => {
    const job = await readyJob(onePlane);
    for (const role of ['viewer', 'developer'] as const) {
      expect((await preview(job.id, file, test.tokens[role])).status).toBe(403);
      expect((await send(job.id, file, { token: test.tokens[role], version: job.version })).status).toBe(403);
    }
    const others = await readyJob(onePlane, ['left'], { token: test.tokens.manager });
    const refused = await send(others.id, file, { version: others.version });
    expect(refused.status).toBe(403);
    expect(refused.body.code).toBe('NOT_YOUR_JOB');
    expect((await preview(others.id, file)).status).toBe(403);
    const byManager = await send(job.id, file, { token: test.tokens.manager, version: job.version });
    expect(byManager.status).toBe(201);
  });

  it('another organisation’s job is not found, to the preview and the import, and stays as it was', async () => {
    const job = await readyJob(onePlane);
    const preview404 = await preview(job.id, file, test.otherOwner);
    expect(preview404.status).toBe(404);
    const import404 = await send(job.id, file, { token: test.otherOwner, version: job.version });
    expect(import404.status).toBe(404);
    expect((await storedJob(job.id)).version).toBe(job.version);
  });

  it('a job before its safety, inspection and set-up takes no runs (409 STEP_MISSING)', async () => {
    const created = await jobsAs(test, test.tokens.technician).create({
      machineId: onePlane,
      scheduledFor: '2026-05-04',
    });
    const early = await preview(created.body.id, file);
    expect(early.status).toBe(409);
    expect(early.body.code).toBe('STEP_MISSING');
  });
});
