import { NgTemplateOutlet } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  booleanAttribute,
  ElementRef,
  Injector,
  forwardRef,
  afterNextRender,
  computed,
  effect,
  inject,
  input,
  model,
  output,
  PendingTasks,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  type ControlValueAccessor,
  FormArray,
  FormGroup,
  FormGroupDirective,
  NG_VALIDATORS,
  NG_VALUE_ACCESSOR,
  ReactiveFormsModule,
  TouchedChangeEvent,
  type ValidationErrors,
  type Validator,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { type Observable, type Subscription, catchError, finalize, map, of, switchMap } from 'rxjs';
import type { CalcRequest } from '@counterpoise/ng/api';
import type { RotationCounting, DialPositions, RotationDirection } from '@counterpoise/ng/core';
import {
  type BlockedSector,
  CpCorrectionOverlay,
  type OverlayWeight,
} from '@counterpoise/ng/correction-overlay';
import {
  BALANCE_SOLVER,
  type BalanceSolver,
  type BalanceSolverError,
  LOCAL_BALANCE_SOLVER,
  _asSolverError as asSolverError,
  _calculateAll as calculateAll,
  _canFallBackToLocal as canFallBackToLocal,
} from '@counterpoise/ng/solver';
import { CpPhaseDial } from '@counterpoise/ng/phase-dial';
import { type FieldKind, type FieldWords, describeField } from './weight-calculator-fields';
import {
  type CalculatorForm,
  createCalculatorForm,
  draftOf,
  fieldErrorMessage,
  invalidFields,
  methodGroup,
  readDraft,
} from './weight-calculator-form';
import {
  type AmplitudeUnit,
  CALC_METHODS,
  type CalcMethod,
  type CorrectionPlacement,
  type MassUnit,
  METHOD_GROUPS,
  METHOD_INFO,
  type MethodAnswer,
  type SensitivityPreset,
  type WeightCalculation,
  type WeightCalculatorDraft,
  type WeightCalculatorErrors,
  type WeightCalculatorValue,
} from './weight-calculator-model';
import { buildRequest, controlPathFor, placementPlan, requestMatches } from './weight-calculator-requests';
import { correctionsToInstall, describeResult } from './weight-calculator-result';
import {
  AMPLITUDE_UNITS,
  MASS_UNITS,
  amplitudeStep,
  massStep,
  sensitivityUnit,
} from './weight-calculator-units';

let nextId = 0;

/** An angle as a weight is placed and as the result panel shows it, so the end view agrees with the figures. */
function wholeDegrees(angleDeg: number): number {
  return Math.round(angleDeg) % 360;
}

/** A calculation that gave no answer, kept so that it can be run again on the device. */
interface Failure {
  readonly error: BalanceSolverError;
  readonly method: CalcMethod;
  readonly solver: BalanceSolver['kind'];
  /** Field messages the engine gave for values the form has no field for. */
  readonly unplaced: readonly string[];
}

/** The last answer of a method, with what was typed when it was computed. */
interface Answer {
  readonly calculation: WeightCalculation;
  readonly typed: string;
}

/**
 * The weight calculator: a form for each balancing method a technician uses in the field (stored
 * sensitivity, trial weight, two planes, amplitude only), with phases and angles on the phase dial, and a
 * result panel with the correction, its split onto the places a weight can really go, the predicted
 * residual, the engine's warnings and an end view of where the weight goes.
 *
 * It computes through `BALANCE_SOLVER` (see `provideCounterpoise()`); when the calculation service cannot
 * answer it says why and offers to compute on the device. What was typed is never lost: not on an error,
 * not on a switch of method.
 *
 * In a reactive form it is one control whose value is a `WeightCalculatorValue`: the draft (everything
 * typed) and the calculation that matches it, or null while there is none or it is stale.
 *
 *   readonly correction = new FormControl<WeightCalculatorValue | null>(null);
 *   <cp-weight-calculator [formControl]="correction" />   (or formControlName="correction" in a group)
 *
 * The value changes as the technician types, switches method or unit, and when a calculation finishes;
 * `setValue(kept)` restores a kept job (its draft, and its calculation when it still matches). The
 * control is invalid with `calculatorFields` ({ count, fields: [{ field, label, section, message }] })
 * while fields of the method shown are empty or wrong, and with `calculatorNotComputed` while there is no
 * current calculation; see `WeightCalculatorErrors`. Disabling the control disables the calculator, as
 * the `disabled` input does, and it is touched when the focus leaves it. Without a form, `draft`
 * (two-way) keeps what was typed and `calculated` reports each calculation.
 */
