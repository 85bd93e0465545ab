import { Directive, input } from '@angular/core';
import type { FormControl } from '@angular/forms';
import { errorMessage } from '../shell/validators';

/**
 * What the text fields of the forms share: the form's control with its validators, the line under the field,
 * and the control's first message (or the server's, set on the control) as the field's error. Each field
 * adds its own label, with the default that suits it, and its own input.
 */
@Directive()
export abstract class TextField {
  /** The form's control of the field's value, with its validators. */
  readonly control = input.required<FormControl<string>>();
  /** A line under the field: "Where reports go", or the rule of a new password. */
  readonly hint = input<string | null>(null);

  protected readonly errorMessage = errorMessage;
}
