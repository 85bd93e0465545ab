import { and, eq, getTableColumns } from 'drizzle-orm';
import type { MachineListQuerySchema } from '@counterpoise/api';
import type * as z from 'zod';
import type { Orm } from '../db/database';
import { customers, machineFamilies, machines } from '../db/schema';
import { archivedCondition, countAll, listPage, searchCondition, sortOrder } from '../records/list-query';
import type { RecordStore } from '../records/versioned-records';
import { type RecordValues, VersionedTable } from '../records/versioned-table';

/** A machine as stored, with the names of its customer and family. */
export type MachineRow = typeof machines.$inferSelect & {
  readonly customerName: string;
  readonly familyName: string | null;
};

/** The columns a create or a change writes: the fields and the keys derived from them. */
export type MachineValues = RecordValues<typeof machines>;

/** A customer or family a machine names, as far as the machine's rules need it. */
export interface MachineReference {
  readonly id: number;
  readonly name: string;
  readonly archived: boolean;
}

/** A family a machine names, with its number of planes. */
export interface FamilyReference extends MachineReference {
  readonly planeCount: number;
}

const SORT_KEYS = {
  serialNumber: { key: machines.serialKey, nullable: true },
  customerName: { key: customers.nameKey, nullable: false },
  make: { key: machines.makeKey, nullable: true },
  updatedAt: { key: machines.updatedAt, nullable: false },
} as const;

/**
 * The machines table, always read and written within one organisation. The customers and families
 * tables are read here (never written): a machine is shown with their names, sorted and searched by
 * its customer's name, and may only name those of its own organisation.
 */
export class MachinesRepo
  extends VersionedTable<typeof machines>
  implements RecordStore<MachineRow, MachineValues>
{
  constructor(orm: Orm) {
    super(orm, machines);
  }

  find(organisationId: number, id: number): MachineRow | undefined {
    return this.selectWithNames()
      .where(and(eq(machines.id, id), eq(machines.organisationId, organisationId)))
      .get();
  }

  /** The organisation's customer with this id, if there is one. */
  findCustomer(organisationId: number, id: number): MachineReference | undefined {
    const row = this.orm
      .select({ id: customers.id, name: customers.name, archivedAt: customers.archivedAt })
      .from(customers)
      .where(and(eq(customers.id, id), eq(customers.organisationId, organisationId)))
      .get();
    return row && { id: row.id, name: row.name, archived: row.archivedAt !== null };
  }

  /** The organisation's machine family with this id, if there is one. */
  findFamily(organisationId: number, id: number): FamilyReference | undefined {
    const row = this.orm
      .select({
        id: machineFamilies.id,
        name: machineFamilies.name,
        archivedAt: machineFamilies.archivedAt,
        planeCount: machineFamilies.planeCount,
      })
      .from(machineFamilies)
      .where(and(eq(machineFamilies.id, id), eq(machineFamilies.organisationId, organisationId)))
      .get();
    return (
      row && { id: row.id, name: row.name, archived: row.archivedAt !== null, planeCount: row.planeCount }
    );
  }

  /** The organisation's customer of this name, for the demo seed, which names its customers. */
  findCustomerByName(organisationId: number, name: string): MachineReference | undefined {
    const row = this.orm
      .select({ id: customers.id })
      .from(customers)
      .where(and(eq(customers.organisationId, organisationId), eq(customers.name, name)))
      .get();
    return row && this.findCustomer(organisationId, row.id);
  }

  /** The organisation's machine family of this name, for the demo seed. */
  findFamilyByName(organisationId: number, name: string): FamilyReference | undefined {
    const row = this.orm
      .select({ id: machineFamilies.id })
      .from(machineFamilies)
      .where(and(eq(machineFamilies.organisationId, organisationId), eq(machineFamilies.name, name)))
      .get();
    return row && this.findFamily(organisationId, row.id);
  }

  /** One page of the organisation's machines that match the query, and how many match in all. */
  list(
    organisationId: number,
    query: z.output<typeof MachineListQuerySchema>,
  ): { rows: MachineRow[]; total: number } {
    const where = and(
      eq(machines.organisationId, organisationId),
      archivedCondition(machines.archivedAt, query.archived),
      query.customerId === undefined ? undefined : eq(machines.customerId, query.customerId),
      query.familyId === undefined ? undefined : eq(machines.familyId, query.familyId),
      searchCondition([machines.searchText, customers.nameKey], query.q),
    );
    const sort = SORT_KEYS[query.sort];
    return listPage(
      this.selectWithNames(),
      this.orm
        .select({ total: countAll })
        .from(machines)
        .innerJoin(customers, eq(customers.id, machines.customerId)),
      where,
      sortOrder(sort.key, machines.id, query.order, sort.nullable),
      query,
    );
  }

  private selectWithNames() {
    return this.orm
      .select({
        ...getTableColumns(machines),
        customerName: customers.name,
        familyName: machineFamilies.name,
      })
      .from(machines)
      .innerJoin(customers, eq(customers.id, machines.customerId))
      .leftJoin(machineFamilies, eq(machineFamilies.id, machines.familyId));
  }
}
