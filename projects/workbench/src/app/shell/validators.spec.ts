import { FormControl } from '@angular/forms';
import { EmailSchema, PasswordSchema } from '@counterpoise/api';
import { describe, expect, it } from 'vitest';
import { errorMessage, requiredWith, schemaValidator } from './validators';

describe('validators', () => {
  it('refuses blank values with the message given', () => {
    const control = new FormControl('   ', requiredWith('Enter a name.'));
    expect(errorMessage(control)).toBe('Enter a name.');
    control.setValue('Marit');
    expect(errorMessage(control)).toBe('');
  });

  it('checks a value with the contract’s schema and gives its message', () => {
    const control = new FormControl('short', schemaValidator(PasswordSchema));
    expect(errorMessage(control)).toContain('Use at least 15 characters');
    control.setValue('long enough to be a passphrase');
    expect(control.valid).toBe(true);
  });

  it('lets an optional field stay empty', () => {
    const control = new FormControl('', schemaValidator(EmailSchema, { optional: true }));
    expect(control.valid).toBe(true);
    control.setValue('not an address');
    expect(errorMessage(control)).toBe('Enter an e-mail address such as name@example.com.');
  });
});
