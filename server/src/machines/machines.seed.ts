import { type CreateMachine, CreateMachineSchema, type PlaneLayout } from '@counterpoise/api';
import type { DemoSeeder } from '../db/seed';
import { ChangeLog } from '../records/change-log';
import { demoOwner } from '../records/demo-actor';
import { MachinesRepo } from './machines.repo';
import { MachinesService } from './machines.service';

/** A demo machine, naming its customer and family by name (the seed does not know their ids). */
export interface DemoMachine extends Omit<CreateMachine, 'customerId' | 'familyId'> {
  readonly customer: string;
  readonly family: string | null;
  /** Sold or scrapped: archived after it is created, so that the demo shows an archived machine. */
  readonly archived?: boolean;
}

/** A plane as the demo data writes it (what the schema fills in may be left out). */
type DemoPlane = CreateMachine['planes'][number];

const MULCHER = 'Fixed-tooth mulcher drum, 2.0 m';
const FLAIL = 'Flail mower rotor, 2.4 m';
const FAN = 'Barn ventilation fan, 1.2 m';

/** A mulcher drum plane: weights go between the 12 rows of teeth, which start 15° after the tape. */
const drumPlane = (blocked: PlaneLayout['blockedSectors'] = []): DemoPlane => ({
  correctionRadiusMm: 210,
  positions: { count: 12, firstDeg: 15 },
  blockedSectors: blocked,
});

/** A flail rotor plane: anywhere on the tube but on the four rows of flail hangers. */
const flailPlane = (): DemoPlane => ({
  correctionRadiusMm: 155,
  positions: null,
  blockedSectors: [0, 90, 180, 270].map((fromDeg) => ({
    fromDeg,
    toDeg: fromDeg + 12,
    label: 'Flail hanger row',
  })),
});

/** A six-blade fan: a clip weight goes on a blade tip. */
const fanPlane = (): DemoPlane => ({ correctionRadiusMm: 520, positions: { count: 6, firstDeg: 0 } });

/**
 * The demo shop's machines. Invented demo data: the makes (Brackenfold, Quernstone, Wrenmoor, Ashcombe
 * Rotary), models, serial numbers, hours and figures are made up and name no real brand or machine.
 * Stock weights are in grams.
 */
