import {
  ChangeDetectionStrategy,
  booleanAttribute,
  numberAttribute,
  Component,
  DestroyRef,
  type DoCheck,
  type ElementRef,
  type OnChanges,
  type SimpleChanges,
  computed,
  effect,
  forwardRef,
  inject,
  input,
  model,
  output,
  signal,
  viewChild,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  type ControlValueAccessor,
  FormGroupDirective,
  NG_VALIDATORS,
  NG_VALUE_ACCESSOR,
  NgForm,
  type ValidationErrors,
  type Validator,
  Validators,
} from '@angular/forms';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatError, MatFormField, MatHint, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import {
  type RotationCounting,
  type DialConvention,
  type DialPositions,
  type RotationDirection,
  _angleAtPoint as angleAtPoint,
  _expandPositions as expandPositions,
  _formatAngle as formatAngle,
  _snapAngle as snapAngle,
} from '@counterpoise/ng/core';
import {
  DIAL_CENTER,
  DIAL_NEEDLE_TIP_RADIUS,
  DIAL_RIM_RADIUS,
  DIAL_THUMB_RADIUS,
  DIAL_VIEW_SIZE,
  MARKER_GLYPHS,
  dialLabels,
  dialTicks,
  labelledAngles,
  placeMarkers,
  pointerLine,
  referenceMark,
  rotationArrow,
  thumbCenter,
} from './phase-dial-drawing';
import {
  DIAL_ANGLE_DECIMALS,
  PHASE_DIAL_MARKER_NAMES,
  type PhaseDialMarker,
  dialValueText,
  describeZeroPosition,
  maxDialValue,
  nextDialValue,
  parseAngleText,
  phaseDialErrorMessage,
  phaseDialErrors,
  toDialAngle,
  validStep,
} from './phase-dial-values';

/** An angle as the dial writes it: up to two decimals, as typed off a meter. */
function writeAngle(angleDeg: number): string {
  return formatAngle(angleDeg, DIAL_ANGLE_DECIMALS);
}

/** A touch this close to the centre, as a share of the dial's radius, says nothing about an angle. */
const CENTER_DEAD_ZONE = 0.15;

let nextId = 0;

/**
 * An end view of the rotor to read or set an angle in degrees: the phase of a reading, where a trial
 * weight went, where the correction goes. Set it by tapping or dragging (the whole dial is the target,
 * for gloved hands), with the keyboard, or in the compact variant by typing. It is a form control
 * (`formControl`, `formControlName`, `ngModel`) that validates `required`, numbers, the range and the
 * allowed positions, and says in words under itself why its angle is not accepted, as Material's form
 * fields do: once the control is invalid and touched, or its form submitted (`ErrorStateMatcher`).
 *
 * The slider is the dial inside the element rather than the element itself: a slider's content is
 * presentational to assistive technology, and the marker legend and the numeric field beside the dial
 * must stay readable and operable.
 */
@Component({
  selector: 'cp-phase-dial',
  templateUrl: './phase-dial.html',
  styleUrl: './phase-dial.scss',
  imports: [MatFormField, MatLabel, MatInput, MatSuffix, MatHint, MatError],
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [
    { provide: NG_VALUE_ACCESSOR, useExisting: forwardRef(() => CpPhaseDial), multi: true },
    { provide: NG_VALIDATORS, useExisting: forwardRef(() => CpPhaseDial), multi: true },
  ],
  host: {
    class: 'cp-phase-dial',
    '[class.cp-phase-dial--compact]': 'compact()',
    '[class.cp-phase-dial--disabled]': 'disabled()',
    '[class.cp-phase-dial--readonly]': 'readonly()',
    '[class.cp-phase-dial--empty]': '_angle() === null',
    '[class.cp-phase-dial--invalid]': '_errorState()',
    '[class.cp-phase-dial--dragging]': '_dragging() !== null',
    '[style.--cp-phase-dial-size]': '_sizeCss()',
  },
})
export class CpPhaseDial implements ControlValueAccessor, Validator, OnChanges, DoCheck {
  /** The angle in degrees from the reference mark, in [0, 360); null when none is set. */
  readonly value = model<number | null>(null);
  /** The way the rotor turns as seen by the viewer. */
  readonly rotation = input<RotationDirection>('clockwise');
  /** Whether angles count with or against the rotation. */
  readonly counting = input<RotationCounting>('againstRotation');
  /** Where the reference mark (0) sits on screen, in degrees clockwise from 12 o'clock. */
  readonly zeroAtDeg = input(0, { transform: numberAttribute });
  /** Degrees per arrow key press, and the pointer's resolution when there are no positions. */
  readonly step = input(1, { transform: numberAttribute });
  /** Discrete positions (a count, a count from a first angle, or a list): drawn as ticks, snapped to. */
  readonly positions = input<DialPositions | null>(null);
  /** Markers to draw, such as the heavy spot, the trial weight or the correction. */
  readonly markers = input<readonly PhaseDialMarker[]>([]);
  /** The dial with a numeric field beside it, for typing an angle read off an instrument. */
  readonly compact = input(false, { transform: booleanAttribute });
  /** Shows the angle without letting it be changed; it can still be focused and read. */
  readonly readonly = input(false, { transform: booleanAttribute });
  /** Disables the dial; bound as `disabled`, merged with the form's state into `disabled()`. */
  // eslint-disable-next-line @angular-eslint/no-input-rename -- `disabled` names the merged state.
  readonly disabledInput = input(false, { alias: 'disabled', transform: booleanAttribute });
  /** Whether an angle must be set. */
  readonly required = input(false, { transform: booleanAttribute });
  /** The accessible name of the dial, also the visible label of the numeric field. */
  readonly label = input('Angle');
  /**
   * The diameter of the dial in pixels; without it, `--cp-phase-dial-size` (240 px by default, 160 px in
   * the compact variant: large enough to drag with a thumb on a tablet).
   */
  readonly size = input<number | undefined, unknown>(undefined, { transform: numberAttribute });
  /**
   * The page's own message for the control's errors, shown under the dial in place of the dial's own
   * ("Enter the phase of the initial run"); null or empty: the dial says why in its own words. Either
   * shows only while the control is in error state.
   */
  readonly errorText = input<string | null>(null);
  /** Decides when the error shows; by default Material's: invalid and touched, or the form submitted. */
  readonly errorStateMatcher = input<ErrorStateMatcher | null>(null);

