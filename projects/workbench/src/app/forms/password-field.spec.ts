import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { describe, expect, it } from 'vitest';
import { requiredWith } from '../shell/validators';
import { PasswordField } from './password-field';

@Component({
  imports: [PasswordField, ReactiveFormsModule],
  template: `
    <form [formGroup]="form">
      <app-password-field
        [control]="form.controls.password"
        label="New password"
        autocomplete="new-password"
        hint="At least 12 characters."
      />
    </form>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class FieldHost {
  readonly form = new FormGroup({
    password: new FormControl('', { nonNullable: true, validators: requiredWith('Enter a new password.') }),
  });
}

async function render() {
  const fixture = TestBed.createComponent(FieldHost);
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  return {
    fixture,
    form: fixture.componentInstance.form,
    loader,
    input: (fixture.nativeElement as HTMLElement).querySelector('input') as HTMLInputElement,
  };
}

describe('PasswordField', () => {
  it('is a hidden password with the autocomplete asked for, its label and rule', async () => {
    const { loader, input } = await render();
    expect(input.type).toBe('password');
    expect(input.getAttribute('autocomplete')).toBe('new-password');
    expect(input.getAttribute('autocapitalize')).toBe('off');
    expect(input.getAttribute('spellcheck')).toBe('false');
    const field = await loader.getHarness(MatFormFieldHarness);
    expect(await field.getLabel()).toBe('New password');
    expect(await field.getTextHints()).toEqual(['At least 12 characters.']);
  });

  it('writes what is typed into the control and reads it back on request', async () => {
    const { loader, form, input } = await render();
    await (await loader.getHarness(MatInputHarness)).setValue('three words together');
    expect(form.controls.password.value).toBe('three words together');
    const toggle = await loader.getHarness(
      MatButtonHarness.with({ selector: '[aria-label="Show the password"]' }),
    );
    await toggle.click();
    expect(input.type).toBe('text');
  });

  it('shows the control’s first message once touched', async () => {
    const { fixture, loader, form } = await render();
    form.markAllAsTouched();
    fixture.detectChanges();
    expect(await (await loader.getHarness(MatFormFieldHarness)).getTextErrors()).toEqual([
      'Enter a new password.',
    ]);
  });
});
