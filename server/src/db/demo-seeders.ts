import { seedDemoAccounts } from '../auth/accounts.seed';
import { seedDemoCustomers } from '../customers/customers.seed';
import { seedDemoApiKey } from '../keys/keys.seed';
import { seedDemoMachineFamilies } from '../machine-families/machine-families.seed';
import { seedDemoJobs } from '../jobs/jobs.seed';
import { seedDemoMachines } from '../machines/machines.seed';
import { seedDemoPhotos } from '../photos/photos.seed';
import type { DemoSeeder, PreparedDemoSeeder } from './seed';

/**
 * What each feature adds to the demo scenario, in the order their data depends on each other. A
 * feature that owns demo data appends its seeder here; `seedDemoData` prepares those that need it, then
 * runs them once, in one transaction.
 */
export const DEMO_SEEDERS: readonly (DemoSeeder | PreparedDemoSeeder)[] = [
  seedDemoAccounts,
  seedDemoApiKey,
  seedDemoCustomers,
  seedDemoMachineFamilies,
  seedDemoMachines,
  seedDemoJobs,
  seedDemoPhotos,
];
