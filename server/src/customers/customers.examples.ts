/*
 * The examples of the customer routes in the OpenAPI document: an invented customer of the demo shop
 * (no real company, person or place). A spec parses each with its schema.
 */

export const CREATE_CUSTOMER_EXAMPLE = {
  name: 'Alder Creek Land Clearing',
  email: 'office@aldercreek-clearing.test',
  phone: '+1 555 0142',
  siteAddress: '14 Sawmill Road, Fernhollow',
  notes: 'Yard gate code at the office. Mulcher work mostly in spring and late autumn.',
  contacts: [
    { name: 'Juno Hartwell', role: 'Fleet foreman', phone: '+1 555 0143' },
    { name: 'Bram Okonkwo-Reyes', role: 'Accounts', email: 'bram@aldercreek-clearing.test' },
  ],
};

export const UPDATE_CUSTOMER_EXAMPLE = {
  phone: '+1 555 0199',
  notes: 'Yard gate code at the office. Call the foreman before driving out.',
};

export const CUSTOMER_EXAMPLE = {
  id: 12,
  version: 3,
  createdAt: '2026-02-16T09:12:40.000Z',
  updatedAt: '2026-04-03T14:05:11.000Z',
  archivedAt: null,
  ...CREATE_CUSTOMER_EXAMPLE,
  ...UPDATE_CUSTOMER_EXAMPLE,
  machineCount: 3,
};

export const CUSTOMER_PAGE_EXAMPLE = { items: [CUSTOMER_EXAMPLE], total: 1, page: 1, pageSize: 25 };

export const CUSTOMER_HISTORY_EXAMPLE = {
  changes: [
    {
      id: 88,
      version: 3,
      action: 'updated',
      at: '2026-04-03T14:05:11.000Z',
      by: { id: 3, name: 'Tomasz Wrenfield' },
      fields: [
        { field: 'phone', before: '+1 555 0142', after: '+1 555 0199' },
        {
          field: 'notes',
          before: 'Yard gate code at the office. Mulcher work mostly in spring and late autumn.',
          after: 'Yard gate code at the office. Call the foreman before driving out.',
        },
      ],
    },
    {
      id: 41,
      version: 1,
      action: 'created',
      at: '2026-02-16T09:12:40.000Z',
      by: { id: 2, name: 'Dagny Fairbrook' },
      fields: [{ field: 'name', before: null, after: 'Alder Creek Land Clearing' }],
    },
  ],
};
