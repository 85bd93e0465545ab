import {
  changedMeanwhileProblemSchema,
  CreateMachineFamilySchema,
  MachineFamilyListQuerySchema,
  MachineFamilyPageSchema,
  MachineFamilySchema,
  UpdateMachineFamilySchema,
} from '@counterpoise/api';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { addRecordRoutes, type RecordAccess, RECORDS_BASE_PATH } from '../records/record-routes';
import {
  CREATE_MACHINE_FAMILY_EXAMPLE,
  MACHINE_FAMILY_EXAMPLE,
  MACHINE_FAMILY_HISTORY_EXAMPLE,
  MACHINE_FAMILY_PAGE_EXAMPLE,
  UPDATE_MACHINE_FAMILY_EXAMPLE,
} from './machine-families.examples';
import type { MachineFamiliesService } from './machine-families.service';

/** The 412 answer of a change to a family: the problem and the family as stored. */
const MachineFamilyChangedMeanwhileSchema = changedMeanwhileProblemSchema(
  MachineFamilySchema,
  'MachineFamilyChangedMeanwhile',
);

/** The machine family routes, mounted on the signed-in `/api/v1` router; access comes from the app. */
export function machineFamiliesRouter(deps: {
  access: Readonly<Record<RecordAccess, AccessRule>>;
  families: MachineFamiliesService;
}): FeatureRoutes {
  const table = new RouteTable({
    basePath: RECORDS_BASE_PATH,
    tag: 'Machine families',
    access: deps.access,
  });
  addRecordRoutes(table, {
    path: '/machine-families',
    noun: 'machine family',
    plural: 'machine families',
    schemas: {
      record: MachineFamilySchema,
      page: MachineFamilyPageSchema,
      create: CreateMachineFamilySchema,
      update: UpdateMachineFamilySchema,
      query: MachineFamilyListQuerySchema,
      changedMeanwhile: MachineFamilyChangedMeanwhileSchema,
    },
    examples: {
      record: MACHINE_FAMILY_EXAMPLE,
      page: MACHINE_FAMILY_PAGE_EXAMPLE,
      create: CREATE_MACHINE_FAMILY_EXAMPLE,
      update: UPDATE_MACHINE_FAMILY_EXAMPLE,
      history: MACHINE_FAMILY_HISTORY_EXAMPLE,
    },
    searches: 'families by name',
    rules:
      'A family has one correction radius per plane and sensitivities of its own planes only; its ' +
      'planeCount changes only while every machine of the family has that many planes (400 on ' +
      '`planeCount`, `code` `PLANES_DO_NOT_MATCH`).',
    service: deps.families,
  });
  return table;
}
