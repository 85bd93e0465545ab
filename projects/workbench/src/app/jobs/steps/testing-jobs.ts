import type { MachineFamily } from '../../machine-families/machine-families.api';
import type { Machine } from '../../machines/machines.api';
import type { Job } from '../jobs.api';

/*
 * Jobs for the steps' specs, as the demo server answers them (server/src/jobs/jobs.seed.ts): the modelled
 * mulcher drum's job 8 at four moments, and a completed job of the same family. Figures are the server's own.
 */

/** The two-plane mulcher of job 8: 12 tooth-row positions from 15°, a skid-plate bolt at 80–100°. */
export const MULCHER_MACHINE: Machine = {
  id: 5,
  version: 1,
  createdAt: '2026-12-05T02:45:54.614Z',
  updatedAt: '2026-12-05T02:45:54.614Z',
  archivedAt: null,
  customerId: 6,
  customerName: 'Wyndle Ridge Line Services',
  familyId: 1,
  familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  make: 'Brackenfold',
  model: 'BF-250',
  serialNumber: 'BF250-00921',
  hours: 3120,
  rotorMassKg: 480,
  operatingSpeedRpm: 2100,
  sensorSides: ['left', 'right'],
  rotationSeenFromLeft: 'counterClockwise',
  planes: [
    {
      correctionRadiusMm: 210,
      positions: {
        count: 12,
        firstDeg: 15,
      },
      blockedSectors: [
        {
          fromDeg: 80,
          toDeg: 100,
          label: 'Skid plate bolt',
        },
      ],
    },
    {
      correctionRadiusMm: 210,
      positions: {
        count: 12,
        firstDeg: 15,
      },
      blockedSectors: [
        {
          fromDeg: 80,
          toDeg: 100,
          label: 'Skid plate bolt',
        },
      ],
    },
  ],
  stockWeightsGrams: [50, 100, 150, 200],
  acceptance: null,
  notes: 'Arrives on a low-loader; balance in the yard, not on site.',
};

/** The mulchers' family, its stored sensitivities refined by four completed jobs. */
export const MULCHER_FAMILY: MachineFamily = {
  id: 1,
  version: 5,
  createdAt: '2026-12-05T02:45:54.614Z',
  updatedAt: '2026-11-05T08:30:00.000Z',
  archivedAt: null,
  name: 'Fixed-tooth mulcher drum, 2.0 m',
  rotorType: 'fixed-tooth-drum',
  nominalSpeedRpm: 2200,
  planeCount: 2,
  correctionRadiiMm: [210, 210],
  inspectionLimits: {
    bearingEndPlayMm: 0.3,
    shaftRunoutMm: 0.2,
  },
  acceptance: {
    kind: 'shop-target',
    amplitude: 0.15,
    unit: 'in/s-pk',
  },
  sensitivities: [
    {
      sensorSide: 'left',
      planeIndex: 0,
      gramsPerUnit: 618.6324471372923,
      unit: 'in/s-pk',
      phaseLagDeg: 39.97195845572418,
      jobCount: 4,
      spread: {
        massPercent: 3.5540731423455734,
        phaseDeg: 2.0367628522542676,
      },
    },
    {
      sensorSide: 'right',
      planeIndex: 0,
      gramsPerUnit: 2197.1370472026797,
      unit: 'in/s-pk',
      phaseLagDeg: 121.26033682871147,
      jobCount: 4,
      spread: {
        massPercent: 6.197662294629117,
        phaseDeg: 3.5532761530661654,
      },
    },
    {
      sensorSide: 'left',
      planeIndex: 1,
      gramsPerUnit: 2487.37202118242,
      unit: 'in/s-pk',
      phaseLagDeg: 73.52963802661986,
      jobCount: 4,
      spread: {
        massPercent: 4.449665234148564,
        phaseDeg: 2.5503124369568813,
      },
    },
    {
      sensorSide: 'right',
      planeIndex: 1,
      gramsPerUnit: 668.4822976393197,
      unit: 'in/s-pk',
      phaseLagDeg: 34.90245269429539,
      jobCount: 4,
      spread: {
        massPercent: 1.9092727057700882,
        phaseDeg: 1.0939991529921986,
      },
    },
  ],
  notes: 'Weld plates between the tooth rows, never on a tooth holder. Grind the spot clean first.',
  machineCount: 5,
};

/** Job 8 after its initial run and a trial run in the left plane (version 6): it opens at the correction. */
export const JOB_AFTER_LEFT_TRIAL: Job = {
  id: 8,
  version: 6,
  status: 'open',
  nextStep: 'correction',
  scheduledFor: '2026-12-05',
  machine: {
    id: 5,
    serialNumber: 'BF250-00921',
    make: 'Brackenfold',
    model: 'BF-250',
    customerId: 6,
    customerName: 'Wyndle Ridge Line Services',
    familyId: 1,
    familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  },
  technician: {
    id: 3,
    name: 'Tomasz Wrenfield',
  },
  createdAt: '2026-12-05T07:30:00.000Z',
  updatedAt: '2026-12-05T08:00:00.000Z',
  safety: {
    topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    acknowledgedAt: '2026-12-05T07:36:00.000Z',
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  inspection: {
    bearingEndPlayMm: 0.14,
    shaftRunoutMm: 0.07,
    checks: {
      teethOrKnives: 'ok',
      buildUpCleaned: 'fixed',
      welds: 'ok',
      beltsAndPulleys: 'ok',
    },
    notes: null,
    limits: {
      bearingEndPlayMm: 0.3,
      shaftRunoutMm: 0.2,
    },
    passed: true,
    reasons: [],
    measuredAt: '2026-12-05T07:42:00.000Z',
    override: null,
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  setup: {
    sensors: [
      {
        side: 'left',
        position: 'Left bearing housing, horizontal',
      },
      {
        side: 'right',
        position: 'Right bearing housing, horizontal',
      },
    ],
    tachometer: 'Magnetic stand on the left skid, aimed at the end plate',
    referenceMark: 'Reflective tape on the left end plate, in line with tooth row 1',
    rotationSeenFromLeft: 'counterClockwise',
    operatingSpeedRpm: 2100,
    amplitudeUnit: 'in/s-pk',
    phaseSense: 'lag',
    weightAngles: 'againstRotation',
    recordedAt: '2026-12-05T07:48:00.000Z',
  },
  runs: [
    {
      id: 29,
      sequence: 1,
      kind: 'initial',
      trialWeight: null,
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.57,
              phaseDeg: 300,
              speedRpm: 2100,
            },
            {
              amplitude: 0.561,
              phaseDeg: 299,
              speedRpm: 2097,
            },
          ],
          average: {
            amplitude: 0.5654784688563126,
            phaseDeg: 299.50397888083796,
          },
          spread: 0.006678417471256812,
          spreadRatio: 0.011810206469512441,
          trusted: true,
          speedRpm: 2098.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.35,
              phaseDeg: 105,
              speedRpm: 2100,
            },
            {
              amplitude: 0.348,
              phaseDeg: 105,
              speedRpm: 2099,
            },
          ],
          average: {
            amplitude: 0.349,
            phaseDeg: 105.00000000000001,
          },
          spread: 0.0010000000000000026,
          spreadRatio: 0.0028653295128939905,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T07:54:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
    {
      id: 30,
      sequence: 2,
      kind: 'trial',
      trialWeight: {
        planeIndex: 0,
        massGrams: 120,
        angleDeg: 0,
      },
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.568,
              phaseDeg: 320,
              speedRpm: 2100,
            },
            {
              amplitude: 0.559,
              phaseDeg: 319,
              speedRpm: 2097,
            },
          ],
          average: {
            amplitude: 0.5634785450150236,
            phaseDeg: 319.503993002864,
          },
          spread: 0.00666553131805345,
          spreadRatio: 0.011829254861648248,
          trusted: true,
          speedRpm: 2098.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.402,
              phaseDeg: 107,
              speedRpm: 2100,
            },
            {
              amplitude: 0.4,
              phaseDeg: 106,
              speedRpm: 2099,
            },
          ],
          average: {
            amplitude: 0.40098473124368944,
            phaseDeg: 106.50124691444564,
          },
          spread: 0.003639410587738693,
          spreadRatio: 0.00907618246822202,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T08:00:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
  ],
  corrections: [],
  verification: {
    runId: 29,
    acceptance: {
      kind: 'shop-target',
      amplitude: 0.15,
      unit: 'in/s-pk',
    },
    sides: [
      {
        sensorSide: 'left',
        amplitude: 0.5654784688563126,
        limit: 0.15,
        accepted: false,
      },
      {
        sensorSide: 'right',
        amplitude: 0.349,
        limit: 0.15,
        accepted: false,
      },
    ],
    accepted: false,
    nextSide: 'left',
    why: 'The left side reads 0.565 in/s-pk, above its limit of 0.15 in/s-pk, and above the right side (0.349 in/s-pk): work the worse side first.',
  },
  completion: null,
  abandonment: null,
};

