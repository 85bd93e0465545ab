import {
  type BaseHarnessFilters,
  ComponentHarness,
  HarnessPredicate,
  type ModifierKeys,
  TestKey,
  parallel,
} from '@angular/cdk/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import {
  type DialConvention,
  _normalizeDeg as normalizeDeg,
  _pointAtScreenAngle as pointAtScreenAngle,
  _screenAngleDeg as screenAngleDeg,
} from '@counterpoise/ng/core';
import type { PhaseDialMarkerKind } from '@counterpoise/ng/phase-dial';

/** A key the dial handles, for `pressKey`. */
export type PhaseDialKey =
  'ArrowUp' | 'ArrowRight' | 'ArrowDown' | 'ArrowLeft' | 'PageUp' | 'PageDown' | 'Home' | 'End';

/** Filters for finding a `cp-phase-dial`. */
export interface PhaseDialHarnessFilters extends BaseHarnessFilters {
  /** Only the dial whose accessible name matches. */
  label?: string | RegExp;
  /** Only the dial showing this angle (null: no angle set). */
  value?: number | null;
}

/** A marker as the dial's legend lists it. */
export interface PhaseDialMarkerInfo {
  /** What the marker stands for. */
  kind: PhaseDialMarkerKind;
  /** The marker's own detail, or an empty string. */
  label: string;
  /** Its angle in degrees, as the legend shows it. */
  angleDeg: number;
}

const KEYS: Readonly<Record<PhaseDialKey, TestKey>> = {
  ArrowUp: TestKey.UP_ARROW,
  ArrowRight: TestKey.RIGHT_ARROW,
  ArrowDown: TestKey.DOWN_ARROW,
  ArrowLeft: TestKey.LEFT_ARROW,
  PageUp: TestKey.PAGE_UP,
  PageDown: TestKey.PAGE_DOWN,
  Home: TestKey.HOME,
  End: TestKey.END,
};

/** Two angles this close are the same angle. */
const TOLERANCE_DEG = 1e-6;

/** Reads and drives a `cp-phase-dial` in tests: its angle, its states and its markers. */
export class CpPhaseDialHarness extends ComponentHarness {
  static hostSelector = 'cp-phase-dial';

  private readonly _dial = this.locatorFor('[role="slider"]');
  private readonly _field = this.locatorForOptional('input.cp-phase-dial__input');
  private readonly _legendItems = this.locatorForAll('.cp-phase-dial__legend-item');
  private readonly _description = this.locatorFor('.cp-phase-dial__description');
  private readonly _error = this.locatorForOptional('.cp-phase-dial__error');
  private readonly _formField = this.locatorForOptional(MatFormFieldHarness);

  /** A predicate that finds a dial by its accessible name or its angle. */
  static with(options: PhaseDialHarnessFilters = {}): HarnessPredicate<CpPhaseDialHarness> {
    return new HarnessPredicate(CpPhaseDialHarness, options)
      .addOption('label', options.label, (harness, label) =>
        HarnessPredicate.stringMatches(harness.getLabel(), label),
      )
      .addOption('value', options.value, async (harness, value) => {
        const shown = await harness.getValue();
        return value === null || shown === null ? shown === value : Math.abs(shown - value) < TOLERANCE_DEG;
      });
  }

  /** The dial's accessible name. */
  async getLabel(): Promise<string> {
    return (await (await this._dial()).getAttribute('aria-label')) ?? '';
  }

  /** The angle shown, in degrees; null when none is set. */
  async getValue(): Promise<number | null> {
    const [empty, now] = await parallel(() => [
      this.host().then((host) => host.hasClass('cp-phase-dial--empty')),
      this._dial().then((dial) => dial.getAttribute('aria-valuenow')),
    ]);
    return empty || now === null ? null : Number(now);
  }

  /** The angle as a screen reader speaks it. */
  async getValueText(): Promise<string> {
    return (await (await this._dial()).getAttribute('aria-valuetext')) ?? '';
  }

  /** The largest angle the keyboard reaches (the last position, or 359 for a step of 1). */
  async getMax(): Promise<number> {
    return Number(await (await this._dial()).getAttribute('aria-valuemax'));
  }

  /** How the dial describes itself to a screen reader: rotation, reference mark, positions. */
  async getDescription(): Promise<string> {
    return (await this._description()).text();
  }

  /** Whether the dial is disabled, by its input or by its form control. */
  async isDisabled(): Promise<boolean> {
    return (await (await this._dial()).getAttribute('aria-disabled')) === 'true';
  }

  /** Whether the dial only shows its angle. */
  async isReadonly(): Promise<boolean> {
    return (await (await this._dial()).getAttribute('aria-readonly')) === 'true';
  }

  /** Whether an angle must be set. */
  async isRequired(): Promise<boolean> {
    return (await (await this._dial()).getAttribute('aria-required')) === 'true';
  }

  /**
   * Whether the dial is in error state: its form control invalid and touched, or its form submitted
   * (or whatever its `errorStateMatcher` decides).
   */
  async isInvalid(): Promise<boolean> {
    return (await (await this._dial()).getAttribute('aria-invalid')) === 'true';
  }

  /** The error message shown under the dial (the page's `errorText` or the dial's own); null when none. */
  async getErrorText(): Promise<string | null> {
    const error = await this._error();
    return error ? (await error.text()).trim() : null;
  }

  /** The Material form field of the compact variant, for its label, hint and error; null on a full dial. */
  async getFormField(): Promise<MatFormFieldHarness | null> {
    return this._formField();
  }

