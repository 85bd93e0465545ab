import { and, eq, getTableColumns, ne, sql } from 'drizzle-orm';
import type { MachineFamilyListQuerySchema } from '@counterpoise/api';
import type * as z from 'zod';
import type { Orm } from '../db/database';
import { machineFamilies, machines } from '../db/schema';
import {
  archivedCondition,
  countAll,
  inUseCount,
  listPage,
  searchCondition,
  sortOrder,
} from '../records/list-query';
import type { RecordStore } from '../records/versioned-records';
import { type RecordValues, VersionedTable } from '../records/versioned-table';

/** A machine family as stored, with how many machines in use belong to it. */
export type MachineFamilyRow = typeof machineFamilies.$inferSelect & { readonly machineCount: number };

/** The columns a create or a change writes: the fields and the sort key derived from the name. */
export type MachineFamilyValues = RecordValues<typeof machineFamilies>;

/** How many machines in use belong to a family. The machines table is read here (never written). */
const machineCount = inUseCount(machines.familyId, machines.archivedAt, machineFamilies.id);

const SORT_KEYS = {
  name: machineFamilies.nameKey,
  rotorType: machineFamilies.rotorType,
  updatedAt: machineFamilies.updatedAt,
} as const;

/** The machine families table, always read and written within one organisation. */
export class MachineFamiliesRepo
  extends VersionedTable<typeof machineFamilies>
  implements RecordStore<MachineFamilyRow, MachineFamilyValues>
{
  constructor(orm: Orm) {
    super(orm, machineFamilies);
  }

  find(organisationId: number, id: number): MachineFamilyRow | undefined {
    return this.selectRows()
      .where(and(eq(machineFamilies.id, id), eq(machineFamilies.organisationId, organisationId)))
      .get();
  }

  /**
   * How many machines of the family, archived ones included, have another number of planes than
   * `planeCount`: a family's planeCount must stay that of every machine it names.
   */
  countMachinesWithOtherPlaneCount(organisationId: number, familyId: number, planeCount: number): number {
    return (
      this.orm
        .select({ total: countAll })
        .from(machines)
        .where(
          and(
            eq(machines.organisationId, organisationId),
            eq(machines.familyId, familyId),
            ne(sql`json_array_length(${machines.planes})`, planeCount),
          ),
        )
        .get()?.total ?? 0
    );
  }

  /** One page of the organisation's families that match the query, and how many match in all. */
  list(
    organisationId: number,
    query: z.output<typeof MachineFamilyListQuerySchema>,
  ): { rows: MachineFamilyRow[]; total: number } {
    const where = and(
      eq(machineFamilies.organisationId, organisationId),
      archivedCondition(machineFamilies.archivedAt, query.archived),
      searchCondition([machineFamilies.nameKey], query.q),
    );
    return listPage(
      this.selectRows(),
      this.orm.select({ total: countAll }).from(machineFamilies),
      where,
      sortOrder(SORT_KEYS[query.sort], machineFamilies.id, query.order),
      query,
    );
  }

  /** The rows with how many machines in use each has. */
  private selectRows() {
    return this.orm.select({ ...getTableColumns(machineFamilies), machineCount }).from(machineFamilies);
  }
}