@Component({
  selector: 'cp-weight-calculator',
  templateUrl: './weight-calculator.html',
  styleUrl: './weight-calculator.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [
    { provide: NG_VALUE_ACCESSOR, useExisting: forwardRef(() => CpWeightCalculator), multi: true },
    { provide: NG_VALIDATORS, useExisting: forwardRef(() => CpWeightCalculator), multi: true },
  ],
  imports: [
    ReactiveFormsModule,
    NgTemplateOutlet,
    MatButtonModule,
    MatButtonToggleModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    CpPhaseDial,
    CpCorrectionOverlay,
  ],
  host: {
    class: 'cp-weight-calculator',
    '[class.cp-weight-calculator--computing]': '_pending()',
    '[class.cp-weight-calculator--disabled]': 'disabled()',
    '[attr.data-method]': '_method()',
    '(focusout)': '_onFocusOut($event)',
  },
})
export class CpWeightCalculator implements ControlValueAccessor, Validator {
  /** The methods offered, in this order; all of them when empty. */
  readonly methods = input<readonly CalcMethod[]>(CALC_METHODS);
  /** The method shown; the first offered when null or not offered. */
  readonly method = model<CalcMethod | null>(null);
  /** The unit of every mass of a calculation; the technician can switch it. */
  readonly massUnit = model<MassUnit>('g');
  /** The unit of every amplitude of a calculation; the technician can switch it. */
  readonly amplitudeUnit = model<AmplitudeUnit>('in/s');
  /** The way the rotor turns, as seen in the end views. */
  readonly rotation = input<RotationDirection>('clockwise');
  /** Which way angles are counted from the reference mark; weight angles are sent to the engine so. */
  readonly counting = input<RotationCounting>('againstRotation');
  /** Where the reference mark is drawn, clockwise from 12 o'clock. */
  readonly zeroAtDeg = input(0);
  /** Where weights can go (holes, holders): corrections are split onto them, trial weights snap to them. */
  readonly allowedPositions = input<DialPositions | null>(null);
  /** Stretches of the rim where no weight can go; corrections are moved out of them. */
  readonly blockedSectors = input<readonly BlockedSector[]>([]);
  /** The stored sensitivity of the machine family, filled into the stored-sensitivity form. */
  readonly sensitivity = input<SensitivityPreset | null>(null);
  /** Shows the form without letting it be changed or computed. */
  // eslint-disable-next-line @angular-eslint/no-input-rename -- `disabled` names the merged state.
  readonly disabledInput = input(false, { alias: 'disabled', transform: booleanAttribute });
  /**
   * Everything typed, for every method, with the method and units it was typed in; set it to restore a
   * job (its method and units then win over the inputs of the same names), read it to keep one.
   */
  readonly draft = model<WeightCalculatorDraft | null>(null);

  /** Emits each finished calculation: the method, the request, the answer and the placed corrections. */
  readonly calculated = output<WeightCalculation>();

  /** Whether the calculator is disabled, by its input or by its form control. */
  readonly disabled = computed(() => this.disabledInput() || this._formDisabled());

