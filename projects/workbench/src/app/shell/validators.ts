import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import type * as z from 'zod';

/*
 * Validators that carry their message in the error itself, so that a template shows the first error of a
 * control with `errorMessage(control)` and the server's messages (set by `applyServerErrors`) read the
 * same way.
 */

/** Refuses an empty or blank value with the given message. */
export function requiredWith(message: string): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null =>
    String(control.value ?? '').trim() === '' ? { required: message } : null;
}

/**
 * Checks a value against a schema of the shared API contract, with the message the server would give. An
 * empty value passes when `optional`, for fields a person may leave blank.
 */
export function schemaValidator(schema: z.ZodType, options: { optional?: boolean } = {}): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const value: unknown = control.value;
    if (options.optional && (value === null || value === undefined || value === '')) return null;
    return schemaError(schema, value);
  };
}

/** The schema's first message about a value, as a validation error; null when the value passes. */
export function schemaError(schema: z.ZodType, value: unknown): ValidationErrors | null {
  const result = schema.safeParse(value);
  return result.success ? null : { schema: result.error.issues[0]?.message ?? 'Check this value.' };
}

/** The message of a control's first error, or an empty string. */
export function errorMessage(control: AbstractControl): string {
  const first = Object.values(control.errors ?? {}).find((value) => typeof value === 'string');
  return typeof first === 'string' ? first : '';
}