  /** Emits the angle when a drag, a key change or a typed entry ends. */
  readonly valueCommit = output<number | null>();

  /** Whether the dial is disabled, by its input or by its form control. */
  readonly disabled = computed(() => this.disabledInput() || this._formDisabled());

  private readonly _formDisabled = signal(false);
  private readonly _destroyRef = inject(DestroyRef);
  private readonly _defaultMatcher = inject(ErrorStateMatcher);
  private readonly _parentFormGroup = inject(FormGroupDirective, { optional: true });
  private readonly _parentForm = inject(NgForm, { optional: true });
  private readonly _matInput = viewChild(MatInput);
  private readonly _dial = viewChild.required<ElementRef<HTMLElement>>('dial');
  private _onChange: (value: number | null) => void = () => undefined;
  private _onTouched: () => void = () => undefined;
  private _onValidatorChange: () => void = () => undefined;
  private _control: AbstractControl | null = null;
  private _keyCommitPending = false;

  private readonly _id = nextId++;
  protected readonly _descriptionId = `cp-phase-dial-description-${this._id}`;
  protected readonly _fieldId = `cp-phase-dial-field-${this._id}`;
  protected readonly _fieldHintId = `cp-phase-dial-field-hint-${this._id}`;
  protected readonly _errorId = `cp-phase-dial-error-${this._id}`;
  protected readonly _viewBox = `0 0 ${DIAL_VIEW_SIZE} ${DIAL_VIEW_SIZE}`;
  protected readonly _center = DIAL_CENTER;
  protected readonly _rimRadius = DIAL_RIM_RADIUS;
  protected readonly _thumbRadius = DIAL_THUMB_RADIUS;
  protected readonly _needleTipRadius = DIAL_NEEDLE_TIP_RADIUS;
  protected readonly _glyphs = MARKER_GLYPHS;
  protected readonly _names = PHASE_DIAL_MARKER_NAMES;
  protected readonly _formatAngle = writeAngle;

  /** The drag in progress: the pointer and the angle it started from. */
  protected readonly _dragging = signal<{ pointerId: number; startValue: number | null } | null>(null);
  /** Whether the form control carries `Validators.required`, which makes the dial required too. */
  private readonly _controlRequired = signal(false);
  /** Whether an angle must be set: by the input, or by the form control's validators, as for matInput. */
  protected readonly _required = computed(() => this.required() || this._controlRequired());
  /** Whether the control is in error state (by default invalid and touched, or its form submitted). */
  protected readonly _errorState = signal(false);
  /** The dial's own words for the control's errors, kept while the control is watched. */
  protected readonly _ownErrorText = signal<string | null>(null);
  /** The sentence shown under the dial: the page's, else the dial's own; null outside error state. */
  protected readonly _shownError = computed(() =>
    this._errorState() ? this.errorText() || this._ownErrorText() : null,
  );
  /** What describes the slider: its description, and the error while one shows. */
  protected readonly _sliderDescribedBy = computed(() =>
    this._shownError() === null ? this._descriptionId : `${this._descriptionId} ${this._errorId}`,
  );
  /** The numeric field's text while the technician types, so half-typed numbers are not rewritten. */
  protected readonly _draft = signal<string | null>(null);

