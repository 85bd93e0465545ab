import {
  type AbstractControl,
  FormArray,
  FormControl,
  FormGroup,
  type ValidationErrors,
} from '@angular/forms';
import type { AcceptanceLevel, AmplitudeUnit, MachineSide, RotorType } from '@counterpoise/api';
import {
  acceptanceGroup,
  type AcceptanceGroup,
  acceptanceValue,
  setAcceptance,
} from '../records/acceptance-fields';
import type { FieldDescriptions } from '../records/record-fields';
import {
  AMPLITUDE_UNIT_LABELS,
  describeAcceptance,
  formatNumber,
  planeName,
  ROTOR_TYPE_LABELS,
  SIDE_LABELS,
} from '../records/record-labels';
import {
  angleDeg,
  maxChars,
  numberOrNull,
  numberWithin,
  RECORD_RULES,
  requiredNumber,
  textOrNull,
} from '../records/record-rules';
import { requiredWith } from '../shell/validators';
import type { CreateMachineFamily, MachineFamily, StoredSensitivity } from './machine-families.api';

/**
 * Limits of the pre-balance inspection a new family starts with, in mm: 1/8 in of bearing end play and
 * 0.014 in of stub-shaft runout (common practice for mulcher and mower rotors, no published source; the
 * engine's COMMON_PRACTICE_INSPECTION_LIMITS_IN, converted and rounded; family-form-model.spec.ts checks
 * they agree). A shop with the manufacturer's figures types those instead.
 */
export const COMMON_PRACTICE_LIMITS_MM = { bearingEndPlayMm: 3.18, shaftRunoutMm: 0.36 } as const;

/** A stored sensitivity in words: "Left sensor, left plane: 42 g per in/s peak, lag 30°". */
export function describeSensitivity(figure: StoredSensitivity, planeCount: number): string {
  return (
    `${SIDE_LABELS[figure.sensorSide]} sensor, ${planeName(figure.planeIndex, planeCount).toLowerCase()}: ` +
    `${formatNumber(figure.gramsPerUnit)} g per ${AMPLITUDE_UNIT_LABELS[figure.unit]}, lag ${formatNumber(figure.phaseLagDeg, 1)}°`
  );
}

/** What stands behind a stored figure: "From 4 jobs, spread ±6 % in mass and ±8° in phase." */
export function describeEvidence(figure: StoredSensitivity): string {
  if (figure.jobCount === 0) return 'A rule of thumb typed in; no jobs behind it yet.';
  const jobs = `From ${figure.jobCount} ${figure.jobCount === 1 ? 'job' : 'jobs'}`;
  if (figure.spread === null) return `${jobs}.`;
  return (
    `${jobs}, spread ±${formatNumber(figure.spread.massPercent, 1)} % in mass and ` +
    `±${formatNumber(figure.spread.phaseDeg, 1)}° in phase.`
  );
}

/** How a machine family's fields read in the change history and the "changed meanwhile" dialog. */
export const FAMILY_FIELDS: FieldDescriptions = {
  name: { label: 'name' },
  rotorType: {
    label: 'rotor type',
    format: (value) => ROTOR_TYPE_LABELS[value as RotorType] ?? String(value),
  },
  nominalSpeedRpm: { label: 'nominal speed', format: (value) => `${formatNumber(value as number)} rpm` },
  planeCount: { label: 'number of planes' },
  correctionRadiiMm: {
    label: 'correction radii',
    format: (value) => (value as number[]).map((radius) => `${formatNumber(radius)} mm`).join(' and '),
  },
  inspectionLimits: {
    label: 'inspection limits',
    format: (value) => {
      const limits = value as MachineFamily['inspectionLimits'];
      return `end play ${formatNumber(limits.bearingEndPlayMm)} mm, runout ${formatNumber(limits.shaftRunoutMm)} mm`;
    },
  },
  acceptance: { label: 'acceptance level', format: (value) => describeAcceptance(value as AcceptanceLevel) },
  sensitivities: {
    label: 'stored sensitivities',
    format: (value) => {
      const figures = value as StoredSensitivity[];
      const planes = Math.max(1, ...figures.map((figure) => figure.planeIndex + 1));
      return figures.map((figure) => describeSensitivity(figure, planes)).join('; ');
    },
  },
  notes: { label: 'notes' },
};

/** One stored sensitivity's fields; `stored` keeps the figure as loaded, to tell whether it was retyped. */
export type SensitivityGroup = FormGroup<{
  sensorSide: FormControl<MachineSide>;
  planeIndex: FormControl<number>;
  gramsPerUnit: FormControl<number | null>;
  unit: FormControl<AmplitudeUnit>;
  phaseLagDeg: FormControl<number | null>;
  stored: FormControl<StoredSensitivity | null>;
}>;

