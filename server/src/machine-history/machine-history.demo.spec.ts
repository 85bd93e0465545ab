/*
 * The history of the demo machines: the demo seed, and two more jobs on one demo mulcher run through the
 * jobs' service as the demo technician would (one read in mm/s RMS), so that it has several. Every demo
 * machine's history holds its jobs with the jobs' own figures; the export holds them all.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  AddRunSchema,
  type AmplitudeUnit,
  type Job,
  MachineHistorySchema,
  RecordInspectionSchema,
  RecordSetupSchema,
} from '@counterpoise/api';
import { convertVibration } from '@counterpoise/engine';
import { AccountsRepo } from '../accounts/accounts.repo';
import { DEMO_ORGANISATION } from '../auth/accounts.seed';
import { DEMO_SEEDERS } from '../db/demo-seeders';
import { seedDemoData } from '../db/seed';
import { JobsRepo } from '../jobs/jobs.repo';
import { type JobActor, JobsService } from '../jobs/jobs.service';
import { type ModelRotor, modelReadings } from '../jobs/model-rotor';
import { MachineFamiliesRepo } from '../machine-families/machine-families.repo';
import { MachineFamiliesService } from '../machine-families/machine-families.service';
import { MachinesRepo } from '../machines/machines.repo';
import { MachinesService } from '../machines/machines.service';
import { ChangeLog } from '../records/change-log';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { MachineHistoryRepo } from './machine-history.repo';
import { MachineHistoryService } from './machine-history.service';

const now = new Date('2026-03-02T08:00:00Z');
let temporary: TemporaryDatabase;
let dataDir: string;
let technician: JobActor;
let jobs: JobsService;
let history: MachineHistoryService;
let machines: MachinesService;

/** A demo mulcher drum read by an instrument set to `unit`. */
function drum(left: [number, number], right: [number, number], unit: AmplitudeUnit): ModelRotor {
  const k = convertVibration(1, 'in/s-pk', unit);
  return {
    initial: [
      { amplitude: left[0] * k, phaseDeg: left[1] },
      { amplitude: right[0] * k, phaseDeg: right[1] },
    ],
    coefficients: [
      [
        { amplitudePerMass: 0.0016 * k, phaseDeg: 45 },
        { amplitudePerMass: 0.0004 * k, phaseDeg: 75 },
      ],
      [
        { amplitudePerMass: 0.00045 * k, phaseDeg: 120 },
        { amplitudePerMass: 0.0015 * k, phaseDeg: 32 },
      ],
    ],
  };
}

/** A two-plane job on the machine through the jobs' service, completed. */
function balance(machineId: number, scheduledFor: string, rotor: ModelRotor, unit: AmplitudeUnit): Job {
  const readings = (weights: { planeIndex: number; massGrams: number; angleDeg: number }[]) =>
    modelReadings(rotor, weights).map((reading, index) => ({
      sensorSide: index === 0 ? 'left' : 'right',
      repeats: [{ amplitude: reading.amplitude, phaseDeg: reading.phaseDeg % 360, speedRpm: 2150 }],
    }));
  let job = jobs.create(technician, { machineId, scheduledFor });
  job = jobs.acknowledgeSafety(
    technician,
    job.id,
    [job.version],
    ['lockout', 'running', 'hot-work', 'weights', 'protection'],
  );
  job = jobs.recordInspection(
    technician,
    job.id,
    [job.version],
    RecordInspectionSchema.parse({
      bearingEndPlayMm: 0.1,
      shaftRunoutMm: 0.04,
      checks: { teethOrKnives: 'ok', buildUpCleaned: 'fixed', welds: 'ok', beltsAndPulleys: 'ok' },
    }),
  );
  job = jobs.recordSetup(
    technician,
    job.id,
    [job.version],
    RecordSetupSchema.parse({
      sensors: [
        { side: 'left', position: 'Left bearing housing' },
        { side: 'right', position: 'Right bearing housing' },
      ],
      tachometer: 'Left skid',
      referenceMark: 'Tape on the left end plate',
      rotationSeenFromLeft: 'counterClockwise',
      operatingSpeedRpm: 2150,
      amplitudeUnit: unit,
      phaseSense: 'lag',
      weightAngles: 'againstRotation',
    }),
  );
  const run = (body: object) =>
    (job = jobs.addRun(technician, job.id, [job.version], AddRunSchema.parse(body)));
  run({ kind: 'initial', readings: readings([]) });
  for (const planeIndex of [0, 1]) {
    const trialWeight = { planeIndex, massGrams: 100, angleDeg: 0 };
    run({ kind: 'trial', trialWeight, readings: readings([trialWeight]) });
  }
  job = jobs.computeCorrection(technician, job.id, [job.version], 'multi-plane');
  const correction = job.corrections.at(-1)!;
  const fitted = correction.plan.map((weight) => ({
    planeIndex: weight.planeIndex,
    massGrams: Math.round(weight.massGrams),
    angleDeg: Math.round(weight.angleDeg) % 360,
    radiusMm: 210,
    fixing: 'bolted' as const,
  }));
  job = jobs.recordInstalled(technician, job.id, correction.id, [job.version], fitted);
  run({ kind: 'verification', readings: readings(fitted) });
  return jobs.complete(technician, job.id, [job.version]);
}

