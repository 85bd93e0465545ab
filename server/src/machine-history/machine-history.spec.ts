/*
 * A machine's history and the export of the shop's jobs, through the real app: jobs balanced through the
 * job routes on a modelled rotor (one read in in/s peak, one in mm/s RMS, one still open), their history
 * against the jobs' own figures, another organisation's machine, and the CSV file (rows, quoting, the
 * formula guard, the byte order mark, bad ranges, the same file for requests sent at once).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  type AmplitudeUnit,
  type Job,
  type MachineHistory,
  MachineHistorySchema,
  PROBLEM_MEDIA_TYPE,
} from '@counterpoise/api';
import { convertVibration } from '@counterpoise/engine';
import Papa from 'papaparse';
import request from 'supertest';
import { jobReports } from '../db/schema';
import {
  jobsAs,
  machineOfFamily,
  type ModelRotor,
  modelReadings,
  passingInspection,
  runReadings,
  setupBody,
} from '../jobs/jobs.test-app';
import {
  as,
  customerBody,
  machineBody,
  ManualClock,
  type RecordsTestApp,
  startRecordsTestApp,
} from '../records/records.test-app';
import { JOBS_CSV_COLUMNS, UTF8_BOM } from './jobs-csv';

let test: RecordsTestApp;
let machineId: number;
let familyId: number;
let otherMachineId: number;
/** The jobs on the machine, as the job routes answer them after their last step. */
const balanced: Job[] = [];
let openJob: Job;
let unstartedJobId: number;

const SIDES = ['left', 'right'] as const;
const MM_PER_S_RMS_PER_IN_PER_S_PK = convertVibration(1, 'in/s-pk', 'mm/s-rms');

/** A two-plane drum, in in/s peak: about 0.0016 in/s per gram on its own side. */
function drum(variation: number, left: [number, number], right: [number, number]): ModelRotor {
  return {
    initial: [
      { amplitude: left[0], phaseDeg: left[1] },
      { amplitude: right[0], phaseDeg: right[1] },
    ],
    coefficients: [
      [
        { amplitudePerMass: 0.0016 * (1 + variation), phaseDeg: 40 },
        { amplitudePerMass: 0.0004, phaseDeg: 75 },
      ],
      [
        { amplitudePerMass: 0.00045, phaseDeg: 120 },
        { amplitudePerMass: 0.0015 * (1 - variation), phaseDeg: 35 },
      ],
    ],
  };
}

/** The same rotor read by an instrument set to mm/s RMS. */
function inMmPerSecondRms(rotor: ModelRotor): ModelRotor {
  const k = MM_PER_S_RMS_PER_IN_PER_S_PK;
  return {
    initial: rotor.initial.map((reading) => ({ ...reading, amplitude: reading.amplitude * k })),
    coefficients: rotor.coefficients.map((row) =>
      row.map((c) => ({ ...c, amplitudePerMass: c.amplitudePerMass * k })),
    ),
  };
}

