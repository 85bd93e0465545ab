import {
  type AbstractControl,
  FormArray,
  FormControl,
  FormGroup,
  type ValidationErrors,
  type ValidatorFn,
  Validators,
} from '@angular/forms';
import { describeField } from './weight-calculator-fields';
import {
  type AmplitudeUnit,
  CALC_METHODS,
  type CalcMethod,
  type MassUnit,
  type WeightCalculatorDraft,
  type WeightCalculatorFieldError,
} from './weight-calculator-model';

/*
 * The calculator's reactive form, typed, one group per method and shaped like `WeightCalculatorDraft`, so
 * that `getRawValue()` is the draft. Its validators and messages are plain functions, tested without
 * TestBed.
 */

/** Beyond this, a value is a typing slip; the calculator API refuses it too. */
export const LARGEST_VALUE = 1e9;

/** The phase offset of a stored sensitivity lies within one turn either way. */
export const OFFSET_RANGE_DEG = 360;

/** Refuses a negative number: masses and amplitudes have a size, their direction is an angle. */
export const nonNegative: ValidatorFn = (control) =>
  typeof control.value === 'number' && control.value < 0 ? { negative: true } : null;

/** Refuses zero and below. */
export const positive: ValidatorFn = (control) =>
  typeof control.value === 'number' && control.value <= 0 ? { notPositive: true } : null;

/** Refuses a number too large to be a measurement. */
export const plausible: ValidatorFn = (control) =>
  typeof control.value === 'number' && Math.abs(control.value) > LARGEST_VALUE
    ? { tooLarge: { max: LARGEST_VALUE } }
    : null;

/** Refuses a number outside [min, max]. */
export function withinRange(min: number, max: number): ValidatorFn {
  return (control) =>
    typeof control.value === 'number' && (control.value < min || control.value > max)
      ? { outOfRange: { min, max } }
      : null;
}

/**
 * The message for a field's first error, naming the field in the technician's words (`what`, e.g.
 * "trial mass"). An error from the engine (`engine`) is shown as the engine wrote it.
 */
export function fieldErrorMessage(errors: ValidationErrors | null, what: string): string | null {
  if (errors === null) return null;
  if (typeof errors['engine'] === 'string') return errors['engine'];
  if (errors['required']) return `Enter the ${what}.`;
  if (errors['negative'])
    return `The ${what} cannot be negative; give its size, the angle gives its direction.`;
  if (errors['notPositive']) return `The ${what} must be greater than zero.`;
  if (errors['tooLarge']) return `The ${what} is too large to be a measurement; check the number typed.`;
  const range = errors['outOfRange'] as { min: number; max: number } | undefined;
  if (range) return `The ${what} must lie between ${range.min} and ${range.max}.`;
  const position = errors['cpPhasePosition'] as { allowed: number[] } | undefined;
  if (position) {
    return `The ${what} must be one of the allowed positions: ${position.allowed.map((angle) => `${angle}°`).join(', ')}.`;
  }
  return `Check the ${what}.`;
}

const amplitude = () => new FormControl<number | null>(null, [Validators.required, nonNegative, plausible]);
const angle = (value: number | null = null) => new FormControl<number | null>(value, Validators.required);
const mass = () => new FormControl<number | null>(null, [Validators.required, positive, plausible]);

/** A reading: amplitude and phase. */
export function readingGroup() {
  return new FormGroup({ amplitude: amplitude(), phaseDeg: angle() });
}

/** A weight: mass and angle. */
export function weightGroup() {
  return new FormGroup({ mass: mass(), angleDeg: angle() });
}