  protected readonly _angle = computed(() => toDialAngle(this.value()));
  protected readonly _editable = computed(() => !this.disabled() && !this.readonly());
  protected readonly _convention = computed<DialConvention>(() => ({
    rotation: this.rotation(),
    counting: this.counting(),
    zeroAtDeg: Number.isFinite(this.zeroAtDeg()) ? this.zeroAtDeg() : 0,
  }));
  protected readonly _positions = computed(() => expandPositions(this.positions()));
  protected readonly _step = computed(() => validStep(this.step()));
  protected readonly _valueMax = computed(() => {
    const positions = this._positions();
    return positions.length > 0 ? positions[positions.length - 1]! : maxDialValue(this._step());
  });
  protected readonly _valueText = computed(() => dialValueText(this._angle(), this.counting()));
  protected readonly _readout = computed(() => {
    const angle = this._angle();
    return angle === null ? '–' : `${writeAngle(angle)}°`;
  });
  protected readonly _description = computed(() => {
    const rotation = this.rotation() === 'clockwise' ? 'clockwise' : 'counter-clockwise';
    const parts = [
      `The rotor turns ${rotation} as seen here.`,
      `The reference mark is ${describeZeroPosition(this._convention().zeroAtDeg)}.`,
    ];
    const positions = this._positions();
    if (positions.length > 0) {
      parts.push(`${positions.length} allowed positions: ${positions.map(writeAngle).join(', ')}.`);
    }
    return parts.join(' ');
  });
  protected readonly _fieldHint = computed(
    () => `Degrees ${this.counting() === 'withRotation' ? 'with' : 'against'} rotation from the mark`,
  );
  protected readonly _sizeCss = computed(() => {
    const size = this.size();
    return typeof size === 'number' && size > 0 ? `${size}px` : null;
  });
  protected readonly _fieldText = computed(() => {
    const draft = this._draft();
    if (draft !== null) return draft;
    const angle = this._angle();
    return angle === null ? '' : writeAngle(angle);
  });

  protected readonly _ticks = computed(() => dialTicks(this._positions(), this._convention()));
  protected readonly _labels = computed(() => dialLabels(this._positions(), this._convention()));
  protected readonly _reference = computed(() => referenceMark(this._convention()));
  protected readonly _rotationArrow = computed(() =>
    rotationArrow(this._convention(), labelledAngles(this._positions())),
  );
  protected readonly _pointer = computed(() => {
    const angle = this._angle();
    if (angle === null) return null;
    const convention = this._convention();
    return {
      line: pointerLine(angle, convention),
      thumb: thumbCenter(angle, convention),
    };
  });
  protected readonly _placedMarkers = computed(() => placeMarkers(this.markers(), this._convention()));

  constructor() {
    // The inner matInput has no form control of its own: it shows the dial's error state, so the form
    // field outlines itself and shows its mat-error exactly when the dial is in error.
    effect(() => {
      const field = this._matInput();
      const errorState = this._errorState();
      if (field && field.errorState !== errorState) {
        field.errorState = errorState;
        field.stateChanges.next();
      }
    });
    const submitted = this._parentFormGroup?.ngSubmit ?? this._parentForm?.ngSubmit;
    submitted?.pipe(takeUntilDestroyed()).subscribe(() => this._updateErrorState());
  }

  /** Moves keyboard focus to the dial. */
  focus(options?: FocusOptions): void {
    this._dial().nativeElement.focus(options);
  }

  /** Tells the form to validate again when the rules change. */
  ngOnChanges(changes: SimpleChanges): void {
    if (changes['required'] || changes['positions']) this._onValidatorChange();
    if (changes['errorStateMatcher']) this._updateErrorState();
  }

  /** Follows the error state as Material's inputs do: touched and submitted change no value. */
  ngDoCheck(): void {
    this._updateErrorState();
  }

  /** Shows the angle the form control holds (ControlValueAccessor). */
  writeValue(value: unknown): void {
    this.value.set(toDialAngle(value));
    this._draft.set(null);
  }

  /** Lets the dial report changes to the form control (ControlValueAccessor). */
  registerOnChange(fn: (value: number | null) => void): void {
    this._onChange = fn;
  }

  /** Lets the dial report that it was touched (ControlValueAccessor). */
  registerOnTouched(fn: () => void): void {
    this._onTouched = fn;
  }

  /** Disables the dial when the form control is disabled (ControlValueAccessor). */
  setDisabledState(isDisabled: boolean): void {
    this._formDisabled.set(isDisabled);
  }

