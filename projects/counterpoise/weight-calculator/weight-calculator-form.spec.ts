import { FormControl } from '@angular/forms';
import { describe, expect, it } from 'vitest';
import { describeField } from './weight-calculator-fields';
import {
  createCalculatorForm,
  draftOf,
  fieldErrorMessage,
  invalidFields,
  leafControls,
  methodGroup,
  nonNegative,
  plausible,
  positive,
  readDraft,
  withinRange,
} from './weight-calculator-form';
import { filledDraft } from './weight-calculator.fixtures';
import { CALC_METHODS } from './weight-calculator-model';

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

describe('describeField', () => {
  it('names every field of every method, as its label, in a sentence and by its section', () => {
    const form = createCalculatorForm();
    for (const method of CALC_METHODS) {
      const numbers = leafControls(methodGroup(form, method)).filter(
        ({ control }) => typeof control.value !== 'boolean',
      );
      for (const { path } of numbers) {
        const words = describeField(method, path);
        expect(words.label.toLowerCase(), `${method} ${path}`).toContain(words.what);
        expect(words.section, `${method} ${path}`).not.toBe('');
      }
    }
  });

  it("names the fields in the trade's words, with the run, plane and sensor they belong to", () => {
    expect(describeField('single-plane', 'withTrial.phaseDeg')).toEqual({
      label: 'Trial run phase',
      what: 'trial run phase',
      section: 'Run 2: trial weight on',
      kind: 'phase',
    });
    expect(describeField('multi-plane', 'runs.1.readings.0.amplitude')).toMatchObject({
      label: 'Sensor 1 amplitude',
      section: 'Run 3: trial weight in plane 2, sensor 1',
    });
    expect(describeField('multi-plane', 'runs.0.trialWeight.mass').label).toBe('Plane 1 trial mass');
    expect(describeField('four-run', 'trialRuns.2.angleDeg')).toMatchObject({
      label: 'Run 4 trial angle',
      kind: 'angle',
    });
    expect(describeField('one-run', 'sensitivity.massPerAmplitude').kind).toBe('sensitivity');
  });
});

describe('invalidFields', () => {
  it('lists what is missing or wrong in the method shown, in the order of the form', () => {
    const form = createCalculatorForm();
    form.patchValue({ singlePlane: { initial: { amplitude: -1, phaseDeg: 74 }, trialWeight: { mass: 60 } } });
    expect(invalidFields(form, 'single-plane')).toEqual([
      {
        field: 'initial.amplitude',
        label: 'Initial amplitude',
        section: 'Run 1: no weight',
        message: 'The initial amplitude cannot be negative; give its size, the angle gives its direction.',
      },
      {
        field: 'trialWeight.angleDeg',
        label: 'Trial angle',
        section: 'Trial weight',
        message: 'Enter the trial angle.',
      },
      {
        field: 'withTrial.amplitude',
        label: 'Trial run amplitude',
        section: 'Run 2: trial weight on',
        message: 'Enter the trial run amplitude.',
      },
      {
        field: 'withTrial.phaseDeg',
        label: 'Trial run phase',
        section: 'Run 2: trial weight on',
        message: 'Enter the trial run phase.',
      },
    ]);
    form.patchValue(filledDraft());
    expect(invalidFields(form, 'single-plane')).toEqual([]);
    expect(invalidFields(form, 'multi-plane')).toEqual([]);
  });
});

describe('readDraft', () => {
  it('reads a draft kept under the earlier names of the two-plane method', () => {
    const { multiPlane, ...rest } = filledDraft();
    const kept = { ...rest, method: 'two-plane', twoPlane: multiPlane };
    expect(readDraft(kept)).toEqual({ ...rest, method: 'multi-plane', multiPlane });
    const form = createCalculatorForm();
    form.patchValue(readDraft(JSON.parse(JSON.stringify(kept))));
    expect(draftOf(form)).toEqual({ ...rest, method: 'multi-plane', multiPlane });
  });

  it('keeps a current draft as it is, and drops what it cannot read', () => {
    expect(readDraft(filledDraft())).toEqual(filledDraft());
    expect(readDraft({ method: 'three-plane', massUnit: 'oz' })).toEqual({ massUnit: 'oz' });
    expect(readDraft(null)).toEqual({});
    expect(readDraft('single-plane')).toEqual({});
  });
});
