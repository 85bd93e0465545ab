import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';

/*
 * The bounds of the records' fields, as the shared schemas (shared/api/records.ts) set them, for the forms
 * to check before they send. They are repeated here because importing the schemas would load zod with the
 * pages; record-rules.spec.ts parses each bound with the schemas themselves, so the two cannot drift apart.
 * The server checks everything again and its messages land on the same fields.
 */
export const RECORD_RULES = {
  customerNameMaxLength: 120,
  contactNameMaxLength: 100,
  contactRoleMaxLength: 60,
  siteAddressMaxLength: 500,
  notesMaxLength: 4000,
  familyNameMaxLength: 120,
  makeMaxLength: 80,
  modelMaxLength: 80,
  serialNumberMaxLength: 60,
  sectorLabelMaxLength: 40,
  maxContacts: 20,
  maxSpeedRpm: 30_000,
  maxRadiusMm: 5_000,
  maxHours: 1_000_000,
  maxRotorMassKg: 100_000,
  maxStockWeightGrams: 50_000,
  maxStockSizes: 20,
  maxEndPlayMm: 50,
  maxRunoutMm: 10,
  maxGramsPerUnit: 1_000_000,
  maxTargetAmplitude: 100,
  minPositions: 2,
  maxPositions: 360,
  maxBlockedSectors: 24,
} as const;

/** An e-mail address as the server accepts it, roughly: something@host.domain, no spaces. */
const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;
/** A phone number as people write it: digits, spaces and + ( ) - . / only (the server's rule). */
const PHONE = /^\+?[0-9 ()./-]{3,40}$/;

function isBlank(value: unknown): boolean {
  return value === null || value === undefined || (typeof value === 'string' && value.trim() === '');
}

/** Refuses a text longer than `max` characters once trimmed. */
export function maxChars(max: number, message: string): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null =>
    typeof control.value === 'string' && control.value.trim().length > max ? { maxChars: message } : null;
}

/** Refuses what is not an e-mail address; an empty field passes (pair with a required check if needed). */
export function emailAddress(): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null =>
    isBlank(control.value) || EMAIL.test(String(control.value).trim())
      ? null
      : { email: 'Enter an e-mail address such as name@example.com.' };
}

/** Refuses a phone number with other characters than digits, spaces and + ( ) - . /. */
export function phoneNumber(): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null =>
    isBlank(control.value) || PHONE.test(String(control.value).trim())
      ? null
      : { phone: 'Write the phone number with digits, spaces and + ( ) - . / only.' };
}

/** Refuses an empty number field. */
export function requiredNumber(message: string): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null =>
    isBlank(control.value) ? { required: message } : null;
}

/** The bounds of a number field; each message says what is expected. */
export interface NumberBounds {
  /** The smallest value allowed. */
  readonly min?: number;
  /** A bound the value must stay above (0 for "above 0"). */
  readonly above?: number;
  /** The largest value allowed. */
  readonly max?: number;
  /** A bound the value must stay below (360 for angles). */
  readonly below?: number;
  /** Whole numbers only. */
  readonly whole?: boolean;
}

/**
 * Refuses a number outside its bounds with the given message; an empty field passes (pair with
 * `requiredNumber` where a value is needed).
 */
export function numberWithin(bounds: NumberBounds, message: string): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const value: unknown = control.value;
    if (isBlank(value)) return null;
    const number = typeof value === 'number' ? value : Number(value);
    const fails =
      !Number.isFinite(number) ||
      (bounds.min !== undefined && number < bounds.min) ||
      (bounds.above !== undefined && number <= bounds.above) ||
      (bounds.max !== undefined && number > bounds.max) ||
      (bounds.below !== undefined && number >= bounds.below) ||
      (bounds.whole === true && !Number.isInteger(number));
    return fails ? { range: message } : null;
  };
}

/** An angle from 0 to 359.9 degrees, as every angle field of the records is. */
export function angleDeg(message = 'An angle is from 0 to 359.9°.'): ValidatorFn {
  return numberWithin({ min: 0, below: 360 }, message);
}

/** A number field's value for the API: null when empty. */
export function numberOrNull(value: unknown): number | null {
  if (isBlank(value)) return null;
  const number = typeof value === 'number' ? value : Number(value);
  return Number.isFinite(number) ? number : null;
}

/** A text field's value for the API: trimmed, null when empty. */
export function textOrNull(value: string | null | undefined): string | null {
  const text = value?.trim() ?? '';
  return text === '' ? null : text;
}
