import {
  type CreateMachineSchema,
  type FieldError,
  type Machine,
  type MachineListQuerySchema,
  type MachineSide,
  RECORDS_PROBLEM_CODES,
  type UpdateMachineSchema,
} from '@counterpoise/api';
import type * as z from 'zod';
import type { Clock } from '../clock';
import { HttpProblem } from '../http/problem';
import type { Actor, ChangeLog } from '../records/change-log';
import { foldCase, searchTextOf } from '../records/list-query';
import { RecordService } from '../records/record-service';
import { lifecycleOf, textOrNull } from '../records/versioned-records';
import type { MachineRow, MachinesRepo, MachineValues } from './machines.repo';

type CreateMachine = z.output<typeof CreateMachineSchema>;
type UpdateMachine = z.output<typeof UpdateMachineSchema>;
type MachineListQuery = z.output<typeof MachineListQuerySchema>;

/** The fields of a machine a person edits, in the order the history lists them. */
export const MACHINE_FIELDS = [
  'customerId',
  'familyId',
  'make',
  'model',
  'serialNumber',
  'hours',
  'rotorMassKg',
  'operatingSpeedRpm',
  'sensorSides',
  'rotationSeenFromLeft',
  'planes',
  'stockWeightsGrams',
  'acceptance',
  'notes',
] as const;
type MachineFields = Pick<Machine, (typeof MACHINE_FIELDS)[number]>;

/**
 * The sensor sides of a machine created without them: one sensor per bearing of a two-plane rotor;
 * on the left for a one-plane rotor, which a technician changes when the sensor sits on the right.
 */
export function defaultSensorSides(planeCount: number): MachineSide[] {
  return planeCount === 2 ? ['left', 'right'] : ['left'];
}

/** A stored machine as the API shows it. */
export function toMachine(row: MachineRow): Machine {
  return {
    ...lifecycleOf(row),
    customerId: row.customerId,
    customerName: row.customerName,
    familyId: row.familyId,
    familyName: row.familyName,
    make: row.make,
    model: row.model,
    serialNumber: row.serialNumber,
    hours: row.hours,
    rotorMassKg: row.rotorMassKg,
    operatingSpeedRpm: row.operatingSpeedRpm,
    sensorSides: row.sensorSides,
    rotationSeenFromLeft: row.rotationSeenFromLeft,
    planes: row.planes,
    stockWeightsGrams: row.stockWeightsGrams,
    acceptance: row.acceptance,
    notes: row.notes,
  };
}

/** The columns of a machine's fields, with its sort keys and the text a search looks in. */
function machineValues(fields: MachineFields): MachineValues {
  return {
    ...fields,
    makeKey: fields.make === null ? null : foldCase(fields.make),
    serialKey: fields.serialNumber === null ? null : foldCase(fields.serialNumber),
    searchText: searchTextOf([fields.serialNumber, fields.make, fields.model]),
  };
}

/**
 * The machines of the shop's customers: what identifies one on site, and what a balancing job needs
 * to know of it. A machine names a customer and, when it has one, a family of the same organisation.
 */
export class MachinesService extends RecordService<
  MachineRow,
  Machine,
  MachineFields,
  MachineValues,
  CreateMachine,
  UpdateMachine,
  MachineListQuery
> {
  constructor(
    private readonly repo: MachinesRepo,
    changes: ChangeLog,
    clock: Clock,
  ) {
    super(
      {
        kind: 'machine',
        noun: 'machine',
        fields: MACHINE_FIELDS,
        store: repo,
        toRecord: toMachine,
        toValues: machineValues,
      },
      changes,
      clock,
    );
  }

  create(actor: Actor, fields: CreateMachine): Machine {
    return this.records.create(
      actor,
      {
        customerId: fields.customerId,
        familyId: fields.familyId ?? null,
        make: fields.make ?? null,
        model: fields.model ?? null,
        serialNumber: fields.serialNumber ?? null,
        hours: fields.hours ?? null,
        rotorMassKg: fields.rotorMassKg ?? null,
        operatingSpeedRpm: fields.operatingSpeedRpm ?? null,
        sensorSides: fields.sensorSides ?? defaultSensorSides(fields.planes.length),
        rotationSeenFromLeft: fields.rotationSeenFromLeft,
        planes: fields.planes,
        stockWeightsGrams: fields.stockWeightsGrams ?? [],
        acceptance: fields.acceptance ?? null,
        notes: fields.notes ?? null,
      },
      (prepared) => this.checked(actor, prepared),
    );
  }

  update(actor: Actor, id: number, versions: readonly number[], change: UpdateMachine): Machine {
    return this.records.update(actor, id, versions, change, (next, current) =>
      this.checked(actor, next, current),
    );
  }

  /**
   * The machine as it will be stored, or 400 naming each field at fault: a customer or family it comes
   * to name must be the organisation's and in use (one it already names may have been archived since),
   * and its planes must be as many as its family's.
   */
  private checked(actor: Actor, next: MachineFields, current?: Machine): MachineFields {
    const errors: FieldError[] = [];
    let code: string = RECORDS_PROBLEM_CODES.unknownReference;
    if (next.customerId !== current?.customerId) {
      const customer = this.repo.findCustomer(actor.organisationId, next.customerId);
      if (customer === undefined || customer.archived) {
        errors.push({
          path: 'customerId',
          message:
            customer === undefined
              ? `There is no customer ${next.customerId} in your organisation.`
              : `${customer.name} is archived: restore the customer first, or choose another.`,
        });
      }
    }
    if (next.familyId !== null) {
      const family = this.repo.findFamily(actor.organisationId, next.familyId);
      const changed = next.familyId !== current?.familyId;
      if (family === undefined || (changed && family.archived)) {
        errors.push({
          path: 'familyId',
          message:
            family === undefined
              ? `There is no machine family ${next.familyId} in your organisation.`
              : `${family.name} is archived: restore the family first, or choose another.`,
        });
      } else if (family.planeCount !== next.planes.length) {
        if (errors.length === 0) code = RECORDS_PROBLEM_CODES.planesDoNotMatch;
        errors.push({
          path: 'planes',
          message:
            `The family ${family.name} has ${family.planeCount} plane${family.planeCount === 1 ? '' : 's'}: ` +
            `give the machine as many.`,
        });
      }
    }
    if (errors.length > 0) {
      throw new HttpProblem(
        400,
        'Bad Request',
        errors.map((error) => `${error.path}: ${error.message}`).join(' '),
        errors,
        'about:blank',
        code,
      );
    }
    return { ...next, notes: textOrNull(next.notes) };
  }
}