/** A job on `machine` through the job routes, up to its initial run, or balanced two-plane and completed. */
async function jobOn(
  machine: number,
  scheduledFor: string,
  rotor: ModelRotor,
  unit: AmplitudeUnit,
  until: 'initial' | 'complete' = 'complete',
): Promise<Job> {
  const jobs = jobsAs(test, test.tokens.technician);
  const created = await jobs.create({ machineId: machine, scheduledFor });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const path = `/api/v1/jobs/${created.body.id}`;
  let version = created.body.version as number;
  const step = async (call: Promise<request.Response>, status = 200) => {
    const response = await call;
    expect(response.status, JSON.stringify(response.body)).toBe(status);
    version = response.body.version;
    return response.body as Job;
  };
  await step(
    jobs.put(
      `${path}/safety`,
      { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
      version,
    ),
  );
  await step(jobs.put(`${path}/inspection`, passingInspection(), version));
  await step(jobs.put(`${path}/setup`, { ...setupBody([...SIDES]), amplitudeUnit: unit }, version));
  let job = await step(
    jobs.post(`${path}/runs`, { kind: 'initial', readings: runReadings(SIDES, rotor.initial) }, version),
    201,
  );
  if (until === 'initial') return job;
  for (const planeIndex of [0, 1]) {
    const trialWeight = { planeIndex, massGrams: 100, angleDeg: 0 };
    await step(
      jobs.post(
        `${path}/runs`,
        { kind: 'trial', trialWeight, readings: runReadings(SIDES, modelReadings(rotor, [trialWeight])) },
        version,
      ),
      201,
    );
  }
  job = await step(jobs.post(`${path}/corrections`, { method: 'multi-plane' }, version), 201);
  const fitted = job.corrections[0]!.plan.map((weight) => ({
    planeIndex: weight.planeIndex,
    massGrams: Math.round(weight.massGrams),
    angleDeg: Math.round(weight.angleDeg) % 360,
    radiusMm: 210,
    fixing: 'welded' as const,
  }));
  await step(
    jobs.put(`${path}/corrections/${job.corrections[0]!.id}/installed`, { weights: fitted }, version),
  );
  await step(
    jobs.post(
      `${path}/runs`,
      { kind: 'verification', readings: runReadings(SIDES, modelReadings(rotor, fitted)) },
      version,
    ),
    201,
  );
  return step(jobs.post(`${path}/complete`, undefined, version));
}

beforeAll(async () => {
  test = await startRecordsTestApp({ clock: new ManualClock() });
  ({ machineId, familyId } = await machineOfFamily(test, test.tokens.owner, { planeCount: 2 }));
  otherMachineId = (await machineOfFamily(test, test.otherOwner, { planeCount: 2 })).machineId;
  balanced.push(
    await jobOn(machineId, '2024-11-05', inMmPerSecondRms(drum(-0.02, [0.61, 75], [0.44, 290])), 'mm/s-rms'),
  );
  balanced.push(await jobOn(machineId, '2025-06-10', drum(0.03, [0.52, 214], [0.31, 140]), 'in/s-pk'));
  openJob = await jobOn(machineId, '2026-02-20', drum(0.01, [0.47, 160], [0.58, 330]), 'in/s-pk', 'initial');
  // Started last but dated first, and never begun: the history sorts by date.
  const unstarted = await jobsAs(test, test.tokens.technician).create({
    machineId,
    scheduledFor: '2023-05-01',
  });
  expect(unstarted.status).toBe(201);
  unstartedJobId = unstarted.body.id;
}, 60_000);
afterAll(async () => test.close());

const historyPath = (id: number) => `/api/v1/machines/${id}/job-history`;

describe('a machine’s job history', () => {
  it('lists every job oldest first with the jobs’ own figures, the weights on the rotor and the family’s sensitivity', async () => {
    const response = await as(test.app, test.tokens.viewer).get(historyPath(machineId));
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    const history: MachineHistory = MachineHistorySchema.parse(response.body);
    expect(history.machine.id).toBe(machineId);
    expect(history.jobs.map((job) => job.id)).toEqual([
      unstartedJobId,
      balanced[0]!.id,
      balanced[1]!.id,
      openJob.id,
    ]);
    expect(history.jobs[0]).toMatchObject({ status: 'open', unit: null, sides: [], accepted: null });
    // The latest job was read in in/s: the history compares in in/s.
    expect(history.unit).toBe('in/s-pk');

    for (const job of balanced) {
      const shown = history.jobs.find((entry) => entry.id === job.id)!;
      const unit = job.setup!.amplitudeUnit;
      expect(shown).toMatchObject({
        scheduledFor: job.scheduledFor,
        completedAt: job.completion!.completedAt,
        status: 'completed',
        technician: job.technician,
        methods: ['multi-plane'],
        unit,
        operatingSpeedRpm: 2150,
        weightAngles: 'againstRotation',
        acceptance: job.verification!.acceptance,
        accepted: job.completion!.accepted,
        weightsFitted: job.corrections.flatMap((correction) => correction.installed ?? []),
      });
      expect(shown.accepted).toBe(true);
      expect(shown.sides.map((side) => side.sensorSide)).toEqual(['left', 'right']);
      const initialRun = job.runs.find((run) => run.kind === 'initial')!;
      const lastRun = job.runs.at(-1)!;
      for (const side of shown.sides) {
        const kept = job.completion!.beforeAfter.find((figure) => figure.sensorSide === side.sensorSide)!;
        const verdict = job.verification!.sides.find((figure) => figure.sensorSide === side.sensorSide)!;
        expect(side.before).toEqual({
          runId: initialRun.id,
          ...kept.before,
          speedRpm: initialRun.readings.find((r) => r.sensorSide === side.sensorSide)!.speedRpm,
        });
        expect(side.after).toEqual({
          runId: lastRun.id,
          ...kept.after,
          speedRpm: lastRun.readings.find((r) => r.sensorSide === side.sensorSide)!.speedRpm,
        });
        expect(side.limit).toBe(verdict.limit);
        expect(side.accepted).toBe(verdict.accepted);
        const toHistory = (value: number) =>
          unit === 'in/s-pk' ? value : convertVibration(value, unit, 'in/s-pk');
        expect(side.inHistoryUnit.before).toBeCloseTo(toHistory(kept.before.amplitude), 12);
        expect(side.inHistoryUnit.after).toBeCloseTo(toHistory(kept.after.amplitude), 12);
        expect(side.inHistoryUnit.limit).toBeCloseTo(toHistory(verdict.limit!), 12);
      }
    }
    // The mm/s job's limit is the shop's 0.15 in/s target in its own unit, and back in in/s in the history.
    const mmJob = history.jobs[1]!;
    expect(mmJob.unit).toBe('mm/s-rms');
    expect(mmJob.sides[0]!.limit).toBeCloseTo(0.15 * MM_PER_S_RMS_PER_IN_PER_S_PK, 9);
    expect(mmJob.sides[0]!.inHistoryUnit.limit).toBeCloseTo(0.15, 12);

    // The open job has its before and nothing after yet.
    const open = history.jobs[3]!;
    expect(open.status).toBe('open');
    expect(open.accepted).toBeNull();
    expect(open.methods).toEqual([]);
    expect(open.weightsFitted).toEqual([]);
    for (const side of open.sides) {
      const initial = openJob.runs[0]!.readings.find((r) => r.sensorSide === side.sensorSide)!;
      expect(side.before).toEqual({
        runId: openJob.runs[0]!.id,
        amplitude: initial.average.amplitude,
        phaseDeg: initial.average.phaseDeg,
        speedRpm: initial.speedRpm,
      });
      expect(side.after).toBeNull();
      expect(side.accepted).toBeNull();
      expect(side.inHistoryUnit.after).toBeNull();
    }

    // The weights on the rotor: the latest completed job's list (both jobs' weights), each with its day.
    const latest = balanced[1]!;
    expect(history.weightsOnRotor?.jobId).toBe(latest.id);
    expect(history.weightsOnRotor?.completedAt).toBe(latest.completion!.completedAt);
    expect(history.weightsOnRotor?.weights).toEqual(
      latest.completion!.weightsOnRotor.map((weight) => ({
        ...weight,
        fittedOn: balanced.find((job) => job.id === weight.jobId)!.scheduledFor,
      })),
    );
    expect(new Set(history.weightsOnRotor?.weights.map((weight) => weight.jobId))).toEqual(
      new Set(balanced.map((job) => job.id)),
    );

    // The family's sensitivity: as stored on the family, which the latest completion refined.
    const family = await as(test.app, test.tokens.viewer).get(`/api/v1/machine-families/${familyId}`);
    expect(history.family).toEqual({
      id: familyId,
      name: family.body.name,
      sensitivities: family.body.sensitivities,
    });
    expect(history.family!.sensitivities).toEqual(latest.completion!.familySensitivities);
    expect(history.family!.sensitivities.every((figure) => figure.jobCount === 2)).toBe(true);
  });

  it('is another organisation’s machine: 404, as for a machine that does not exist', async () => {
    for (const id of [otherMachineId, 999_999]) {
      const response = await as(test.app, test.tokens.owner).get(historyPath(id));
      expect(response.status).toBe(404);
      expect(response.type).toBe(PROBLEM_MEDIA_TYPE);
    }
    const own = await as(test.app, test.otherOwner).get(historyPath(machineId));
    expect(own.status).toBe(404);
    expect(own.body.jobs).toBeUndefined();
  });

  it('refuses a bad id, a role without jobs:read, and no token', async () => {
    const bad = await as(test.app, test.tokens.owner).get('/api/v1/machines/abc/job-history');
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].path).toBe('id');
    expect((await as(test.app, test.tokens.developer).get(historyPath(machineId))).status).toBe(403);
    expect((await request(test.app).get(historyPath(machineId))).status).toBe(401);
  });

  it('is a machine without jobs: no figures, no weights, and its family', async () => {
    const owner = as(test.app, test.tokens.owner);
    const machine = await owner.get(`/api/v1/machines/${machineId}`);
    const customer = await owner.post('/api/v1/customers', customerBody(`empty-${Date.now()}`));
    const fresh = await owner.post(
      '/api/v1/machines',
      machineBody(customer.body.id, { familyId: machine.body.familyId, serialNumber: 'NEW-1' }),
    );
    const response = await owner.get(historyPath(fresh.body.id));
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ jobs: [], unit: null, weightsOnRotor: null });
    expect(response.body.family.id).toBe(familyId);
  });
});

