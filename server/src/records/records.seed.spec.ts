/*
 * The demo records: what the seed puts in for the demo organisation, through the same schemas and
 * services as the API, with the change log's first entries made by the demo owner.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CustomerSchema, MachineFamilySchema, MachineSchema } from '@counterpoise/api';
import { AccountsRepo } from '../accounts/accounts.repo';
import { DEMO_ORGANISATION } from '../auth/accounts.seed';
import { CustomersRepo } from '../customers/customers.repo';
import { CustomersService } from '../customers/customers.service';
import { DEMO_SEEDERS } from '../db/demo-seeders';
import { seedDemoData } from '../db/seed';
import { MachineFamiliesRepo } from '../machine-families/machine-families.repo';
import { MachineFamiliesService } from '../machine-families/machine-families.service';
import { MachinesRepo } from '../machines/machines.repo';
import { MachinesService } from '../machines/machines.service';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { ChangeLog } from './change-log';
import { demoOwner } from './demo-actor';

const now = new Date('2026-03-02T08:00:00Z');
let temporary: TemporaryDatabase;
let dataDir: string;

beforeAll(async () => {
  temporary = openTemporaryDatabase();
  dataDir = mkdtempSync(join(tmpdir(), 'counterpoise-demo-'));
  await seedDemoData(temporary.database, now, DEMO_SEEDERS, { dataDir });
});
afterAll(() => {
  temporary.dispose();
  rmSync(dataDir, { recursive: true, force: true });
});

function services() {
  const { orm } = temporary.database;
  const changes = new ChangeLog(orm);
  const clock = { now: () => now };
  return {
    actor: demoOwner(temporary.database),
    customers: new CustomersService(new CustomersRepo(orm), changes, clock),
    families: new MachineFamiliesService(new MachineFamiliesRepo(orm), changes, clock),
    machines: new MachinesService(new MachinesRepo(orm), changes, clock),
  };
}
const everything = { archived: 'all', sort: 'updatedAt', order: 'asc', page: 1, pageSize: 100 } as const;

describe('the demo records', () => {
  it('are the demo organisation’s, with one archived customer and one archived machine', () => {
    const { actor, customers, families, machines } = services();
    const organisation = new AccountsRepo(temporary.database.orm).findOrganisationByName(DEMO_ORGANISATION);
    expect(actor.organisationId).toBe(organisation?.id);

    const customerPage = customers.list(actor, { ...everything, sort: 'name' });
    expect(customerPage.total).toBe(7);
    expect(customerPage.items.filter((customer) => customer.archivedAt !== null)).toHaveLength(1);
    for (const customer of customerPage.items)
      expect(CustomerSchema.safeParse(customer).error).toBeUndefined();

    const familyPage = families.list(actor, { ...everything, sort: 'name' });
    expect(familyPage.items.map((family) => [family.rotorType, family.planeCount])).toEqual([
      ['fan', 1],
      ['fixed-tooth-drum', 2],
      ['flail', 2],
    ]);
    for (const family of familyPage.items)
      expect(MachineFamilySchema.safeParse(family).error).toBeUndefined();

    const machinePage = machines.list(actor, { ...everything, sort: 'serialNumber' });
    expect(machinePage.total).toBe(12);
    expect(machinePage.items.filter((machine) => machine.archivedAt !== null)).toHaveLength(1);
    for (const machine of machinePage.items) {
      expect(MachineSchema.safeParse(machine).error).toBeUndefined();
      const family = familyPage.items.find((candidate) => candidate.id === machine.familyId);
      if (family) expect(machine.planes).toHaveLength(family.planeCount);
      expect(machine.serialNumber).not.toBeNull();
      expect(machine.stockWeightsGrams.length).toBeGreaterThan(0);
    }
    const serials = machinePage.items.map((machine) => machine.serialNumber);
    expect(new Set(serials).size).toBe(serials.length);
  });

  it('were created by the demo owner, as their history says', () => {
    const { actor, customers, machines } = services();
    const [customer] = customers.list(actor, { ...everything, sort: 'name', archived: 'false' }).items;
    const history = customers.history(actor, customer!.id);
    expect(history.changes).toHaveLength(1);
    expect(history.changes[0]).toMatchObject({
      action: 'created',
      version: 1,
      at: now.toISOString(),
      by: { id: actor.id, name: 'Maren Oakhurst' },
    });
    const sold = machines.list(actor, { ...everything, sort: 'serialNumber', archived: 'true' }).items[0]!;
    expect(machines.history(actor, sold.id).changes.map((change) => change.action)).toEqual([
      'archived',
      'created',
    ]);
  });
});
