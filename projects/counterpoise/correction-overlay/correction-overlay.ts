import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  type ElementRef,
  afterNextRender,
  booleanAttribute,
  computed,
  effect,
  forwardRef,
  inject,
  input,
  linkedSignal,
  model,
  output,
  signal,
  viewChild,
} from '@angular/core';
import { type ControlValueAccessor, NG_VALUE_ACCESSOR } from '@angular/forms';
import {
  type DialConvention,
  type DialPositions,
  type RotationCounting,
  type RotationDirection,
  type _ScreenPoint as ScreenPoint,
  _angleAtPoint as angleAtPoint,
  _describeAngle as describeAngle,
  _expandPositions as expandPositions,
  _normalizeDeg as normalizeDeg,
  _pointAtAngle as pointAtAngle,
} from '@counterpoise/ng/core';
import { type PhotoState, describeOverlay } from './overlay-description';
import {
  defaultCalibration,
  fittedFrame,
  frameFromCalibration,
  nudgeHandle,
  photoToStage,
  stageToPhoto,
  withHandleAt,
} from './overlay-geometry';
import {
  type BlockedSector,
  CALIBRATION_HANDLES,
  type CalibrationHandle,
  type OverlayPoint,
  type OverlayWeight,
  type PhotoCalibration,
  type RotorPhoto,
} from './overlay-model';
import { type SceneGlyph, buildOverlayScene } from './overlay-scene';

let nextId = 0;

/** The stage width used until the element is measured (and on the server). */
const UNMEASURED_WIDTH_PX = 360;
/** Photos are usually 4:3 landscape; used until the image tells its own proportions. */
const UNKNOWN_PHOTO_ASPECT = 4 / 3;
/** A handle moves by half a percent of the photo per arrow key: about 2 px on a tablet, fine enough to sit on a rim. */
const HANDLE_STEP = 0.005;
const CROSSHAIR_RADIUS_STEP = 0.05;
const CROSSHAIR_MAX_RADIUS = 1.25;

const DEFAULT_LABEL = 'Where the correction weight goes, end view of the rotor';

const HANDLE_NAMES: Record<CalibrationHandle, string> = {
  centre: 'Centre',
  rim: 'Rim',
  referenceMark: 'Ref mark',
};

type LegendKind =
  | 'correction'
  | 'conflict'
  | 'existing'
  | 'heavySpot'
  | 'sensor'
  | 'reference'
  | 'rotation'
  | 'allowed'
  | 'blocked'
  | 'marked';

function roundPoint(angleDeg: number, radiusFraction: number): OverlayPoint {
  return {
    angleDeg: normalizeDeg(Math.round(angleDeg)),
    radiusFraction: Math.round(radiusFraction * 100) / 100,
  };
}

function isOverlayPoint(value: unknown): value is OverlayPoint {
  if (typeof value !== 'object' || value === null) return false;
  const { angleDeg, radiusFraction } = value as Partial<OverlayPoint>;
  return Number.isFinite(angleDeg) && Number.isFinite(radiusFraction);
}

/**
 * An end view of the rotor that shows where the correction weight goes: reference mark, sensor line,
 * rotation arrow, heavy spot, corrections with mass and angle, allowed positions, blocked sectors and the
 * weights already on. It can lie over a photo of the technician's own rotor, calibrated by dragging three
 * handles. Clicking or tapping a point (or Enter on the keyboard crosshair) marks where a weight really went;
 * as a form control its value is that marked point. Everything drawn is also said in words.
 */
