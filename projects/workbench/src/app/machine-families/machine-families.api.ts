import { Injectable } from '@angular/core';
import type {
  CreateMachineFamilySchema,
  MachineFamilyListQuerySchema,
  MachineFamilyPageSchema,
  MachineFamilySchema,
  UpdateMachineFamilySchema,
} from '@counterpoise/api';
import type * as z from 'zod';
import { RecordsApi } from '../records/records-api';

/*
 * The shapes of the machine-family routes, from the shared schemas by type alone, so that the family pages
 * never load zod.
 */

/** A machine family as the API answers it. */
export type MachineFamily = z.output<typeof MachineFamilySchema>;
/** `GET /api/v1/machine-families`: one page of the list. */
export type MachineFamilyPage = z.output<typeof MachineFamilyPageSchema>;
/** The list's query; what is left out takes the server's default. */
export type MachineFamilyListQuery = Partial<z.output<typeof MachineFamilyListQuerySchema>>;
/** `POST /api/v1/machine-families`. */
export type CreateMachineFamily = z.input<typeof CreateMachineFamilySchema>;
/** `PATCH /api/v1/machine-families/{id}`: the fields to change. */
export type UpdateMachineFamily = z.input<typeof UpdateMachineFamilySchema>;
/** What the shop knows of how the family's rotors answer a weight, for one sensor and one plane. */
export type StoredSensitivity = MachineFamily['sensitivities'][number];
/** The fields the list sorts by. */
export type MachineFamilySortField = NonNullable<MachineFamilyListQuery['sort']>;

/** The shop's machine families on the server: list, read, add, change, archive, restore and their history. */
@Injectable({ providedIn: 'root' })
export class MachineFamiliesApi extends RecordsApi<
  MachineFamily,
  MachineFamilyPage,
  MachineFamilyListQuery,
  CreateMachineFamily,
  UpdateMachineFamily
> {
  protected readonly url = '/api/v1/machine-families';
}