  private readonly _solver = inject(BALANCE_SOLVER);
  private readonly _host: ElementRef<HTMLElement> = inject(ElementRef);
  private readonly _formDirective = viewChild(FormGroupDirective);
  private readonly _injector = inject(Injector);
  private _running: Subscription | null = null;
  private readonly _formDisabled = signal(false);
  private _onChange: (value: WeightCalculatorValue) => void = () => undefined;
  private _onTouched: () => void = () => undefined;
  private _onValidatorChange: () => void = () => undefined;
  /** The page's form control this calculator validates, watched for `markAllAsTouched()`. */
  private _outerControl: AbstractControl | null = null;
  private _outerTouched: Subscription | null = null;
  /** True while the calculator itself reports the technician leaving it, which shows no new errors. */
  private _leaving = false;
  /** Above zero while the form is set from outside (inputs, `draft`, `writeValue`), not by the technician. */
  private _quiet = 0;

  protected readonly _id = `cp-weight-calculator-${nextId++}`;
  protected readonly _form: CalculatorForm = createCalculatorForm();
  protected readonly _info = METHOD_INFO;
  protected readonly _massUnits = MASS_UNITS;
  protected readonly _amplitudeUnits = AMPLITUDE_UNITS;

  /** The form's value, as a signal for the computed state below. */
  private readonly _typed = signal<WeightCalculatorDraft>(draftOf(this._form));
  protected readonly _method = computed(() => this._typed().method);
  protected readonly _massUnit = computed(() => this._typed().massUnit);
  protected readonly _amplitudeUnit = computed(() => this._typed().amplitudeUnit);
  protected readonly _massStep = computed(() => massStep(this._massUnit()));
  protected readonly _amplitudeStep = computed(() => amplitudeStep(this._amplitudeUnit()));
  protected readonly _sensitivityUnit = computed(() =>
    sensitivityUnit(this._massUnit(), this._amplitudeUnit()),
  );

  protected readonly _methods = computed(() => {
    const offered = CALC_METHODS.filter((one) => this.methods().includes(one));
    const ordered = this.methods().filter(
      (one, index, all) => offered.includes(one) && all.indexOf(one) === index,
    );
    return ordered.length > 0 ? ordered : [...CALC_METHODS];
  });

  protected readonly _pending = signal(false);
  private readonly _tasks = inject(PendingTasks);
  /** What the live region says: the answer, or why there is none. */
  protected readonly _announcement = signal('');
  protected readonly _submitted = signal(false);
  protected readonly _failure = signal<Failure | null>(null);
  private readonly _answers = signal<Partial<Record<CalcMethod, Answer>>>({});

  /** The last answer of the method shown. */
  protected readonly _answer = computed(() => this._answers()[this._method()] ?? null);
  protected readonly _view = computed(() => {
    const answer = this._answer();
    return answer === null ? null : describeResult(answer.calculation);
  });
  /** Whether the values changed since the answer shown was computed. */
  protected readonly _stale = computed(() => {
    const answer = this._answer();
    return answer !== null && answer.typed !== this._typedKey(this._method(), this._typed());
  });
  /** The calculation that matches what is typed now, or null. */
  private readonly _current = computed(() => (this._stale() ? null : (this._answer()?.calculation ?? null)));
  /** The value as a form control holds it. */
  private readonly _value = computed<WeightCalculatorValue>(() => ({
    draft: this._typed(),
    calculation: this._current(),
  }));
  protected readonly _canUseLocal = computed(() => {
    const failure = this._failure();
    return (
      failure !== null &&
      failure.solver === 'remote' &&
      this._localEngine().kind === 'local' &&
      canFallBackToLocal(failure.error)
    );
  });
  /** What the end views draw, one per plane. */
  protected readonly _overlays = computed(() => {
    const view = this._view();
    const answer = this._answer();
    if (view === null || answer === null) return [];
    const unit = answer.calculation.massUnit;
    return view.corrections.map((correction, index) => {
      const parts: OverlayWeight[] =
        correction.split.length > 0
          ? (answer.calculation.placements.find((one) => one.plane === correction.plane)?.weights ?? []).map(
              (part, partIndex) => ({
                mass: part.mass,
                angleDeg: wholeDegrees(part.angleDeg),
                unit,
                label: `Part ${String.fromCharCode(65 + partIndex)}`,
              }),
            )
          : [
              {
                mass: correction.mass,
                angleDeg: wholeDegrees(correction.angleDeg),
                unit,
                label: 'Correction',
              },
            ];
      const existing: OverlayWeight[] = view.weightsLeftOn
        .filter((weight) => weight.plane === correction.plane)
        .map((weight) => ({ mass: weight.mass, angleDeg: weight.angleDeg, unit, label: 'Trial weight' }));
      return {
        plane: correction.plane,
        label:
          view.corrections.length > 1
            ? `Plane ${correction.plane}: where the correction weight goes, end view of the rotor`
            : 'Where the correction weight goes, end view of the rotor',
        heavySpotDeg: view.heavySpotsDeg[index] ?? null,
        corrections: parts,
        existing,
      };
    });
  });

