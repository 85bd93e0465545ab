import { type BaseHarnessFilters, ComponentHarness, HarnessPredicate, parallel } from '@angular/cdk/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { CpPhaseDialHarness } from '@counterpoise/ng/phase-dial/testing';
import type { AmplitudeUnit, CalcMethod, MassUnit } from '@counterpoise/ng/weight-calculator';

/** Filters for finding a `cp-weight-calculator`. */
export interface WeightCalculatorHarnessFilters extends BaseHarnessFilters {
  /** Only the calculator showing this method. */
  method?: CalcMethod;
}

/** A value to type: a number (or null to empty the field), or true/false for a check box. */
export type WeightCalculatorFieldValue = number | null | boolean;

/** One weight to install, as the result panel shows it. */
export interface WeightCalculatorCorrectionInfo {
  /** The correction plane, from 1. */
  plane: number;
  /** What the weight is: "Correction weight", "Plane 2 correction"... */
  title: string;
  /** The mass with its unit: "84.2 g". */
  mass: string;
  /** The angle: "253°". */
  angle: string;
  /** The weights it is split into where weights can go ("51.0 g at 240°"); empty when it goes on whole. */
  split: string[];
}

/** The result panel, read. */
export interface WeightCalculatorResultInfo {
  /** The weights to install. */
  corrections: WeightCalculatorCorrectionInfo[];
  /** The figures listed under them, by label: "Predicted residual", "Heavy spot"... */
  facts: Record<string, string>;
  /** The engine's warnings and the notes on the split. */
  warnings: string[];
  /** Where it was computed. */
  solver: 'remote' | 'local';
  /** Whether the values changed since it was computed. */
  stale: boolean;
}

/** Why the last calculation gave no answer. */
export interface WeightCalculatorFailureInfo {
  /** The engine's reason: invalid, unauthorized, revoked, rate-limited, unreachable, server. */
  reason: string;
  /** The message the technician reads. */
  message: string;
}

/**
 * Drives a `cp-weight-calculator` in tests: picks the method and units, types the fields (named by their
 * path in the method's form, e.g. `initial.amplitude`, `runs.1.readings.0.phaseDeg`), computes, and reads
 * the result, the field errors and the engine's failure. Built on Material's and the phase dial's own
 * harnesses.
 */
export class CpWeightCalculatorHarness extends ComponentHarness {
  static hostSelector = 'cp-weight-calculator';

  private readonly _submitButton = this.locatorFor(
    MatButtonHarness.with({ selector: '.cp-weight-calculator__submit' }),
  );
  private readonly _localButton = this.locatorForOptional(
    MatButtonHarness.with({ selector: '.cp-weight-calculator__local' }),
  );
  private readonly _progress = this.locatorForOptional(MatProgressBarHarness);
  private readonly _failure = this.locatorForOptional('.cp-weight-calculator__failure');
  private readonly _failureMessage = this.locatorForOptional('.cp-weight-calculator__failure-message');
  private readonly _failureDetails = this.locatorForAll('.cp-weight-calculator__failure-details li');
  private readonly _answer = this.locatorForOptional('.cp-weight-calculator__answer');
  private readonly _corrections = this.locatorForAll('.cp-weight-calculator__correction');
  private readonly _facts = this.locatorForAll('.cp-weight-calculator__fact');
  private readonly _warnings = this.locatorForAll(
    '.cp-weight-calculator__warning, .cp-weight-calculator__split-warning',
  );
  private readonly _solverNote = this.locatorForOptional('.cp-weight-calculator__solver');
  // Every Material form field of the form, the phase dials' own included, in the order of the form.
  private readonly _formFields = this.locatorForAll(MatFormFieldHarness);

  /** A predicate that finds a calculator by the method it shows. */
  static with(options: WeightCalculatorHarnessFilters = {}): HarnessPredicate<CpWeightCalculatorHarness> {
    return new HarnessPredicate(CpWeightCalculatorHarness, options).addOption(
      'method',
      options.method,
      async (harness, method) => (await harness.getMethod()) === method,
    );
  }