beforeAll(async () => {
  dataDir = mkdtempSync(join(tmpdir(), 'counterpoise-demo-history-'));
  temporary = openTemporaryDatabase();
  await seedDemoData(temporary.database, now, DEMO_SEEDERS, { dataDir });
  const accounts = new AccountsRepo(temporary.database.orm);
  const organisation = accounts.findOrganisationByName(DEMO_ORGANISATION)!;
  technician = accounts.listUsers(organisation.id).find((person) => person.role === 'technician')!;
  const clock = { now: () => now };
  const changes = new ChangeLog(temporary.database.orm);
  const families = new MachineFamiliesService(
    new MachineFamiliesRepo(temporary.database.orm),
    changes,
    clock,
  );
  jobs = new JobsService(new JobsRepo(temporary.database.orm), families, clock);
  machines = new MachinesService(new MachinesRepo(temporary.database.orm), changes, clock);
  history = new MachineHistoryService(
    new MachineHistoryRepo(temporary.database.orm),
    jobs,
    machines,
    families,
  );
});
afterAll(() => {
  temporary.dispose();
  rmSync(dataDir, { recursive: true, force: true });
});

const everything = { page: 1, pageSize: 100 };

describe('the demo machines’ history', () => {
  it('holds every job of every demo machine with the jobs’ own before, after and verdict', () => {
    const mulcher = machines
      .list(technician, { archived: 'all', sort: 'serialNumber', order: 'asc', ...everything })
      .items.find((machine) => machine.serialNumber === 'BF220-18734')!;
    // Two more jobs on the demo mulcher, after its demo job (late 2025): one read in mm/s RMS.
    balance(mulcher.id, '2026-01-12', drum([0.41, 300], [0.33, 80], 'mm/s-rms'), 'mm/s-rms');
    balance(mulcher.id, '2026-02-20', drum([0.38, 140], [0.45, 20], 'in/s-pk'), 'in/s-pk');

    const all = jobs.list(technician, everything).items.map((item) => jobs.get(technician, item.id));
    const machineIds = [...new Set(all.map((job) => job.machine.id))];
    expect(machineIds.length).toBeGreaterThan(5);
    for (const machineId of machineIds) {
      const shown = MachineHistorySchema.parse(history.history(technician, machineId));
      const own = all
        .filter((job) => job.machine.id === machineId)
        .sort((a, b) => a.scheduledFor.localeCompare(b.scheduledFor) || a.id - b.id);
      expect(shown.jobs.map((job) => job.id)).toEqual(own.map((job) => job.id));
      for (const [index, job] of own.entries()) {
        const entry = shown.jobs[index]!;
        expect(entry.status).toBe(job.status);
        expect(entry.accepted).toBe(job.completion?.accepted ?? null);
        for (const kept of job.completion?.beforeAfter ?? []) {
          const side = entry.sides.find((figure) => figure.sensorSide === kept.sensorSide)!;
          expect(side.before).toMatchObject(kept.before);
          expect(side.after).toMatchObject(kept.after);
          expect(side.limit).toBe(
            job.verification!.sides.find((s) => s.sensorSide === kept.sensorSide)!.limit,
          );
        }
      }
      const lastCompleted = own.filter((job) => job.completion !== null).at(-1);
      expect(shown.weightsOnRotor?.weights.map(({ fittedOn: _day, ...weight }) => weight) ?? null).toEqual(
        lastCompleted?.completion?.weightsOnRotor ?? null,
      );
    }

    const drumHistory = history.history(technician, mulcher.id);
    expect(drumHistory.jobs).toHaveLength(3);
    expect(drumHistory.unit).toBe('in/s-pk');
    // The mm/s job is drawn in in/s: its before and after are the jobs' own, converted by the engine.
    const mm = drumHistory.jobs[1]!;
    expect(mm.unit).toBe('mm/s-rms');
    for (const side of mm.sides) {
      expect(side.inHistoryUnit.before).toBeCloseTo(
        convertVibration(side.before!.amplitude, 'mm/s-rms', 'in/s-pk'),
        12,
      );
    }
    // Three jobs' weights are on the rotor now, each named with the job and day that fitted it.
    expect(new Set(drumHistory.weightsOnRotor!.weights.map((weight) => weight.jobId))).toEqual(
      new Set(drumHistory.jobs.map((job) => job.id)),
    );
    // The family's figures stand on the demo mulchers' four jobs and these two.
    expect(drumHistory.family!.sensitivities.map((figure) => figure.jobCount)).toEqual([6, 6, 6, 6]);
  });

  it('exports every demo job of the range, one row each', () => {
    const text = history.exportJobs(technician, { from: '2024-01-01', to: '2026-12-31' });
    const rows = Papa.parse<string[]>(text.slice(1), { skipEmptyLines: true }).data.slice(1);
    expect(rows.map((row) => Number(row[0])).sort((a, b) => a - b)).toEqual(
      jobs
        .list(technician, everything)
        .items.map((item) => item.id)
        .sort((a, b) => a - b),
    );
  });
});
