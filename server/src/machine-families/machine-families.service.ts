import {
  CreateMachineFamilySchema,
  invalidRequestProblem,
  type MachineFamily,
  type MachineFamilyListQuerySchema,
  RECORDS_PROBLEM_CODES,
  type UpdateMachineFamilySchema,
} from '@counterpoise/api';
import type * as z from 'zod';
import type { Clock } from '../clock';
import { HttpProblem } from '../http/problem';
import type { Actor, ChangeLog } from '../records/change-log';
import { foldCase } from '../records/list-query';
import { RecordService } from '../records/record-service';
import { lifecycleOf, textOrNull } from '../records/versioned-records';
import type { MachineFamiliesRepo, MachineFamilyRow, MachineFamilyValues } from './machine-families.repo';

type CreateMachineFamily = z.output<typeof CreateMachineFamilySchema>;
type UpdateMachineFamily = z.output<typeof UpdateMachineFamilySchema>;
type MachineFamilyListQuery = z.output<typeof MachineFamilyListQuerySchema>;

/** The fields of a family a person edits, in the order the history lists them. */
export const MACHINE_FAMILY_FIELDS = [
  'name',
  'rotorType',
  'nominalSpeedRpm',
  'planeCount',
  'correctionRadiiMm',
  'inspectionLimits',
  'acceptance',
  'sensitivities',
  'notes',
] as const;
type MachineFamilyFields = Pick<MachineFamily, (typeof MACHINE_FAMILY_FIELDS)[number]>;

/** A stored family as the API shows it. */
export function toMachineFamily(row: MachineFamilyRow): MachineFamily {
  return {
    ...lifecycleOf(row),
    name: row.name,
    rotorType: row.rotorType,
    nominalSpeedRpm: row.nominalSpeedRpm,
    planeCount: row.planeCount === 1 ? 1 : 2,
    correctionRadiiMm: row.correctionRadiiMm,
    inspectionLimits: row.inspectionLimits,
    acceptance: row.acceptance,
    sensitivities: row.sensitivities,
    notes: row.notes,
    machineCount: row.machineCount,
  };
}

function familyValues(fields: MachineFamilyFields): MachineFamilyValues {
  return { ...fields, nameKey: foldCase(fields.name) };
}

/**
 * Kinds of machine the shop balances often, with what holds for all of them: the planes and their
 * radii, the inspection limits, when a rotor is balanced enough, and what the shop knows of how such a
 * rotor answers a weight.
 */
export class MachineFamiliesService extends RecordService<
  MachineFamilyRow,
  MachineFamily,
  MachineFamilyFields,
  MachineFamilyValues,
  CreateMachineFamily,
  UpdateMachineFamily,
  MachineFamilyListQuery
> {
  constructor(
    private readonly repo: MachineFamiliesRepo,
    changes: ChangeLog,
    clock: Clock,
  ) {
    super(
      {
        kind: 'machine-family',
        noun: 'machine family',
        fields: MACHINE_FAMILY_FIELDS,
        store: repo,
        toRecord: toMachineFamily,
        toValues: familyValues,
      },
      changes,
      clock,
    );
  }

  create(actor: Actor, fields: CreateMachineFamily): MachineFamily {
    return this.records.create(actor, { ...fields, notes: textOrNull(fields.notes) });
  }

  /**
   * Changes a family. The family as it would be must keep the rules of a new one (one radius per plane,
   * sensitivities of planes it has), and a new planeCount must be that of every machine of the family.
   */
  update(actor: Actor, id: number, versions: readonly number[], change: UpdateMachineFamily): MachineFamily {
    return this.records.update(actor, id, versions, change, (next, current) => {
      const checked = CreateMachineFamilySchema.safeParse(next);
      if (!checked.success) throw HttpProblem.from(invalidRequestProblem(checked.error));
      if (next.planeCount !== current.planeCount) {
        const others = this.repo.countMachinesWithOtherPlaneCount(actor.organisationId, id, next.planeCount);
        if (others > 0) {
          const message =
            `${others} machine${others === 1 ? '' : 's'} of this family ha${others === 1 ? 's' : 've'} ` +
            `${current.planeCount} plane${current.planeCount === 1 ? '' : 's'}: change ` +
            `${others === 1 ? 'it' : 'them'} first, or make a new family.`;
          throw new HttpProblem(
            400,
            'Bad Request',
            `planeCount: ${message}`,
            [{ path: 'planeCount', message }],
            'about:blank',
            RECORDS_PROBLEM_CODES.planesDoNotMatch,
          );
        }
      }
      return { ...checked.data, notes: textOrNull(checked.data.notes) };
    });
  }
}
