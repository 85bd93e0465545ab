import { type AbstractControl, FormArray, FormControl, FormGroup } from '@angular/forms';
import { describe, expect, it } from 'vitest';
import {
  createCalculatorForm,
  draftOf,
  fieldErrorMessage,
  methodGroup,
  nonNegative,
  plausible,
  positive,
  withinRange,
} from './weight-calculator-form';
import { CALC_METHODS } from './weight-calculator-model';

/** The leaf controls of a group with their dotted paths, in the order of the form. */
function leafControls(control: AbstractControl, path = ''): { path: string; control: AbstractControl }[] {
  if (control instanceof FormGroup || control instanceof FormArray) {
    return Object.entries(control.controls).flatMap(([key, child]) =>
      leafControls(child as AbstractControl, path === '' ? key : `${path}.${key}`),
    );
  }
  return [{ path, control }];
}

describe('validators', () => {
  it('refuses negative, zero, implausible and out-of-range numbers, and lets empty fields to required', () => {
    expect(nonNegative(new FormControl(-0.1))).toEqual({ negative: true });
    expect(nonNegative(new FormControl(0))).toBeNull();
    expect(positive(new FormControl(0))).toEqual({ notPositive: true });
    expect(positive(new FormControl(null))).toBeNull();
    expect(plausible(new FormControl(2e9))).toEqual({ tooLarge: { max: 1e9 } });
    expect(withinRange(-360, 360)(new FormControl(400))).toEqual({ outOfRange: { min: -360, max: 360 } });
    expect(withinRange(-360, 360)(new FormControl(-20))).toBeNull();
  });
});

describe('fieldErrorMessage', () => {
  it('names the field and says what to do', () => {
    expect(fieldErrorMessage({ required: true }, 'trial mass')).toBe('Enter the trial mass.');
    expect(fieldErrorMessage({ negative: true }, 'initial amplitude')).toMatch(
      /initial amplitude cannot be negative/,
    );
    expect(fieldErrorMessage({ notPositive: true }, 'sensitivity')).toBe(
      'The sensitivity must be greater than zero.',
    );
    expect(fieldErrorMessage({ tooLarge: { max: 1e9 } }, 'trial mass')).toMatch(/too large/);
    expect(fieldErrorMessage({ outOfRange: { min: -360, max: 360 } }, 'phase offset')).toBe(
      'The phase offset must lie between -360 and 360.',
    );
    expect(fieldErrorMessage({ cpPhasePosition: { allowed: [0, 90] } }, 'trial angle')).toBe(
      'The trial angle must be one of the allowed positions: 0°, 90°.',
    );
    expect(fieldErrorMessage(null, 'phase')).toBeNull();
  });

  it("puts the engine's own message first", () => {
    expect(
      fieldErrorMessage({ required: true, engine: 'The trial weight changed almost nothing.' }, 'x'),
    ).toBe('The trial weight changed almost nothing.');
  });
});

describe('createCalculatorForm', () => {
  it('holds the draft of every method, empty but for the usual trial positions', () => {
    const form = createCalculatorForm('four-run', 'oz', 'mm/s');
    const draft = draftOf(form);
    expect(draft.method).toBe('four-run');
    expect(draft.massUnit).toBe('oz');
    expect(draft.fourRun.trialRuns.map((run) => run.angleDeg)).toEqual([0, 120, 240]);
    expect(draft.singlePlane.initial).toEqual({ amplitude: null, phaseDeg: null });
    expect(draft.singlePlane.trialWeightRemoved).toBe(true);
  });

  it('requires every reading and weight, and leaves the phase offset optional', () => {
    const form = createCalculatorForm();
    for (const method of CALC_METHODS) {
      const leaves = leafControls(methodGroup(form, method)).filter(({ control }) => control.value === null);
      const optional = leaves.filter(({ control }) => !control.invalid).map(({ path }) => path);
      expect(optional).toEqual(method === 'one-run' ? ['sensitivity.offsetDeg'] : []);
    }
  });
});
