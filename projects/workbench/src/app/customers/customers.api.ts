import { Injectable } from '@angular/core';
import type {
  CreateCustomerSchema,
  CustomerListQuerySchema,
  CustomerPageSchema,
  CustomerSchema,
  UpdateCustomerSchema,
} from '@counterpoise/api';
import type * as z from 'zod';
import { RecordsApi } from '../records/records-api';

/*
 * The shapes of the customers routes, from the shared schemas by type alone: a type costs the bundle
 * nothing, so the customers pages never load zod.
 */

/** A customer as the API answers it. */
export type Customer = z.output<typeof CustomerSchema>;
/** `GET /api/v1/customers`: one page of the list. */
export type CustomerPage = z.output<typeof CustomerPageSchema>;
/** The list's query; what is left out takes the server's default. */
export type CustomerListQuery = Partial<z.output<typeof CustomerListQuerySchema>>;
/** `POST /api/v1/customers`. */
export type CreateCustomer = z.input<typeof CreateCustomerSchema>;
/** `PATCH /api/v1/customers/{id}`: the fields to change. */
export type UpdateCustomer = z.input<typeof UpdateCustomerSchema>;
/** A further person to reach at a customer's. */
export type ContactPerson = Customer['contacts'][number];
/** The fields the list sorts by. */
export type CustomerSortField = NonNullable<CustomerListQuery['sort']>;

/** The shop's customers on the server: list, read, add, change, archive, restore and their history. */
@Injectable({ providedIn: 'root' })
export class CustomersApi extends RecordsApi<
  Customer,
  CustomerPage,
  CustomerListQuery,
  CreateCustomer,
  UpdateCustomer
> {
  protected readonly url = '/api/v1/customers';
}
