import {
  type BaseHarnessFilters,
  ComponentHarness,
  HarnessPredicate,
  type TestElement,
  type TestKey,
} from '@angular/cdk/testing';

/** Filters for finding a `cp-polar-plot`. */
export interface PolarPlotHarnessFilters extends BaseHarnessFilters {
  /** Only the plot whose caption matches. */
  caption?: string | RegExp;
}

/** One row of the plot's table of values, as text. */
export interface PolarPlotTableRow {
  /** The series' label. */
  series: string;
  /** The point's label, or "Point n". */
  point: string;
  /** The amplitude with its unit ("0.31 in/s"). */
  amplitude: string;
  /** The angle ("141°"). */
  angle: string;
  /** Where the vector is drawn from ("Origin", or an amplitude and angle). */
  from: string;
}

/** Reads and drives a `cp-polar-plot` in tests: legend, rings, points, details and the table of values. */
export class CpPolarPlotHarness extends ComponentHarness {
  static hostSelector = 'cp-polar-plot';

  private readonly _caption = this.locatorFor('.cp-polar-plot__caption');
  private readonly _legendLabels = this.locatorForAll('.cp-polar-plot__legend-label');
  private readonly _ringLabels = this.locatorForAll('.cp-polar-plot__ring-label');
  private readonly _angleLabels = this.locatorForAll('.cp-polar-plot__angle-label');
  private readonly _points = this.locatorForAll('.cp-polar-plot__point');
  private readonly _detail = this.locatorFor('.cp-polar-plot__detail');
  private readonly _tableCaption = this.locatorFor('.cp-polar-plot__table caption');
  private readonly _toggle = this.locatorFor('.cp-polar-plot__table-toggle');
  private readonly _note = this.locatorFor('.cp-polar-plot__note');

  /** A predicate that finds a plot by its caption. */
  static with(options: PolarPlotHarnessFilters = {}): HarnessPredicate<CpPolarPlotHarness> {
    return new HarnessPredicate(CpPolarPlotHarness, options).addOption(
      'caption',
      options.caption,
      (harness, caption) => HarnessPredicate.stringMatches(harness.getCaption(), caption),
    );
  }

  /** The caption of the plot. */
  async getCaption(): Promise<string> {
    return (await this._caption()).text();
  }

  /** The labels of the series, in legend order. */
  async getSeriesLabels(): Promise<string[]> {
    return textsOf(await this._legendLabels());
  }

  /** The labels of the amplitude rings that have one, inner to outer; the outer one carries the unit. */
  async getRingLabels(): Promise<string[]> {
    return textsOf(await this._ringLabels());
  }

  /** The angle labels round the outside ("0°", "90°", ...). */
  async getAngleLabels(): Promise<string[]> {
    return textsOf(await this._angleLabels());
  }

  /** The scale and the angle convention, as the note under the legend states them. */
  async getNote(): Promise<string> {
    return (await (await this._note()).text()).replace(/\s+/g, ' ').trim();
  }

  /** How many points the plot draws. */
  async getPointCount(): Promise<number> {
    return (await this._points()).length;
  }

  /** The accessible name of every point, in focus order ("Run 2, Sensor A: 0.31 in/s at 141 degrees"). */
  async getPointDescriptions(): Promise<string[]> {
    const points = await this._points();
    return Promise.all(points.map(async (point) => (await point.getAttribute('aria-label')) ?? ''));
  }

  /** Focuses the point at `index` in focus order, as Tab or a tap would. */
  async focusPoint(index: number): Promise<void> {
    await (await this._point(index)).focus();
  }

  /** Moves the pointer over the point at `index`. */
  async hoverPoint(index: number): Promise<void> {
    await (await this._point(index)).hover();
  }

  /** Moves the pointer off the point at `index`. */
  async leavePoint(index: number): Promise<void> {
    await (await this._point(index)).mouseAway();
  }

  /** Presses a key on the point that has focus (the first point when none has). */
  async pressKey(key: TestKey): Promise<void> {
    const index = (await this.getFocusedPointIndex()) ?? 0;
    await (await this._point(index)).sendKeys(key);
  }

  /** The index of the point that has focus, or null. */
  async getFocusedPointIndex(): Promise<number | null> {
    const points = await this._points();
    const focused = await Promise.all(points.map((point) => point.isFocused()));
    const index = focused.indexOf(true);
    return index < 0 ? null : index;
  }

  /** The index of the point that Tab reaches (tabindex 0), or null when there is none. */
  async getTabStopIndex(): Promise<number | null> {
    const points = await this._points();
    const tabIndexes = await Promise.all(points.map((point) => point.getAttribute('tabindex')));
    const index = tabIndexes.indexOf('0');
    return index < 0 ? null : index;
  }

  /** The detail shown for the focused or hovered point, or null while the plot shows its hint. */
  async getFocusedDetail(): Promise<string | null> {
    const detail = await this._detail();
    if (await detail.hasClass('cp-polar-plot__detail--hint')) return null;
    return (await detail.text()).trim();
  }

  /** The rows of the table of values, one per point. */
  async getTableRows(): Promise<PolarPlotTableRow[]> {
    const [series, point, amplitude, angle, from] = await Promise.all(
      TABLE_COLUMNS.map(async (column) =>
        textsOf(await this.locatorForAll(`.cp-polar-plot__cell--${column}`)()),
      ),
    );
    return (series ?? []).map((_, i) => ({
      series: series?.[i] ?? '',
      point: point?.[i] ?? '',
      amplitude: amplitude?.[i] ?? '',
      angle: angle?.[i] ?? '',
      from: from?.[i] ?? '',
    }));
  }

  /** The caption of the table of values. */
  async getTableCaption(): Promise<string> {
    return (await (await this._tableCaption()).text()).trim();
  }

  /** Whether the table of values is shown on screen (it is always there for screen readers). */
  async isTableShown(): Promise<boolean> {
    return (await this.host()).hasClass('cp-polar-plot--table-shown');
  }

  /** Shows or hides the table of values with the plot's own button. */
  async toggleTable(): Promise<void> {
    await (await this._toggle()).click();
  }

  private async _point(index: number): Promise<TestElement> {
    const point = (await this._points())[index];
    if (!point) throw new Error(`The polar plot has no point at index ${index}.`);
    return point;
  }
}

const TABLE_COLUMNS = ['series', 'point', 'amplitude', 'angle', 'from'] as const;

async function textsOf(elements: TestElement[]): Promise<string[]> {
  return Promise.all(elements.map(async (element) => (await element.text()).trim()));
}