/** Job 8 with a single-plane correction computed from its trial run (version 7). */
export const JOB_WITH_CORRECTION: Job = {
  id: 8,
  version: 7,
  status: 'open',
  nextStep: 'correction',
  scheduledFor: '2026-12-05',
  machine: {
    id: 5,
    serialNumber: 'BF250-00921',
    make: 'Brackenfold',
    model: 'BF-250',
    customerId: 6,
    customerName: 'Wyndle Ridge Line Services',
    familyId: 1,
    familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  },
  technician: {
    id: 3,
    name: 'Tomasz Wrenfield',
  },
  createdAt: '2026-12-05T07:30:00.000Z',
  updatedAt: '2026-12-05T02:46:15.530Z',
  safety: {
    topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    acknowledgedAt: '2026-12-05T07:36:00.000Z',
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  inspection: {
    bearingEndPlayMm: 0.14,
    shaftRunoutMm: 0.07,
    checks: {
      teethOrKnives: 'ok',
      buildUpCleaned: 'fixed',
      welds: 'ok',
      beltsAndPulleys: 'ok',
    },
    notes: null,
    limits: {
      bearingEndPlayMm: 0.3,
      shaftRunoutMm: 0.2,
    },
    passed: true,
    reasons: [],
    measuredAt: '2026-12-05T07:42:00.000Z',
    override: null,
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  setup: {
    sensors: [
      {
        side: 'left',
        position: 'Left bearing housing, horizontal',
      },
      {
        side: 'right',
        position: 'Right bearing housing, horizontal',
      },
    ],
    tachometer: 'Magnetic stand on the left skid, aimed at the end plate',
    referenceMark: 'Reflective tape on the left end plate, in line with tooth row 1',
    rotationSeenFromLeft: 'counterClockwise',
    operatingSpeedRpm: 2100,
    amplitudeUnit: 'in/s-pk',
    phaseSense: 'lag',
    weightAngles: 'againstRotation',
    recordedAt: '2026-12-05T07:48:00.000Z',
  },
  runs: [
    {
      id: 29,
      sequence: 1,
      kind: 'initial',
      trialWeight: null,
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.57,
              phaseDeg: 300,
              speedRpm: 2100,
            },
            {
              amplitude: 0.561,
              phaseDeg: 299,
              speedRpm: 2097,
            },
          ],
          average: {
            amplitude: 0.5654784688563126,
            phaseDeg: 299.50397888083796,
          },
          spread: 0.006678417471256812,
          spreadRatio: 0.011810206469512441,
          trusted: true,
          speedRpm: 2098.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.35,
              phaseDeg: 105,
              speedRpm: 2100,
            },
            {
              amplitude: 0.348,
              phaseDeg: 105,
              speedRpm: 2099,
            },
          ],
          average: {
            amplitude: 0.349,
            phaseDeg: 105.00000000000001,
          },
          spread: 0.0010000000000000026,
          spreadRatio: 0.0028653295128939905,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T07:54:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
    {
      id: 30,
      sequence: 2,
      kind: 'trial',
      trialWeight: {
        planeIndex: 0,
        massGrams: 120,
        angleDeg: 0,
      },
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.568,
              phaseDeg: 320,
              speedRpm: 2100,
            },
            {
              amplitude: 0.559,
              phaseDeg: 319,
              speedRpm: 2097,
            },
          ],
          average: {
            amplitude: 0.5634785450150236,
            phaseDeg: 319.503993002864,
          },
          spread: 0.00666553131805345,
          spreadRatio: 0.011829254861648248,
          trusted: true,
          speedRpm: 2098.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.402,
              phaseDeg: 107,
              speedRpm: 2100,
            },
            {
              amplitude: 0.4,
              phaseDeg: 106,
              speedRpm: 2099,
            },
          ],
          average: {
            amplitude: 0.40098473124368944,
            phaseDeg: 106.50124691444564,
          },
          spread: 0.003639410587738693,
          spreadRatio: 0.00907618246822202,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T08:00:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
  ],
  corrections: [
    {
      id: 8,
      sequence: 1,
      method: 'single-plane',
      basis: 'trial',
      runIds: [29, 30],
      calc: {
        route: 'single-plane',
        request: {
          initial: {
            amplitude: 0.5654784688563126,
            phaseDeg: 299.50397888083796,
          },
          trialWeight: {
            mass: 120,
            angleDeg: 0,
          },
          withTrial: {
            amplitude: 0.5634785450150236,
            phaseDeg: 319.503993002864,
          },
          weightAngles: 'againstRotation',
        },
        sensorSides: ['left'],
      },
      result: {
        influenceCoefficient: {
          amplitudePerMass: 0.0016337613202816912,
          phaseDeg: 40.07959151350297,
        },
        correction: {
          mass: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
        totalCorrection: {
          mass: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
        trialEffect: {
          amplitude: 0.19605135843380292,
          phaseDeg: 40.07959151350296,
        },
        predictedResidual: {
          amplitude: 0,
          phaseDeg: 0,
        },
        warnings: [],
      },
      plan: [
        {
          planeIndex: 0,
          massGrams: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
      ],
      installed: null,
      predicted: null,
      installedAt: null,
      warnings: [],
      createdAt: '2026-12-05T02:46:15.530Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
  ],
  verification: {
    runId: 29,
    acceptance: {
      kind: 'shop-target',
      amplitude: 0.15,
      unit: 'in/s-pk',
    },
    sides: [
      {
        sensorSide: 'left',
        amplitude: 0.5654784688563126,
        limit: 0.15,
        accepted: false,
      },
      {
        sensorSide: 'right',
        amplitude: 0.349,
        limit: 0.15,
        accepted: false,
      },
    ],
    accepted: false,
    nextSide: 'left',
    why: 'The left side reads 0.565 in/s-pk, above its limit of 0.15 in/s-pk, and above the right side (0.349 in/s-pk): work the worse side first.',
  },
  completion: null,
  abandonment: null,
};

/** Job 8 with that correction's weights recorded as fitted, and the reading they should give (version 8). */
export const JOB_WITH_INSTALLED: Job = {
  id: 8,
  version: 8,
  status: 'open',
  nextStep: 'verification',
  scheduledFor: '2026-12-05',
  machine: {
    id: 5,
    serialNumber: 'BF250-00921',
    make: 'Brackenfold',
    model: 'BF-250',
    customerId: 6,
    customerName: 'Wyndle Ridge Line Services',
    familyId: 1,
    familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  },
  technician: {
    id: 3,
    name: 'Tomasz Wrenfield',
  },
  createdAt: '2026-12-05T07:30:00.000Z',
  updatedAt: '2026-12-05T02:46:18.699Z',
  safety: {
    topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    acknowledgedAt: '2026-12-05T07:36:00.000Z',
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  inspection: {
    bearingEndPlayMm: 0.14,
    shaftRunoutMm: 0.07,
    checks: {
      teethOrKnives: 'ok',
      buildUpCleaned: 'fixed',
      welds: 'ok',
      beltsAndPulleys: 'ok',
    },
    notes: null,
    limits: {
      bearingEndPlayMm: 0.3,
      shaftRunoutMm: 0.2,
    },
    passed: true,
    reasons: [],
    measuredAt: '2026-12-05T07:42:00.000Z',
    override: null,
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  setup: {
    sensors: [
      {
        side: 'left',
        position: 'Left bearing housing, horizontal',
      },
      {
        side: 'right',
        position: 'Right bearing housing, horizontal',
      },
    ],
    tachometer: 'Magnetic stand on the left skid, aimed at the end plate',
    referenceMark: 'Reflective tape on the left end plate, in line with tooth row 1',
    rotationSeenFromLeft: 'counterClockwise',
    operatingSpeedRpm: 2100,
    amplitudeUnit: 'in/s-pk',
    phaseSense: 'lag',
    weightAngles: 'againstRotation',
    recordedAt: '2026-12-05T07:48:00.000Z',
  },
  runs: [
    {
      id: 29,
      sequence: 1,
      kind: 'initial',
      trialWeight: null,
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.57,
              phaseDeg: 300,
              speedRpm: 2100,
            },
            {
              amplitude: 0.561,
              phaseDeg: 299,
              speedRpm: 2097,
            },
          ],
          average: {
            amplitude: 0.5654784688563126,
            phaseDeg: 299.50397888083796,
          },
          spread: 0.006678417471256812,
          spreadRatio: 0.011810206469512441,
          trusted: true,
          speedRpm: 2098.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.35,
              phaseDeg: 105,
              speedRpm: 2100,
            },
            {
              amplitude: 0.348,
              phaseDeg: 105,
              speedRpm: 2099,
            },
          ],
          average: {
            amplitude: 0.349,
            phaseDeg: 105.00000000000001,
          },
          spread: 0.0010000000000000026,
          spreadRatio: 0.0028653295128939905,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T07:54:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
    {
      id: 30,
      sequence: 2,
      kind: 'trial',
      trialWeight: {
        planeIndex: 0,
        massGrams: 120,
        angleDeg: 0,
      },
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.568,
              phaseDeg: 320,
              speedRpm: 2100,
            },
            {
              amplitude: 0.559,
              phaseDeg: 319,
              speedRpm: 2097,
            },
          ],
          average: {
            amplitude: 0.5634785450150236,
            phaseDeg: 319.503993002864,
          },
          spread: 0.00666553131805345,
          spreadRatio: 0.011829254861648248,
          trusted: true,
          speedRpm: 2098.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.402,
              phaseDeg: 107,
              speedRpm: 2100,
            },
            {
              amplitude: 0.4,
              phaseDeg: 106,
              speedRpm: 2099,
            },
          ],
          average: {
            amplitude: 0.40098473124368944,
            phaseDeg: 106.50124691444564,
          },
          spread: 0.003639410587738693,
          spreadRatio: 0.00907618246822202,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T08:00:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
  ],
  corrections: [
    {
      id: 8,
      sequence: 1,
      method: 'single-plane',
      basis: 'trial',
      runIds: [29, 30],
      calc: {
        route: 'single-plane',
        request: {
          initial: {
            amplitude: 0.5654784688563126,
            phaseDeg: 299.50397888083796,
          },
          trialWeight: {
            mass: 120,
            angleDeg: 0,
          },
          withTrial: {
            amplitude: 0.5634785450150236,
            phaseDeg: 319.503993002864,
          },
          weightAngles: 'againstRotation',
        },
        sensorSides: ['left'],
      },
      result: {
        influenceCoefficient: {
          amplitudePerMass: 0.0016337613202816912,
          phaseDeg: 40.07959151350297,
        },
        correction: {
          mass: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
        totalCorrection: {
          mass: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
        trialEffect: {
          amplitude: 0.19605135843380292,
          phaseDeg: 40.07959151350296,
        },
        predictedResidual: {
          amplitude: 0,
          phaseDeg: 0,
        },
        warnings: [],
      },
      plan: [
        {
          planeIndex: 0,
          massGrams: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
      ],
      installed: [
        {
          planeIndex: 0,
          massGrams: 300,
          angleDeg: 75,
          radiusMm: 210,
          fixing: 'welded',
        },
        {
          planeIndex: 0,
          massGrams: 50,
          angleDeg: 105,
          radiusMm: 210,
          fixing: 'welded',
        },
      ],
      predicted: [
        {
          sensorSide: 'left',
          reading: {
            amplitude: 0.004031699637286975,
            phaseDeg: 338.65140886049994,
          },
        },
      ],
      installedAt: '2026-12-05T02:46:18.699Z',
      warnings: [],
      createdAt: '2026-12-05T02:46:15.530Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
  ],
  verification: {
    runId: 29,
    acceptance: {
      kind: 'shop-target',
      amplitude: 0.15,
      unit: 'in/s-pk',
    },
    sides: [
      {
        sensorSide: 'left',
        amplitude: 0.5654784688563126,
        limit: 0.15,
        accepted: false,
      },
      {
        sensorSide: 'right',
        amplitude: 0.349,
        limit: 0.15,
        accepted: false,
      },
    ],
    accepted: false,
    nextSide: 'left',
    why: 'The left side reads 0.565 in/s-pk, above its limit of 0.15 in/s-pk, and above the right side (0.349 in/s-pk): work the worse side first.',
  },
  completion: null,
  abandonment: null,
};

/** Job 8 after a verification run: the left side within the shop target, the right still above (version 9). */
export const JOB_VERIFIED_RIGHT_ABOVE: Job = {
  id: 8,
  version: 9,
  status: 'open',
  nextStep: 'correction',
  scheduledFor: '2026-12-05',
  machine: {
    id: 5,
    serialNumber: 'BF250-00921',
    make: 'Brackenfold',
    model: 'BF-250',
    customerId: 6,
    customerName: 'Wyndle Ridge Line Services',
    familyId: 1,
    familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  },
  technician: {
    id: 3,
    name: 'Tomasz Wrenfield',
  },
  createdAt: '2026-12-05T07:30:00.000Z',
  updatedAt: '2026-12-05T02:46:28.360Z',
  safety: {
    topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    acknowledgedAt: '2026-12-05T07:36:00.000Z',
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  inspection: {
    bearingEndPlayMm: 0.14,
    shaftRunoutMm: 0.07,
    checks: {
      teethOrKnives: 'ok',
      buildUpCleaned: 'fixed',
      welds: 'ok',
      beltsAndPulleys: 'ok',
    },
    notes: null,
    limits: {
      bearingEndPlayMm: 0.3,
      shaftRunoutMm: 0.2,
    },
    passed: true,
    reasons: [],
    measuredAt: '2026-12-05T07:42:00.000Z',
    override: null,
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  setup: {
    sensors: [
      {
        side: 'left',
        position: 'Left bearing housing, horizontal',
      },
      {
        side: 'right',
        position: 'Right bearing housing, horizontal',
      },
    ],
    tachometer: 'Magnetic stand on the left skid, aimed at the end plate',
    referenceMark: 'Reflective tape on the left end plate, in line with tooth row 1',
    rotationSeenFromLeft: 'counterClockwise',
    operatingSpeedRpm: 2100,
    amplitudeUnit: 'in/s-pk',
    phaseSense: 'lag',
    weightAngles: 'againstRotation',
    recordedAt: '2026-12-05T07:48:00.000Z',
  },
  runs: [
    {
      id: 29,
      sequence: 1,
      kind: 'initial',
      trialWeight: null,
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.57,
              phaseDeg: 300,
              speedRpm: 2100,
            },
            {
              amplitude: 0.561,
              phaseDeg: 299,
              speedRpm: 2097,
            },
          ],
          average: {
            amplitude: 0.5654784688563126,
            phaseDeg: 299.50397888083796,
          },
          spread: 0.006678417471256812,
          spreadRatio: 0.011810206469512441,
          trusted: true,
          speedRpm: 2098.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.35,
              phaseDeg: 105,
              speedRpm: 2100,
            },
            {
              amplitude: 0.348,
              phaseDeg: 105,
              speedRpm: 2099,
            },
          ],
          average: {
            amplitude: 0.349,
            phaseDeg: 105.00000000000001,
          },
          spread: 0.0010000000000000026,
          spreadRatio: 0.0028653295128939905,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T07:54:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
    {
      id: 30,
      sequence: 2,
      kind: 'trial',
      trialWeight: {
        planeIndex: 0,
        massGrams: 120,
        angleDeg: 0,
      },
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.568,
              phaseDeg: 320,
              speedRpm: 2100,
            },
            {
              amplitude: 0.559,
              phaseDeg: 319,
              speedRpm: 2097,
            },
          ],
          average: {
            amplitude: 0.5634785450150236,
            phaseDeg: 319.503993002864,
          },
          spread: 0.00666553131805345,
          spreadRatio: 0.011829254861648248,
          trusted: true,
          speedRpm: 2098.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.402,
              phaseDeg: 107,
              speedRpm: 2100,
            },
            {
              amplitude: 0.4,
              phaseDeg: 106,
              speedRpm: 2099,
            },
          ],
          average: {
            amplitude: 0.40098473124368944,
            phaseDeg: 106.50124691444564,
          },
          spread: 0.003639410587738693,
          spreadRatio: 0.00907618246822202,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T08:00:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
    {
      id: 31,
      sequence: 3,
      kind: 'verification',
      trialWeight: null,
      weightsOnRotor: [
        {
          planeIndex: 0,
          massGrams: 300,
          angleDeg: 75,
        },
        {
          planeIndex: 0,
          massGrams: 50,
          angleDeg: 105,
        },
      ],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.061,
              phaseDeg: 212,
              speedRpm: 2099,
            },
            {
              amplitude: 0.059,
              phaseDeg: 214,
              speedRpm: 2100,
            },
          ],
          average: {
            amplitude: 0.05999086424799081,
            phaseDeg: 212.9833316412783,
          },
          spread: 0.0014478282975329746,
          spreadRatio: 0.024134146351816637,
          trusted: true,
          speedRpm: 2099.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.318,
              phaseDeg: 101,
              speedRpm: 2099,
            },
            {
              amplitude: 0.322,
              phaseDeg: 103,
              speedRpm: 2100,
            },
          ],
          average: {
            amplitude: 0.31995126435400073,
            phaseDeg: 102.00625063467217,
          },
          spread: 0.005931984345590983,
          spreadRatio: 0.018540274743305007,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T02:46:28.359Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
  ],
  corrections: [
    {
      id: 8,
      sequence: 1,
      method: 'single-plane',
      basis: 'trial',
      runIds: [29, 30],
      calc: {
        route: 'single-plane',
        request: {
          initial: {
            amplitude: 0.5654784688563126,
            phaseDeg: 299.50397888083796,
          },
          trialWeight: {
            mass: 120,
            angleDeg: 0,
          },
          withTrial: {
            amplitude: 0.5634785450150236,
            phaseDeg: 319.503993002864,
          },
          weightAngles: 'againstRotation',
        },
        sensorSides: ['left'],
      },
      result: {
        influenceCoefficient: {
          amplitudePerMass: 0.0016337613202816912,
          phaseDeg: 40.07959151350297,
        },
        correction: {
          mass: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
        totalCorrection: {
          mass: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
        trialEffect: {
          amplitude: 0.19605135843380292,
          phaseDeg: 40.07959151350296,
        },
        predictedResidual: {
          amplitude: 0,
          phaseDeg: 0,
        },
        warnings: [],
      },
      plan: [
        {
          planeIndex: 0,
          massGrams: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
      ],
      installed: [
        {
          planeIndex: 0,
          massGrams: 300,
          angleDeg: 75,
          radiusMm: 210,
          fixing: 'welded',
        },
        {
          planeIndex: 0,
          massGrams: 50,
          angleDeg: 105,
          radiusMm: 210,
          fixing: 'welded',
        },
      ],
      predicted: [
        {
          sensorSide: 'left',
          reading: {
            amplitude: 0.004031699637286975,
            phaseDeg: 338.65140886049994,
          },
        },
      ],
      installedAt: '2026-12-05T02:46:18.699Z',
      warnings: [],
      createdAt: '2026-12-05T02:46:15.530Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
  ],
  verification: {
    runId: 31,
    acceptance: {
      kind: 'shop-target',
      amplitude: 0.15,
      unit: 'in/s-pk',
    },
    sides: [
      {
        sensorSide: 'left',
        amplitude: 0.05999086424799081,
        limit: 0.15,
        accepted: true,
      },
      {
        sensorSide: 'right',
        amplitude: 0.31995126435400073,
        limit: 0.15,
        accepted: false,
      },
    ],
    accepted: false,
    nextSide: 'right',
    why: 'The right side reads 0.32 in/s-pk, above its limit of 0.15 in/s-pk; the left side is within its limit.',
  },
  completion: null,
  abandonment: null,
};

/** A completed two-plane job on another mulcher of the family, the fourth to refine its sensitivity. */
export const COMPLETED_MULCHER_JOB: Job = {
  id: 6,
  version: 11,
  status: 'completed',
  nextStep: 'done',
  scheduledFor: '2026-11-05',
  machine: {
    id: 3,
    serialNumber: 'QS180-0457',
    make: 'Quernstone',
    model: 'QS-180',
    customerId: 1,
    customerName: 'Alder Creek Land Clearing',
    familyId: 1,
    familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  },
  technician: {
    id: 3,
    name: 'Tomasz Wrenfield',
  },
  createdAt: '2026-11-05T07:30:00.000Z',
  updatedAt: '2026-11-05T08:30:00.000Z',
  safety: {
    topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    acknowledgedAt: '2026-11-05T07:36:00.000Z',
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  inspection: {
    bearingEndPlayMm: 0.18,
    shaftRunoutMm: 0.07,
    checks: {
      teethOrKnives: 'ok',
      buildUpCleaned: 'fixed',
      welds: 'ok',
      beltsAndPulleys: 'ok',
    },
    notes: null,
    limits: {
      bearingEndPlayMm: 0.3,
      shaftRunoutMm: 0.2,
    },
    passed: true,
    reasons: [],
    measuredAt: '2026-11-05T07:42:00.000Z',
    override: null,
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  setup: {
    sensors: [
      {
        side: 'left',
        position: 'Left bearing housing, horizontal',
      },
      {
        side: 'right',
        position: 'Right bearing housing, horizontal',
      },
    ],
    tachometer: 'Magnetic stand on the left skid, aimed at the end plate',
    referenceMark: 'Reflective tape on the left end plate, in line with tooth row 1',
    rotationSeenFromLeft: 'clockwise',
    operatingSpeedRpm: 2300,
    amplitudeUnit: 'in/s-pk',
    phaseSense: 'lag',
    weightAngles: 'againstRotation',
    recordedAt: '2026-11-05T07:48:00.000Z',
  },
  runs: [
    {
      id: 21,
      sequence: 1,
      kind: 'initial',
      trialWeight: null,
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.39,
              phaseDeg: 250,
              speedRpm: 2300,
            },
            {
              amplitude: 0.39,
              phaseDeg: 250,
              speedRpm: 2300,
            },
          ],
          average: {
            amplitude: 0.39000000000000007,
            phaseDeg: 249.99999999999994,
          },
          spread: 0,
          spreadRatio: 0,
          trusted: true,
          speedRpm: 2300,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.36,
              phaseDeg: 30,
              speedRpm: 2300,
            },
            {
              amplitude: 0.364,
              phaseDeg: 31,
              speedRpm: 2302,
            },
          ],
          average: {
            amplitude: 0.36198621656997765,
            phaseDeg: 30.502762501062936,
          },
          spread: 0.0037388518763446675,
          spreadRatio: 0.010328713374151052,
          trusted: true,
          speedRpm: 2301,
        },
      ],
      warnings: [],
      createdAt: '2026-11-05T07:54:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
    {
      id: 22,
      sequence: 2,
      kind: 'trial',
      trialWeight: {
        planeIndex: 0,
        massGrams: 80,
        angleDeg: 0,
      },
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.288,
              phaseDeg: 263,
              speedRpm: 2300,
            },
            {
              amplitude: 0.288,
              phaseDeg: 263,
              speedRpm: 2300,
            },
          ],
          average: {
            amplitude: 0.288,
            phaseDeg: 263,
          },
          spread: 0,
          spreadRatio: 0,
          trusted: true,
          speedRpm: 2300,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.362,
              phaseDeg: 36,
              speedRpm: 2300,
            },
            {
              amplitude: 0.365,
              phaseDeg: 37,
              speedRpm: 2302,
            },
          ],
          average: {
            amplitude: 0.36348615926952016,
            phaseDeg: 36.502063326104114,
          },
          spread: 0.003508848741825833,
          spreadRatio: 0.009653321460375244,
          trusted: true,
          speedRpm: 2301,
        },
      ],
      warnings: [],
      createdAt: '2026-11-05T08:00:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
    {
      id: 23,
      sequence: 3,
      kind: 'trial',
      trialWeight: {
        planeIndex: 1,
        massGrams: 80,
        angleDeg: 0,
      },
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.358,
              phaseDeg: 250,
              speedRpm: 2300,
            },
            {
              amplitude: 0.358,
              phaseDeg: 250,
              speedRpm: 2300,
            },
          ],
          average: {
            amplitude: 0.35799999999999993,
            phaseDeg: 249.99999999999994,
          },
          spread: 0,
          spreadRatio: 0,
          trusted: true,
          speedRpm: 2300,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.481,
              phaseDeg: 31,
              speedRpm: 2300,
            },
            {
              amplitude: 0.486,
              phaseDeg: 32,
              speedRpm: 2302,
            },
          ],
          average: {
            amplitude: 0.4834815902937406,
            phaseDeg: 31.502585381036397,
          },
          spread: 0.004904268246693167,
          spreadRatio: 0.010143650441195837,
          trusted: true,
          speedRpm: 2301,
        },
      ],
      warnings: [],
      createdAt: '2026-11-05T08:06:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
    {
      id: 24,
      sequence: 4,
      kind: 'verification',
      trialWeight: null,
      weightsOnRotor: [
        {
          planeIndex: 0,
          massGrams: 294,
          angleDeg: 34,
        },
        {
          planeIndex: 1,
          massGrams: 201,
          angleDeg: 198,
        },
      ],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.001,
              phaseDeg: 30,
              speedRpm: 2300,
            },
            {
              amplitude: 0.001,
              phaseDeg: 30,
              speedRpm: 2300,
            },
          ],
          average: {
            amplitude: 0.001,
            phaseDeg: 29.999999999999993,
          },
          spread: 0,
          spreadRatio: 0,
          trusted: true,
          speedRpm: 2300,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.012,
              phaseDeg: 331,
              speedRpm: 2300,
            },
            {
              amplitude: 0.012,
              phaseDeg: 332,
              speedRpm: 2302,
            },
          ],
          average: {
            amplitude: 0.011999543076770055,
            phaseDeg: 331.5,
          },
          spread: 0.00010471842598048611,
          spreadRatio: 0.008726867790758697,
          trusted: true,
          speedRpm: 2301,
        },
      ],
      warnings: [],
      createdAt: '2026-11-05T08:24:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
  ],
  corrections: [
    {
      id: 6,
      sequence: 1,
      method: 'multi-plane',
      basis: 'trial',
      runIds: [21, 22, 23],
      calc: {
        route: 'multi-plane',
        request: {
          planes: 2,
          initial: [
            {
              amplitude: 0.39000000000000007,
              phaseDeg: 249.99999999999994,
            },
            {
              amplitude: 0.36198621656997765,
              phaseDeg: 30.502762501062936,
            },
          ],
          runs: [
            {
              weights: [
                {
                  plane: 1,
                  mass: 80,
                  angleDeg: 0,
                },
              ],
              readings: [
                {
                  amplitude: 0.288,
                  phaseDeg: 263,
                },
                {
                  amplitude: 0.36348615926952016,
                  phaseDeg: 36.502063326104114,
                },
              ],
            },
            {
              weights: [
                {
                  plane: 2,
                  mass: 80,
                  angleDeg: 0,
                },
              ],
              readings: [
                {
                  amplitude: 0.35799999999999993,
                  phaseDeg: 249.99999999999994,
                },
                {
                  amplitude: 0.4834815902937406,
                  phaseDeg: 31.502585381036397,
                },
              ],
            },
          ],
          weightAngles: 'againstRotation',
        },
        sensorSides: ['left', 'right'],
      },
      result: {
        corrections: [
          {
            plane: 1,
            mass: 293.87848177901753,
            angleDeg: 33.71008765796736,
          },
          {
            plane: 2,
            mass: 200.82325570713064,
            angleDeg: 198.15362911451686,
          },
        ],
        toAdd: [
          {
            plane: 1,
            mass: 293.87848177901753,
            angleDeg: 33.71008765796736,
          },
          {
            plane: 2,
            mass: 277.96102089576414,
            angleDeg: 193.00890007484398,
          },
        ],
        influenceCoefficients: [
          {
            sensor: 1,
            plane: 1,
            amplitudePerMass: 0.001589099029651159,
            phaseDeg: 39.36201711358218,
          },
          {
            sensor: 1,
            plane: 2,
            amplitudePerMass: 0.00040000000000000186,
            phaseDeg: 70,
          },
          {
            sensor: 2,
            plane: 1,
            amplitudePerMass: 0.0004749176085996446,
            phaseDeg: 121.24294511196194,
          },
          {
            sensor: 2,
            plane: 2,
            amplitudePerMass: 0.0015214311628656205,
            phaseDeg: 34.47730403449716,
          },
        ],
        conditionNumber: 1.3284707736857944,
        predictedResidual: [
          {
            amplitude: 0,
            phaseDeg: 0,
          },
          {
            amplitude: 0,
            phaseDeg: 0,
          },
        ],
        warnings: [],
      },
      plan: [
        {
          planeIndex: 0,
          massGrams: 293.87848177901753,
          angleDeg: 33.71008765796736,
        },
        {
          planeIndex: 1,
          massGrams: 200.8232557071306,
          angleDeg: 198.15362911451683,
        },
      ],
      installed: [
        {
          planeIndex: 0,
          massGrams: 294,
          angleDeg: 34,
          radiusMm: 210,
          fixing: 'welded',
        },
        {
          planeIndex: 1,
          massGrams: 201,
          angleDeg: 198,
          radiusMm: 210,
          fixing: 'welded',
        },
      ],
      predicted: [
        {
          sensorSide: 'left',
          reading: {
            amplitude: 0.002554574102128062,
            phaseDeg: 161.65787689397007,
          },
        },
        {
          sensorSide: 'right',
          reading: {
            amplitude: 0.001210270961598537,
            phaseDeg: 195.89857834456805,
          },
        },
      ],
      installedAt: '2026-11-05T08:18:00.000Z',
      warnings: [],
      createdAt: '2026-11-05T08:12:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
  ],
  verification: {
    runId: 24,
    acceptance: {
      kind: 'shop-target',
      amplitude: 0.12,
      unit: 'in/s-pk',
    },
    sides: [
      {
        sensorSide: 'left',
        amplitude: 0.001,
        limit: 0.12,
        accepted: true,
      },
      {
        sensorSide: 'right',
        amplitude: 0.011999543076770055,
        limit: 0.12,
        accepted: true,
      },
    ],
    accepted: true,
    nextSide: null,
    why: 'Every side is within the acceptance level (left 0.001 in/s-pk ≤ 0.12 in/s-pk, right 0.012 in/s-pk ≤ 0.12 in/s-pk).',
  },
  completion: {
    completedAt: '2026-11-05T08:30:00.000Z',
    accepted: true,
    beforeAfter: [
      {
        sensorSide: 'left',
        before: {
          amplitude: 0.39000000000000007,
          phaseDeg: 249.99999999999994,
        },
        after: {
          amplitude: 0.001,
          phaseDeg: 29.999999999999993,
        },
      },
      {
        sensorSide: 'right',
        before: {
          amplitude: 0.36198621656997765,
          phaseDeg: 30.502762501062936,
        },
        after: {
          amplitude: 0.011999543076770055,
          phaseDeg: 331.5,
        },
      },
    ],
    weightsOnRotor: [
      {
        planeIndex: 0,
        massGrams: 294,
        angleDeg: 34,
        radiusMm: 210,
        fixing: 'welded',
        jobId: 6,
      },
      {
        planeIndex: 1,
        massGrams: 201,
        angleDeg: 198,
        radiusMm: 210,
        fixing: 'welded',
        jobId: 6,
      },
    ],
    coefficients: [
      {
        sensorSide: 'left',
        planeIndex: 0,
        amplitudePerGram: 0.001589099029651159,
        phaseDeg: 39.36201711358218,
        unit: 'in/s-pk',
      },
      {
        sensorSide: 'left',
        planeIndex: 1,
        amplitudePerGram: 0.00040000000000000186,
        phaseDeg: 70,
        unit: 'in/s-pk',
      },
      {
        sensorSide: 'right',
        planeIndex: 0,
        amplitudePerGram: 0.0004749176085996446,
        phaseDeg: 121.24294511196194,
        unit: 'in/s-pk',
      },
      {
        sensorSide: 'right',
        planeIndex: 1,
        amplitudePerGram: 0.0015214311628656205,
        phaseDeg: 34.47730403449716,
        unit: 'in/s-pk',
      },
    ],
    familySensitivities: [
      {
        sensorSide: 'left',
        planeIndex: 0,
        gramsPerUnit: 618.6324471372923,
        unit: 'in/s-pk',
        phaseLagDeg: 39.97195845572418,
        jobCount: 4,
        spread: {
          massPercent: 3.5540731423455734,
          phaseDeg: 2.0367628522542676,
        },
      },
      {
        sensorSide: 'right',
        planeIndex: 0,
        gramsPerUnit: 2197.1370472026797,
        unit: 'in/s-pk',
        phaseLagDeg: 121.26033682871147,
        jobCount: 4,
        spread: {
          massPercent: 6.197662294629117,
          phaseDeg: 3.5532761530661654,
        },
      },
      {
        sensorSide: 'left',
        planeIndex: 1,
        gramsPerUnit: 2487.37202118242,
        unit: 'in/s-pk',
        phaseLagDeg: 73.52963802661986,
        jobCount: 4,
        spread: {
          massPercent: 4.449665234148564,
          phaseDeg: 2.5503124369568813,
        },
      },
      {
        sensorSide: 'right',
        planeIndex: 1,
        gramsPerUnit: 668.4822976393197,
        unit: 'in/s-pk',
        phaseLagDeg: 34.90245269429539,
        jobCount: 4,
        spread: {
          massPercent: 1.9092727057700882,
          phaseDeg: 1.0939991529921986,
        },
      },
    ],
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  abandonment: null,
};

// Job 13 on the same mulcher, as the demo server answered its first steps (safety, inspection, set-up specs).

/** Job 13 as started (version 1): nothing done yet, it opens at the safety step. */
export const JOB_NEW: Job = {
  id: 13,
  version: 1,
  status: 'open',
  nextStep: 'safety',
  scheduledFor: '2026-12-05',
  machine: {
    id: 5,
    serialNumber: 'BF250-00921',
    make: 'Brackenfold',
    model: 'BF-250',
    customerId: 6,
    customerName: 'Wyndle Ridge Line Services',
    familyId: 1,
    familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  },
  technician: {
    id: 3,
    name: 'Tomasz Wrenfield',
  },
  createdAt: '2026-12-05T02:56:03.275Z',
  updatedAt: '2026-12-05T02:56:03.275Z',
  safety: null,
  inspection: null,
  setup: null,
  runs: [],
  corrections: [],
  verification: null,
  completion: null,
  abandonment: null,
};

/** Job 13 with its safety cautions acknowledged (version 2): it opens at the inspection. */
export const JOB_SAFETY_ACKNOWLEDGED: Job = {
  id: 13,
  version: 2,
  status: 'open',
  nextStep: 'inspection',
  scheduledFor: '2026-12-05',
  machine: {
    id: 5,
    serialNumber: 'BF250-00921',
    make: 'Brackenfold',
    model: 'BF-250',
    customerId: 6,
    customerName: 'Wyndle Ridge Line Services',
    familyId: 1,
    familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  },
  technician: {
    id: 3,
    name: 'Tomasz Wrenfield',
  },
  createdAt: '2026-12-05T02:56:03.275Z',
  updatedAt: '2026-12-05T02:56:04.741Z',
  safety: {
    topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    acknowledgedAt: '2026-12-05T02:56:04.741Z',
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  inspection: null,
  setup: null,
  runs: [],
  corrections: [],
  verification: null,
  completion: null,
  abandonment: null,
};

/** Job 13 on hold (version 3): the end play over the family’s limit and a cracked weld left. */
export const JOB_ON_HOLD: Job = {
  id: 13,
  version: 3,
  status: 'on-hold',
  nextStep: 'inspection',
  scheduledFor: '2026-12-05',
  machine: {
    id: 5,
    serialNumber: 'BF250-00921',
    make: 'Brackenfold',
    model: 'BF-250',
    customerId: 6,
    customerName: 'Wyndle Ridge Line Services',
    familyId: 1,
    familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  },
  technician: {
    id: 3,
    name: 'Tomasz Wrenfield',
  },
  createdAt: '2026-12-05T02:56:03.275Z',
  updatedAt: '2026-12-05T02:56:04.916Z',
  safety: {
    topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    acknowledgedAt: '2026-12-05T02:56:04.741Z',
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  inspection: {
    bearingEndPlayMm: 0.42,
    shaftRunoutMm: 0.12,
    checks: {
      teethOrKnives: 'ok',
      buildUpCleaned: 'fixed',
      welds: 'fault',
      beltsAndPulleys: 'ok',
    },
    notes: 'Crack at the weld of the left end plate, 40 mm long.',
    limits: {
      bearingEndPlayMm: 0.3,
      shaftRunoutMm: 0.2,
    },
    passed: false,
    reasons: [
      'Bearing end play is 0.42 mm, over the limit of 0.3 mm: repair before balancing.',
      'Welds: a fault is left; fix it before balancing.',
    ],
    measuredAt: '2026-12-05T02:56:04.916Z',
    override: null,
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  setup: null,
  runs: [],
  corrections: [],
  verification: null,
  completion: null,
  abandonment: null,
};

/** Job 13 let go on by the manager with a reason (version 4): it opens at the set-up. */
export const JOB_LET_GO_ON: Job = {
  id: 13,
  version: 4,
  status: 'open',
  nextStep: 'setup',
  scheduledFor: '2026-12-05',
  machine: {
    id: 5,
    serialNumber: 'BF250-00921',
    make: 'Brackenfold',
    model: 'BF-250',
    customerId: 6,
    customerName: 'Wyndle Ridge Line Services',
    familyId: 1,
    familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  },
  technician: {
    id: 3,
    name: 'Tomasz Wrenfield',
  },
  createdAt: '2026-12-05T02:56:03.275Z',
  updatedAt: '2026-12-05T02:56:05.112Z',
  safety: {
    topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    acknowledgedAt: '2026-12-05T02:56:04.741Z',
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  inspection: {
    bearingEndPlayMm: 0.42,
    shaftRunoutMm: 0.12,
    checks: {
      teethOrKnives: 'ok',
      buildUpCleaned: 'fixed',
      welds: 'fault',
      beltsAndPulleys: 'ok',
    },
    notes: 'Crack at the weld of the left end plate, 40 mm long.',
    limits: {
      bearingEndPlayMm: 0.3,
      shaftRunoutMm: 0.2,
    },
    passed: false,
    reasons: [
      'Bearing end play is 0.42 mm, over the limit of 0.3 mm: repair before balancing.',
      'Welds: a fault is left; fix it before balancing.',
    ],
    measuredAt: '2026-12-05T02:56:04.916Z',
    override: {
      reason:
        'The crack is outside the weight area; the customer has the drum booked for repair next week and needs the machine today.',
      at: '2026-12-05T02:56:05.112Z',
      by: {
        id: 2,
        name: 'Dagny Fairbrook',
      },
    },
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  setup: null,
  runs: [],
  corrections: [],
  verification: null,
  completion: null,
  abandonment: null,
};

/** Job 8 completed after that verification run (version 10): not within its level, the family refined with it. */
export const JOB_8_COMPLETED: Job = {
  id: 8,
  version: 10,
  status: 'completed',
  nextStep: 'done',
  scheduledFor: '2026-12-05',
  machine: {
    id: 5,
    serialNumber: 'BF250-00921',
    make: 'Brackenfold',
    model: 'BF-250',
    customerId: 6,
    customerName: 'Wyndle Ridge Line Services',
    familyId: 1,
    familyName: 'Fixed-tooth mulcher drum, 2.0 m',
  },
  technician: {
    id: 3,
    name: 'Tomasz Wrenfield',
  },
  createdAt: '2026-12-05T07:30:00.000Z',
  updatedAt: '2026-12-05T03:04:21.037Z',
  safety: {
    topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'],
    acknowledgedAt: '2026-12-05T07:36:00.000Z',
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  inspection: {
    bearingEndPlayMm: 0.14,
    shaftRunoutMm: 0.07,
    checks: {
      teethOrKnives: 'ok',
      buildUpCleaned: 'fixed',
      welds: 'ok',
      beltsAndPulleys: 'ok',
    },
    notes: null,
    limits: {
      bearingEndPlayMm: 0.3,
      shaftRunoutMm: 0.2,
    },
    passed: true,
    reasons: [],
    measuredAt: '2026-12-05T07:42:00.000Z',
    override: null,
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  setup: {
    sensors: [
      {
        side: 'left',
        position: 'Left bearing housing, horizontal',
      },
      {
        side: 'right',
        position: 'Right bearing housing, horizontal',
      },
    ],
    tachometer: 'Magnetic stand on the left skid, aimed at the end plate',
    referenceMark: 'Reflective tape on the left end plate, in line with tooth row 1',
    rotationSeenFromLeft: 'counterClockwise',
    operatingSpeedRpm: 2100,
    amplitudeUnit: 'in/s-pk',
    phaseSense: 'lag',
    weightAngles: 'againstRotation',
    recordedAt: '2026-12-05T07:48:00.000Z',
  },
  runs: [
    {
      id: 29,
      sequence: 1,
      kind: 'initial',
      trialWeight: null,
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.57,
              phaseDeg: 300,
              speedRpm: 2100,
            },
            {
              amplitude: 0.561,
              phaseDeg: 299,
              speedRpm: 2097,
            },
          ],
          average: {
            amplitude: 0.5654784688563126,
            phaseDeg: 299.50397888083796,
          },
          spread: 0.006678417471256812,
          spreadRatio: 0.011810206469512441,
          trusted: true,
          speedRpm: 2098.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.35,
              phaseDeg: 105,
              speedRpm: 2100,
            },
            {
              amplitude: 0.348,
              phaseDeg: 105,
              speedRpm: 2099,
            },
          ],
          average: {
            amplitude: 0.349,
            phaseDeg: 105.00000000000001,
          },
          spread: 0.0010000000000000026,
          spreadRatio: 0.0028653295128939905,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T07:54:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
      retyped: [],
    },
    {
      id: 30,
      sequence: 2,
      kind: 'trial',
      trialWeight: {
        planeIndex: 0,
        massGrams: 120,
        angleDeg: 0,
      },
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.568,
              phaseDeg: 320,
              speedRpm: 2100,
            },
            {
              amplitude: 0.559,
              phaseDeg: 319,
              speedRpm: 2097,
            },
          ],
          average: {
            amplitude: 0.5634785450150236,
            phaseDeg: 319.503993002864,
          },
          spread: 0.00666553131805345,
          spreadRatio: 0.011829254861648248,
          trusted: true,
          speedRpm: 2098.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.402,
              phaseDeg: 107,
              speedRpm: 2100,
            },
            {
              amplitude: 0.4,
              phaseDeg: 106,
              speedRpm: 2099,
            },
          ],
          average: {
            amplitude: 0.40098473124368944,
            phaseDeg: 106.50124691444564,
          },
          spread: 0.003639410587738693,
          spreadRatio: 0.00907618246822202,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T08:00:00.000Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
      retyped: [],
    },
    {
      id: 31,
      sequence: 3,
      kind: 'verification',
      trialWeight: null,
      weightsOnRotor: [
        {
          planeIndex: 0,
          massGrams: 300,
          angleDeg: 75,
        },
        {
          planeIndex: 0,
          massGrams: 50,
          angleDeg: 105,
        },
      ],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            {
              amplitude: 0.061,
              phaseDeg: 212,
              speedRpm: 2099,
            },
            {
              amplitude: 0.059,
              phaseDeg: 214,
              speedRpm: 2100,
            },
          ],
          average: {
            amplitude: 0.05999086424799081,
            phaseDeg: 212.9833316412783,
          },
          spread: 0.0014478282975329746,
          spreadRatio: 0.024134146351816637,
          trusted: true,
          speedRpm: 2099.5,
        },
        {
          sensorSide: 'right',
          repeats: [
            {
              amplitude: 0.318,
              phaseDeg: 101,
              speedRpm: 2099,
            },
            {
              amplitude: 0.322,
              phaseDeg: 103,
              speedRpm: 2100,
            },
          ],
          average: {
            amplitude: 0.31995126435400073,
            phaseDeg: 102.00625063467217,
          },
          spread: 0.005931984345590983,
          spreadRatio: 0.018540274743305007,
          trusted: true,
          speedRpm: 2099.5,
        },
      ],
      warnings: [],
      createdAt: '2026-12-05T03:04:20.947Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
      retyped: [],
    },
  ],
  corrections: [
    {
      id: 8,
      sequence: 1,
      method: 'single-plane',
      basis: 'trial',
      runIds: [29, 30],
      calc: {
        route: 'single-plane',
        request: {
          initial: {
            amplitude: 0.5654784688563126,
            phaseDeg: 299.50397888083796,
          },
          trialWeight: {
            mass: 120,
            angleDeg: 0,
          },
          withTrial: {
            amplitude: 0.5634785450150236,
            phaseDeg: 319.503993002864,
          },
          weightAngles: 'againstRotation',
        },
        sensorSides: ['left'],
      },
      result: {
        influenceCoefficient: {
          amplitudePerMass: 0.0016337613202816912,
          phaseDeg: 40.07959151350297,
        },
        correction: {
          mass: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
        totalCorrection: {
          mass: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
        trialEffect: {
          amplitude: 0.19605135843380292,
          phaseDeg: 40.07959151350296,
        },
        predictedResidual: {
          amplitude: 0,
          phaseDeg: 0,
        },
        warnings: [],
      },
      plan: [
        {
          planeIndex: 0,
          massGrams: 346.12061250098236,
          angleDeg: 79.42438736733502,
        },
      ],
      installed: [
        {
          planeIndex: 0,
          massGrams: 300,
          angleDeg: 75,
          radiusMm: 210,
          fixing: 'welded',
        },
        {
          planeIndex: 0,
          massGrams: 50,
          angleDeg: 105,
          radiusMm: 210,
          fixing: 'welded',
        },
      ],
      predicted: [
        {
          sensorSide: 'left',
          reading: {
            amplitude: 0.004031699637286975,
            phaseDeg: 338.65140886049994,
          },
        },
      ],
      installedAt: '2026-12-05T03:04:20.901Z',
      warnings: [],
      createdAt: '2026-12-05T03:04:20.664Z',
      by: {
        id: 3,
        name: 'Tomasz Wrenfield',
      },
    },
  ],
  verification: {
    runId: 31,
    acceptance: {
      kind: 'shop-target',
      amplitude: 0.15,
      unit: 'in/s-pk',
    },
    sides: [
      {
        sensorSide: 'left',
        amplitude: 0.05999086424799081,
        limit: 0.15,
        accepted: true,
      },
      {
        sensorSide: 'right',
        amplitude: 0.31995126435400073,
        limit: 0.15,
        accepted: false,
      },
    ],
    accepted: false,
    nextSide: 'right',
    why: 'The right side reads 0.32 in/s-pk, above its limit of 0.15 in/s-pk; the left side is within its limit.',
  },
  completion: {
    completedAt: '2026-12-05T03:04:21.037Z',
    accepted: false,
    beforeAfter: [
      {
        sensorSide: 'left',
        before: {
          amplitude: 0.5654784688563126,
          phaseDeg: 299.50397888083796,
        },
        after: {
          amplitude: 0.05999086424799081,
          phaseDeg: 212.9833316412783,
        },
      },
      {
        sensorSide: 'right',
        before: {
          amplitude: 0.349,
          phaseDeg: 105.00000000000001,
        },
        after: {
          amplitude: 0.31995126435400073,
          phaseDeg: 102.00625063467217,
        },
      },
    ],
    weightsOnRotor: [
      {
        planeIndex: 0,
        massGrams: 300,
        angleDeg: 75,
        radiusMm: 210,
        fixing: 'welded',
        jobId: 8,
      },
      {
        planeIndex: 0,
        massGrams: 50,
        angleDeg: 105,
        radiusMm: 210,
        fixing: 'welded',
        jobId: 8,
      },
    ],
    coefficients: [
      {
        sensorSide: 'left',
        planeIndex: 0,
        amplitudePerGram: 0.0016414953508745618,
        phaseDeg: 46.422499036128116,
        unit: 'in/s-pk',
      },
    ],
    familySensitivities: [
      {
        sensorSide: 'left',
        planeIndex: 0,
        gramsPerUnit: 617.3542163265209,
        unit: 'in/s-pk',
        phaseLagDeg: 41.27668616243758,
        jobCount: 5,
        spread: {
          massPercent: 5.561711593669232,
          phaseDeg: 3.1882711485716095,
        },
      },
      {
        sensorSide: 'right',
        planeIndex: 0,
        gramsPerUnit: 2197.1370472026797,
        unit: 'in/s-pk',
        phaseLagDeg: 121.26033682871147,
        jobCount: 4,
        spread: {
          massPercent: 6.197662294629117,
          phaseDeg: 3.5532761530661654,
        },
      },
      {
        sensorSide: 'left',
        planeIndex: 1,
        gramsPerUnit: 2487.37202118242,
        unit: 'in/s-pk',
        phaseLagDeg: 73.52963802661986,
        jobCount: 4,
        spread: {
          massPercent: 4.449665234148564,
          phaseDeg: 2.5503124369568813,
        },
      },
      {
        sensorSide: 'right',
        planeIndex: 1,
        gramsPerUnit: 668.4822976393197,
        unit: 'in/s-pk',
        phaseLagDeg: 34.90245269429539,
        jobCount: 4,
        spread: {
          massPercent: 1.9092727057700882,
          phaseDeg: 1.0939991529921986,
        },
      },
    ],
    by: {
      id: 3,
      name: 'Tomasz Wrenfield',
    },
  },
  abandonment: null,
};
