import {
  type AbstractControl,
  FormArray,
  FormControl,
  FormGroup,
  type ValidationErrors,
} from '@angular/forms';
import type { AcceptanceLevel, MachineSide } from '@counterpoise/api';
import { chosenCustomer, type CustomerChoice, isCustomerRef } from '../customers/customer-picker';
import {
  acceptanceGroup,
  type AcceptanceGroup,
  acceptanceValue,
  setAcceptance,
} from '../records/acceptance-fields';
import type { FieldDescriptions } from '../records/record-fields';
import {
  describeAcceptance,
  formatDeg,
  formatNumber,
  planeName,
  type RotationDirection,
  ROTATION_LABELS,
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
import type { BlockedSectorLayout, CreateMachine, Machine, PlaneLayout } from './machines.api';

/** A plane's layout in words: "radius 250 mm, 12 positions from 15°, blocked: holder 350°–15°". */
export function describePlane(plane: PlaneLayout): string {
  const parts = [`radius ${formatNumber(plane.correctionRadiusMm)} mm`];
  parts.push(
    plane.positions
      ? `${plane.positions.count} positions from ${formatDeg(plane.positions.firstDeg)}`
      : 'weights anywhere on the rim',
  );
  if (plane.blockedSectors.length > 0) {
    parts.push(
      `blocked: ${plane.blockedSectors
        .map((sector) => `${sector.label} ${formatDeg(sector.fromDeg)}–${formatDeg(sector.toDeg)}`)
        .join(', ')}`,
    );
  }
  return parts.join(', ');
}

/** How a machine's fields read in the change history and the "changed meanwhile" dialog. */
export const MACHINE_FIELDS: FieldDescriptions = {
  customerId: { label: 'customer', format: (value) => `customer no. ${String(value)}` },
  familyId: { label: 'family', format: (value) => `family no. ${String(value)}` },
  make: { label: 'make' },
  model: { label: 'model' },
  serialNumber: { label: 'serial number' },
  hours: { label: 'hours', format: (value) => `${formatNumber(value as number, 1)} h` },
  rotorMassKg: { label: 'rotor mass', format: (value) => `${formatNumber(value as number, 1)} kg` },
  operatingSpeedRpm: { label: 'operating speed', format: (value) => `${formatNumber(value as number)} rpm` },
  sensorSides: {
    label: 'sensor sides',
    format: (value) => (value as MachineSide[]).map((side) => SIDE_LABELS[side].toLowerCase()).join(' and '),
  },
  rotationSeenFromLeft: {
    label: 'rotation seen from the left',
    format: (value) => (ROTATION_LABELS[value as RotationDirection] ?? String(value)).toLowerCase(),
  },
  planes: {
    label: 'planes',
    format: (value) => {
      const planes = value as PlaneLayout[];
      return planes
        .map((plane, index) => `${planeName(index, planes.length)}: ${describePlane(plane)}`)
        .join('; ');
    },
  },
  stockWeightsGrams: {
    label: 'stock weights',
    format: (value) => (value as number[]).map((grams) => `${formatNumber(grams)} g`).join(', '),
  },
  acceptance: { label: 'acceptance level', format: (value) => describeAcceptance(value as AcceptanceLevel) },
  notes: { label: 'notes' },
};

/** A blocked sector's fields. */
export type SectorGroup = FormGroup<{
  fromDeg: FormControl<number | null>;
  toDeg: FormControl<number | null>;
  label: FormControl<string>;
}>;

/** Where weights may go on a plane: anywhere on the rim, or at equally spaced positions. */
export type PositionsGroup = FormGroup<{
  fixed: FormControl<boolean>;
  count: FormControl<number | null>;
  firstDeg: FormControl<number | null>;
}>;

/** One plane's fields, named as the API names them so that its field errors find them. */
export type PlaneGroup = FormGroup<{
  correctionRadiusMm: FormControl<number | null>;
  positions: PositionsGroup;
  blockedSectors: FormArray<SectorGroup>;
}>;

/** The machine form. `planeCount` is the form's own: the API counts the planes. */
export type MachineForm = FormGroup<{
  customerId: FormControl<CustomerChoice>;
  familyId: FormControl<number | null>;
  make: FormControl<string>;
  model: FormControl<string>;
  serialNumber: FormControl<string>;
  hours: FormControl<number | null>;
  rotorMassKg: FormControl<number | null>;
  operatingSpeedRpm: FormControl<number | null>;
  sensorSides: FormGroup<{ left: FormControl<boolean>; right: FormControl<boolean> }>;
  rotationSeenFromLeft: FormControl<RotationDirection>;
  planeCount: FormControl<1 | 2>;
  planes: FormArray<PlaneGroup>;
  stockWeightsGrams: FormControl<number[]>;
  acceptance: AcceptanceGroup;
  notes: FormControl<string>;
}>;

const text = (maxLength: number, message: string) =>
  new FormControl('', { nonNullable: true, validators: [maxChars(maxLength, message)] });

/** A blocked sector's fields, filled from a stored one or from two marked angles. */
export function sectorGroup(sector: Partial<BlockedSectorLayout> = {}): SectorGroup {
  return new FormGroup({
    fromDeg: new FormControl(sector.fromDeg ?? null, [
      requiredNumber('Enter where the sector starts.'),
      angleDeg(),
    ]),
    toDeg: new FormControl(sector.toDeg ?? null, [
      requiredNumber('Enter where the sector ends.'),
      angleDeg(),
    ]),
    label: new FormControl(sector.label ?? '', {
      nonNullable: true,
      validators: [
        requiredWith('Say what blocks the sector, in a word or two.'),
        maxChars(RECORD_RULES.sectorLabelMaxLength, 'Keep what blocks the sector to 40 characters.'),
      ],
    }),
  });
}

/** Enables the count and first angle only for fixed positions, so that they are checked only then. */
function showPositionFields(group: PositionsGroup): void {
  for (const control of [group.controls.count, group.controls.firstDeg]) {
    if (group.controls.fixed.value) control.enable({ emitEvent: false });
    else control.disable({ emitEvent: false });
  }
}

/** One plane's fields, filled from a stored layout or empty (weights anywhere). */
export function planeGroup(plane: Partial<PlaneLayout> = {}): PlaneGroup {
  const positions: PositionsGroup = new FormGroup({
    fixed: new FormControl(plane.positions != null, { nonNullable: true }),
    count: new FormControl(plane.positions?.count ?? null, [
      requiredNumber('Enter how many positions there are.'),
      numberWithin(
        { min: RECORD_RULES.minPositions, max: RECORD_RULES.maxPositions, whole: true },
        `Give a whole number of positions from ${RECORD_RULES.minPositions} to ${RECORD_RULES.maxPositions}.`,
      ),
    ]),
    firstDeg: new FormControl(plane.positions?.firstDeg ?? null, [
      requiredNumber('Enter the angle of the first position.'),
      angleDeg('The first position is from 0 to 359.9°.'),
    ]),
  });
  showPositionFields(positions);
  positions.controls.fixed.valueChanges.subscribe(() => showPositionFields(positions));
  return new FormGroup({
    correctionRadiusMm: new FormControl(plane.correctionRadiusMm ?? null, [
      requiredNumber('Enter the correction radius in mm.'),
      numberWithin(
        { above: 0, max: RECORD_RULES.maxRadiusMm },
        `The correction radius is above 0 and at most ${RECORD_RULES.maxRadiusMm} mm.`,
      ),
    ]),
    positions,
    blockedSectors: new FormArray((plane.blockedSectors ?? []).map((sector) => sectorGroup(sector))),
  });
}

function atLeastOneSide(group: AbstractControl): ValidationErrors | null {
  const { left, right } = (group as MachineForm['controls']['sensorSides']).getRawValue();
  return left || right ? null : { sides: 'At least one side carries a sensor.' };
}

/** An empty machine form: two planes, a sensor on each side, clockwise seen from the left. */
export function machineForm(): MachineForm {
  return new FormGroup({
    customerId: new FormControl<CustomerChoice>(null, [requiredWith('Choose the customer.'), chosenCustomer]),
    familyId: new FormControl<number | null>(null),
    make: text(RECORD_RULES.makeMaxLength, 'Keep the make to 80 characters.'),
    model: text(RECORD_RULES.modelMaxLength, 'Keep the model to 80 characters.'),
    serialNumber: text(RECORD_RULES.serialNumberMaxLength, 'Keep the serial number to 60 characters.'),
    hours: new FormControl<number | null>(null, [
      numberWithin({ min: 0, max: RECORD_RULES.maxHours }, 'The hours are from 0 to 1000000.'),
    ]),
    rotorMassKg: new FormControl<number | null>(null, [
      numberWithin(
        { above: 0, max: RECORD_RULES.maxRotorMassKg },
        `The rotor mass is above 0 and at most ${RECORD_RULES.maxRotorMassKg} kg.`,
      ),
    ]),
    operatingSpeedRpm: new FormControl<number | null>(null, [
      numberWithin(
        { above: 0, max: RECORD_RULES.maxSpeedRpm },
        `The speed is above 0 and at most ${RECORD_RULES.maxSpeedRpm} rpm.`,
      ),
    ]),
    sensorSides: new FormGroup(
      {
        left: new FormControl(true, { nonNullable: true }),
        right: new FormControl(true, { nonNullable: true }),
      },
      { validators: atLeastOneSide },
    ),
    rotationSeenFromLeft: new FormControl<RotationDirection>('clockwise', { nonNullable: true }),
    planeCount: new FormControl<1 | 2>(2, { nonNullable: true }),
    planes: new FormArray([planeGroup(), planeGroup()]),
    stockWeightsGrams: new FormControl<number[]>([], { nonNullable: true }),
    acceptance: acceptanceGroup(null, true),
    notes: text(RECORD_RULES.notesMaxLength, 'Keep the notes to 4000 characters.'),
  });
}

/** Gives the form one plane group per plane, keeping those already filled in. */
export function matchPlanesToCount(form: MachineForm): void {
  const planes = form.controls.planes;
  const count = form.controls.planeCount.value;
  while (planes.length < count) {
    planes.push(
      planeGroup({ correctionRadiusMm: planes.at(0)?.controls.correctionRadiusMm.value ?? undefined }),
    );
  }
  while (planes.length > count) planes.removeAt(planes.length - 1);
}

/** Puts back planes as the form held them (the values of `PlaneGroup.getRawValue()`), sectors included. */
export function restorePlanes(
  form: MachineForm,
  planes: readonly ReturnType<PlaneGroup['getRawValue']>[],
): void {
  form.controls.planes.clear();
  for (const raw of planes) {
    const group = planeGroup();
    for (const _sector of raw.blockedSectors) group.controls.blockedSectors.push(sectorGroup());
    group.setValue(raw);
    form.controls.planes.push(group);
  }
}

/** Fills the form from a stored machine. */
export function fillMachineForm(form: MachineForm, machine: Machine): void {
  form.controls.planes.clear();
  for (const plane of machine.planes) form.controls.planes.push(planeGroup(plane));
  form.patchValue({
    customerId: { id: machine.customerId, name: machine.customerName },
    familyId: machine.familyId,
    make: machine.make ?? '',
    model: machine.model ?? '',
    serialNumber: machine.serialNumber ?? '',
    hours: machine.hours,
    rotorMassKg: machine.rotorMassKg,
    operatingSpeedRpm: machine.operatingSpeedRpm,
    sensorSides: { left: machine.sensorSides.includes('left'), right: machine.sensorSides.includes('right') },
    rotationSeenFromLeft: machine.rotationSeenFromLeft,
    planeCount: machine.planes.length === 1 ? 1 : 2,
    stockWeightsGrams: [...machine.stockWeightsGrams],
    notes: machine.notes ?? '',
  });
  setAcceptance(form.controls.acceptance, machine.acceptance, true);
}

/** A plane's fields as the API takes them. */
function planeRequest(group: PlaneGroup): PlaneLayout {
  const value = group.getRawValue();
  return {
    correctionRadiusMm: numberOrNull(value.correctionRadiusMm) ?? 0,
    positions: value.positions.fixed
      ? {
          count: numberOrNull(value.positions.count) ?? 0,
          firstDeg: numberOrNull(value.positions.firstDeg) ?? 0,
        }
      : null,
    blockedSectors: value.blockedSectors.map((sector) => ({
      fromDeg: numberOrNull(sector.fromDeg) ?? 0,
      toDeg: numberOrNull(sector.toDeg) ?? 0,
      label: sector.label.trim(),
    })),
  };
}

/** The machine's fields as the API takes them, and as `machineFields` shapes a stored one. */
export type MachineRequest = CreateMachine & {
  familyId: number | null;
  planes: PlaneLayout[];
  sensorSides: MachineSide[];
  stockWeightsGrams: number[];
  acceptance: AcceptanceLevel | null;
};

/** The form's value as the API takes it. */
export function machineRequest(form: MachineForm): MachineRequest {
  const value = form.getRawValue();
  const customer = value.customerId;
  return {
    customerId: isCustomerRef(customer) ? customer.id : 0,
    familyId: value.familyId,
    make: textOrNull(value.make),
    model: textOrNull(value.model),
    serialNumber: textOrNull(value.serialNumber),
    hours: numberOrNull(value.hours),
    rotorMassKg: numberOrNull(value.rotorMassKg),
    operatingSpeedRpm: numberOrNull(value.operatingSpeedRpm),
    sensorSides: (['left', 'right'] as const).filter((side) => value.sensorSides[side]),
    rotationSeenFromLeft: value.rotationSeenFromLeft,
    planes: form.controls.planes.controls.map(planeRequest),
    stockWeightsGrams: [...value.stockWeightsGrams],
    acceptance: acceptanceValue(form.controls.acceptance),
    notes: textOrNull(value.notes),
  };
}

/** A stored machine's fields shaped as `machineRequest` shapes them, to find what a form changed. */
export function machineFields(machine: Machine): MachineRequest {
  return {
    customerId: machine.customerId,
    familyId: machine.familyId,
    make: machine.make,
    model: machine.model,
    serialNumber: machine.serialNumber,
    hours: machine.hours,
    rotorMassKg: machine.rotorMassKg,
    operatingSpeedRpm: machine.operatingSpeedRpm,
    sensorSides: (['left', 'right'] as const).filter((side) => machine.sensorSides.includes(side)),
    rotationSeenFromLeft: machine.rotationSeenFromLeft,
    planes: machine.planes.map((plane) => ({
      correctionRadiusMm: plane.correctionRadiusMm,
      positions: plane.positions
        ? { count: plane.positions.count, firstDeg: plane.positions.firstDeg }
        : null,
      blockedSectors: plane.blockedSectors.map(({ fromDeg, toDeg, label }) => ({ fromDeg, toDeg, label })),
    })),
    stockWeightsGrams: [...machine.stockWeightsGrams],
    acceptance: machine.acceptance,
    notes: machine.notes,
  };
}
