import type {
  CreateCustomerSchema,
  Customer,
  CustomerListQuerySchema,
  UpdateCustomerSchema,
} from '@counterpoise/api';
import type * as z from 'zod';
import type { Clock } from '../clock';
import type { Actor, ChangeLog } from '../records/change-log';
import { foldCase, searchTextOf } from '../records/list-query';
import { RecordService } from '../records/record-service';
import { lifecycleOf, textOrNull } from '../records/versioned-records';
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
    ...lifecycleOf(row),
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
export class CustomersService extends RecordService<
  CustomerRow,
  Customer,
  CustomerFields,
  CustomerValues,
  CreateCustomer,
  UpdateCustomer,
  CustomerListQuery
> {
  constructor(repo: CustomersRepo, changes: ChangeLog, clock: Clock) {
    super(
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
}
