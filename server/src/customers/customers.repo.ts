import { and, eq, getTableColumns, sql } from 'drizzle-orm';
import type { CustomerListQuerySchema } from '@counterpoise/api';
import type * as z from 'zod';
import type { Orm } from '../db/database';
import { customers, machines } from '../db/schema';
import {
  archivedCondition,
  countAll,
  pageWindow,
  qualified,
  searchCondition,
  sortOrder,
} from '../records/list-query';
import type { RecordStore } from '../records/versioned-records';

/** A customer as stored, with how many machines in use they have. */
export type CustomerRow = typeof customers.$inferSelect & { readonly machineCount: number };

/** The columns a create or a change writes: the fields and the keys derived from them. */
export type CustomerValues = Pick<
  typeof customers.$inferInsert,
  'name' | 'email' | 'phone' | 'siteAddress' | 'notes' | 'contacts' | 'nameKey' | 'searchText'
>;

/**
 * How many machines in use a customer has. The machines table is read here (never written) so that a
 * list of customers is one query, whatever its length.
 */
const machineCount =
  sql<number>`(SELECT count(*) FROM ${machines} WHERE ${qualified(machines.customerId)} = ${qualified(customers.id)} AND ${qualified(machines.archivedAt)} IS NULL)`.mapWith(
    Number,
  );

const SORT_KEYS = {
  name: customers.nameKey,
  updatedAt: customers.updatedAt,
  createdAt: customers.createdAt,
} as const;

/** The customers table, always read and written within one organisation. */
export class CustomersRepo implements RecordStore<CustomerRow, CustomerValues> {
  constructor(private readonly orm: Orm) {}

  transaction<T>(work: () => T): T {
    return this.orm.transaction(() => work(), { behavior: 'immediate' });
  }

  find(organisationId: number, id: number): CustomerRow | undefined {
    return this.orm
      .select({ ...getTableColumns(customers), machineCount })
      .from(customers)
      .where(and(eq(customers.id, id), eq(customers.organisationId, organisationId)))
      .get();
  }

  insert(organisationId: number, values: CustomerValues, at: Date): number {
    return this.orm
      .insert(customers)
      .values({ ...values, organisationId, version: 1, createdAt: at, updatedAt: at, archivedAt: null })
      .returning({ id: customers.id })
      .get().id;
  }

  writeAtVersion(
    organisationId: number,
    id: number,
    version: number,
    values: CustomerValues,
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

  /** One page of the organisation's customers that match the query, and how many match in all. */
  list(
    organisationId: number,
    query: z.output<typeof CustomerListQuerySchema>,
  ): { rows: CustomerRow[]; total: number } {
    const where = and(
      eq(customers.organisationId, organisationId),
      archivedCondition(customers.archivedAt, query.archived),
      searchCondition([customers.searchText], query.q),
    );
    const { limit, offset } = pageWindow(query);
    const rows = this.orm
      .select({ ...getTableColumns(customers), machineCount })
      .from(customers)
      .where(where)
      .orderBy(...sortOrder(SORT_KEYS[query.sort], customers.id, query.order))
      .limit(limit)
      .offset(offset)
      .all();
    const total = this.orm.select({ total: countAll }).from(customers).where(where).get()?.total ?? 0;
    return { rows, total };
  }

  /** Writes `set` and the next version, only where the stored version is still `version`. */
  private updateAtVersion(
    organisationId: number,
    id: number,
    version: number,
    set: Partial<typeof customers.$inferInsert>,
  ): boolean {
    return (
      this.orm
        .update(customers)
        .set({ ...set, version: sql`${customers.version} + 1` })
        .where(
          and(
            eq(customers.id, id),
            eq(customers.organisationId, organisationId),
            eq(customers.version, version),
          ),
        )
        .run().changes === 1
    );
  }
}