  /** Whether the calculator is disabled, by its `disabled` input or by its form control. */
  async isDisabled(): Promise<boolean> {
    return (await this.host()).hasClass('cp-weight-calculator--disabled');
  }

  /**
   * Moves the focus out of the calculator, as a technician leaving it does: its form control is then
   * touched. Does nothing when the focus is not in it.
   */
  async blur(): Promise<void> {
    const focusable = await this.locatorForAll('input, button, [role="slider"]')();
    const focused = await parallel(() => focusable.map((element) => element.isFocused()));
    await focusable[focused.indexOf(true)]?.blur();
  }

  /** The method shown. */
  async getMethod(): Promise<CalcMethod> {
    return (await (await this.host()).getAttribute('data-method')) as CalcMethod;
  }

  /** The names of the methods offered, in order; empty when only one is offered. */
  async getMethodLabels(): Promise<string[]> {
    const toggles = await this.locatorForAll(
      MatButtonToggleHarness.with({ ancestor: '.cp-weight-calculator__methods' }),
    )();
    return parallel(() => toggles.map((toggle) => toggle.getText()));
  }

  /** Shows a method; what was typed for the others stays. */
  async selectMethod(method: CalcMethod): Promise<void> {
    const toggle = await this.locatorFor(
      MatButtonToggleHarness.with({ selector: `[data-method="${method}"]` }),
    )();
    await toggle.check();
  }

  /** Switches the unit of the masses. */
  async setMassUnit(unit: MassUnit): Promise<void> {
    await (await this._unitToggle(unit)).check();
  }

  /** Switches the unit of the amplitudes. */
  async setAmplitudeUnit(unit: AmplitudeUnit): Promise<void> {
    await (await this._unitToggle(unit)).check();
  }

  /** The unit of the masses. */
  async getMassUnit(): Promise<MassUnit> {
    return (await (await this._unitToggle('g')).isChecked()) ? 'g' : 'oz';
  }

  /** The unit of the amplitudes. */
  async getAmplitudeUnit(): Promise<AmplitudeUnit> {
    return (await (await this._unitToggle('in/s')).isChecked()) ? 'in/s' : 'mm/s';
  }

  /** Types one field of the method shown, by its path (`withTrial.phaseDeg`), and leaves it. */
  async setField(field: string, value: WeightCalculatorFieldValue): Promise<void> {
    const selector = `[data-field="${field}"]`;
    if (typeof value === 'boolean') {
      const box = await this.locatorFor(MatCheckboxHarness.with({ selector }))();
      await (value ? box.check() : box.uncheck());
      return;
    }
    const text = value === null ? '' : String(value);
    const input = await this.locatorForOptional(MatInputHarness.with({ selector }))();
    if (input) {
      await input.setValue(text);
      await input.blur();
      return;
    }
    const dial = await this.locatorForOptional(CpPhaseDialHarness.with({ selector }))();
    if (!dial) throw new Error(`The weight calculator shows no field "${field}".`);
    await dial.typeInField(text);
  }

  /** Types several fields of the method shown, in the order given. */
  async fill(values: Readonly<Record<string, WeightCalculatorFieldValue>>): Promise<void> {
    for (const [field, value] of Object.entries(values)) await this.setField(field, value);
  }

  /** What a field of the method shown holds, as typed; a check box gives "true" or "false". */
  async getFieldValue(field: string): Promise<string> {
    const selector = `[data-field="${field}"]`;
    const input = await this.locatorForOptional(MatInputHarness.with({ selector }))();
    if (input) return input.getValue();
    const dial = await this.locatorForOptional(CpPhaseDialHarness.with({ selector }))();
    if (dial) return dial.getFieldText();
    const box = await this.locatorForOptional(MatCheckboxHarness.with({ selector }))();
    if (box) return String(await box.isChecked());
    throw new Error(`The weight calculator shows no field "${field}".`);
  }

  /** The error shown under a field, or null when it shows none. */
  async getFieldError(field: string): Promise<string | null> {
    const error = await this.locatorForOptional(`[data-field-error="${field}"]`)();
    // An angle's error is the phase dial's own, shown in its form field.
    const dial = error
      ? null
      : await this.locatorForOptional(CpPhaseDialHarness.with({ selector: `[data-field="${field}"]` }))();
    const text = ((await error?.text()) ?? (await dial?.getErrorText()) ?? '').trim();
    return text === '' ? null : text;
  }

