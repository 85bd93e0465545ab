import {
  changedMeanwhileProblemSchema,
  CreateMachineSchema,
  MachineListQuerySchema,
  MachinePageSchema,
  MachineSchema,
  UpdateMachineSchema,
} from '@counterpoise/api';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { addRecordRoutes, type RecordAccess, RECORDS_BASE_PATH } from '../records/record-routes';
import {
  CREATE_MACHINE_EXAMPLE,
  MACHINE_EXAMPLE,
  MACHINE_HISTORY_EXAMPLE,
  MACHINE_PAGE_EXAMPLE,
  UPDATE_MACHINE_EXAMPLE,
} from './machines.examples';
import type { MachinesService } from './machines.service';

/** The 412 answer of a change to a machine: the problem and the machine as stored. */
const MachineChangedMeanwhileSchema = changedMeanwhileProblemSchema(MachineSchema, 'MachineChangedMeanwhile');

/** The machine routes, mounted on the signed-in `/api/v1` router; access comes from the app. */
export function machinesRouter(deps: {
  access: Readonly<Record<RecordAccess, AccessRule>>;
  machines: MachinesService;
}): FeatureRoutes {
  const table = new RouteTable({
    basePath: RECORDS_BASE_PATH,
    tag: 'Machines',
    access: deps.access,
  });
  addRecordRoutes(table, {
    path: '/machines',
    noun: 'machine',
    plural: 'machines',
    schemas: {
      record: MachineSchema,
      page: MachinePageSchema,
      create: CreateMachineSchema,
      update: UpdateMachineSchema,
      query: MachineListQuerySchema,
      changedMeanwhile: MachineChangedMeanwhileSchema,
    },
    examples: {
      record: MACHINE_EXAMPLE,
      page: MACHINE_PAGE_EXAMPLE,
      create: CREATE_MACHINE_EXAMPLE,
      update: UPDATE_MACHINE_EXAMPLE,
      history: MACHINE_HISTORY_EXAMPLE,
    },
    searches: 'machines by serial number, make, model or customer name (`customerId` and `familyId` filter)',
    rules:
      'A customer or family the machine comes to name must be the organisation’s and in use (400 on ' +
      '`customerId` or `familyId`, `code` `UNKNOWN_REFERENCE`); with a family, the machine has as many ' +
      'planes as the family (400 on `planes`, `code` `PLANES_DO_NOT_MATCH`). Without `sensorSides`, a ' +
      'two-plane machine has sensors left and right, a one-plane machine on the left.',
    service: deps.machines,
  });
  return table;
}