/** The whole calculator form, every method's group in it. */
export function createCalculatorForm(
  method: CalcMethod = 'single-plane',
  massUnit: MassUnit = 'g',
  amplitudeUnit: AmplitudeUnit = 'in/s',
) {
  return new FormGroup({
    method: new FormControl<CalcMethod>(method, { nonNullable: true }),
    massUnit: new FormControl<MassUnit>(massUnit, { nonNullable: true }),
    amplitudeUnit: new FormControl<AmplitudeUnit>(amplitudeUnit, { nonNullable: true }),
    oneRun: new FormGroup({
      reading: readingGroup(),
      sensitivity: new FormGroup({
        massPerAmplitude: new FormControl<number | null>(null, [Validators.required, positive, plausible]),
        offsetDeg: new FormControl<number | null>(null, withinRange(-OFFSET_RANGE_DEG, OFFSET_RANGE_DEG)),
      }),
    }),
    singlePlane: new FormGroup({
      initial: readingGroup(),
      trialWeight: weightGroup(),
      withTrial: readingGroup(),
      trialWeightRemoved: new FormControl(true, { nonNullable: true }),
    }),
    multiPlane: new FormGroup({
      initial: new FormArray([readingGroup(), readingGroup()]),
      runs: new FormArray(
        [0, 1].map(
          () =>
            new FormGroup({
              trialWeight: weightGroup(),
              readings: new FormArray([readingGroup(), readingGroup()]),
            }),
        ),
      ),
      trialWeightsRemoved: new FormControl(true, { nonNullable: true }),
    }),
    fourRun: new FormGroup({
      initialAmplitude: amplitude(),
      trialMass: mass(),
      // Three positions a third of a turn apart is the common practice; the technician may change them.
      trialRuns: new FormArray(
        [0, 120, 240].map((start) => new FormGroup({ angleDeg: angle(start), amplitude: amplitude() })),
      ),
    }),
  });
}

/** The calculator's form. */
export type CalculatorForm = ReturnType<typeof createCalculatorForm>;

/** The group of a method inside the form. */
export function methodGroup(form: CalculatorForm, method: CalcMethod): AbstractControl {
  switch (method) {
    case 'one-run':
      return form.controls.oneRun;
    case 'single-plane':
      return form.controls.singlePlane;
    case 'multi-plane':
      return form.controls.multiPlane;
    case 'four-run':
      return form.controls.fourRun;
  }
}

/** The draft the form holds; the type says it is one. */
export function draftOf(form: CalculatorForm): WeightCalculatorDraft {
  return form.getRawValue();
}

/**
 * A draft as a page may hand it back: one kept by this version, or by an earlier one that named the
 * two-plane method `two-plane` and kept its values under `twoPlane`. Anything missing is left to the form's
 * own values; a method this calculator does not know is dropped.
 */
export function readDraft(kept: unknown): Partial<WeightCalculatorDraft> {
  if (kept === null || typeof kept !== 'object') return {};
  const { twoPlane, method, ...rest } = kept as Record<string, unknown>;
  const draft: Record<string, unknown> = { ...rest };
  if (draft['multiPlane'] === undefined && twoPlane !== undefined) draft['multiPlane'] = twoPlane;
  const renamed = method === 'two-plane' ? 'multi-plane' : method;
  if ((CALC_METHODS as readonly unknown[]).includes(renamed)) draft['method'] = renamed;
  return draft as Partial<WeightCalculatorDraft>;
}

/** The leaf controls of a group with their dotted paths, in the order of the form. */
export function leafControls(
  control: AbstractControl,
  path = '',
): { readonly path: string; readonly control: AbstractControl }[] {
  if (control instanceof FormGroup || control instanceof FormArray) {
    return Object.entries(control.controls as Record<string, AbstractControl>).flatMap(([key, child]) =>
      leafControls(child, path === '' ? key : `${path}.${key}`),
    );
  }
  return [{ path, control }];
}

/** The fields of a method that hold no usable value, each with what is wrong, in the order of the form. */
export function invalidFields(form: CalculatorForm, method: CalcMethod): WeightCalculatorFieldError[] {
  return leafControls(methodGroup(form, method))
    .filter(({ control }) => control.invalid)
    .map(({ path, control }) => {
      const words = describeField(method, path);
      return {
        field: path,
        label: words.label,
        section: words.section,
        message: fieldErrorMessage(control.errors, words.what) ?? `Check the ${words.what}.`,
      };
    });
}