  /** Every field error shown, in the order of the form. */
  async getErrors(): Promise<string[]> {
    const fields = await this._formFields();
    const errors = (await parallel(() => fields.map((field) => field.getTextErrors()))).flat();
    return errors.map((text) => text.trim()).filter((text) => text !== '');
  }

  /** Computes the method shown, as the submit button does. */
  async submit(): Promise<void> {
    await (await this._submitButton()).click();
  }

  /** Whether the submit button can be pressed. */
  async canSubmit(): Promise<boolean> {
    return !(await (await this._submitButton()).isDisabled());
  }

  /** Whether a calculation is under way (the progress bar shows). */
  async isComputing(): Promise<boolean> {
    return (await this._progress()) !== null;
  }

  /** Why the last calculation gave no answer, or null when it did. */
  async getFailure(): Promise<WeightCalculatorFailureInfo | null> {
    const failure = await this._failure();
    if (!failure) return null;
    const [reason, message] = await parallel(() => [
      failure.getAttribute('data-reason'),
      this._failureMessage().then((element) => element?.text() ?? ''),
    ]);
    return { reason: reason ?? '', message: message.trim() };
  }

  /** The engine's field messages that name no field of the form. */
  async getFailureDetails(): Promise<string[]> {
    const items = await this._failureDetails();
    return parallel(() => items.map(async (item) => (await item.text()).trim()));
  }

  /** Whether computing on the device is offered, after the calculation service could not answer. */
  async canUseLocalEngine(): Promise<boolean> {
    return (await this._localButton()) !== null;
  }

  /** Computes on the device instead. */
  async useLocalEngine(): Promise<void> {
    const button = await this._localButton();
    if (!button) throw new Error('The weight calculator does not offer to compute on this device now.');
    await button.click();
  }

  /** The result panel, or null when there is no result for the method shown. */
  async getResult(): Promise<WeightCalculatorResultInfo | null> {
    const answer = await this._answer();
    if (!answer) return null;
    const [corrections, facts, warnings, solverNote, stale] = await parallel(() => [
      this._corrections(),
      this._facts(),
      this._warnings(),
      this._solverNote(),
      answer.hasClass('cp-weight-calculator__answer--stale'),
    ]);
    const read = async (scope: string, selector: string) =>
      (await this.locatorFor(`${scope} ${selector}`)().then((element) => element.text())).trim();
    const readCorrection = async (
      element: (typeof corrections)[number],
    ): Promise<WeightCalculatorCorrectionInfo> => {
      const plane = Number(await element.getAttribute('data-plane'));
      const scope = `.cp-weight-calculator__correction[data-plane="${plane}"]`;
      const parts = await this.locatorForAll(`${scope} .cp-weight-calculator__split-part`)();
      return {
        plane,
        title: await read(scope, '.cp-weight-calculator__correction-title'),
        mass: await read(scope, '.cp-weight-calculator__mass'),
        angle: await read(scope, '.cp-weight-calculator__angle-figure'),
        split: await parallel(() => parts.map(async (part) => (await part.text()).trim())),
      };
    };
    const factEntries = await parallel(() =>
      facts.map(async (fact) => {
        const [label, value] = await parallel(() => [
          fact.text({ exclude: 'dd' }),
          fact.text({ exclude: 'dt' }),
        ]);
        return [label.trim(), value.trim()] as const;
      }),
    );
    return {
      corrections: await Promise.all(corrections.map(readCorrection)),
      facts: Object.fromEntries(factEntries),
      warnings: await parallel(() => warnings.map(async (warning) => (await warning.text()).trim())),
      solver: solverNote !== null && (await solverNote.text()).includes('this device') ? 'local' : 'remote',
      stale,
    };
  }

  private _unitToggle(unit: MassUnit | AmplitudeUnit): Promise<MatButtonToggleHarness> {
    return this.locatorFor(
      MatButtonToggleHarness.with({ text: unit, ancestor: '.cp-weight-calculator__units' }),
    )();
  }
}
