import { type CreateMachineFamily, CreateMachineFamilySchema } from '@counterpoise/api';
import type { DemoSeeder } from '../db/seed';
import { ChangeLog } from '../records/change-log';
import { demoOwner } from '../records/demo-actor';
import { MachineFamiliesRepo } from './machine-families.repo';
import { MachineFamiliesService } from './machine-families.service';

/**
 * The demo shop's machine families. Invented demo data: the speeds, radii, limits and sensitivities are
 * in the range of the trade (from general knowledge, not from any source), made up for the demo, and
 * belong to no real maker's machine.
 */
export const DEMO_MACHINE_FAMILIES: readonly CreateMachineFamily[] = [
  {
    name: 'Fixed-tooth mulcher drum, 2.0 m',
    rotorType: 'fixed-tooth-drum',
    nominalSpeedRpm: 2200,
    planeCount: 2,
    correctionRadiiMm: [210, 210],
    inspectionLimits: { bearingEndPlayMm: 0.3, shaftRunoutMm: 0.2 },
    acceptance: { kind: 'shop-target', amplitude: 0.15, unit: 'in/s-pk' },
    // A rule of thumb typed in by hand: no job stands behind it yet.
    sensitivities: [
      { sensorSide: 'left', planeIndex: 0, gramsPerUnit: 620, unit: 'in/s-pk', phaseLagDeg: 40 },
      { sensorSide: 'right', planeIndex: 1, gramsPerUnit: 640, unit: 'in/s-pk', phaseLagDeg: 35 },
    ],
    notes: 'Weld plates between the tooth rows, never on a tooth holder. Grind the spot clean first.',
  },
  {
    name: 'Flail mower rotor, 2.4 m',
    rotorType: 'flail',
    nominalSpeedRpm: 2000,
    planeCount: 2,
    correctionRadiiMm: [155, 155],
    inspectionLimits: { bearingEndPlayMm: 0.25, shaftRunoutMm: 0.15 },
    acceptance: { kind: 'balance-grade', grade: 'G16' },
    sensitivities: [],
    notes: 'Replace missing or worn flails in pairs, opposite each other, before any reading.',
  },
  {
    name: 'Barn ventilation fan, 1.2 m',
    rotorType: 'fan',
    nominalSpeedRpm: 620,
    planeCount: 1,
    correctionRadiiMm: [520],
    inspectionLimits: { bearingEndPlayMm: 0.2, shaftRunoutMm: 0.1 },
    acceptance: { kind: 'balance-grade', grade: 'G6.3' },
    sensitivities: [],
    notes: 'Clip weights on the blade tips; check the belt tension before the first run.',
  },
];

/**
 * Creates the demo families as the demo owner, each with its "created" entry in the change log, the
 * way the API would: through the schema and the service.
 */
export const seedDemoMachineFamilies: DemoSeeder = (database, now) => {
  const actor = demoOwner(database);
  const service = new MachineFamiliesService(
    new MachineFamiliesRepo(database.orm),
    new ChangeLog(database.orm),
    { now: () => now },
  );
  for (const family of DEMO_MACHINE_FAMILIES) service.create(actor, CreateMachineFamilySchema.parse(family));
};