  /** Validates the control's angle: required, a number, in [0, 360), on an allowed position (Validator). */
  validate(control: AbstractControl): ValidationErrors | null {
    this._watch(control);
    return phaseDialErrors(control.value, {
      required: this.required(),
      positions: this._positions(),
      typedText: this._draft(),
    });
  }

  /** Lets the dial ask the form to validate again (Validator). */
  registerOnValidatorChange(fn: () => void): void {
    this._onValidatorChange = fn;
  }

  protected _onKeydown(event: KeyboardEvent): void {
    if (event.altKey || event.ctrlKey || event.metaKey || event.shiftKey || !this._editable()) return;
    const next = nextDialValue(event.key, this._angle(), {
      step: this._step(),
      positions: this._positions(),
    });
    if (next === undefined) return;
    event.preventDefault();
    if (next !== this._angle()) {
      this._change(next);
      this._keyCommitPending = true;
    }
  }

  protected _onKeyup(): void {
    this._commitKeys();
  }

  protected _onDialBlur(): void {
    this._commitKeys();
    this._onTouched();
  }

  protected _onPointerDown(event: PointerEvent): void {
    if (!this._editable() || (event.button ?? 0) !== 0) return;
    const dial = event.currentTarget as HTMLElement;
    // The dial takes focus itself: the default action would also start a text selection or scroll.
    event.preventDefault();
    dial.focus();
    try {
      dial.setPointerCapture?.(event.pointerId);
    } catch {
      // A synthetic event's pointer is not active, and there is nothing to capture.
    }
    this._dragging.set({ pointerId: event.pointerId, startValue: this._angle() });
    this._followPointer(event, dial);
  }

  protected _onPointerMove(event: PointerEvent): void {
    const drag = this._dragging();
    if (drag === null || event.pointerId !== drag.pointerId) return;
    this._followPointer(event, event.currentTarget as HTMLElement);
  }

  protected _onPointerEnd(event: PointerEvent): void {
    const drag = this._dragging();
    if (drag === null || event.pointerId !== drag.pointerId) return;
    this._dragging.set(null);
    if (this._angle() !== drag.startValue) this.valueCommit.emit(this._angle());
  }

  protected _onFieldInput(event: Event): void {
    const text = (event.target as HTMLInputElement).value;
    const wasNumber = this._draftIsNumber();
    this._draft.set(text);
    const parsed = parseAngleText(text);
    if (parsed !== undefined && parsed !== this._angle()) this._change(parsed);
    else if ((parsed !== undefined) !== wasNumber) this._onValidatorChange();
  }

  protected _onFieldChange(): void {
    // Text that is not a number stays, so the technician sees what the error message is about.
    if (!this._draftIsNumber()) return;
    this._draft.set(null);
    this.valueCommit.emit(this._angle());
  }

  protected _onFieldBlur(): void {
    if (this._draftIsNumber()) this._draft.set(null);
    this._onTouched();
  }

  /** Whether the field's text, if any is being typed, reads as an angle (or is empty). */
  private _draftIsNumber(): boolean {
    const draft = this._draft();
    return draft === null || parseAngleText(draft) !== undefined;
  }

  private _followPointer(event: PointerEvent, dial: HTMLElement): void {
    const rect = dial.getBoundingClientRect();
    const center = { x: rect.left + rect.width / 2, y: rect.top + rect.height / 2 };
    const distance = Math.hypot(event.clientX - center.x, event.clientY - center.y);
    if (distance < (CENTER_DEAD_ZONE * rect.width) / 2) return;
    const angle = angleAtPoint(center, { x: event.clientX, y: event.clientY }, this._convention());
    const snapped = snapAngle(angle, { step: this._step(), positions: this._positions() });
    if (snapped !== this._angle()) this._change(snapped);
  }

  private _change(angle: number | null): void {
    this.value.set(angle);
    this._onChange(angle);
  }

  private _commitKeys(): void {
    if (!this._keyCommitPending) return;
    this._keyCommitPending = false;
    this.valueCommit.emit(this._angle());
  }

  /** Follows the control's status and touched state, so the dial shows an error as form fields do. */
  private _watch(control: AbstractControl): void {
    if (control === this._control) return;
    this._control = control;
    control.events.pipe(takeUntilDestroyed(this._destroyRef)).subscribe(() => this._updateErrorState());
  }

  /** Asks the error state matcher whether the error shows, and words the control's errors. */
  private _updateErrorState(): void {
    const control = this._control;
    const matcher = this.errorStateMatcher() ?? this._defaultMatcher;
    const form = this._parentFormGroup ?? this._parentForm;
    this._errorState.set(control !== null && matcher.isErrorState(control, form));
    this._ownErrorText.set(phaseDialErrorMessage(control?.errors ?? null));
    this._controlRequired.set(control?.hasValidator(Validators.required) ?? false);
  }
}
