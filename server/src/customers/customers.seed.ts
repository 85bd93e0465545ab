import { type CreateCustomer, CreateCustomerSchema } from '@counterpoise/api';
import type { DemoSeeder } from '../db/seed';
import { ChangeLog } from '../records/change-log';
import { demoOwner } from '../records/demo-actor';
import { CustomersRepo } from './customers.repo';
import { CustomersService } from './customers.service';

/**
 * The demo shop's customers. Invented demo data: no real company, person or place; the towns are made
 * up, the phone numbers are in the 555-01xx range set aside for fiction, the addresses on `.test`.
 */
export const DEMO_CUSTOMERS: readonly CreateCustomer[] = [
  {
    name: 'Alder Creek Land Clearing',
    email: 'office@aldercreek-clearing.test',
    phone: '+1 555 0142',
    siteAddress: '14 Sawmill Road, Fernhollow',
    notes: 'Three mulchers on tracked carriers. Gate code at the office.',
    contacts: [
      { name: 'Juno Hartwell', role: 'Fleet foreman', phone: '+1 555 0143' },
      { name: 'Bram Okafor-Reyes', role: 'Accounts', email: 'bram@aldercreek-clearing.test' },
    ],
  },
  {
    name: 'Copperbeck Township Roads',
    email: 'roads@copperbeck-township.test',
    phone: '+1 555 0117',
    siteAddress: 'Township depot, 2 Quarry Lane, Copperbeck',
    notes: 'Roadside flail mowers; the depot has a wash bay we can use before balancing.',
    contacts: [{ name: 'Wilhelmina Strand', role: 'Depot supervisor', phone: '+1 555 0118' }],
  },
  {
    name: 'Harlow Fen Dairy',
    email: 'barn@harlowfen-dairy.test',
    phone: '+1 555 0165',
    siteAddress: 'Harlow Fen Farm, Long Drove, Harlow Fen',
    notes: 'Ventilation fans in the free-stall barn. Work before the afternoon milking.',
    contacts: [],
  },
  {
    name: 'Quillmoor Estate Forestry',
    email: 'forestry@quillmoor-estate.test',
    siteAddress: 'Estate yard, Quillmoor',
    contacts: [{ name: 'Ansel Brightmere', role: 'Head forester', phone: '+1 555 0171' }],
  },
  {
    name: 'Stonebridge Vale Orchards',
    email: 'info@stonebridge-orchards.test',
    phone: '+1 555 0186',
    siteAddress: '88 Orchard Rise, Stonebridge Vale',
    contacts: [],
  },
  {
    name: 'Wyndle Ridge Line Services',
    email: 'dispatch@wyndle-ridge-lines.test',
    phone: '+1 555 0153',
    siteAddress: 'Unit 4, Ridgeway Trading Park, Wyndle Ridge',
    notes: 'Right-of-way clearing under power lines; machines come to our yard on a low-loader.',
    contacts: [{ name: 'Tamsin Greaves', role: 'Plant manager', email: 'tamsin@wyndle-ridge-lines.test' }],
  },
];

/** A former customer, archived: the demo shows that archived records stay, with their history. */
export const DEMO_ARCHIVED_CUSTOMER: CreateCustomer = {
  name: 'Marrowgate Turf Care',
  email: 'hello@marrowgate-turf.test',
  siteAddress: 'Marrowgate',
  notes: 'Closed down; kept for the warranty records of its mowers.',
};

/**
 * Creates the demo customers as the demo owner, each with its "created" entry in the change log, the
 * way the API would: through the schema and the service.
 */
export const seedDemoCustomers: DemoSeeder = (database, now) => {
  const actor = demoOwner(database);
  const service = new CustomersService(new CustomersRepo(database.orm), new ChangeLog(database.orm), {
    now: () => now,
  });
  for (const customer of DEMO_CUSTOMERS) service.create(actor, CreateCustomerSchema.parse(customer));
  const archived = service.create(actor, CreateCustomerSchema.parse(DEMO_ARCHIVED_CUSTOMER));
  service.archive(actor, archived.id, [archived.version]);
};