@Component({
  selector: 'cp-correction-overlay',
  templateUrl: './correction-overlay.html',
  styleUrl: './correction-overlay.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [
    { provide: NG_VALUE_ACCESSOR, useExisting: forwardRef(() => CpCorrectionOverlay), multi: true },
  ],
  host: {
    class: 'cp-correction-overlay',
    '[class.cp-correction-overlay--pickable]': '_canPick()',
    '[class.cp-correction-overlay--calibrating]': '_calibrating()',
    '[class.cp-correction-overlay--disabled]': 'disabled()',
    '[class.cp-correction-overlay--on-photo]': '_photoShown()',
    '(click)': '_onClick($event)',
  },
})
export class CpCorrectionOverlay implements ControlValueAccessor {
  /** The way the rotor turns, as seen in this end view. */
  readonly rotation = input<RotationDirection>('clockwise');
  /** Which way angles are counted from the reference mark. */
  readonly counting = input<RotationCounting>('againstRotation');
  /** Where the reference mark is drawn, clockwise from 12 o'clock; a calibrated photo overrides it. */
  readonly zeroAtDeg = input(0);
  /** The rotor angle in line with the sensor, drawn as a line from the centre; none when null. */
  readonly sensorAngleDeg = input<number | null>(null);
  /** The heavy spot's angle; none when null. */
  readonly heavySpotDeg = input<number | null>(null);
  /** The correction weights to fit (several when a correction is split). */
  readonly corrections = input<readonly OverlayWeight[]>([]);
  /** Weights already on the rotor. */
  readonly existingWeights = input<readonly OverlayWeight[]>([]);
  /** Where weights can go (holes, lugs): a count, a count from a first angle, or a list of angles. */
  readonly allowedPositions = input<DialPositions | null>(null);
  /** Stretches of the rim where no weight can go. */
  readonly blockedSectors = input<readonly BlockedSector[]>([]);
  /** A photo of the rotor to draw over, with its calibration. */
  readonly photo = input<RotorPhoto | null>(null);
  /** Shows the centre, rim and reference-mark handles on the photo to calibrate it. */
  readonly calibrating = input(false, { transform: booleanAttribute });
  /** Whether a click, a tap or Enter on the crosshair marks a point. */
  readonly pickable = input(true, { transform: booleanAttribute });
  /** The accessible name of the drawing; the default one when empty. */
  readonly label = input(DEFAULT_LABEL);
  /** Shows a key to the symbols under the drawing. */
  readonly legend = input(true, { transform: booleanAttribute });
  /** Stops marking points; bound as `disabled`, merged with the form's state into `disabled()`. */
  // eslint-disable-next-line @angular-eslint/no-input-rename -- `disabled` names the merged state.
  readonly disabledInput = input(false, { alias: 'disabled', transform: booleanAttribute });
  /** The point marked last, drawn on the rotor; the form value when used as a form control. */
  readonly markedPoint = model<OverlayPoint | null>(null);

  /** A point was marked by click, tap or Enter: the angle in whole degrees and the distance as a fraction of the radius. */
  readonly pointPicked = output<OverlayPoint>();
  /** A calibration handle was moved (at the end of a drag, or per arrow key). */
  readonly calibrationChange = output<PhotoCalibration>();

  private readonly _formDisabled = signal(false);
  /** Whether marking is switched off, by the `disabled` input or by a form. */
  readonly disabled = computed(() => this.disabledInput() || this._formDisabled());

  private readonly _id = `cp-correction-overlay-${nextId++}`;
  protected readonly _descriptionId = `${this._id}-description`;
  protected readonly _crosshairHelpId = `${this._id}-crosshair-help`;
  protected readonly _crosshairPositionId = `${this._id}-crosshair-position`;
  protected readonly _handleHelpId = `${this._id}-handle-help`;
  protected readonly _hatchId = `${this._id}-hatch`;
  protected readonly _handles = CALIBRATION_HANDLES;
  protected readonly _handleNames = HANDLE_NAMES;

  private readonly _stage = viewChild.required<ElementRef<HTMLElement>>('stage');
  private readonly _measuredWidth = signal(UNMEASURED_WIDTH_PX);
  private readonly _photoAspect = signal<{ src: string; ratio: number } | null>(null);
  private readonly _failedPhoto = signal<string | null>(null);
  private _onChange: (value: OverlayPoint | null) => void = () => undefined;
  private _onTouched: () => void = () => undefined;
  private _drag: { handle: CalibrationHandle; offset: ScreenPoint } | null = null;

  protected readonly _name = computed(() => this.label().trim() || DEFAULT_LABEL);

  protected readonly _photoShown = computed(() => {
    const photo = this.photo();
    return photo !== null && photo.src !== this._failedPhoto();
  });

  private readonly _aspect = computed(() => {
    const photo = this.photo();
    if (!photo || !this._photoShown()) return 1;
    if (photo.aspectRatio && photo.aspectRatio > 0) return photo.aspectRatio;
    const loaded = this._photoAspect();
    return loaded?.src === photo.src ? loaded.ratio : UNKNOWN_PHOTO_ASPECT;
  });

