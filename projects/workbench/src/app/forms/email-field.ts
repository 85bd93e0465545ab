import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { ReactiveFormsModule } from '@angular/forms';
import {
  MAT_FORM_FIELD_DEFAULT_OPTIONS,
  MatFormFieldModule,
  type SubscriptSizing,
} from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { TextField } from './text-field';

/**
 * An e-mail address field: the e-mail keyboard on a phone, no capital or spelling correction, the
 * autocomplete the page asks for, and the first message of the control's validators (or the server's, set
 * on the control) under it. The control brings its own validators, so that a page that must stay free of
 * the API schemas (signing in) checks presence only.
 *
 * `<app-email-field [control]="form.controls.email" autocomplete="username" />`
 */
@Component({
  selector: 'app-email-field',
  imports: [MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  template: `
    <mat-form-field appearance="outline" [subscriptSizing]="subscriptSizing()">
      <mat-label>{{ label() }}</mat-label>
      <input
        matInput
        type="email"
        inputmode="email"
        [formControl]="control()"
        [attr.autocomplete]="autocomplete()"
        autocapitalize="off"
        spellcheck="false"
      />
      @if (hint(); as hint) {
        <mat-hint>{{ hint }}</mat-hint>
      }
      <mat-error>{{ errorMessage(control()) }}</mat-error>
    </mat-form-field>
  `,
  styleUrl: './field.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EmailField extends TextField {
  /** The field's label. */
  readonly label = input('E-mail address');
  /** `username` where the address signs in, `email` for someone's address, `off` for another person's. */
  readonly autocomplete = input<'username' | 'email' | 'off'>('email');
  /** How room is kept for the hint and the message; the form's default when not given. */
  readonly subscriptSizing = input<SubscriptSizing>(
    inject(MAT_FORM_FIELD_DEFAULT_OPTIONS, { optional: true })?.subscriptSizing ?? 'fixed',
  );
}