  constructor() {
    const destroyRef = inject(DestroyRef);
    destroyRef.onDestroy(() => {
      this._running?.unsubscribe();
      this._outerTouched?.unsubscribe();
    });
    this._prefetchOverlay();

    this._form.valueChanges.pipe(takeUntilDestroyed()).subscribe(() => {
      this._sync();
      if (this._quiet === 0) this._onChange(this._value());
    });

    // A restored draft brings its own method and units: readings typed in mm/s stay in mm/s. Patching
    // it updates the method and unit models through valueChanges before the effects below read them.
    effect(() => {
      const draft = this.draft();
      untracked(() => {
        if (draft !== null && JSON.stringify(draft) !== JSON.stringify(draftOf(this._form))) {
          this._quietly(() => this._form.patchValue(readDraft(draft)));
        }
      });
    });
    effect(() => {
      const offered = this._methods();
      const asked = this.method();
      const method = asked !== null && offered.includes(asked) ? asked : (offered[0] ?? 'single-plane');
      untracked(() => this._quietly(() => this._setIfChanged(this._form.controls.method, method)));
    });
    effect(() => {
      const unit = this.massUnit();
      untracked(() => this._quietly(() => this._setIfChanged(this._form.controls.massUnit, unit)));
    });
    effect(() => {
      const unit = this.amplitudeUnit();
      untracked(() => this._quietly(() => this._setIfChanged(this._form.controls.amplitudeUnit, unit)));
    });
    effect(() => {
      const preset = this.sensitivity();
      if (preset === null) return;
      untracked(() => this._quietly(() => this._applySensitivity(preset)));
    });
    effect(() => {
      const disabled = this.disabled();
      untracked(() => {
        if (disabled) this._form.disable({ emitEvent: false });
        else this._form.enable({ emitEvent: false });
      });
    });
  }

  /** Restores a kept value: its draft, and its calculation when it still matches; null empties the form. */
  writeValue(value: WeightCalculatorValue | null): void {
    this._running?.unsubscribe();
    this._pending.set(false);
    this._quietly(() => {
      const typed = this._typed();
      // Through the form directive, so that a new job does not show the last one's submitted errors.
      const blank = draftOf(createCalculatorForm(typed.method, typed.massUnit, typed.amplitudeUnit));
      const directive = this._formDirective();
      // Before the first render the directive has no form yet, and nothing was submitted.
      if (directive?.form) directive.resetForm(blank);
      else this._form.reset(blank);
      const preset = untracked(() => this.sensitivity());
      if (preset !== null) this._applySensitivity(preset);
      if (value?.draft != null) this._form.patchValue(readDraft(value.draft));
    });
    this._sync();
    const restored = draftOf(this._form);
    const calculation = value?.calculation ?? null;
    const matches =
      calculation !== null &&
      calculation.method === restored.method &&
      calculation.massUnit === restored.massUnit &&
      calculation.amplitudeUnit === restored.amplitudeUnit &&
      requestMatches(calculation.method, restored, this.counting(), calculation.request);
    this._answers.set(
      matches
        ? { [calculation.method]: { calculation, typed: this._typedKey(calculation.method, restored) } }
        : {},
    );
    this._failure.set(null);
    this._submitted.set(false);
    this._announcement.set('');
  }

