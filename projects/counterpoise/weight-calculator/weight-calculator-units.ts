import type { AmplitudeUnit, MassUnit } from './weight-calculator-model';

/*
 * Units as the calculator shows them. The engine is unit-agnostic: one calculation keeps one unit per
 * quantity, grams in and grams out, so switching the unit changes the labels and the number of decimals,
 * never the numbers typed. (A reading in in/s peak is not a reading in mm/s RMS times 25.4, so converting
 * typed readings silently would be wrong.)
 */

/** The mass units, in the order offered. */
export const MASS_UNITS: readonly MassUnit[] = ['g', 'oz'];

/** The amplitude units, in the order offered. */
export const AMPLITUDE_UNITS: readonly AmplitudeUnit[] = ['in/s', 'mm/s'];

const MASS_DECIMALS: Readonly<Record<MassUnit, number>> = { g: 1, oz: 2 };
const AMPLITUDE_DECIMALS: Readonly<Record<AmplitudeUnit, number>> = { 'in/s': 3, 'mm/s': 2 };
const MASS_NAMES: Readonly<Record<MassUnit, string>> = { g: 'grams', oz: 'ounces' };

/** A number with a fixed count of decimals, never "-0". */
function fixed(value: number, decimals: number): string {
  const text = value.toFixed(decimals);
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** A mass as shown: "84.2 g", "2.97 oz". */
export function formatMass(mass: number, unit: MassUnit): string {
  return `${fixed(mass, MASS_DECIMALS[unit])} ${unit}`;
}

/** An amplitude as shown: "0.052 in/s", "1.32 mm/s". */
export function formatAmplitude(amplitude: number, unit: AmplitudeUnit): string {
  return `${fixed(amplitude, AMPLITUDE_DECIMALS[unit])} ${unit}`;
}

/** A mass as a screen reader speaks it: "84.2 grams". */
export function spokenMass(mass: number, unit: MassUnit): string {
  return `${fixed(mass, MASS_DECIMALS[unit])} ${MASS_NAMES[unit]}`;
}

/** The unit of a sensitivity: "g per in/s". */
export function sensitivityUnit(massUnit: MassUnit, amplitudeUnit: AmplitudeUnit): string {
  return `${massUnit} per ${amplitudeUnit}`;
}

/** The unit of an influence coefficient: "in/s per g". */
export function influenceUnit(massUnit: MassUnit, amplitudeUnit: AmplitudeUnit): string {
  return `${amplitudeUnit} per ${massUnit}`;
}

/** The input step of a mass field: one shown decimal. */
export function massStep(unit: MassUnit): number {
  return 10 ** -MASS_DECIMALS[unit];
}

/** The input step of an amplitude field: one shown decimal. */
export function amplitudeStep(unit: AmplitudeUnit): number {
  return 10 ** -AMPLITUDE_DECIMALS[unit];
}
