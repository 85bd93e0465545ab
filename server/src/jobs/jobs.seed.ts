import { AddRunSchema, type MachineSide, RecordInspectionSchema, RecordSetupSchema } from '@counterpoise/api';
import { and, eq } from 'drizzle-orm';
import { AccountsRepo } from '../accounts/accounts.repo';
import { DEMO_ORGANISATION } from '../auth/accounts.seed';
import type { Database } from '../db/database';
import { machines } from '../db/schema';
import type { DemoSeeder } from '../db/seed';
import { MachineFamiliesRepo } from '../machine-families/machine-families.repo';
import { MachineFamiliesService } from '../machine-families/machine-families.service';
import { ChangeLog } from '../records/change-log';
import { type ModelRotor, modelReadings } from './model-rotor';
import { JobsRepo } from './jobs.repo';
import { type JobActor, JobsService } from './jobs.service';

/*
 * The demo jobs: completed jobs on the demo mulchers and flail mowers, several per family so that the
 * family's refined sensitivity stands on more than one job, and one job left half-way. Invented demo data:
 * each rotor is a model (an initial unbalance response and influence coefficients in the range of the
 * trade, from general knowledge, made up for the demo); the readings are what the model reads, with a
 * small made-up scatter between repeats; what was fitted is the plan rounded to the gram and the degree.
 */

const DAY_MS = 86_400_000;

/** One demo job: the machine by serial number, how long ago, its rotor, and how far it got. */
interface DemoJob {
  readonly serialNumber: string;
  readonly daysAgo: number;
  readonly rotor: ModelRotor;
  readonly trialGrams: number;
  /** `complete` by default; `half-way` stops after the trial run of the first plane. */
  readonly until?: 'complete' | 'half-way';
}

/** A mulcher drum of the demo family: about 0.004 in/s per gram on its own side, a quarter of it across. */
function mulcherRotor(variation: number, left: [number, number], right: [number, number]): ModelRotor {
  return {
    initial: [
      { amplitude: left[0], phaseDeg: left[1] },
      { amplitude: right[0], phaseDeg: right[1] },
    ],
    coefficients: [
      [
        { amplitudePerMass: 0.0016 * (1 + variation), phaseDeg: 40 + 20 * variation },
        { amplitudePerMass: 0.0004, phaseDeg: 75 },
      ],
      [
        { amplitudePerMass: 0.00045, phaseDeg: 120 },
        { amplitudePerMass: 0.0015 * (1 - variation), phaseDeg: 35 - 15 * variation },
      ],
    ],
  };
}

/** A flail rotor of the demo family: lighter, so more response per gram. */
function flailRotor(variation: number, left: [number, number], right: [number, number]): ModelRotor {
  return {
    initial: [
      { amplitude: left[0], phaseDeg: left[1] },
      { amplitude: right[0], phaseDeg: right[1] },
    ],
    coefficients: [
      [
        { amplitudePerMass: 0.0042 * (1 + variation), phaseDeg: 55 + 10 * variation },
        { amplitudePerMass: 0.0009, phaseDeg: 100 },
      ],
      [
        { amplitudePerMass: 0.001, phaseDeg: 150 },
        { amplitudePerMass: 0.004 * (1 - variation), phaseDeg: 50 - 10 * variation },
      ],
    ],
  };
}

/** The demo jobs, oldest first. */
export const DEMO_JOBS: readonly DemoJob[] = [
  {
    serialNumber: 'QS180-0612',
    daysAgo: 420,
    rotor: mulcherRotor(0.04, [0.52, 214], [0.31, 140]),
    trialGrams: 100,
  },
  {
    serialNumber: 'BF220-18734',
    daysAgo: 200,
    rotor: mulcherRotor(-0.03, [0.61, 75], [0.44, 290]),
    trialGrams: 100,
  },
  {
    serialNumber: 'WF240-33815',
    daysAgo: 150,
    rotor: flailRotor(0.05, [0.38, 20], [0.27, 200]),
    trialGrams: 40,
  },
  {
    serialNumber: 'BF220-19102',
    daysAgo: 90,
    rotor: mulcherRotor(0.02, [0.47, 160], [0.58, 330]),
    trialGrams: 100,
  },
  {
    serialNumber: 'WF240-34002',
    daysAgo: 60,
    rotor: flailRotor(-0.04, [0.33, 310], [0.41, 95]),
    trialGrams: 40,
  },
  {
    serialNumber: 'QS180-0457',
    daysAgo: 30,
    rotor: mulcherRotor(-0.01, [0.39, 250], [0.36, 30]),
    trialGrams: 80,
  },
  {
    serialNumber: 'WF240-29877',
    daysAgo: 12,
    rotor: flailRotor(0.02, [0.45, 130], [0.22, 260]),
    trialGrams: 40,
  },
  {
    serialNumber: 'BF250-00921',
    daysAgo: 0,
    rotor: mulcherRotor(0.03, [0.57, 300], [0.35, 105]),
    trialGrams: 120,
    until: 'half-way',
  },
];

/** Made-up scatter of the repeats: the reading as modelled, and one a little off in amplitude and phase. */
function repeatsOf(reading: { amplitude: number; phaseDeg: number }, speedRpm: number, n: number) {
  const wobble = ((n * 37) % 7) - 3;
  return [
    { amplitude: round(reading.amplitude, 3), phaseDeg: round(reading.phaseDeg, 0) % 360, speedRpm },
    {
      amplitude: round(reading.amplitude * (1 + wobble / 200), 3),
      phaseDeg: (round(reading.phaseDeg + wobble / 2, 0) + 360) % 360,
      speedRpm: speedRpm + wobble,
    },
  ];
}