  protected readonly _size = computed(() => {
    const width = this._measuredWidth();
    return { width, height: Math.round(width / this._aspect()) };
  });

  /** The calibration being edited: the photo's own until a handle moves. */
  private readonly _draftCalibration = linkedSignal<PhotoCalibration | null>(
    () => this.photo()?.calibration ?? null,
  );

  protected readonly _calibrating = computed(() => this.calibrating() && this._photoShown());

  protected readonly _handlePoints = computed(
    () => this._draftCalibration() ?? defaultCalibration(this._size(), this.zeroAtDeg()),
  );

  private readonly _calibration = computed(() => {
    if (!this._photoShown()) return null;
    return this._calibrating() ? this._handlePoints() : this._draftCalibration();
  });

  private readonly _frame = computed(() => {
    const calibration = this._calibration();
    return calibration
      ? frameFromCalibration(calibration, this._size())
      : fittedFrame(this._size(), this.zeroAtDeg());
  });

  protected readonly _convention = computed<DialConvention>(() => ({
    rotation: this.rotation(),
    counting: this.counting(),
    zeroAtDeg: this._frame().zeroAtDeg,
  }));

  private readonly _positions = computed(() => expandPositions(this.allowedPositions()));

  protected readonly _scene = computed(() =>
    buildOverlayScene({
      size: this._size(),
      frame: this._frame(),
      rotation: this.rotation(),
      counting: this.counting(),
      sensorAngleDeg: this.sensorAngleDeg(),
      heavySpotDeg: this.heavySpotDeg(),
      corrections: this.corrections(),
      existingWeights: this.existingWeights(),
      allowedPositions: this._positions(),
      blockedSectors: this.blockedSectors(),
      markedPoint: this.markedPoint(),
    }),
  );

  private readonly _photoState = computed<PhotoState>(() => {
    const photo = this.photo();
    if (!photo) return 'none';
    if (!this._photoShown()) return 'failed';
    return this._calibration() ? 'calibrated' : 'uncalibrated';
  });

  protected readonly _description = computed(() =>
    describeOverlay({
      rotation: this.rotation(),
      counting: this.counting(),
      zeroScreenDeg: this._frame().zeroAtDeg,
      sensorAngleDeg: this.sensorAngleDeg(),
      heavySpotDeg: this.heavySpotDeg(),
      corrections: this.corrections(),
      existingWeights: this.existingWeights(),
      allowedPositions: this._positions(),
      blockedSectors: this.blockedSectors(),
      markedPoint: this.markedPoint(),
      photo: this._photoState(),
      calibrating: this._calibrating(),
    }),
  );

  protected readonly _legend = computed(() => {
    const scene = this._scene();
    const entries: { kind: LegendKind; text: string }[] = [];
    if (scene.corrections.length > 0) entries.push({ kind: 'correction', text: 'Correction' });
    if (scene.existing.length > 0) entries.push({ kind: 'existing', text: 'Existing weight' });
    if ([...scene.corrections, ...scene.existing].some((weight) => weight.conflict)) {
      entries.push({ kind: 'conflict', text: 'Weight in a blocked sector' });
    }
    if (scene.heavySpot) entries.push({ kind: 'heavySpot', text: 'Heavy spot' });
    if (scene.sensor) entries.push({ kind: 'sensor', text: 'Sensor' });
    entries.push({ kind: 'reference', text: 'Reference mark' });
    entries.push({ kind: 'rotation', text: 'Rotation' });
    if (scene.allowed.length > 0) entries.push({ kind: 'allowed', text: 'Allowed position' });
    if (scene.blocked.length > 0) entries.push({ kind: 'blocked', text: 'Blocked' });
    if (scene.marked) entries.push({ kind: 'marked', text: 'Marked point' });
    return entries;
  });

  protected readonly _canPick = computed(() => this.pickable() && !this.disabled() && !this._calibrating());

  /** Where the keyboard crosshair is: the marked point, else the first correction near the rim. */
  protected readonly _crosshair = linkedSignal<OverlayPoint>(
    () => this.markedPoint() ?? roundPoint(this.corrections()[0]?.angleDeg ?? 0, 0.9),
  );
  protected readonly _crosshairFocused = signal(false);
  protected readonly _announcement = signal('');

