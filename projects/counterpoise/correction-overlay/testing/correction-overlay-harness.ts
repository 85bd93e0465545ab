import {
  type BaseHarnessFilters,
  ComponentHarness,
  HarnessPredicate,
  type TestElement,
  TestKey,
  parallel,
} from '@angular/cdk/testing';
import {
  type RotationCounting,
  type RotationDirection,
  _pointAtAngle as pointAtAngle,
} from '@counterpoise/ng/core';
import type { CalibrationHandle, OverlayPoint, PhotoPoint } from '@counterpoise/ng/correction-overlay';

/** Filters for finding a `cp-correction-overlay`. */
export interface CorrectionOverlayHarnessFilters extends BaseHarnessFilters {
  /** Only the overlay whose accessible name matches. */
  label?: string | RegExp;
}

/** Reads and drives a `cp-correction-overlay` in tests: its words, its labels, marking points and calibrating. */
export class CpCorrectionOverlayHarness extends ComponentHarness {
  static hostSelector = 'cp-correction-overlay';

  private readonly _drawing = this.locatorFor('.cp-correction-overlay__drawing');
  private readonly _stage = this.locatorFor('.cp-correction-overlay__stage');
  private readonly _descriptionLines = this.locatorForAll('.cp-correction-overlay__description li');
  private readonly _legendItems = this.locatorForAll('.cp-correction-overlay__legend-item');
  private readonly _crosshair = this.locatorForOptional('.cp-correction-overlay__crosshair');

  /** A predicate that finds an overlay by its accessible name. */
  static with(options: CorrectionOverlayHarnessFilters = {}): HarnessPredicate<CpCorrectionOverlayHarness> {
    return new HarnessPredicate(CpCorrectionOverlayHarness, options).addOption(
      'label',
      options.label,
      (harness, label) => HarnessPredicate.stringMatches(harness.getLabel(), label),
    );
  }

  /** The accessible name of the drawing. */
  async getLabel(): Promise<string> {
    return (await (await this._drawing()).getAttribute('aria-label')) ?? '';
  }

  /** The text alternative, every sentence in order, as one string. */
  async getDescription(): Promise<string> {
    return (await this.getDescriptionLines()).join(' ');
  }

  /** The text alternative, one entry per line. */
  async getDescriptionLines(): Promise<string[]> {
    const lines = await this._descriptionLines();
    return parallel(() => lines.map((line) => line.text()));
  }

  /** The labels drawn beside the corrections, e.g. "84 g at 100°". */
  async getCorrectionLabels(): Promise<string[]> {
    return this._labelTexts('correction');
  }

  /** The labels drawn beside the existing weights. */
  async getExistingWeightLabels(): Promise<string[]> {
    return this._labelTexts('existing');
  }

  /** The labels drawn on blocked sectors; a label with no room is left out of the drawing (never of the text alternative). */
  async getBlockedSectorLabels(): Promise<string[]> {
    return this._labelTexts('blocked');
  }

  /** Whether the label of the correction at `index` is drawn as lying in a blocked sector. */
  async isCorrectionBlocked(index: number): Promise<boolean> {
    const labels = await this.locatorForAll('.cp-correction-overlay__label--correction')();
    const label = labels[index];
    if (!label) throw new Error(`The overlay has no correction at index ${index}.`);
    return label.hasClass('cp-correction-overlay__label--conflict');
  }

  /** The entries of the key under the drawing. */
  async getLegend(): Promise<string[]> {
    const items = await this._legendItems();
    return parallel(() => items.map((item) => item.text()));
  }

  /** Whether a click, a tap or the keyboard crosshair marks a point. */
  async isPickable(): Promise<boolean> {
    return (await this._crosshair()) !== null;
  }

  /** Whether the calibration handles are shown. */
  async isCalibrating(): Promise<boolean> {
    return (await this.host()).hasClass('cp-correction-overlay--calibrating');
  }

  /** Clicks the point of the rotor at a rotor angle and a fraction of the radius. */
  async pickAt(angleDeg: number, radiusFraction: number): Promise<void> {
    const drawing = await this._drawing();
    const [cx, cy, radius, zero, rotation, counting, viewBox] = await parallel(() => [
      drawing.getAttribute('data-center-x'),
      drawing.getAttribute('data-center-y'),
      drawing.getAttribute('data-radius'),
      drawing.getAttribute('data-zero-at-deg'),
      drawing.getAttribute('data-rotation'),
      drawing.getAttribute('data-counting'),
      drawing.getAttribute('viewBox'),
    ]);
    const point = pointAtAngle({ x: Number(cx), y: Number(cy) }, Number(radius) * radiusFraction, angleDeg, {
      rotation: rotation as RotationDirection,
      counting: counting as RotationCounting,
      zeroAtDeg: Number(zero),
    });
    const { scaleX, scaleY } = await this._stageScale(viewBox ?? null);
    await (await this._stage()).click(point.x * scaleX, point.y * scaleY);
  }

