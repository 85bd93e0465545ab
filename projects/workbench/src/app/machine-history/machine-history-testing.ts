import { aMachine } from '../records/testing';
import type { MachineHistory, MachineHistoryJob, MachineHistorySide } from './machine-history.api';

/*
 * A machine's history as the server answers it, for the specs: an invented mulcher drum balanced twice
 * (once read in mm/s RMS, once in in/s peak) and a job begun after them. Figures are made up, in the range
 * of the trade.
 */

/** mm/s RMS per in/s peak for one sinusoid (25.4 / √2), as the engine converts. */
export const MM_S_RMS_PER_IN_S_PK = 25.4 / Math.SQRT2;

function side(
  sensorSide: 'left' | 'right',
  before: number,
  after: number | null,
  limit: number,
  toHistory = 1,
): MachineHistorySide {
  return {
    sensorSide,
    before: { runId: 100, amplitude: before, phaseDeg: 212, speedRpm: 2150 },
    after: after === null ? null : { runId: 104, amplitude: after, phaseDeg: 61, speedRpm: 2151 },
    limit,
    accepted: after === null ? null : after <= limit,
    inHistoryUnit: {
      before: before * toHistory,
      after: after === null ? null : after * toHistory,
      limit: limit * toHistory,
    },
  };
}

const ACCEPTANCE = { kind: 'shop-target' as const, amplitude: 0.15, unit: 'in/s-pk' as const };

/** A job of the history, completed in in/s peak unless told otherwise. */
export function aHistoryJob(overrides: Partial<MachineHistoryJob> = {}): MachineHistoryJob {
  return {
    id: 42,
    scheduledFor: '2026-04-14',
    completedAt: '2026-04-14T10:05:00.000Z',
    status: 'completed',
    technician: { id: 7, name: 'Rowan Tally' },
    methods: ['multi-plane'],
    unit: 'in/s-pk',
    operatingSpeedRpm: 2150,
    weightAngles: 'againstRotation',
    acceptance: ACCEPTANCE,
    accepted: true,
    sides: [side('left', 0.46, 0.08, 0.15), side('right', 0.31, 0.05, 0.15)],
    weightsFitted: [
      { planeIndex: 0, massGrams: 86, angleDeg: 118, radiusMm: 240, fixing: 'welded' },
      { planeIndex: 1, massGrams: 54, angleDeg: 300, radiusMm: 240, fixing: 'welded' },
    ],
    ...overrides,
  };
}

/** The history of the machine of `aMachine()`: two completed jobs and one begun. */
export function aHistory(overrides: Partial<MachineHistory> = {}): MachineHistory {
  const k = 1 / MM_S_RMS_PER_IN_S_PK;
  return {
    machine: aMachine(),
    unit: 'in/s-pk',
    jobs: [
      aHistoryJob({
        id: 18,
        scheduledFor: '2025-06-10',
        completedAt: '2025-06-10T11:42:00.000Z',
        unit: 'mm/s-rms',
        methods: ['single-plane', 'multi-plane'],
        sides: [
          side('left', 9.9, 1.8, 0.15 * MM_S_RMS_PER_IN_S_PK, k),
          side('right', 6.1, 1.2, 0.15 * MM_S_RMS_PER_IN_S_PK, k),
        ],
        weightsFitted: [{ planeIndex: 0, massGrams: 120, angleDeg: 40, radiusMm: 240, fixing: 'bolted' }],
      }),
      aHistoryJob(),
      aHistoryJob({
        id: 57,
        scheduledFor: '2026-11-30',
        completedAt: null,
        status: 'open',
        methods: [],
        accepted: null,
        sides: [side('left', 0.24, null, 0.15), side('right', 0.21, null, 0.15)],
        weightsFitted: [],
      }),
    ],
    weightsOnRotor: {
      jobId: 42,
      completedAt: '2026-04-14T10:05:00.000Z',
      weights: [
        {
          planeIndex: 0,
          massGrams: 120,
          angleDeg: 40,
          radiusMm: 240,
          fixing: 'bolted',
          jobId: 18,
          fittedOn: '2025-06-10',
        },
        {
          planeIndex: 0,
          massGrams: 86,
          angleDeg: 118,
          radiusMm: 240,
          fixing: 'welded',
          jobId: 42,
          fittedOn: '2026-04-14',
        },
        {
          planeIndex: 1,
          massGrams: 54,
          angleDeg: 300,
          radiusMm: 240,
          fixing: 'welded',
          jobId: 42,
          fittedOn: '2026-04-14',
        },
      ],
    },
    family: {
      id: 4,
      name: 'Thornmill FM-225 mulcher heads',
      sensitivities: [
        {
          sensorSide: 'left',
          planeIndex: 0,
          gramsPerUnit: 612,
          unit: 'in/s-pk',
          phaseLagDeg: 41,
          jobCount: 4,
          spread: { massPercent: 6.2, phaseDeg: 3.6 },
        },
        {
          sensorSide: 'right',
          planeIndex: 1,
          gramsPerUnit: 655,
          unit: 'in/s-pk',
          phaseLagDeg: 37,
          jobCount: 1,
          spread: null,
        },
      ],
    },
    ...overrides,
  };
}