  protected readonly _crosshairPoint = computed(() => {
    const { center, radius } = this._frame();
    const crosshair = this._crosshair();
    return pointAtAngle(center, radius * crosshair.radiusFraction, crosshair.angleDeg, this._convention());
  });

  protected readonly _crosshairRing = computed(() => this._frame().radius * this._crosshair().radiusFraction);

  protected readonly _crosshairSpoke = computed(() => {
    const { center, radius } = this._frame();
    const crosshair = this._crosshair();
    const reach = Math.max(radius, radius * crosshair.radiusFraction) + 8;
    return pointAtAngle(center, reach, crosshair.angleDeg, this._convention());
  });

  protected readonly _crosshairText = computed(() => this._describePoint(this._crosshair()));

  protected readonly _crosshairReadout = computed(() => {
    const { angleDeg, radiusFraction } = this._crosshair();
    return `${angleDeg}° · ${Math.round(radiusFraction * 100)}% radius`;
  });

  constructor() {
    const destroyRef = inject(DestroyRef);
    afterNextRender(() => {
      const stage = this._stage().nativeElement;
      const measure = (width: number) => {
        if (width > 0) this._measuredWidth.set(Math.round(width));
      };
      measure(stage.clientWidth);
      if (typeof ResizeObserver === 'undefined') return;
      const observer = new ResizeObserver((entries) => measure(entries[0]?.contentRect.width ?? 0));
      observer.observe(stage);
      destroyRef.onDestroy(() => observer.disconnect());
    });

    // The photo's proportions set the stage's, so they are read from the image itself when not given.
    effect((onCleanup) => {
      const photo = this.photo();
      if (!photo || (photo.aspectRatio && photo.aspectRatio > 0) || typeof Image === 'undefined') return;
      const image = new Image();
      let current = true;
      image.onload = () => {
        if (current && image.naturalWidth > 0 && image.naturalHeight > 0) {
          this._photoAspect.set({ src: photo.src, ratio: image.naturalWidth / image.naturalHeight });
        }
      };
      image.onerror = () => {
        if (current) this._failedPhoto.set(photo.src);
      };
      image.src = photo.src;
      onCleanup(() => (current = false));
    });
  }

  /** Sets the marked point (forms). */
  writeValue(value: unknown): void {
    this.markedPoint.set(isOverlayPoint(value) ? roundPoint(value.angleDeg, value.radiusFraction) : null);
  }

  /** Registers the form's change callback. */
  registerOnChange(fn: (value: OverlayPoint | null) => void): void {
    this._onChange = fn;
  }

  /** Registers the form's touched callback. */
  registerOnTouched(fn: () => void): void {
    this._onTouched = fn;
  }

  /** Disables marking (forms). */
  setDisabledState(isDisabled: boolean): void {
    this._formDisabled.set(isDisabled);
  }

  protected _transform(glyph: SceneGlyph): string {
    return `translate(${glyph.x} ${glyph.y}) rotate(${glyph.rotateDeg})`;
  }

  protected _percent(value: number, of: number): number {
    return of > 0 ? (value / of) * 100 : 0;
  }

  protected _handleStage(handle: CalibrationHandle): ScreenPoint {
    return photoToStage(this._handlePoints()[handle], this._size());
  }

  protected _handleLabel(handle: CalibrationHandle): string {
    const point = this._handlePoints()[handle];
    return `${HANDLE_NAMES[handle]} handle: ${Math.round(point.x * 100)}% across, ${Math.round(point.y * 100)}% down`;
  }

  protected _onClick(event: MouseEvent): void {
    if (!this._canPick()) return;
    const stage = this._stage().nativeElement;
    if (!(event.target instanceof Node) || !stage.contains(event.target)) return;
    const at = this._toStage(event.clientX, event.clientY);
    const { center, radius } = this._frame();
    const angle = angleAtPoint(center, at, this._convention());
    this._pick(roundPoint(angle, Math.hypot(at.x - center.x, at.y - center.y) / radius));
  }