  /** Registers the form's callback for a value the technician changed. */
  registerOnChange(fn: (value: WeightCalculatorValue) => void): void {
    this._onChange = fn;
  }

  /** Registers the form's callback for when the focus leaves the calculator. */
  registerOnTouched(fn: () => void): void {
    this._onTouched = fn;
  }

  /** Disables the calculator from its form control, on top of the `disabled` input. */
  setDisabledState(isDisabled: boolean): void {
    this._formDisabled.set(isDisabled);
  }

  /**
   * What keeps the value from being usable: `calculatorFields` lists the empty or wrong fields of the
   * method shown, `calculatorNotComputed` says there is no current calculation.
   */
  validate(control?: AbstractControl): ValidationErrors | null {
    if (control && control !== this._outerControl) this._watchOuterControl(control);
    const fields = invalidFields(this._form, this._method());
    const errors: WeightCalculatorErrors = {
      ...(fields.length > 0 ? { calculatorFields: { count: fields.length, fields } } : {}),
      ...(this._current() === null ? { calculatorNotComputed: true as const } : {}),
    };
    return Object.keys(errors).length > 0 ? { ...errors } : null;
  }

  /**
   * When the page marks its form touched (`markAllAsTouched()` before saving, say), the calculator shows
   * every field error of the method shown, as Material's fields do when their control is touched.
   */
  private _watchOuterControl(control: AbstractControl): void {
    this._outerTouched?.unsubscribe();
    this._outerControl = control;
    this._outerTouched = control.events.subscribe((event) => {
      if (!(event instanceof TouchedChangeEvent) || !event.touched || event.source !== control) return;
      if (this._leaving) return;
      methodGroup(this._form, this._method()).markAllAsTouched();
      this._submitted.set(true);
    });
  }

  /** Registers the form's callback for a change of validity that no new value brings (the engine's refusal). */
  registerOnValidatorChange(fn: () => void): void {
    this._onValidatorChange = fn;
  }

  /** Computes the method shown with the configured solver, after checking every field. */
  protected _submit(): void {
    this._compute(this._solver);
  }

  /** Computes the method shown on the device, after the calculation service could not answer. */
  protected _useLocalEngine(): void {
    this._compute(this._localEngine());
  }

  /**
   * The on-device solver, asked for only when it is offered: made, it starts loading the engine, which a
   * page that computes remotely should not download on every visit.
   */
  private _localEngine(): BalanceSolver {
    return this._injector.get(LOCAL_BALANCE_SOLVER);
  }

  /** The words of a field of the method shown (label, message name, section, kind). */
  protected _words(field: string): FieldWords {
    return describeField(this._method(), field);
  }

  /** The words on a toggle: a method's label in the technician's words, or a unit's symbol. */
  protected _toggleLabel(option: string): string {
    return option in METHOD_INFO ? METHOD_INFO[option as CalcMethod].label : option;
  }

  /** The unit shown after a field of this kind. */
  protected _unitOf(kind: FieldKind): string {
    if (kind === 'amplitude') return this._amplitudeUnit();
    if (kind === 'mass') return this._massUnit();
    if (kind === 'sensitivity') return this._sensitivityUnit();
    return '°';
  }

  /** The step of a field of this kind: one shown decimal of its unit, or any for the sensitivity. */
  protected _stepOf(kind: FieldKind): number | 'any' {
    if (kind === 'amplitude') return this._amplitudeStep();
    if (kind === 'mass') return this._massStep();
    return 'any';
  }

  /** The technician left the calculator: the form control is touched. */
  protected _onFocusOut(event: FocusEvent): void {
    const next = event.relatedTarget;
    if (next instanceof Node && this._host.nativeElement.contains(next)) return;
    this._leaving = true;
    try {
      this._onTouched();
    } finally {
      this._leaving = false;
    }
  }

  /** The message of a field's first error, or null while it has none to show. */
  protected _errorOf(control: AbstractControl, what: string): string | null {
    if (!control.invalid || !(control.touched || this._submitted())) return null;
    return this._messageOf(control, what);
  }

