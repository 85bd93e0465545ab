import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { PasswordToggle } from './password-toggle';
import { TextField } from './text-field';

/**
 * A password field: no capitals or spelling correction, the autocomplete that tells a password manager
 * whether to fill (`current-password`) or to offer a new one (`new-password`), the button that reads it back,
 * an optional rule under it and the control's first message. Like EmailField it brings no validators and
 * no API schema, so that the sign-in page stays light.
 *
 * `<app-password-field [control]="form.controls.password" autocomplete="new-password" [hint]="passwordRule" />`
 */
@Component({
  selector: 'app-password-field',
  imports: [MatFormFieldModule, MatInputModule, PasswordToggle, ReactiveFormsModule],
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>{{ label() }}</mat-label>
      <input
        #passwordInput
        matInput
        type="password"
        [formControl]="control()"
        [attr.autocomplete]="autocomplete()"
        autocapitalize="off"
        spellcheck="false"
      />
      <app-password-toggle matSuffix [input]="passwordInput" />
      @if (hint(); as hint) {
        <mat-hint>{{ hint }}</mat-hint>
      }
      <mat-error>{{ errorMessage(control()) }}</mat-error>
    </mat-form-field>
  `,
  styleUrl: './field.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PasswordField extends TextField {
  /** The field's label. */
  readonly label = input('Password');
  /** `current-password` to sign in, `new-password` where one is chosen. */
  readonly autocomplete = input.required<'current-password' | 'new-password'>();
}