  protected _onCrosshairKeydown(event: KeyboardEvent): void {
    if (event.altKey || event.ctrlKey || event.metaKey || !this._canPick()) return;
    const { angleDeg, radiusFraction } = this._crosshair();
    const turn = (by: number) => roundPoint(angleDeg + by, radiusFraction);
    const reach = (by: number) =>
      roundPoint(angleDeg, Math.min(CROSSHAIR_MAX_RADIUS, Math.max(0, radiusFraction + by)));
    const moves: Record<string, () => OverlayPoint> = {
      ArrowRight: () => turn(1),
      ArrowLeft: () => turn(-1),
      PageUp: () => turn(10),
      PageDown: () => turn(-10),
      Home: () => roundPoint(0, radiusFraction),
      ArrowUp: () => reach(CROSSHAIR_RADIUS_STEP),
      ArrowDown: () => reach(-CROSSHAIR_RADIUS_STEP),
    };
    if (event.key === 'Enter' || event.key === ' ') {
      event.preventDefault();
      this._pick(this._crosshair());
      return;
    }
    const move = moves[event.key];
    if (!move) return;
    event.preventDefault();
    const next = move();
    this._crosshair.set(next);
    this._announcement.set(this._describePoint(next));
  }

  protected _onCrosshairFocus(): void {
    this._crosshairFocused.set(true);
  }

  protected _onCrosshairBlur(): void {
    this._crosshairFocused.set(false);
    this._announcement.set('');
    this._onTouched();
  }

  protected _onHandlePointerDown(event: PointerEvent, handle: CalibrationHandle): void {
    if ((event.button ?? 0) !== 0) return;
    event.preventDefault();
    const target = event.currentTarget as HTMLElement | null;
    target?.focus();
    try {
      target?.setPointerCapture?.(event.pointerId);
    } catch {
      // A synthetic event has no live pointer to capture; moves still reach the handle directly.
    }
    const at = this._toStage(event.clientX, event.clientY);
    const handleAt = this._handleStage(handle);
    this._drag = { handle, offset: { x: handleAt.x - at.x, y: handleAt.y - at.y } };
  }

  protected _onHandlePointerMove(event: PointerEvent, handle: CalibrationHandle): void {
    if (this._drag?.handle !== handle) return;
    const at = this._toStage(event.clientX, event.clientY);
    const to = stageToPhoto({ x: at.x + this._drag.offset.x, y: at.y + this._drag.offset.y }, this._size());
    this._draftCalibration.set(withHandleAt(this._handlePoints(), handle, to));
  }

  protected _onHandlePointerUp(event: PointerEvent, handle: CalibrationHandle): void {
    if (this._drag?.handle !== handle) return;
    this._onHandlePointerMove(event, handle);
    this._drag = null;
    this.calibrationChange.emit(this._handlePoints());
  }

  protected _onHandleKeydown(event: KeyboardEvent, handle: CalibrationHandle): void {
    if (event.altKey || event.ctrlKey || event.metaKey) return;
    const steps: Record<string, [number, number]> = {
      ArrowRight: [1, 0],
      ArrowLeft: [-1, 0],
      ArrowDown: [0, 1],
      ArrowUp: [0, -1],
    };
    const step = steps[event.key];
    if (!step) return;
    event.preventDefault();
    const next = nudgeHandle(this._handlePoints(), handle, step[0] * HANDLE_STEP, step[1] * HANDLE_STEP);
    this._draftCalibration.set(next);
    this.calibrationChange.emit(next);
  }

  private _pick(point: OverlayPoint): void {
    if (!this._canPick()) return;
    this.markedPoint.set(point);
    this._crosshair.set(point);
    this._onChange(point);
    this._onTouched();
    this.pointPicked.emit(point);
    this._announcement.set(`Marked: ${this._describePoint(point)}.`);
  }

  private _describePoint(point: OverlayPoint): string {
    return `${describeAngle(point.angleDeg, this.counting())}, at ${Math.round(point.radiusFraction * 100)}% of the radius`;
  }

  /** A pointer position in stage pixels; the stage's viewBox is its own size, so only its offset and zoom matter. */
  private _toStage(clientX: number, clientY: number): ScreenPoint {
    const rect = this._stage().nativeElement.getBoundingClientRect();
    const { width, height } = this._scene();
    const scaleX = rect.width > 0 ? width / rect.width : 1;
    const scaleY = rect.height > 0 ? height / rect.height : 1;
    return { x: (clientX - rect.left) * scaleX, y: (clientY - rect.top) * scaleY };
  }
}
