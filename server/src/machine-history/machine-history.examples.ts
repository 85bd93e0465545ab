import type { MachineHistory } from '@counterpoise/api';
import { MACHINE_EXAMPLE } from '../machines/machines.examples';

/*
 * The examples of the history routes in the OpenAPI document: an invented mulcher drum of the demo shop
 * balanced twice. Names, serial numbers and figures are made up (no real brand, person or company).
 */

const TECHNICIAN = { id: 7, name: 'Rowan Tally' };
const ACCEPTANCE = { kind: 'shop-target' as const, amplitude: 0.15, unit: 'in/s-pk' as const };

export const MACHINE_JOB_HISTORY_EXAMPLE: MachineHistory = {
  machine: MACHINE_EXAMPLE as MachineHistory['machine'],
  unit: 'in/s-pk',
  jobs: [
    {
      id: 18,
      scheduledFor: '2025-06-10',
      completedAt: '2025-06-10T11:42:00.000Z',
      status: 'completed',
      technician: TECHNICIAN,
      methods: ['multi-plane'],
      unit: 'mm/s-rms',
      operatingSpeedRpm: 2150,
      weightAngles: 'againstRotation',
      acceptance: ACCEPTANCE,
      accepted: true,
      sides: [
        {
          sensorSide: 'left',
          before: { runId: 140, amplitude: 9.9, phaseDeg: 212, speedRpm: 2148 },
          after: { runId: 144, amplitude: 1.8, phaseDeg: 61, speedRpm: 2151 },
          limit: 2.69,
          accepted: true,
          inHistoryUnit: { before: 0.551, after: 0.1, limit: 0.15 },
        },
      ],
      weightsFitted: [{ planeIndex: 0, massGrams: 86, angleDeg: 118, radiusMm: 210, fixing: 'welded' }],
    },
    {
      id: 42,
      scheduledFor: '2026-04-14',
      completedAt: '2026-04-14T10:05:00.000Z',
      status: 'completed',
      technician: TECHNICIAN,
      methods: ['single-plane'],
      unit: 'in/s-pk',
      operatingSpeedRpm: 2150,
      weightAngles: 'againstRotation',
      acceptance: ACCEPTANCE,
      accepted: true,
      sides: [
        {
          sensorSide: 'left',
          before: { runId: 402, amplitude: 0.46, phaseDeg: 39, speedRpm: 2151 },
          after: { runId: 405, amplitude: 0.08, phaseDeg: 300, speedRpm: 2149 },
          limit: 0.15,
          accepted: true,
          inHistoryUnit: { before: 0.46, after: 0.08, limit: 0.15 },
        },
      ],
      weightsFitted: [{ planeIndex: 0, massGrams: 50, angleDeg: 225, radiusMm: 210, fixing: 'bolted' }],
    },
  ],
  weightsOnRotor: {
    jobId: 42,
    completedAt: '2026-04-14T10:05:00.000Z',
    weights: [
      {
        planeIndex: 0,
        massGrams: 86,
        angleDeg: 118,
        radiusMm: 210,
        fixing: 'welded',
        jobId: 18,
        fittedOn: '2025-06-10',
      },
      {
        planeIndex: 0,
        massGrams: 50,
        angleDeg: 225,
        radiusMm: 210,
        fixing: 'bolted',
        jobId: 42,
        fittedOn: '2026-04-14',
      },
    ],
  },
  family: {
    id: 4,
    name: 'Fixed-tooth mulcher drum, 2.0 m',
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
    ],
  },
};

/** The first lines of an export, as a spreadsheet would show them. */
export const JOBS_CSV_EXAMPLE =
  '\uFEFFJob no.,Scheduled for,Completed on,Customer,Make,Model,Serial number,Family,Technician,State,' +
  'Methods,Unit,Left before,Left after,Right before,Right after,Acceptance level,Within acceptance,' +
  'Weights fitted,Report signed,Report signed on\r\n' +
  '42,2026-04-14,2026-04-14,"Alder Creek Land Clearing, North yard",Northfield,FM-220,NF220-18734,' +
  'Fixed-tooth mulcher drum 2.0 m,Rowan Tally,completed,single-plane,in/s-pk,0.46,0.08,,,' +
  'Shop target 0.15 in/s-pk,yes,"plane 1: 50 g at 225°, 210 mm, bolted",yes,2026-04-14\r\n';