  /**
   * The message of a field's first error, for a field that decides itself when to show it (the phase
   * dial, in Material's error state); null while the field is valid.
   */
  protected _messageOf(control: AbstractControl, what: string): string | null {
    return control.invalid ? fieldErrorMessage(control.errors, what) : null;
  }

  private _compute(solver: BalanceSolver): void {
    if (this.disabled()) return;
    const method = this._method();
    const group = methodGroup(this._form, method);
    this._submitted.set(true);
    if (group.invalid) {
      group.markAllAsTouched();
      this._failure.set(null);
      this._focusFirstInvalid();
      this._announcement.set('Some values are missing or cannot be used; check the marked fields.');
      return;
    }
    const typed = draftOf(this._form);
    const key = this._typedKey(method, typed);
    const request = buildRequest(method, typed, this.counting());
    const units = { massUnit: typed.massUnit, amplitudeUnit: typed.amplitudeUnit };

    this._running?.unsubscribe();
    this._pending.set(true);
    this._failure.set(null);
    // A pending task keeps the application unstable while the answer is on its way (over the network,
    // or while the on-device solver loads), so that tests, harnesses and server rendering wait for it.
    const settled = this._tasks.add();
    this._running = (solver.calculate(method, request as never) as Observable<unknown>)
      .pipe(
        map((result) => ({ method, request, result }) as MethodAnswer),
        switchMap((answer) =>
          this._place(answer, solver).pipe(
            map(
              (placements) => ({ ...answer, placements, solver: solver.kind, ...units }) as WeightCalculation,
            ),
          ),
        ),
        finalize(settled),
      )
      .subscribe({
        next: (calculation) => {
          this._pending.set(false);
          this._answers.update((answers) => ({ ...answers, [method]: { calculation, typed: key } }));
          this._announce(calculation);
          this.calculated.emit(calculation);
          this._onChange(this._value());
        },
        error: (error: unknown) => {
          this._pending.set(false);
          this._fail(method, solver, request, error);
        },
      });
  }

  /**
   * Splits each correction onto the places a weight can go, all in one batch (one request to the
   * calculator API, whatever the number of planes); a split that fails becomes a warning.
   */
  private _place(answer: MethodAnswer, solver: BalanceSolver): Observable<CorrectionPlacement[]> {
    const plan = placementPlan(this.allowedPositions(), this.blockedSectors());
    if (plan.kind === 'anywhere') return of([]);
    const corrections = correctionsToInstall(answer).filter((weight) => weight.mass > 0);
    const unsplit = (plane: number, warning: string): CorrectionPlacement => ({
      plane,
      weights: [],
      massRatio: 1,
      warnings: [warning],
    });
    if (plan.kind === 'nowhere') return of(corrections.map((weight) => unsplit(weight.plane, plan.reason)));
    const failed = (plane: number, error: unknown) =>
      unsplit(
        plane,
        `The split onto the allowed places could not be computed: ${
          error instanceof Error ? error.message : String(error)
        }`,
      );
    const requests = corrections.map((weight): CalcRequest<'split'> => ({
      weight: { mass: weight.mass, angleDeg: weight.angleDeg },
      ...plan.places,
    }));
    return calculateAll(solver, 'split', requests).pipe(
      map((outcomes) =>
        corrections.map((weight, index): CorrectionPlacement => {
          const outcome = outcomes[index];
          if (outcome === undefined) return failed(weight.plane, 'no answer came for it.');
          return outcome.ok
            ? { plane: weight.plane, ...outcome.result }
            : failed(weight.plane, outcome.error);
        }),
      ),
      catchError((error: unknown) => of(corrections.map((weight) => failed(weight.plane, error)))),
    );
  }

