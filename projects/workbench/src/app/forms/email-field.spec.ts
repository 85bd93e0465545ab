import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { describe, expect, it } from 'vitest';
import { requiredWith } from '../shell/validators';
import { EmailField } from './email-field';

@Component({
  imports: [EmailField, ReactiveFormsModule],
  template: `
    <form [formGroup]="form">
      <app-email-field [control]="form.controls.email" autocomplete="username" subscriptSizing="dynamic" />
      <app-email-field
        [control]="form.controls.billing"
        label="E-mail address (optional)"
        hint="Where reports go"
        autocomplete="off"
      />
    </form>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class FieldHost {
  readonly form = new FormGroup({
    email: new FormControl('', { nonNullable: true, validators: requiredWith('Enter your e-mail address.') }),
    billing: new FormControl('', { nonNullable: true }),
  });
}

async function render() {
  const fixture = TestBed.createComponent(FieldHost);
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const element = fixture.nativeElement as HTMLElement;
  return { fixture, form: fixture.componentInstance.form, loader, element };
}

describe('EmailField', () => {
  it('is an e-mail address field for a phone’s e-mail keyboard, with the autocomplete asked for', async () => {
    const { element, loader } = await render();
    const [signIn, other] = Array.from(element.querySelectorAll('input'));
    expect(signIn?.type).toBe('email');
    expect(signIn?.getAttribute('inputmode')).toBe('email');
    expect(signIn?.getAttribute('autocomplete')).toBe('username');
    expect(signIn?.getAttribute('autocapitalize')).toBe('off');
    expect(signIn?.getAttribute('spellcheck')).toBe('false');
    expect(other?.getAttribute('autocomplete')).toBe('off');
    const fields = await loader.getAllHarnesses(MatFormFieldHarness);
    expect(await fields[0]!.getLabel()).toBe('E-mail address');
    expect(await fields[1]!.getLabel()).toBe('E-mail address (optional)');
    expect(await fields[1]!.getTextHints()).toEqual(['Where reports go']);
  });

  it('writes what is typed into the control', async () => {
    const { loader, form } = await render();
    const input = await loader.getHarness(MatInputHarness.with({ selector: '[autocomplete="username"]' }));
    await input.setValue('marit@example.com');
    expect(form.controls.email.value).toBe('marit@example.com');
  });

  it('shows the control’s first message once touched, and a message the server set on it', async () => {
    const { fixture, loader, form } = await render();
    const field = (await loader.getAllHarnesses(MatFormFieldHarness))[0]!;
    expect(await field.getTextErrors()).toEqual([]);
    form.markAllAsTouched();
    fixture.detectChanges();
    expect(await field.getTextErrors()).toEqual(['Enter your e-mail address.']);
    form.controls.email.setValue('marit@example');
    form.controls.email.setErrors({ server: 'This address is already in the organisation.' });
    fixture.detectChanges();
    expect(await field.getTextErrors()).toEqual(['This address is already in the organisation.']);
  });
});
