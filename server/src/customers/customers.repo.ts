import { and, eq, getTableColumns } from 'drizzle-orm';
import type { CustomerListQuerySchema } from '@counterpoise/api';
import type * as z from 'zod';
import type { Orm } from '../db/database';
import { customers, machines } from '../db/schema';
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

/** A customer as stored, with how many machines in use they have. */
export type CustomerRow = typeof customers.$inferSelect & { readonly machineCount: number };

/** The columns a create or a change writes: the fields and the keys derived from them. */
export type CustomerValues = RecordValues<typeof customers>;

/** How many machines in use a customer has. The machines table is read here (never written). */
const machineCount = inUseCount(machines.customerId, machines.archivedAt, customers.id);

const SORT_KEYS = {
  name: customers.nameKey,
  updatedAt: customers.updatedAt,
  createdAt: customers.createdAt,
} as const;

/** The customers table, always read and written within one organisation. */
export class CustomersRepo
  extends VersionedTable<typeof customers>
  implements RecordStore<CustomerRow, CustomerValues>
{
  constructor(orm: Orm) {
    super(orm, customers);
  }

  find(organisationId: number, id: number): CustomerRow | undefined {
    return this.selectRows()
      .where(and(eq(customers.id, id), eq(customers.organisationId, organisationId)))
      .get();
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
    return listPage(
      this.selectRows(),
      this.orm.select({ total: countAll }).from(customers),
      where,
      sortOrder(SORT_KEYS[query.sort], customers.id, query.order),
      query,
    );
  }

  /** The rows with how many machines in use each has. */
  private selectRows() {
    return this.orm.select({ ...getTableColumns(customers), machineCount }).from(customers);
  }
}
