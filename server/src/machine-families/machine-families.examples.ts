/*
 * The examples of the machine family routes in the OpenAPI document: an invented family of mulcher
 * drums of the demo shop. The figures are typical of the trade, made up for the example (no maker's
 * published data).
 */

export const CREATE_MACHINE_FAMILY_EXAMPLE = {
  name: 'Fixed-tooth mulcher drum, 2.0 m',
  rotorType: 'fixed-tooth-drum',
  nominalSpeedRpm: 2200,
  planeCount: 2,
  correctionRadiiMm: [210, 210],
  inspectionLimits: { bearingEndPlayMm: 0.5, shaftRunoutMm: 0.25 },
  acceptance: { kind: 'shop-target', amplitude: 0.15, unit: 'in/s-pk' },
  sensitivities: [
    {
      sensorSide: 'left',
      planeIndex: 0,
      gramsPerUnit: 900,
      unit: 'in/s-pk',
      phaseLagDeg: 30,
      jobCount: 0,
      spread: null,
    },
  ],
  notes: 'Weld plates between the tooth holders, never on a holder.',
};

export const UPDATE_MACHINE_FAMILY_EXAMPLE = {
  acceptance: { kind: 'shop-target', amplitude: 0.12, unit: 'in/s-pk' },
};

export const MACHINE_FAMILY_EXAMPLE = {
  id: 4,
  version: 2,
  createdAt: '2026-01-20T10:00:00.000Z',
  updatedAt: '2026-03-11T16:42:09.000Z',
  archivedAt: null,
  ...CREATE_MACHINE_FAMILY_EXAMPLE,
  ...UPDATE_MACHINE_FAMILY_EXAMPLE,
  machineCount: 5,
};

export const MACHINE_FAMILY_PAGE_EXAMPLE = {
  items: [MACHINE_FAMILY_EXAMPLE],
  total: 1,
  page: 1,
  pageSize: 25,
};

export const MACHINE_FAMILY_HISTORY_EXAMPLE = {
  changes: [
    {
      id: 57,
      version: 2,
      action: 'updated',
      at: '2026-03-11T16:42:09.000Z',
      by: { id: 2, name: 'Dagny Fairbrook' },
      fields: [
        {
          field: 'acceptance',
          before: { kind: 'shop-target', amplitude: 0.15, unit: 'in/s-pk' },
          after: { kind: 'shop-target', amplitude: 0.12, unit: 'in/s-pk' },
        },
      ],
    },
    {
      id: 19,
      version: 1,
      action: 'created',
      at: '2026-01-20T10:00:00.000Z',
      by: { id: 1, name: 'Maren Oakhurst' },
      fields: [
        { field: 'name', before: null, after: 'Fixed-tooth mulcher drum, 2.0 m' },
        { field: 'planeCount', before: null, after: 2 },
      ],
    },
  ],
};