/** The machine-family form, named as the API names the fields so that its field errors find them. */
export type FamilyForm = FormGroup<{
  name: FormControl<string>;
  rotorType: FormControl<RotorType>;
  nominalSpeedRpm: FormControl<number | null>;
  planeCount: FormControl<1 | 2>;
  correctionRadiiMm: FormArray<FormControl<number | null>>;
  inspectionLimits: FormGroup<{
    bearingEndPlayMm: FormControl<number | null>;
    shaftRunoutMm: FormControl<number | null>;
  }>;
  acceptance: AcceptanceGroup;
  sensitivities: FormArray<SensitivityGroup>;
  notes: FormControl<string>;
}>;

/** A correction radius field. */
export function radiusControl(value: number | null = null): FormControl<number | null> {
  return new FormControl(value, [
    requiredNumber('Enter the correction radius in mm.'),
    numberWithin(
      { above: 0, max: RECORD_RULES.maxRadiusMm },
      `The correction radius is above 0 and at most ${RECORD_RULES.maxRadiusMm} mm.`,
    ),
  ]);
}

/** A stored sensitivity's fields, filled from a stored one or for the next sensor and plane. */
export function sensitivityGroup(
  figure: Partial<StoredSensitivity> = {},
  stored: StoredSensitivity | null = null,
): SensitivityGroup {
  return new FormGroup({
    sensorSide: new FormControl<MachineSide>(figure.sensorSide ?? 'left', { nonNullable: true }),
    planeIndex: new FormControl(figure.planeIndex ?? 0, { nonNullable: true }),
    gramsPerUnit: new FormControl(figure.gramsPerUnit ?? null, [
      requiredNumber('Enter the grams per unit of amplitude.'),
      numberWithin(
        { above: 0, max: RECORD_RULES.maxGramsPerUnit },
        'The grams per unit of amplitude are above 0 and at most 1000000.',
      ),
    ]),
    unit: new FormControl<AmplitudeUnit>(figure.unit ?? 'in/s-pk', { nonNullable: true }),
    phaseLagDeg: new FormControl(figure.phaseLagDeg ?? null, [
      requiredNumber('Enter the phase lag in degrees.'),
      angleDeg('The phase lag is from 0 to 359.9 degrees.'),
    ]),
    stored: new FormControl<StoredSensitivity | null>(stored),
  });
}

/** Refuses two figures for one sensor and plane, and a figure for a plane the family does not have. */
function sensitivityRules(form: AbstractControl): ValidationErrors | null {
  const family = form as FamilyForm;
  const planeCount = family.controls.planeCount.value;
  const seen = new Set<string>();
  for (const figure of family.controls.sensitivities.controls) {
    const { sensorSide, planeIndex } = figure.getRawValue();
    if (planeIndex >= planeCount) {
      return { sensitivities: `A figure names a plane the family does not have (it has ${planeCount}).` };
    }
    const key = `${sensorSide}/${planeIndex}`;
    if (seen.has(key)) return { sensitivities: 'Give at most one figure per sensor and plane.' };
    seen.add(key);
  }
  return null;
}

/** An empty family form, with the common-practice inspection limits and grade G16. */
export function familyForm(): FamilyForm {
  return new FormGroup(
    {
      name: new FormControl('', {
        nonNullable: true,
        validators: [
          requiredWith('Name the machine family.'),
          maxChars(RECORD_RULES.familyNameMaxLength, 'Keep the family’s name to 120 characters.'),
        ],
      }),
      rotorType: new FormControl<RotorType>('fixed-tooth-drum', { nonNullable: true }),
      nominalSpeedRpm: new FormControl<number | null>(null, [
        requiredNumber('Enter the speed in rpm.'),
        numberWithin(
          { above: 0, max: RECORD_RULES.maxSpeedRpm },
          `The speed is above 0 and at most ${RECORD_RULES.maxSpeedRpm} rpm.`,
        ),
      ]),
      planeCount: new FormControl<1 | 2>(2, { nonNullable: true }),
      correctionRadiiMm: new FormArray([radiusControl(), radiusControl()]),
      inspectionLimits: new FormGroup({
        bearingEndPlayMm: new FormControl<number | null>(COMMON_PRACTICE_LIMITS_MM.bearingEndPlayMm, [
          requiredNumber('Enter the end-play limit in mm.'),
          numberWithin(
            { above: 0, max: RECORD_RULES.maxEndPlayMm },
            `The end-play limit is above 0 and at most ${RECORD_RULES.maxEndPlayMm} mm.`,
          ),
        ]),
        shaftRunoutMm: new FormControl<number | null>(COMMON_PRACTICE_LIMITS_MM.shaftRunoutMm, [
          requiredNumber('Enter the runout limit in mm.'),
          numberWithin(
            { above: 0, max: RECORD_RULES.maxRunoutMm },
            `The runout limit is above 0 and at most ${RECORD_RULES.maxRunoutMm} mm.`,
          ),
        ]),
      }),
      acceptance: acceptanceGroup(null, false),
      sensitivities: new FormArray<SensitivityGroup>([]),
      notes: new FormControl('', {
        nonNullable: true,
        validators: [maxChars(RECORD_RULES.notesMaxLength, 'Keep the notes to 4000 characters.')],
      }),
    },
    { validators: sensitivityRules },
  );
}