export const DEMO_MACHINES: readonly DemoMachine[] = [
  {
    customer: 'Alder Creek Land Clearing',
    family: MULCHER,
    make: 'Brackenfold',
    model: 'BF-220',
    serialNumber: 'BF220-18734',
    hours: 1460,
    rotorMassKg: 410,
    operatingSpeedRpm: 2150,
    rotationSeenFromLeft: 'counterClockwise',
    planes: [
      drumPlane([{ fromDeg: 80, toDeg: 100, label: 'Skid plate bolt' }]),
      drumPlane([{ fromDeg: 260, toDeg: 280, label: 'Grease line clamp' }]),
    ],
    stockWeightsGrams: [25, 50, 100, 150],
    notes: 'Hydrostatic carrier: readings at full throttle only.',
  },
  {
    customer: 'Alder Creek Land Clearing',
    family: MULCHER,
    make: 'Brackenfold',
    model: 'BF-220',
    serialNumber: 'BF220-19102',
    hours: 880,
    rotorMassKg: 410,
    operatingSpeedRpm: 2150,
    rotationSeenFromLeft: 'counterClockwise',
    planes: [drumPlane([{ fromDeg: 80, toDeg: 100, label: 'Skid plate bolt' }]), drumPlane()],
    stockWeightsGrams: [25, 50, 100, 150],
  },
  {
    customer: 'Alder Creek Land Clearing',
    family: MULCHER,
    make: 'Quernstone',
    model: 'QS-180',
    serialNumber: 'QS180-0457',
    hours: 2310,
    rotorMassKg: 365,
    operatingSpeedRpm: 2300,
    rotationSeenFromLeft: 'clockwise',
    planes: [
      drumPlane([{ fromDeg: 170, toDeg: 195, label: 'Drive-side access plate' }]),
      drumPlane([{ fromDeg: 350, toDeg: 10, label: 'Counter-knife bracket' }]),
    ],
    stockWeightsGrams: [20, 40, 80, 120],
    // The customer asked for a tighter target on this one after a bearing failure.
    acceptance: { kind: 'shop-target', amplitude: 0.12, unit: 'in/s-pk' },
  },
  {
    customer: 'Quillmoor Estate Forestry',
    family: MULCHER,
    make: 'Quernstone',
    model: 'QS-180',
    serialNumber: 'QS180-0612',
    hours: 540,
    rotorMassKg: 365,
    operatingSpeedRpm: 2300,
    rotationSeenFromLeft: 'clockwise',
    planes: [drumPlane(), drumPlane()],
    stockWeightsGrams: [20, 40, 80, 120],
  },
  {
    customer: 'Wyndle Ridge Line Services',
    family: MULCHER,
    make: 'Brackenfold',
    model: 'BF-250',
    serialNumber: 'BF250-00921',
    hours: 3120,
    rotorMassKg: 480,
    operatingSpeedRpm: 2100,
    rotationSeenFromLeft: 'counterClockwise',
    planes: [
      drumPlane([{ fromDeg: 80, toDeg: 100, label: 'Skid plate bolt' }]),
      drumPlane([{ fromDeg: 80, toDeg: 100, label: 'Skid plate bolt' }]),
    ],
    stockWeightsGrams: [50, 100, 150, 200],
    notes: 'Arrives on a low-loader; balance in the yard, not on site.',
  },
  {
    customer: 'Wyndle Ridge Line Services',
    family: null,
    make: 'Ashcombe Rotary',
    model: 'SG-36 stump grinder wheel',
    serialNumber: 'ASG36-2291',
    hours: 1745,
    rotorMassKg: 95,
    operatingSpeedRpm: 1100,
    sensorSides: ['right'],
    rotationSeenFromLeft: 'clockwise',
    planes: [{ correctionRadiusMm: 300, positions: { count: 16, firstDeg: 11.25 }, blockedSectors: [] }],
    stockWeightsGrams: [15, 30, 60],
    acceptance: { kind: 'shop-target', amplitude: 4.5, unit: 'mm/s-rms' },
  },
  {
    customer: 'Copperbeck Township Roads',
    family: FLAIL,
    make: 'Wrenmoor',
    model: 'WF-240',
    serialNumber: 'WF240-33815',
    hours: 1980,
    rotorMassKg: 140,
    operatingSpeedRpm: 2000,
    rotationSeenFromLeft: 'clockwise',
    planes: [flailPlane(), flailPlane()],
    stockWeightsGrams: [10, 20, 40],
  },
  {
    customer: 'Copperbeck Township Roads',
    family: FLAIL,
    make: 'Wrenmoor',
    model: 'WF-240',
    serialNumber: 'WF240-34002',
    hours: 1220,
    rotorMassKg: 140,
    operatingSpeedRpm: 2000,
    rotationSeenFromLeft: 'clockwise',
    planes: [flailPlane(), flailPlane()],
    stockWeightsGrams: [10, 20, 40],
  },
  {
    customer: 'Stonebridge Vale Orchards',
    family: FLAIL,
    make: 'Wrenmoor',
    model: 'WF-240',
    serialNumber: 'WF240-29877',
    hours: 2650,
    rotorMassKg: 140,
    operatingSpeedRpm: 1950,
    rotationSeenFromLeft: 'clockwise',
    planes: [flailPlane(), flailPlane()],
    stockWeightsGrams: [10, 20, 40],
    notes: 'Mows between the tree rows; flails wear unevenly on the left.',
  },
  {
    customer: 'Stonebridge Vale Orchards',
    family: FLAIL,
    make: 'Wrenmoor',
    model: 'WF-240',
    serialNumber: 'WF240-21450',
    hours: 5210,
    rotorMassKg: 140,
    operatingSpeedRpm: 1950,
    rotationSeenFromLeft: 'clockwise',
    planes: [flailPlane(), flailPlane()],
    stockWeightsGrams: [10, 20, 40],
    notes: 'Sold at the end of the season; kept for its warranty record.',
    archived: true,
  },
  {
    customer: 'Harlow Fen Dairy',
    family: FAN,
    make: 'Ashcombe Rotary',
    model: 'AR-1200',
    serialNumber: 'AR1200-7781',
    hours: 21400,
    operatingSpeedRpm: 620,
    rotationSeenFromLeft: 'clockwise',
    planes: [fanPlane()],
    stockWeightsGrams: [5, 10, 20],
    notes: 'North wall, first fan from the door.',
  },
  {
    customer: 'Harlow Fen Dairy',
    family: FAN,
    make: 'Ashcombe Rotary',
    model: 'AR-1200',
    serialNumber: 'AR1200-7790',
    hours: 20950,
    operatingSpeedRpm: 620,
    rotationSeenFromLeft: 'clockwise',
    planes: [fanPlane()],
    stockWeightsGrams: [5, 10, 20],
    notes: 'North wall, second fan from the door.',
  },
];

/**
 * Creates the demo machines as the demo owner, through the schema and the service, after the demo
 * customers and families they name; the sold one is archived.
 */
export const seedDemoMachines: DemoSeeder = (database, now) => {
  const actor = demoOwner(database);
  const repo = new MachinesRepo(database.orm);
  const service = new MachinesService(repo, new ChangeLog(database.orm), { now: () => now });
  for (const { customer, family, archived, ...fields } of DEMO_MACHINES) {
    const customerId = repo.findCustomerByName(actor.organisationId, customer)?.id;
    const familyId = family === null ? null : repo.findFamilyByName(actor.organisationId, family)?.id;
    if (customerId === undefined || familyId === undefined) {
      throw new Error(`The demo machine ${fields.serialNumber} names a customer or family not seeded.`);
    }
    const machine = service.create(actor, CreateMachineSchema.parse({ ...fields, customerId, familyId }));
    if (archived === true) service.archive(actor, machine.id, [machine.version]);
  }
};
