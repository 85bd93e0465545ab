import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { FormControl } from '@angular/forms';
import { PasswordField } from '../forms/password-field';
import { PASSWORD_RULE } from './password-rule';

/**
 * The field where someone chooses a password: a password manager offers a new one (`new-password`), and the
 * rule of a new password stands under it before anyone types.
 *
 * `<app-new-password-field [control]="form.controls.password" label="New password" />`
 */
@Component({
  selector: 'app-new-password-field',
  imports: [PasswordField],
  template: `
    <app-password-field
      [control]="control()"
      [label]="label()"
      autocomplete="new-password"
      [hint]="passwordRule"
    />
  `,
  styles: ':host { display: block; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewPasswordField {
  /** The form's control of the new password, with its validators. */
  readonly control = input.required<FormControl<string>>();
  /** The field's label. */
  readonly label = input('Password');

  protected readonly passwordRule = PASSWORD_RULE;
}