  private _fail(method: CalcMethod, solver: BalanceSolver, request: unknown, error: unknown): void {
    const failure = asSolverError(error);
    const unplaced: string[] = [];
    if (failure.reason === 'invalid') {
      const group = methodGroup(this._form, method);
      for (const fieldError of failure.problem?.errors ?? []) {
        const path = controlPathFor(method, fieldError.path, request as CalcRequest<'multi-plane'>);
        const control = path === null ? null : group.get(path);
        if (control === null || control instanceof FormGroup || control instanceof FormArray) {
          unplaced.push(fieldError.message);
          continue;
        }
        control.setErrors({ ...control.errors, engine: fieldError.message });
        control.markAsTouched();
      }
      this._focusFirstInvalid();
      this._onValidatorChange();
    } else {
      this._revealResults();
    }
    this._failure.set({ error: failure, method, solver: solver.kind, unplaced });
    this._announcement.set('');
  }

  private _announce(calculation: WeightCalculation): void {
    const view = describeResult(calculation);
    const weights = view.corrections.map((one) => `${one.title}: ${one.spoken}`).join('. ');
    const warnings = view.warnings.length > 0 ? ` ${view.warnings.length} warnings.` : '';
    this._announcement.set(`${weights}.${warnings}`);
    this._revealResults();
  }

  /**
   * On a phone the result panel sits under the form, out of sight: bring its top into view and leave
   * the focus where it is. Beside the form it is already in sight, and nothing moves.
   */
  private _revealResults(): void {
    afterNextRender(
      () => {
        const results = this._host.nativeElement.querySelector('.cp-weight-calculator__results');
        const top = results?.getBoundingClientRect().top ?? 0;
        if (results && top > window.innerHeight * 0.8) results.scrollIntoView?.({ block: 'start' });
      },
      { injector: this._injector },
    );
  }

  /**
   * The overlay of the result panel is a deferred view (`@defer`), so that the form renders without it.
   * Its code is fetched here once the browser is idle after the first render, well before an answer
   * needs it, and while the device still has its connection: the deferred view then finds it in the
   * browser's module cache, also for work offline later.
   */
  private _prefetchOverlay(): void {
    afterNextRender(
      () => {
        const fetchOverlay = () => void import('@counterpoise/ng/correction-overlay').catch(() => undefined);
        if (typeof requestIdleCallback === 'function') requestIdleCallback(fetchOverlay, { timeout: 3000 });
        else setTimeout(fetchOverlay, 0);
      },
      { injector: this._injector },
    );
  }

  /** Moves focus to the first field that needs the technician, once the form shows its errors. */
  private _focusFirstInvalid(): void {
    afterNextRender(
      () => {
        const field = this._host.nativeElement.querySelector<HTMLElement>(
          '.cp-weight-calculator__form input.ng-invalid, .cp-weight-calculator__form cp-phase-dial.ng-invalid',
        );
        const target = field?.matches('input')
          ? field
          : field?.querySelector<HTMLElement>('input, [role="slider"]');
        target?.focus();
      },
      { injector: this._injector },
    );
  }

  /** What was typed for a method, as a key to tell whether an answer still matches it. */
  private _typedKey(method: CalcMethod, typed: WeightCalculatorDraft): string {
    return JSON.stringify([
      typed[METHOD_GROUPS[method]],
      typed.massUnit,
      typed.amplitudeUnit,
      this.counting(),
    ]);
  }

  /** Takes what the form holds into the signals and the models. */
  private _sync(): void {
    const typed = draftOf(this._form);
    this._typed.set(typed);
    this.method.set(typed.method);
    this.massUnit.set(typed.massUnit);
    this.amplitudeUnit.set(typed.amplitudeUnit);
    this.draft.set(typed);
  }

  /** Changes the form from outside: the form control is not told of a change the technician did not make. */
  private _quietly(change: () => void): void {
    this._quiet++;
    try {
      change();
    } finally {
      this._quiet--;
    }
  }

  private _applySensitivity(preset: SensitivityPreset): void {
    this._form.controls.oneRun.controls.sensitivity.patchValue({
      massPerAmplitude: preset.massPerAmplitude,
      offsetDeg: preset.offsetDeg ?? null,
    });
  }

  private _setIfChanged<T>(control: { value: T; setValue(value: T): void }, value: T): void {
    if (control.value !== value) control.setValue(value);
  }
}