/** A GET whose body is read as bytes, whatever its type. */
function bytesOf(call: request.Test): Promise<request.Response & { body: Buffer }> {
  return call.buffer(true).parse((res, done) => {
    const chunks: Buffer[] = [];
    res.on('data', (chunk: Buffer) => chunks.push(chunk));
    res.on('end', () => done(null, Buffer.concat(chunks)));
  }) as unknown as Promise<request.Response & { body: Buffer }>;
}

const exportPath = (from: string, to: string) => `/api/v1/exports/jobs.csv?from=${from}&to=${to}`;

describe('the export of the shop’s jobs', () => {
  let oddJobId: number;
  let signedJobId: number;

  beforeAll(async () => {
    // A customer whose name holds a comma and quotes, and one a spreadsheet would run as a formula.
    const owner = as(test.app, test.tokens.owner);
    const odd = await owner.post('/api/v1/customers', {
      ...customerBody('odd'),
      name: 'Fernhollow "North", Clearing',
    });
    expect(odd.status, JSON.stringify(odd.body)).toBe(201);
    const formula = await owner.post('/api/v1/customers', {
      ...customerBody('formula'),
      name: '=HYPERLINK("http://x.test","open")',
    });
    expect(formula.status, JSON.stringify(formula.body)).toBe(201);
    const oddMachine = await owner.post('/api/v1/machines', {
      ...machineBody(odd.body.id, { serialNumber: '-40+2' }),
      make: '@Tally',
    });
    expect(oddMachine.status, JSON.stringify(oddMachine.body)).toBe(201);
    const formulaMachine = await owner.post('/api/v1/machines', machineBody(formula.body.id));
    const jobs = jobsAs(test, test.tokens.technician);
    oddJobId = (await jobs.create({ machineId: oddMachine.body.id, scheduledFor: '2025-06-12' })).body.id;
    await jobs.create({ machineId: formulaMachine.body.id, scheduledFor: '2025-06-11' });
    // Out of every range asked below.
    await jobs.create({ machineId, scheduledFor: '2023-01-02' });
    signedJobId = balanced[1]!.id;
    test.temporary.database.orm
      .insert(jobReports)
      .values({
        organisationId: test.own.id,
        jobId: signedJobId,
        revision: 1,
        jobVersion: balanced[1]!.version,
        sourceSha256: 'a'.repeat(64),
        signerName: 'Juno Hartwell',
        signaturePng: Buffer.from('png'),
        pdf: Buffer.from('%PDF-1.7'),
        pdfSha256: 'b'.repeat(64),
        signedById: test.own.people.technician.id,
        signedAt: new Date('2025-06-10T12:00:00Z'),
      })
      .run();
  });

  it('answers a CSV file of the range: BOM, CRLF, a header of our own, one row per job by date', async () => {
    const response = await bytesOf(
      as(test.app, test.tokens.viewer).get(exportPath('2025-06-01', '2025-06-30')),
    );
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(response.headers['content-disposition']).toBe(
      'attachment; filename=counterpoise-jobs-2025-06-01-to-2025-06-30.csv',
    );
    const bytes = response.body;
    expect([...bytes.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const text = bytes.toString('utf8');
    expect(text.startsWith(UTF8_BOM)).toBe(true);
    // Every line ends in CRLF; no bare LF.
    expect(text.endsWith('\r\n')).toBe(true);
    expect(text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
    const parsed = Papa.parse<string[]>(text.slice(1), { newline: '\r\n', skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const [header, ...rows] = parsed.data;
    expect(header).toEqual([...JOBS_CSV_COLUMNS]);
    const column = (row: string[], name: (typeof JOBS_CSV_COLUMNS)[number]) =>
      row[JOBS_CSV_COLUMNS.indexOf(name)]!;
    // 2025-06-10 (balanced, signed), 2025-06-11 (formula), 2025-06-12 (odd): by date.
    expect(rows.map((row) => column(row, 'Scheduled for'))).toEqual([
      '2025-06-10',
      '2025-06-11',
      '2025-06-12',
    ]);

    const signed = rows[0]!;
    const job = balanced[1]!;
    expect(column(signed, 'Job no.')).toBe(String(job.id));
    expect(column(signed, 'State')).toBe('completed');
    expect(column(signed, 'Methods')).toBe('multi-plane');
    expect(column(signed, 'Unit')).toBe('in/s-pk');
    const kept = (side: string) => job.completion!.beforeAfter.find((figure) => figure.sensorSide === side)!;
    expect(Number(column(signed, 'Left before'))).toBe(Number(kept('left').before.amplitude.toPrecision(4)));
    expect(Number(column(signed, 'Right after'))).toBe(Number(kept('right').after.amplitude.toPrecision(4)));
    expect(column(signed, 'Acceptance level')).toBe('Shop target 0.15 in/s-pk');
    expect(column(signed, 'Within acceptance')).toBe('yes');
    expect(column(signed, 'Weights fitted')).toMatch(/^plane 1: \d+ g at \d+°, 210 mm, welded; plane 2: /);
    expect(column(signed, 'Report signed')).toBe('yes');
    expect(column(signed, 'Report signed on')).toBe('2025-06-10');
    expect(column(rows[1]!, 'Report signed')).toBe('no');

    // Quoting: the comma and the quotes survive a round trip, and the raw line doubles the quotes.
    const odd = rows[2]!;
    expect(column(odd, 'Job no.')).toBe(String(oddJobId));
    expect(column(odd, 'Customer')).toBe('Fernhollow "North", Clearing');
    expect(text).toContain('"Fernhollow ""North"", Clearing"');
    // The formula guard: text beginning with =, -, @ gets an apostrophe; numbers stay numbers.
    expect(column(rows[1]!, 'Customer')).toBe('\'=HYPERLINK("http://x.test","open")');
    expect(column(odd, 'Serial number')).toBe("'-40+2");
    expect(column(odd, 'Make')).toBe("'@Tally");
    expect(column(odd, 'Left before')).toBe('');
    expect(column(signed, 'Left before')).toMatch(/^\d/);
  });

  it('counts a job completed in the range though scheduled before it', async () => {
    // The jobs were completed on the test clock's day (2026-03-02), long after their scheduled days.
    const response = await bytesOf(
      as(test.app, test.tokens.manager).get(exportPath('2026-03-01', '2026-03-31')),
    );
    const rows = Papa.parse<string[]>(response.body.toString('utf8').slice(1), { skipEmptyLines: true }).data;
    expect(rows.slice(1).map((row) => Number(row[0]))).toEqual(balanced.map((job) => job.id));
    expect(rows.slice(1).every((row) => row[2] === '2026-03-02')).toBe(true);
  });

  it('answers the header alone for a range without jobs, and never another organisation’s jobs', async () => {
    const empty = await bytesOf(as(test.app, test.tokens.owner).get(exportPath('2020-01-01', '2020-12-31')));
    expect(empty.status).toBe(200);
    expect(empty.body.toString('utf8')).toBe(`${UTF8_BOM}${JOBS_CSV_COLUMNS.join(',')}\r\n`);
    const other = await bytesOf(as(test.app, test.otherOwner).get(exportPath('2024-01-01', '2026-12-31')));
    expect(other.status).toBe(200);
    expect(other.body.toString('utf8').split('\r\n').filter(Boolean)).toHaveLength(1);
  });

  it('refuses bad ranges with a problem naming from or to', async () => {
    const owner = as(test.app, test.tokens.owner);
    const cases: [string, string][] = [
      ['/api/v1/exports/jobs.csv?to=2026-01-31', 'from'],
      [exportPath('2026-02-30', '2026-03-31'), 'from'],
      [exportPath('2026-01-01', 'tomorrow'), 'to'],
      [exportPath('2026-03-01', '2026-02-28'), 'to'],
      [exportPath('2020-01-01', '2023-01-01'), 'to'],
    ];
    for (const [path, field] of cases) {
      const response = await owner.get(path);
      expect(response.status, path).toBe(400);
      expect(response.type, path).toBe(PROBLEM_MEDIA_TYPE);
      expect(
        response.body.errors.map((error: { path: string }) => error.path),
        path,
      ).toEqual([field]);
    }
    // Three years to the day before is the longest range.
    expect((await owner.get(exportPath('2020-01-01', '2022-12-31'))).status).toBe(200);
  });

  it('is refused to a role without reports:read and without a token', async () => {
    expect(
      (await as(test.app, test.tokens.developer).get(exportPath('2025-01-01', '2025-12-31'))).status,
    ).toBe(403);
    expect((await request(test.app).get(exportPath('2025-01-01', '2025-12-31'))).status).toBe(401);
  });

  it('gives the same file to requests sent at once', async () => {
    const owner = as(test.app, test.tokens.owner);
    const answers = await Promise.all(
      Array.from({ length: 8 }, () => bytesOf(owner.get(exportPath('2024-01-01', '2026-12-31')))),
    );
    for (const answer of answers) {
      expect(answer.status).toBe(200);
      expect(answer.body.equals(answers[0]!.body)).toBe(true);
    }
    expect(answers[0]!.body.toString('utf8').split('\r\n').filter(Boolean).length).toBe(1 + 5);
  });
});