/** Gives the form one radius field per plane, keeping the radii already typed. */
export function matchRadiiToPlanes(form: FamilyForm): void {
  const radii = form.controls.correctionRadiiMm;
  const count = form.controls.planeCount.value;
  while (radii.length < count) radii.push(radiusControl(radii.at(0)?.value ?? null));
  while (radii.length > count) radii.removeAt(radii.length - 1);
}

/** Fills the form from a stored family. */
export function fillFamilyForm(form: FamilyForm, family: MachineFamily): void {
  form.controls.correctionRadiiMm.clear();
  for (const radius of family.correctionRadiiMm) form.controls.correctionRadiiMm.push(radiusControl(radius));
  form.controls.sensitivities.clear();
  for (const figure of family.sensitivities)
    form.controls.sensitivities.push(sensitivityGroup(figure, figure));
  form.patchValue({
    name: family.name,
    rotorType: family.rotorType,
    nominalSpeedRpm: family.nominalSpeedRpm,
    planeCount: family.planeCount,
    inspectionLimits: family.inspectionLimits,
    notes: family.notes ?? '',
  });
  setAcceptance(form.controls.acceptance, family.acceptance, false);
}

/**
 * A figure as the API takes it. Retyped figures become a rule of thumb again (no jobs behind them, no
 * spread); figures left as loaded keep what the jobs taught.
 */
function sensitivityRequest(group: SensitivityGroup): StoredSensitivity {
  const { stored, ...figure } = group.getRawValue();
  const next = {
    sensorSide: figure.sensorSide,
    planeIndex: figure.planeIndex,
    gramsPerUnit: figure.gramsPerUnit ?? 0,
    unit: figure.unit,
    phaseLagDeg: figure.phaseLagDeg ?? 0,
  };
  const unchanged =
    stored !== null &&
    stored.sensorSide === next.sensorSide &&
    stored.planeIndex === next.planeIndex &&
    stored.gramsPerUnit === next.gramsPerUnit &&
    stored.unit === next.unit &&
    stored.phaseLagDeg === next.phaseLagDeg;
  return { ...next, jobCount: unchanged ? stored.jobCount : 0, spread: unchanged ? stored.spread : null };
}

/** Whether a figure was retyped since it was loaded (so its jobs no longer stand behind it). */
export function isRetyped(group: SensitivityGroup): boolean {
  const stored = group.controls.stored.value;
  if (stored === null || stored.jobCount === 0) return false;
  return sensitivityRequest(group).jobCount === 0;
}

/** The form's value as the API takes it. */
export function familyRequest(form: FamilyForm): CreateMachineFamily & { notes: string | null } {
  const value = form.getRawValue();
  return {
    name: value.name.trim(),
    rotorType: value.rotorType,
    nominalSpeedRpm: numberOrNull(value.nominalSpeedRpm) ?? 0,
    planeCount: value.planeCount,
    correctionRadiiMm: value.correctionRadiiMm.map((radius) => numberOrNull(radius) ?? 0),
    inspectionLimits: {
      bearingEndPlayMm: numberOrNull(value.inspectionLimits.bearingEndPlayMm) ?? 0,
      shaftRunoutMm: numberOrNull(value.inspectionLimits.shaftRunoutMm) ?? 0,
    },
    acceptance: acceptanceValue(form.controls.acceptance) ?? { kind: 'balance-grade', grade: 'G16' },
    sensitivities: form.controls.sensitivities.controls.map(sensitivityRequest),
    notes: textOrNull(value.notes),
  };
}

/** A stored family's fields shaped as `familyRequest` shapes them, to find what a form changed. */
export function familyFields(family: MachineFamily): CreateMachineFamily & { notes: string | null } {
  return {
    name: family.name,
    rotorType: family.rotorType,
    nominalSpeedRpm: family.nominalSpeedRpm,
    planeCount: family.planeCount,
    correctionRadiiMm: family.correctionRadiiMm,
    inspectionLimits: {
      bearingEndPlayMm: family.inspectionLimits.bearingEndPlayMm,
      shaftRunoutMm: family.inspectionLimits.shaftRunoutMm,
    },
    acceptance: family.acceptance,
    sensitivities: family.sensitivities.map((figure) => ({
      sensorSide: figure.sensorSide,
      planeIndex: figure.planeIndex,
      gramsPerUnit: figure.gramsPerUnit,
      unit: figure.unit,
      phaseLagDeg: figure.phaseLagDeg,
      jobCount: figure.jobCount,
      spread: figure.spread,
    })),
    notes: family.notes,
  };
}
