import type { HttpRequest } from '@angular/common/http';
import type { HttpTestingController, TestRequest } from '@angular/common/http/testing';
import type { RecordChange } from '@counterpoise/api';
import type { Customer } from '../customers/customers.api';
import type { MachineFamily } from '../machine-families/machine-families.api';
import type { Machine } from '../machines/machines.api';
import { routedPageTestBed } from '../shell/testing';

/*
 * Invented records of an invented shop, for the specs of the records pages. Addresses are under
 * example.com, which is reserved for examples; names, makes and serial numbers are made up.
 */

/** A customer, as the API answers it. */
export function aCustomer(overrides: Partial<Customer> = {}): Customer {
  return {
    id: 7,
    version: 3,
    createdAt: '2026-03-02T08:00:00.000Z',
    updatedAt: '2026-11-20T14:05:00.000Z',
    archivedAt: null,
    name: 'Bramblecote Estate Services',
    email: 'yard@bramblecote.example.com',
    phone: '+44 1632 960 118',
    siteAddress: 'Home Farm yard\nBramblecote',
    notes: null,
    contacts: [{ name: 'Orla Penhallow', role: 'fleet manager', phone: '+44 1632 960 119' }],
    machineCount: 2,
    ...overrides,
  };
}

/** A machine family, as the API answers it. */
export function aFamily(overrides: Partial<MachineFamily> = {}): MachineFamily {
  return {
    id: 4,
    version: 2,
    createdAt: '2026-02-10T09:00:00.000Z',
    updatedAt: '2026-10-01T10:30:00.000Z',
    archivedAt: null,
    name: 'Thornmill FM-225 mulcher heads',
    rotorType: 'fixed-tooth-drum',
    nominalSpeedRpm: 2200,
    planeCount: 2,
    correctionRadiiMm: [240, 240],
    inspectionLimits: { bearingEndPlayMm: 3.18, shaftRunoutMm: 0.36 },
    acceptance: { kind: 'shop-target', amplitude: 0.12, unit: 'in/s-pk' },
    sensitivities: [
      {
        sensorSide: 'left',
        planeIndex: 0,
        gramsPerUnit: 410,
        unit: 'in/s-pk',
        phaseLagDeg: 35,
        jobCount: 5,
        spread: { massPercent: 8, phaseDeg: 12 },
      },
    ],
    notes: null,
    machineCount: 3,
    ...overrides,
  };
}

/** A machine, as the API answers it. */
export function aMachine(overrides: Partial<Machine> = {}): Machine {
  return {
    id: 12,
    version: 5,
    createdAt: '2026-03-05T08:00:00.000Z',
    updatedAt: '2026-11-28T16:40:00.000Z',
    archivedAt: null,
    customerId: 7,
    customerName: 'Bramblecote Estate Services',
    familyId: 4,
    familyName: 'Thornmill FM-225 mulcher heads',
    make: 'Thornmill',
    model: 'FM-225',
    serialNumber: 'TM225-0419',
    hours: 1830,
    rotorMassKg: 410,
    operatingSpeedRpm: 2200,
    sensorSides: ['left', 'right'],
    rotationSeenFromLeft: 'clockwise',
    planes: [
      {
        correctionRadiusMm: 240,
        positions: { count: 12, firstDeg: 15 },
        blockedSectors: [{ fromDeg: 350, toDeg: 10, label: 'holder' }],
      },
      { correctionRadiusMm: 240, positions: null, blockedSectors: [] },
    ],
    stockWeightsGrams: [50, 100, 150],
    acceptance: null,
    notes: null,
    ...overrides,
  };
}

/** One change of a record's history. */
export function aChange(overrides: Partial<RecordChange> = {}): RecordChange {
  return {
    id: 31,
    version: 3,
    action: 'updated',
    at: '2026-12-03T14:05:00.000Z',
    by: { id: 9, name: 'Dagny Fairbrook' },
    fields: [{ field: 'phone', before: '+44 1632 960 100', after: '+44 1632 960 118' }],
    ...overrides,
  };
}

/**
 * The next request a page sends to `url` (a page's requests leave from effects and debounced searches, so
 * they are waited for). While it is pending, Angular does not count the page as stable, so harness actions
 * that started it are awaited after it is answered.
 */
export async function nextRequest(
  http: HttpTestingController,
  url: string | ((request: HttpRequest<unknown>) => boolean),
): Promise<TestRequest> {
  for (let attempt = 0; attempt < 200; attempt++) {
    const [request] = http.match(url);
    if (request) return request;
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
  throw new Error(`No request to ${typeof url === 'string' ? url : 'the address expected'} was sent.`);
}

/** A list page of records, as the API answers it. */
export function aPage<T>(items: readonly T[], total = items.length, page = 1, pageSize = 25) {
  return { items: [...items], total, page, pageSize };
}

/** The test bed of a records page reached through the router (see routedPageTestBed). */
export const recordsTestBed = routedPageTestBed;
