import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  type ElementRef,
  inject,
  input,
  model,
  signal,
  viewChild,
  viewChildren,
} from '@angular/core';
import {
  type RotationCounting,
  type RotationDirection,
  _degreesText as degreesText,
  _normalizeDeg as normalizeDeg,
} from '@counterpoise/ng/core';
import {
  dashOf,
  formatAmplitude,
  markerPath,
  POLAR_SERIES_KINDS,
  type PolarSeries,
  type PolarSeriesKind,
} from './polar-plot-geometry';
import { FOCUS_RING_RADIUS, layoutPolarPlot } from './polar-plot-layout';
import { amplitudeText, conventionText, focusTarget, plottedPoints, valueText } from './polar-plot-model';

let nextId = 0;

/** The width the plot is drawn for until it has been measured (and where it cannot be, as on a server). */
const UNMEASURED_SIZE = 320;
const MIN_SIZE = 200;
const MAX_SIZE = 600;

/**
 * Readings and weights as vectors on a polar chart of the rotor's end view: amplitude rings with their unit,
 * angles from the reference mark, a legend of shapes, the details of a point on focus or hover, and a table
 * of every value for screen readers (or for everyone, with `showTable`).
 *
 * Series in another unit than the first series' (grams of weight beside in/s of vibration) are drawn to a
 * scale of their own whose outer ring is named in the legend, so that their direction and their size
 * relative to each other read at a glance; the rings are labelled in the first unit.
 */
@Component({
  selector: 'cp-polar-plot',
  templateUrl: './polar-plot.html',
  styleUrl: './polar-plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    class: 'cp-polar-plot',
    '[class.cp-polar-plot--table-shown]': 'showTable()',
  },
})
export class CpPolarPlot {
  /** The series to draw, each a set of vectors of one kind and one unit. */
  readonly series = input<readonly PolarSeries[]>([]);
  /** The way the rotor turns as seen in this view. */
  readonly rotation = input<RotationDirection>('clockwise');
  /** Which way angles are counted from the reference mark. */
  readonly counting = input<RotationCounting>('againstRotation');
  /** Where the reference mark sits on screen, in degrees clockwise from 12 o'clock. */
  readonly zeroAtDeg = input(0);
  /** The amplitude of the outer ring in the first series' unit; null for a round value above the largest. */
  readonly maxAmplitude = input<number | null>(null);
  /** How many amplitude rings to draw (1 to 12). */
  readonly ringCount = input(4);
  /** The caption of the plot and of its table. */
  readonly caption = input('Readings');
  /** Whether the table of values is shown on screen; it is always there for screen readers. */
  readonly showTable = model(false);

  private readonly _destroyRef = inject(DestroyRef);
  private readonly _frame = viewChild.required<ElementRef<HTMLElement>>('frame');
  private readonly _pointElements = viewChildren<ElementRef<SVGGElement>>('pointElement');
  private readonly _size = signal(UNMEASURED_SIZE);
  private readonly _activeIndex = signal(0);
  private readonly _hoveredIndex = signal<number | null>(null);
  private readonly _hasFocus = signal(false);

  private readonly _uid = nextId++;
  protected readonly _ids = {
    caption: `cp-polar-plot-caption-${this._uid}`,
    convention: `cp-polar-plot-convention-${this._uid}`,
    table: `cp-polar-plot-table-${this._uid}`,
  };

  protected readonly _layout = computed(() =>
    layoutPolarPlot({
      series: this.series(),
      convention: {
        rotation: this.rotation(),
        counting: this.counting(),
        zeroAtDeg: Number.isFinite(this.zeroAtDeg()) ? normalizeDeg(this.zeroAtDeg()) : 0,
      },
      maxAmplitude: this.maxAmplitude(),
      ringCount: this.ringCount(),
      size: this._size(),
    }),
  );

  /** The point that takes Tab: the last one focused, kept inside the points there are. */
  protected readonly _tabStop = computed(() => {
    const count = this._layout().points.length;
    return count === 0 ? -1 : Math.min(this._activeIndex(), count - 1);
  });

  /** The point whose detail is shown: the one under the pointer, else the one with focus. */
  protected readonly _shownIndex = computed(
    () => this._hoveredIndex() ?? (this._hasFocus() ? this._tabStop() : null),
  );

  protected readonly _detail = computed(() => {
    const index = this._shownIndex();
    return index === null ? null : (this._layout().points[index]?.detail ?? null);
  });

  protected readonly _conventionText = computed(() => conventionText(this.rotation(), this.counting()));

  protected readonly _scaleText = computed(() => {
    const primary = this._layout().scales[0];
    if (!primary) return '';
    const { step, max } = primary.scale;
    const unit = primary.unit ? ` ${primary.unit}` : '';
    return `Rings ${formatAmplitude(step)}${unit} apart, outer ring ${formatAmplitude(max)}${unit}.`;
  });

  protected readonly _rows = computed(() =>
    plottedPoints(this.series()).map((p) => ({
      index: p.index,
      series: p.series.label,
      point: p.point.label ?? `Point ${p.pointIndex + 1}`,
      amplitude: amplitudeText(p.point, p.series.unit),
      angle: degreesText(p.point.angleDeg),
      from: p.point.from ? valueText(p.point.from, p.series.unit) : 'Origin',
    })),
  );

  protected readonly _angleHeader = computed(
    () => `Angle (degrees ${this.counting() === 'withRotation' ? 'with' : 'against'} rotation)`,
  );

  protected readonly _focusRingRadius = FOCUS_RING_RADIUS;

  protected readonly _glyphs = Object.fromEntries(
    POLAR_SERIES_KINDS.map((kind) => [
      kind,
      { dash: dashOf(kind), marker: markerPath(kind, { x: 30, y: 10 }, 11, 90) },
    ]),
  ) as Record<PolarSeriesKind, { dash: string; marker: string }>;

  constructor() {
    afterNextRender(() => {
      const frame = this._frame().nativeElement;
      const measure = () => {
        const width = frame.clientWidth;
        if (width > 0) this._size.set(Math.round(Math.min(MAX_SIZE, Math.max(MIN_SIZE, width))));
      };
      measure();
      if (typeof ResizeObserver === 'undefined') return;
      const observer = new ResizeObserver(measure);
      observer.observe(frame);
      this._destroyRef.onDestroy(() => observer.disconnect());
    });
  }

  protected _onPointFocus(index: number): void {
    this._activeIndex.set(index);
    this._hasFocus.set(true);
  }

  protected _onPointBlur(): void {
    this._hasFocus.set(false);
  }

  protected _onPointHover(index: number | null): void {
    this._hoveredIndex.set(index);
  }

  protected _onPointKeydown(event: KeyboardEvent, index: number): void {
    if (event.altKey || event.ctrlKey || event.metaKey || event.shiftKey) return;
    const target = focusTarget(event.key, index, plottedPoints(this.series()));
    if (target === null) return;
    event.preventDefault();
    this._activeIndex.set(target);
    this._hoveredIndex.set(null);
    this._pointElements()[target]?.nativeElement.focus();
  }

  protected _toggleTable(): void {
    this.showTable.update((shown) => !shown);
  }
}
