import { ChangeDetectionStrategy, Component, effect, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

/**
 * The button that shows or hides a password field, placed as its suffix:
 * `<app-password-toggle matSuffix [input]="passwordInput" />`. Typing a long password in gloves is easier
 * when you can read it back. It imports nothing from the API contract, so that the sign-in page that uses
 * it stays free of zod.
 */
@Component({
  selector: 'app-password-toggle',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <button
      matIconButton
      type="button"
      [attr.aria-label]="visible() ? 'Hide the password' : 'Show the password'"
      [attr.aria-pressed]="visible()"
      (click)="visible.set(!visible())"
    >
      <mat-icon aria-hidden="true" [svgIcon]="visible() ? 'visibility_off' : 'visibility'" />
    </button>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PasswordToggle {
  /** The password field this button shows or hides. */
  readonly input = input.required<HTMLInputElement>();
  /** Whether the password is readable. */
  readonly visible = signal(false);

  constructor() {
    effect(() => {
      this.input().type = this.visible() ? 'text' : 'password';
    });
  }
}
