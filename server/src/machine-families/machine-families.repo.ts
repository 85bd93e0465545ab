import { and, eq, getTableColumns, ne, sql } from 'drizzle-orm';
import type { MachineFamilyListQuerySchema } from '@counterpoise/api';
import type * as z from 'zod';
import type { Orm } from '../db/database';
import { machineFamilies, machines } from '../db/schema';
import {
  archivedCondition,
  countAll,
  pageWindow,
  qualified,
  searchCondition,
  sortOrder,
} from '../records/list-query';
import type { RecordStore } from '../records/versioned-records';

/** A machine family as stored, with how many machines in use belong to it. */
export type MachineFamilyRow = typeof machineFamilies.$inferSelect & { readonly machineCount: number };

/** The columns a create or a change writes: the fields and the sort key derived from the name. */
export type MachineFamilyValues = Omit<
  typeof machineFamilies.$inferInsert,
  'id' | 'organisationId' | 'version' | 'createdAt' | 'updatedAt' | 'archivedAt'
>;

/**
 * How many machines in use belong to a family. The machines table is read here (never written) so
 * that a list of families is one query.
 */
const machineCount =
  sql<number>`(SELECT count(*) FROM ${machines} WHERE ${qualified(machines.familyId)} = ${qualified(machineFamilies.id)} AND ${qualified(machines.archivedAt)} IS NULL)`.mapWith(
    Number,
  );

const SORT_KEYS = {
  name: machineFamilies.nameKey,
  rotorType: machineFamilies.rotorType,
  updatedAt: machineFamilies.updatedAt,
} as const;

/** The machine families table, always read and written within one organisation. */
export class MachineFamiliesRepo implements RecordStore<MachineFamilyRow, MachineFamilyValues> {
  constructor(private readonly orm: Orm) {}

  transaction<T>(work: () => T): T {
    return this.orm.transaction(() => work(), { behavior: 'immediate' });
  }

  find(organisationId: number, id: number): MachineFamilyRow | undefined {
    return this.orm
      .select({ ...getTableColumns(machineFamilies), machineCount })
      .from(machineFamilies)
      .where(and(eq(machineFamilies.id, id), eq(machineFamilies.organisationId, organisationId)))
      .get();
  }

  insert(organisationId: number, values: MachineFamilyValues, at: Date): number {
    return this.orm
      .insert(machineFamilies)
      .values({ ...values, organisationId, version: 1, createdAt: at, updatedAt: at, archivedAt: null })
      .returning({ id: machineFamilies.id })
      .get().id;
  }

  writeAtVersion(
    organisationId: number,
    id: number,
    version: number,
    values: MachineFamilyValues,
    at: Date,
  ): boolean {
    return this.updateAtVersion(organisationId, id, version, { ...values, updatedAt: at });
  }

  setArchivedAt(
    organisationId: number,
    id: number,
    version: number,
    archivedAt: Date | null,
    at: Date,
  ): boolean {
    return this.updateAtVersion(organisationId, id, version, { archivedAt, updatedAt: at });
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
    const { limit, offset } = pageWindow(query);
    const rows = this.orm
      .select({ ...getTableColumns(machineFamilies), machineCount })
      .from(machineFamilies)
      .where(where)
      .orderBy(...sortOrder(SORT_KEYS[query.sort], machineFamilies.id, query.order))
      .limit(limit)
      .offset(offset)
      .all();
    const total = this.orm.select({ total: countAll }).from(machineFamilies).where(where).get()?.total ?? 0;
    return { rows, total };
  }

  /** Writes `set` and the next version, only where the stored version is still `version`. */
  private updateAtVersion(
    organisationId: number,
    id: number,
    version: number,
    set: Partial<typeof machineFamilies.$inferInsert>,
  ): boolean {
    return (
      this.orm
        .update(machineFamilies)
        .set({ ...set, version: sql`${machineFamilies.version} + 1` })
        .where(
          and(
            eq(machineFamilies.id, id),
            eq(machineFamilies.organisationId, organisationId),
            eq(machineFamilies.version, version),
          ),
        )
        .run().changes === 1
    );
  }
}
