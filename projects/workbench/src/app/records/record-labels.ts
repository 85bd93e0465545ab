import type { AcceptanceLevel, AmplitudeUnit, MachineSide, RotorType } from '@counterpoise/api';

/*
 * How the records' coded values read on screen, and the lists the forms offer. The lists repeat the
 * shared API's constants because importing a value from `@counterpoise/api` would load zod with the page;
 * record-labels.spec.ts checks that they still match. The Record types make the compiler refuse a missing
 * label when the API gains a value.
 */

/** A rotor's direction of rotation, as seen from one end. */
export type RotationDirection = 'clockwise' | 'counterClockwise';
/** An ISO 21940-11 balance quality grade a field shop uses. */
export type BalanceGrade = Extract<AcceptanceLevel, { kind: 'balance-grade' }>['grade'];
/** How a machine sits, for the ISO 10816-3 / 20816-3 zones. */
export type Foundation = Extract<AcceptanceLevel, { kind: 'severity-zone' }>['foundation'];

/** The kinds of rotor, in the order the form offers them. */
export const ROTOR_TYPE_LABELS: Readonly<Record<RotorType, string>> = {
  'fixed-tooth-drum': 'Fixed-tooth drum',
  flail: 'Flail rotor',
  fan: 'Fan',
  pulley: 'Pulley',
  other: 'Other rotor',
};

/** The units of a vibration amplitude, as a technician reads them off the meter. */
export const AMPLITUDE_UNIT_LABELS: Readonly<Record<AmplitudeUnit, string>> = {
  'in/s-pk': 'in/s peak',
  'mm/s-rms': 'mm/s RMS',
};

/** The balance grades offered, coarsest first, with where the trade uses them when that is well known. */
export const BALANCE_GRADES: readonly { readonly grade: BalanceGrade; readonly use: string }[] = [
  { grade: 'G40', use: 'coarse' },
  { grade: 'G16', use: 'agricultural and crushing machinery parts' },
  { grade: 'G6.3', use: 'fans and general rotors' },
  { grade: 'G2.5', use: 'fine' },
];

/** The sides of a machine, as a technician standing behind it in its working direction names them. */
export const SIDE_LABELS: Readonly<Record<MachineSide, string>> = { left: 'Left', right: 'Right' };

/** The two directions of rotation. */
export const ROTATION_LABELS: Readonly<Record<RotationDirection, string>> = {
  clockwise: 'Clockwise',
  counterClockwise: 'Counter-clockwise',
};

/** The highest zone a machine may reach and still pass. */
export const ZONE_LABELS: Readonly<Record<'A' | 'B', string>> = {
  A: 'Zone A: as a new machine',
  B: 'Zone B: fit for long-term use',
};

/** The machine groups of the zones. */
export const MACHINE_GROUP_LABELS: Readonly<Record<1 | 2, string>> = {
  1: 'Group 1: large machines',
  2: 'Group 2: medium-sized machines',
};

/** The foundations of the zones. */
export const FOUNDATION_LABELS: Readonly<Record<Foundation, string>> = {
  rigid: 'Rigid foundation',
  flexible: 'Flexible foundation',
};

/** Why the zones are shown only as guidance for the machines a field shop balances. */
export const ZONE_GUIDANCE =
  'As guidance: mobile machines are outside the scope of these zones (ISO 10816-3 / 20816-3).';

/** The same rotor seen from the other end turns the other way. */
export function opposite(rotation: RotationDirection): RotationDirection {
  return rotation === 'clockwise' ? 'counterClockwise' : 'clockwise';
}

/** A number as people read it: thousands separated, at most `fractionDigits` decimals. */
export function formatNumber(value: number, fractionDigits = 2): string {
  return value.toLocaleString('en-GB', { maximumFractionDigits: fractionDigits });
}

/** An angle in degrees, `15°`. */
export function formatDeg(value: number): string {
  return `${formatNumber(value, 1)}°`;
}

/** An acceptance level in one line: "Shop target 0.12 in/s peak", "Balance grade G16 (ISO 21940-11)". */
export function describeAcceptance(level: AcceptanceLevel): string {
  switch (level.kind) {
    case 'shop-target':
      return `Shop target ${formatNumber(level.amplitude, 3)} ${AMPLITUDE_UNIT_LABELS[level.unit]}`;
    case 'balance-grade':
      return `Balance grade ${level.grade} (ISO 21940-11)`;
    case 'severity-zone':
      return (
        `Zone ${level.zone} or better, ${MACHINE_GROUP_LABELS[level.group].toLowerCase().replace(':', ' –')}, ` +
        `${FOUNDATION_LABELS[level.foundation].toLowerCase()} (ISO 10816-3 / 20816-3, as guidance)`
      );
  }
}

/** The name of a correction plane: the left and right planes of a drum, or the one plane of a disc. */
export function planeName(index: number, planeCount: number): string {
  if (planeCount <= 1) return 'The plane';
  return index === 0 ? 'Left plane' : 'Right plane';
}

/** The end a plane is drawn as seen from: the left plane from the left, the right plane from the right. */
export function planeSide(index: number, planeCount: number): MachineSide {
  return planeCount > 1 && index === 1 ? 'right' : 'left';
}