function round(value: number, digits: number): number {
  const factor = 10 ** digits;
  return Math.round(value * factor) / factor;
}

function machineBySerial(database: Database, organisationId: number, serialNumber: string) {
  const machine = database.orm
    .select()
    .from(machines)
    .where(and(eq(machines.organisationId, organisationId), eq(machines.serialNumber, serialNumber)))
    .get();
  if (machine === undefined) throw new Error(`The demo job names the machine ${serialNumber}, not seeded.`);
  return machine;
}

/**
 * Runs the demo jobs through the jobs' service, as the demo technician would through the API: the same
 * checks, averages and recomputed corrections, and each completion refining its family's sensitivity.
 * The clock moves a few minutes per step from each job's day, so that the seed is deterministic.
 */
export const seedDemoJobs: DemoSeeder = (database, now) => {
  const accounts = new AccountsRepo(database.orm);
  const organisation = accounts.findOrganisationByName(DEMO_ORGANISATION);
  const person =
    organisation && accounts.listUsers(organisation.id).find((user) => user.role === 'technician');
  if (organisation === undefined || person === undefined) {
    throw new Error(`The demo jobs need ${DEMO_ORGANISATION} and its technician, seeded before them.`);
  }
  const technician: JobActor = person;
  let at = now;
  const clock = { now: () => at };
  const jobs = new JobsService(
    new JobsRepo(database.orm),
    new MachineFamiliesService(new MachineFamiliesRepo(database.orm), new ChangeLog(database.orm), clock),
    clock,
  );
  for (const [n, demo] of DEMO_JOBS.entries()) {
    const day = new Date(now.getTime() - demo.daysAgo * DAY_MS);
    at = new Date(Date.UTC(day.getUTCFullYear(), day.getUTCMonth(), day.getUTCDate(), 7, 30));
    const step = () => (at = new Date(at.getTime() + 6 * 60_000));
    const machine = machineBySerial(database, organisation.id, demo.serialNumber);
    const sides = machine.sensorSides as MachineSide[];
    const speedRpm = machine.operatingSpeedRpm ?? 2000;
    let job = jobs.create(technician, { machineId: machine.id, scheduledFor: at.toISOString().slice(0, 10) });
    step();
    job = jobs.acknowledgeSafety(
      technician,
      job.id,
      [job.version],
      ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    );
    step();
    job = jobs.recordInspection(
      technician,
      job.id,
      [job.version],
      RecordInspectionSchema.parse({
        bearingEndPlayMm: 0.1 + (n % 3) * 0.04,
        shaftRunoutMm: 0.04 + (n % 2) * 0.03,
        checks: {
          teethOrKnives: n % 2 === 0 ? 'fixed' : 'ok',
          buildUpCleaned: 'fixed',
          welds: 'ok',
          beltsAndPulleys: 'ok',
        },
        notes:
          n % 2 === 0 ? 'Worn teeth replaced and caked debris washed off before the readings.' : undefined,
      }),
    );
    step();
    job = jobs.recordSetup(
      technician,
      job.id,
      [job.version],
      RecordSetupSchema.parse({
        sensors: sides.map((side) => ({
          side,
          position: `${side === 'left' ? 'Left' : 'Right'} bearing housing, horizontal`,
        })),
        tachometer: 'Magnetic stand on the left skid, aimed at the end plate',
        referenceMark: 'Reflective tape on the left end plate, in line with tooth row 1',
        rotationSeenFromLeft: machine.rotationSeenFromLeft,
        operatingSpeedRpm: speedRpm,
        amplitudeUnit: 'in/s-pk',
        phaseSense: 'lag',
        weightAngles: 'againstRotation',
      }),
    );
    const run = (
      kind: 'initial' | 'trial' | 'verification',
      weights: { planeIndex: number; massGrams: number; angleDeg: number }[],
      trialWeight?: { planeIndex: number; massGrams: number; angleDeg: number },
    ) => {
      step();
      const readings = modelReadings(demo.rotor, trialWeight ? [...weights, trialWeight] : weights);
      job = jobs.addRun(
        technician,
        job.id,
        [job.version],
        AddRunSchema.parse({
          kind,
          ...(trialWeight ? { trialWeight } : {}),
          readings: sides.map((side, index) => ({
            sensorSide: side,
            repeats: repeatsOf(readings[index]!, speedRpm, n + index),
          })),
        }),
      );
    };
    run('initial', []);
    run('trial', [], { planeIndex: 0, massGrams: demo.trialGrams, angleDeg: 0 });
    if (demo.until === 'half-way') continue;
    run('trial', [], { planeIndex: 1, massGrams: demo.trialGrams, angleDeg: 0 });
    step();
    job = jobs.computeCorrection(technician, job.id, [job.version], 'multi-plane');
    const correction = job.corrections.at(-1)!;
    const fitted = correction.plan.map((weight) => ({
      planeIndex: weight.planeIndex,
      massGrams: Math.max(1, Math.round(weight.massGrams)),
      angleDeg: Math.round(weight.angleDeg) % 360,
      radiusMm: machine.planes[weight.planeIndex]!.correctionRadiusMm,
      fixing: 'welded' as const,
    }));
    step();
    job = jobs.recordInstalled(technician, job.id, correction.id, [job.version], fitted);
    run('verification', fitted);
    step();
    job = jobs.complete(technician, job.id, [job.version]);
  }
};
