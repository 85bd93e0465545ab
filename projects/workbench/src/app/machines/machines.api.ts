import { Injectable } from '@angular/core';
import type {
  CreateMachineSchema,
  MachineListQuerySchema,
  MachinePageSchema,
  MachineSchema,
  UpdateMachineSchema,
} from '@counterpoise/api';
import type * as z from 'zod';
import { RecordsApi } from '../records/records-api';

/*
 * The shapes of the machines routes, from the shared schemas by type alone, so that the machine pages never
 * load zod.
 */

/** A machine as the API answers it, with its customer's and family's names. */
export type Machine = z.output<typeof MachineSchema>;
/** `GET /api/v1/machines`: one page of the list. */
export type MachinePage = z.output<typeof MachinePageSchema>;
/** The list's query, with its customer and family filters; what is left out takes the server's default. */
export type MachineListQuery = Partial<z.output<typeof MachineListQuerySchema>>;
/** `POST /api/v1/machines`. */
export type CreateMachine = z.input<typeof CreateMachineSchema>;
/** `PATCH /api/v1/machines/{id}`: the fields to change. */
export type UpdateMachine = z.input<typeof UpdateMachineSchema>;
/** Where weights may go on one correction plane. */
export type PlaneLayout = Machine['planes'][number];
/** A stretch of a plane's rim where no weight can go. */
export type BlockedSectorLayout = PlaneLayout['blockedSectors'][number];
/** The fields the list sorts by. */
export type MachineSortField = NonNullable<MachineListQuery['sort']>;

/** The shop's machines on the server: list (by customer, family, serial number…), read, add, change, archive, restore and history. */
@Injectable({ providedIn: 'root' })
export class MachinesApi extends RecordsApi<
  Machine,
  MachinePage,
  MachineListQuery,
  CreateMachine,
  UpdateMachine
> {
  protected readonly url = '/api/v1/machines';
}
