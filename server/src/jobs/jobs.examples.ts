import type { Job, JobPage, JobsHome } from '@counterpoise/api';

/*
 * The examples of the job routes in the OpenAPI document: an invented job of the demo shop on an invented
 * mulcher drum. Names, serial numbers and figures are made up (no real brand, person or company).
 */

const MACHINE = {
  id: 31,
  serialNumber: 'BF220-18734',
  make: 'Brackenfold',
  model: 'BF-220',
  customerId: 12,
  customerName: 'Alder Creek Land Clearing',
  familyId: 4,
  familyName: 'Fixed-tooth mulcher drum, 2.0 m',
};
const TECHNICIAN = { id: 7, name: 'Rowan Tally' };

export const CREATE_JOB_EXAMPLE = { machineId: 31, scheduledFor: '2026-04-14' };

export const ADD_RUN_EXAMPLE = {
  kind: 'initial' as const,
  readings: [
    {
      sensorSide: 'left' as const,
      repeats: [
        { amplitude: 0.46, phaseDeg: 38, speedRpm: 2150 },
        { amplitude: 0.47, phaseDeg: 40, speedRpm: 2152 },
      ],
    },
  ],
};

/** The initial run's readings typed again: the second repeat's phase was typed 4 for 40. */
export const CORRECT_RUN_READINGS_EXAMPLE = { readings: ADD_RUN_EXAMPLE.readings };

export const SETUP_EXAMPLE = {
  sensors: [
    { side: 'left' as const, position: 'Left bearing housing, horizontal' },
    { side: 'right' as const, position: 'Right bearing housing, horizontal' },
  ],
  tachometer: 'On the left skid, aimed at the drum end plate',
  referenceMark: 'Tape on the left end plate beside tooth row 1',
  rotationSeenFromLeft: 'counterClockwise' as const,
  operatingSpeedRpm: 2150,
  amplitudeUnit: 'in/s-pk' as const,
  phaseSense: 'lag' as const,
  weightAngles: 'againstRotation' as const,
};

export const INSPECTION_EXAMPLE = {
  bearingEndPlayMm: 0.4,
  shaftRunoutMm: 0.12,
  checks: {
    teethOrKnives: 'fixed' as const,
    buildUpCleaned: 'ok' as const,
    welds: 'ok' as const,
    beltsAndPulleys: 'ok' as const,
  },
  notes: 'Two teeth replaced on row 7.',
};

export const INSTALLED_EXAMPLE = {
  weights: [{ planeIndex: 0, massGrams: 100, angleDeg: 225, radiusMm: 210, fixing: 'welded' as const }],
};

export const JOB_EXAMPLE: Job = {
  id: 118,
  version: 5,
  status: 'open',
  nextStep: 'correction',
  scheduledFor: '2026-04-14',
  machine: MACHINE,
  technician: TECHNICIAN,
  createdAt: '2026-04-14T07:02:11.000Z',
  updatedAt: '2026-04-14T08:15:40.000Z',
  safety: {
    topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    acknowledgedAt: '2026-04-14T07:05:00.000Z',
    by: TECHNICIAN,
  },
  inspection: {
    ...INSPECTION_EXAMPLE,
    limits: { bearingEndPlayMm: 0.5, shaftRunoutMm: 0.3 },
    passed: true,
    reasons: [],
    measuredAt: '2026-04-14T07:40:00.000Z',
    by: TECHNICIAN,
    override: null,
  },
  setup: { ...SETUP_EXAMPLE, recordedAt: '2026-04-14T07:55:00.000Z' },
  runs: [
    {
      id: 402,
      sequence: 1,
      kind: 'initial',
      amplitudeOnly: false,
      trialWeight: null,
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: ADD_RUN_EXAMPLE.readings[0]!.repeats,
          average: { amplitude: 0.465, phaseDeg: 39 },
          spread: 0.009,
          spreadRatio: 0.019,
          trusted: true,
          speedRpm: 2151,
        },
      ],
      warnings: [],
      createdAt: '2026-04-14T08:12:05.000Z',
      by: TECHNICIAN,
      retyped: [
        {
          at: '2026-04-14T08:15:40.000Z',
          by: TECHNICIAN,
          previousReadings: [
            {
              sensorSide: 'left',
              repeats: [
                { amplitude: 0.46, phaseDeg: 38, speedRpm: 2150 },
                { amplitude: 0.47, phaseDeg: 4, speedRpm: 2152 },
              ],
            },
          ],
          previousTrialWeight: null,
        },
      ],
    },
  ],
  corrections: [],
  verification: {
    runId: 402,
    acceptance: { kind: 'shop-target', amplitude: 0.15, unit: 'in/s-pk' },
    sides: [{ sensorSide: 'left', amplitude: 0.465, limit: 0.15, accepted: false }],
    accepted: false,
    nextSide: 'left',
    why: 'The left side reads 0.465 in/s-pk, above its limit of 0.15 in/s-pk.',
  },
  completion: null,
  abandonment: null,
};

const SUMMARY = {
  id: JOB_EXAMPLE.id,
  version: JOB_EXAMPLE.version,
  status: JOB_EXAMPLE.status,
  scheduledFor: JOB_EXAMPLE.scheduledFor,
  machine: MACHINE,
  technician: TECHNICIAN,
  updatedAt: JOB_EXAMPLE.updatedAt,
};

export const JOB_PAGE_EXAMPLE: JobPage = { items: [SUMMARY], total: 1, page: 1, pageSize: 25 };

export const JOBS_HOME_EXAMPLE: JobsHome = {
  myOpenJobs: [SUMMARY],
  waitingForManager: [],
  machinesDue: [
    {
      machine: { ...MACHINE, id: 33, serialNumber: 'QS180-0457', make: 'Quernstone', model: 'QS-180' },
      lastJob: { id: 97, scheduledFor: '2025-02-03', status: 'completed' },
      reason: 'The last job was on 2025-02-03, more than 365 days ago.',
    },
  ],
  dueAfterDays: 365,
};
