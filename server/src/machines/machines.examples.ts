/*
 * The examples of the machine routes in the OpenAPI document: an invented mulcher of an invented
 * customer of the demo shop. Make, model, serial number and figures are made up (no real brand).
 */

export const CREATE_MACHINE_EXAMPLE = {
  customerId: 12,
  familyId: 4,
  make: 'Northfield',
  model: 'FM-220',
  serialNumber: 'NF220-18734',
  hours: 1460,
  rotorMassKg: 410,
  operatingSpeedRpm: 2150,
  sensorSides: ['left', 'right'],
  rotationSeenFromLeft: 'counterClockwise',
  planes: [
    {
      correctionRadiusMm: 210,
      positions: { count: 12, firstDeg: 15 },
      blockedSectors: [{ fromDeg: 80, toDeg: 100, label: 'Skid plate bolt' }],
    },
    { correctionRadiusMm: 210, positions: { count: 12, firstDeg: 15 }, blockedSectors: [] },
  ],
  stockWeightsGrams: [25, 50, 100, 150],
  acceptance: null,
  notes: 'Carrier has a hydrostatic drive: run the drum at full throttle for readings.',
};

export const UPDATE_MACHINE_EXAMPLE = { hours: 1532 };

export const MACHINE_EXAMPLE = {
  id: 31,
  version: 4,
  createdAt: '2026-02-16T09:30:02.000Z',
  updatedAt: '2026-04-03T14:20:47.000Z',
  archivedAt: null,
  ...CREATE_MACHINE_EXAMPLE,
  ...UPDATE_MACHINE_EXAMPLE,
  customerName: 'Alder Creek Land Clearing',
  familyName: 'Fixed-tooth mulcher drum, 2.0 m',
};

export const MACHINE_PAGE_EXAMPLE = { items: [MACHINE_EXAMPLE], total: 1, page: 1, pageSize: 25 };

export const MACHINE_HISTORY_EXAMPLE = {
  changes: [
    {
      id: 90,
      version: 4,
      action: 'updated',
      at: '2026-04-03T14:20:47.000Z',
      by: { id: 3, name: 'Tomasz Wrenfield' },
      fields: [{ field: 'hours', before: 1460, after: 1532 }],
    },
  ],
};