  /** Where the keyboard crosshair is. */
  async getCrosshair(): Promise<OverlayPoint> {
    const crosshair = await this._requireCrosshair();
    const [angle, radius] = await parallel(() => [
      crosshair.getAttribute('data-angle-deg'),
      crosshair.getAttribute('data-radius-fraction'),
    ]);
    return { angleDeg: Number(angle), radiusFraction: Number(radius) };
  }

  /** Moves the crosshair with arrow keys: `turn` steps of 1 degree (negative: back), `reach` steps of 5 % of the radius (negative: in). */
  async moveCrosshair(turn: number, reach = 0): Promise<void> {
    const crosshair = await this._requireCrosshair();
    await crosshair.focus();
    await this._press(crosshair, turn, TestKey.RIGHT_ARROW, TestKey.LEFT_ARROW);
    await this._press(crosshair, reach, TestKey.UP_ARROW, TestKey.DOWN_ARROW);
  }

  /** Marks the crosshair's point with Enter. */
  async markWithKeyboard(): Promise<void> {
    const crosshair = await this._requireCrosshair();
    await crosshair.focus();
    await crosshair.sendKeys(TestKey.ENTER);
  }

  /** Where a calibration handle is, as fractions of the photo. */
  async getHandlePosition(handle: CalibrationHandle): Promise<PhotoPoint> {
    const element = await this._handle(handle);
    const [x, y] = await parallel(() => [element.getAttribute('data-x'), element.getAttribute('data-y')]);
    return { x: Number(x), y: Number(y) };
  }

  /** Moves a calibration handle with arrow keys: `right` and `down` steps of half a percent of the photo (negative: left, up). */
  async moveHandle(handle: CalibrationHandle, right: number, down = 0): Promise<void> {
    const element = await this._handle(handle);
    await element.focus();
    await this._press(element, right, TestKey.RIGHT_ARROW, TestKey.LEFT_ARROW);
    await this._press(element, down, TestKey.DOWN_ARROW, TestKey.UP_ARROW);
  }

  /** Drags a calibration handle to a point of the photo with pointer events. */
  async dragHandle(handle: CalibrationHandle, to: PhotoPoint): Promise<void> {
    const element = await this._handle(handle);
    const from = await this.getHandlePosition(handle);
    const drawing = await this._drawing();
    const viewBox = await drawing.getAttribute('viewBox');
    const [, , width = 0, drawnHeight = 0] = (viewBox ?? '').split(' ').map(Number);
    // The photo fills the stage's own height; rows of labels below it make the drawing taller.
    const height = Number(await drawing.getAttribute('data-stage-height')) || drawnHeight;
    const { scaleX, scaleY, left, top } = await this._stageScale(viewBox);
    const client = (p: PhotoPoint) => ({
      clientX: left + p.x * width * scaleX,
      clientY: top + p.y * height * scaleY,
      pointerId: 1,
      button: 0,
    });
    await element.dispatchEvent('pointerdown', client(from));
    await element.dispatchEvent('pointermove', client(to));
    await element.dispatchEvent('pointerup', client(to));
  }

  private async _labelTexts(kind: string): Promise<string[]> {
    const texts = await this.locatorForAll(
      `.cp-correction-overlay__label--${kind} .cp-correction-overlay__label-text`,
    )();
    return parallel(() => texts.map((text) => text.text()));
  }

  private async _requireCrosshair(): Promise<TestElement> {
    const crosshair = await this._crosshair();
    if (!crosshair)
      throw new Error('The overlay does not mark points now (not pickable, disabled or calibrating).');
    return crosshair;
  }

  private async _handle(handle: CalibrationHandle): Promise<TestElement> {
    const element = await this.locatorForOptional(
      `.cp-correction-overlay__handle[data-handle="${handle}"]`,
    )();
    if (!element) throw new Error('The overlay is not calibrating a photo.');
    return element;
  }

  private async _press(element: TestElement, times: number, forward: TestKey, back: TestKey): Promise<void> {
    for (let i = 0; i < Math.abs(times); i++) await element.sendKeys(times > 0 ? forward : back);
  }

  /** The stage's zoom from viewBox units to its rendered size; 1 where nothing is laid out (jsdom). */
  private async _stageScale(viewBox: string | null) {
    const [, , width = 0, height = 0] = (viewBox ?? '').split(' ').map(Number);
    const { left, top, width: shownWidth, height: shownHeight } = await (await this._stage()).getDimensions();
    return {
      left,
      top,
      scaleX: shownWidth > 0 && width > 0 ? shownWidth / width : 1,
      scaleY: shownHeight > 0 && height > 0 ? shownHeight / height : 1,
    };
  }
}