  /** The rendered diameter of the dial, in pixels. */
  async getSizePx(): Promise<number> {
    return (await (await this._dial()).getDimensions()).width;
  }

  /** Whether the dial has the numeric field beside it. */
  async isCompact(): Promise<boolean> {
    return (await this.host()).hasClass('cp-phase-dial--compact');
  }

  /** Focuses the dial. */
  async focus(): Promise<void> {
    await (await this._dial()).focus();
  }

  /** Takes focus away from the dial, which marks its form control as touched. */
  async blur(): Promise<void> {
    await (await this._dial()).blur();
  }

  /** Whether the dial has keyboard focus. */
  async isFocused(): Promise<boolean> {
    return (await this._dial()).isFocused();
  }

  /** Presses one of the dial's keys on the focused dial, optionally with modifiers. */
  async pressKey(key: PhaseDialKey, modifiers: ModifierKeys = {}): Promise<void> {
    const dial = await this._dial();
    await dial.focus();
    await dial.sendKeys(modifiers, KEYS[key]);
  }

  /**
   * Sets an angle with the keyboard, as a technician would: Home, Page Up while it does not overshoot,
   * then arrows. Throws when the dial cannot be changed or cannot reach the angle (off its positions or
   * its step).
   */
  async setValue(angleDeg: number): Promise<void> {
    if ((await this.isDisabled()) || (await this.isReadonly())) {
      throw new Error('The phase dial is disabled or read-only; its angle cannot be set.');
    }
    const target = normalizeDeg(angleDeg);
    const reached = (value: number | null) => value !== null && Math.abs(value - target) < TOLERANCE_DEG;
    await this.pressKey('Home');
    let value = await this.getValue();
    let pages = 0;
    while (!reached(value) && pages <= 360) {
      await this.pressKey('PageUp');
      const next = await this.getValue();
      if (next === null || next <= value! || next > target + TOLERANCE_DEG) {
        await this.pressKey('Home');
        for (let i = 0; i < pages; i++) await this.pressKey('PageUp');
        break;
      }
      value = next;
      pages++;
    }
    value = await this.getValue();
    for (let presses = 0; !reached(value); presses++) {
      await this.pressKey('ArrowUp');
      const next = await this.getValue();
      if (next === null || next <= value! || next > target + TOLERANCE_DEG || presses > 36000) {
        throw new Error(`The phase dial cannot reach ${target} degrees from the keyboard.`);
      }
      value = next;
    }
  }

  /**
   * Drags the thumb to an angle with pointer events: down on the thumb (or on the target when no angle
   * is set), a few moves along the shorter way round, up at the target. The dial snaps as it would
   * under a finger.
   */
  async dragTo(angleDeg: number): Promise<void> {
    const dial = await this._dial();
    const [rotation, counting, zero, rect] = await parallel(() => [
      dial.getAttribute('data-rotation'),
      dial.getAttribute('data-counting'),
      dial.getAttribute('data-zero-at-deg'),
      dial.getDimensions(),
    ]);
    const convention = {
      rotation,
      counting,
      zeroAtDeg: Number(zero ?? 0),
    } as DialConvention;
    const center = { x: rect.left + rect.width / 2, y: rect.top + rect.height / 2 };
    // Where the thumb runs on a laid-out dial; a test DOM without layout has a zero-sized dial.
    const radius = rect.width > 0 ? rect.width * 0.37 : 100;
    const target = normalizeDeg(angleDeg);
    const start = (await this.getValue()) ?? target;
    const turn = ((target - start + 540) % 360) - 180;
    const at = (angle: number) => {
      const point = pointAtScreenAngle(center, radius, screenAngleDeg(angle, convention));
      return { clientX: point.x, clientY: point.y, pointerId: 1, button: 0, isPrimary: true };
    };
    await dial.dispatchEvent('pointerdown', at(start));
    for (const share of [0.25, 0.5, 0.75, 1]) {
      await dial.dispatchEvent('pointermove', at(start + turn * share));
    }
    await dial.dispatchEvent('pointerup', at(target));
  }

  /** The text in the numeric field of the compact variant. */
  async getFieldText(): Promise<string> {
    const field = await this._field();
    if (!field) throw new Error('The phase dial has no numeric field; it is not compact.');
    return field.getProperty<string>('value');
  }

  /** Types into the numeric field of the compact variant, replacing its text, and leaves the field. */
  async typeInField(text: string): Promise<void> {
    const field = await this._field();
    if (!field) throw new Error('The phase dial has no numeric field; it is not compact.');
    await field.clear();
    if (text !== '') await field.sendKeys(text);
    await field.dispatchEvent('change');
    await field.blur();
  }

  /** The markers, as the legend lists them. */
  async getMarkers(): Promise<PhaseDialMarkerInfo[]> {
    const items = await this._legendItems();
    return parallel(() =>
      items.map(async (item) => {
        const [kind, angle, detail] = await parallel(() => [
          item.getAttribute('data-kind'),
          item.text({ exclude: '.cp-phase-dial__legend-name, .cp-phase-dial__legend-detail' }),
          item.text({ exclude: '.cp-phase-dial__legend-name, .cp-phase-dial__legend-angle' }),
        ]);
        return {
          kind: kind as PhaseDialMarkerKind,
          label: detail.trim(),
          angleDeg: Number.parseFloat(angle),
        };
      }),
    );
  }
}
