import type { AbstractControl, ValidationErrors } from '@angular/forms';
import { AllowedOriginsSchema, MAX_ALLOWED_ORIGINS } from '@counterpoise/api';
import { schemaError } from '../shell/validators';

/** How many origins a key may name, for the field's hint. */
export const MAX_ORIGINS = MAX_ALLOWED_ORIGINS;

/** The origins typed in a field, one a line (commas and spaces also part them); blank lines dropped. */
export function originsFromText(text: string): string[] {
  return text
    .split(/[\s,]+/)
    .map((origin) => origin.trim())
    .filter((origin) => origin !== '');
}

/** A key's origins as the field shows them: one a line. */
export function originsText(origins: readonly string[]): string {
  return origins.join('\n');
}

/**
 * The typed origins, checked with the contract's own rule (`AllowedOriginsSchema`), so that the field says
 * what the server would: which origin is not one, and why. Empty is allowed: the key is then not limited.
 */
export function validOrigins(control: AbstractControl<string>): ValidationErrors | null {
  const origins = originsFromText(control.value);
  return origins.length === 0 ? null : schemaError(AllowedOriginsSchema, origins);
}
