import {
  changedMeanwhileProblemSchema,
  CreateCustomerSchema,
  CustomerListQuerySchema,
  CustomerPageSchema,
  CustomerSchema,
  UpdateCustomerSchema,
} from '@counterpoise/api';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { addRecordRoutes, type RecordAccess, RECORDS_BASE_PATH } from '../records/record-routes';
import {
  CREATE_CUSTOMER_EXAMPLE,
  CUSTOMER_EXAMPLE,
  CUSTOMER_HISTORY_EXAMPLE,
  CUSTOMER_PAGE_EXAMPLE,
  UPDATE_CUSTOMER_EXAMPLE,
} from './customers.examples';
import type { CustomersService } from './customers.service';

/** The 412 answer of a change to a customer: the problem and the customer as stored. */
const CustomerChangedMeanwhileSchema = changedMeanwhileProblemSchema(
  CustomerSchema,
  'CustomerChangedMeanwhile',
);

/** The customer routes, mounted on the signed-in `/api/v1` router; who may call what comes from the app. */
export function customersRouter(deps: {
  access: Readonly<Record<RecordAccess, AccessRule>>;
  customers: CustomersService;
}): FeatureRoutes {
  const table = new RouteTable({
    basePath: RECORDS_BASE_PATH,
    tag: 'Customers',
    access: deps.access,
  });
  addRecordRoutes(table, {
    path: '/customers',
    noun: 'customer',
    plural: 'customers',
    schemas: {
      record: CustomerSchema,
      page: CustomerPageSchema,
      create: CreateCustomerSchema,
      update: UpdateCustomerSchema,
      query: CustomerListQuerySchema,
      changedMeanwhile: CustomerChangedMeanwhileSchema,
    },
    examples: {
      record: CUSTOMER_EXAMPLE,
      page: CUSTOMER_PAGE_EXAMPLE,
      create: CREATE_CUSTOMER_EXAMPLE,
      update: UPDATE_CUSTOMER_EXAMPLE,
      history: CUSTOMER_HISTORY_EXAMPLE,
    },
    searches: 'customers by name, e-mail address, phone number, site address or a contact’s name',
    service: deps.customers,
  });
  return table;
}
