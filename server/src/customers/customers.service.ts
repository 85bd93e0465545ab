import type {
  CreateCustomerSchema,
  Customer,
  CustomerListQuerySchema,
  CustomerPage,
  RecordHistory,
  UpdateCustomerSchema,
} from '@counterpoise/api';
import type * as z from 'zod';
import type { Clock } from '../clock';
import type { Actor, ChangeLog } from '../records/change-log';
import { foldCase, searchTextOf } from '../records/list-query';
import type { RecordRoutesService } from '../records/record-routes';
import { textOrNull, VersionedRecords } from '../records/versioned-records';
import type { CustomerRow, CustomersRepo, CustomerValues } from './customers.repo';

type CreateCustomer = z.output<typeof CreateCustomerSchema>;
type UpdateCustomer = z.output<typeof UpdateCustomerSchema>;
type CustomerListQuery = z.output<typeof CustomerListQuerySchema>;

/** The fields of a customer a person edits, in the order the history lists them. */
export const CUSTOMER_FIELDS = ['name', 'email', 'phone', 'siteAddress', 'notes', 'contacts'] as const;
type CustomerFields = Pick<Customer, (typeof CUSTOMER_FIELDS)[number]>;

/** A stored customer as the API shows it. */
export function toCustomer(row: CustomerRow): Customer {
  return {
    id: row.id,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    archivedAt: row.archivedAt?.toISOString() ?? null,
    name: row.name,
    email: row.email,
    phone: row.phone,
    siteAddress: row.siteAddress,
    notes: row.notes,
    contacts: row.contacts,
    machineCount: row.machineCount,
  };
}

/** The fields as stored: empty free text as null. */
function normalise(fields: CustomerFields): CustomerFields {
  return { ...fields, siteAddress: textOrNull(fields.siteAddress), notes: textOrNull(fields.notes) };
}

/** The columns of a customer's fields, with the sort key and the text a search looks in. */
function customerValues(fields: CustomerFields): CustomerValues {
  return {
    ...fields,
    nameKey: foldCase(fields.name),
    searchText: searchTextOf([
      fields.name,
      fields.email,
      fields.phone,
      fields.siteAddress,
      ...fields.contacts.map((contact) => contact.name),
    ]),
  };
}

/** The shop's customers: who the machines belong to and where the reports go. */
export class CustomersService implements RecordRoutesService<
  Customer,
  CustomerPage,
  CreateCustomer,
  UpdateCustomer,
  CustomerListQuery
> {
  private readonly records: VersionedRecords<CustomerRow, Customer, CustomerFields, CustomerValues>;

  constructor(
    private readonly repo: CustomersRepo,
    changes: ChangeLog,
    clock: Clock,
  ) {
    this.records = new VersionedRecords(
      {
        kind: 'customer',
        noun: 'customer',
        fields: CUSTOMER_FIELDS,
        store: repo,
        toRecord: toCustomer,
        toValues: customerValues,
      },
      changes,
      clock,
    );
  }

  list(actor: Actor, query: CustomerListQuery): CustomerPage {
    const { rows, total } = this.repo.list(actor.organisationId, query);
    return { items: rows.map(toCustomer), total, page: query.page, pageSize: query.pageSize };
  }

  get(actor: Actor, id: number): Customer {
    return this.records.get(actor, id);
  }

  create(actor: Actor, fields: CreateCustomer): Customer {
    return this.records.create(
      actor,
      {
        name: fields.name,
        email: fields.email ?? null,
        phone: fields.phone ?? null,
        siteAddress: fields.siteAddress ?? null,
        notes: fields.notes ?? null,
        contacts: fields.contacts ?? [],
      },
      normalise,
    );
  }

  update(actor: Actor, id: number, versions: readonly number[], change: UpdateCustomer): Customer {
    return this.records.update(actor, id, versions, change, normalise);
  }

  archive(actor: Actor, id: number, versions: readonly number[]): Customer {
    return this.records.archive(actor, id, versions);
  }

  restore(actor: Actor, id: number, versions: readonly number[]): Customer {
    return this.records.restore(actor, id, versions);
  }

  history(actor: Actor, id: number): RecordHistory {
    return this.records.history(actor, id);
  }
}
