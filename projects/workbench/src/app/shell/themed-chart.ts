import {
  afterRenderEffect,
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  inject,
  input,
  type Signal,
  signal,
  viewChild,
} from '@angular/core';

/** The theme's colours a chart draws with, read from the component's element (light or dark scheme). */
export interface ThemeColours {
  readonly primary: string;
  readonly tertiary: string;
  readonly error: string;
  readonly text: string;
  readonly grid: string;
  readonly surface: string;
}

/** The colours of the app's theme where `element` stands, with Material's defaults where none is set. */
export function themeColours(element: HTMLElement): ThemeColours {
  const style = getComputedStyle(element);
  const read = (name: string, fallback: string) => style.getPropertyValue(name).trim() || fallback;
  return {
    primary: read('--mat-sys-primary', '#36618e'),
    tertiary: read('--mat-sys-tertiary', '#8b4a62'),
    error: read('--mat-sys-error', '#ba1a1a'),
    text: read('--mat-sys-on-surface', '#1a1c1e'),
    grid: read('--mat-sys-outline-variant', '#c3c7cf'),
    surface: read('--mat-sys-surface', '#ffffff'),
  };
}

/** What `keepChartDrawn` needs of a chart.js chart: to be destroyed before the next one is drawn. */
export interface DrawnChart {
  destroy(): void;
}

/**
 * Keeps a chart.js chart drawn on a component's canvas: after each render in which a signal that `draw`
 * reads has changed, or when the device's colour scheme changes, the chart is drawn again with the
 * theme's colours of the moment; it is destroyed with the component. Where the canvas has no 2D context
 * (a test's document) nothing is drawn: the page's table and the canvas's name still say it all. Call it
 * in the component's constructor.
 */
export function keepChartDrawn(
  canvas: Signal<ElementRef<HTMLCanvasElement>>,
  draw: (canvas: HTMLCanvasElement, colours: ThemeColours) => DrawnChart,
): void {
  const host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;
  /** Bumped when the colour scheme changes, so that the chart reads the theme again. */
  const scheme = signal(0);
  let chart: DrawnChart | null = null;
  const media = typeof matchMedia === 'function' ? matchMedia('(prefers-color-scheme: dark)') : null;
  const onScheme = () => scheme.update((n) => n + 1);
  media?.addEventListener('change', onScheme);
  inject(DestroyRef).onDestroy(() => {
    media?.removeEventListener('change', onScheme);
    chart?.destroy();
    chart = null;
  });
  afterRenderEffect({
    write: () => {
      scheme();
      chart?.destroy();
      chart = null;
      const element = canvas().nativeElement;
      if (element.getContext('2d') === null) return;
      chart = draw(element, themeColours(host));
    },
  });
}

/** How a chart is drawn on a canvas with the theme's colours: it returns the chart.js chart it made. */
export type ChartDrawing = (canvas: HTMLCanvasElement, colours: ThemeColours) => DrawnChart;

/**
 * A chart.js chart kept drawn (`keepChartDrawn`) on a canvas that fills the element, which is as wide as
 * its container and as high as `--themed-chart-block-size` (20rem by default). The canvas is an image to
 * assistive technology, named by `label`; the page's table holds every figure. `drawing` is drawn again
 * whenever it changes: a component gives it as a `computed` of its data:
 *
 * `<app-themed-chart [label]="summary()" [drawing]="drawing()" />`
 */
@Component({
  selector: 'app-themed-chart',
  template: `<canvas #canvas role="img" [attr.aria-label]="label()"></canvas>`,
  styles: `
    :host {
      display: block;
      position: relative;
      inline-size: 100%;
      block-size: var(--themed-chart-block-size, 20rem);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ThemedChart {
  /** The chart in words, its accessible name. */
  readonly label = input.required<string>();
  /** Draws the chart. */
  readonly drawing = input.required<ChartDrawing>();

  private readonly canvas = viewChild.required<ElementRef<HTMLCanvasElement>>('canvas');

  constructor() {
    keepChartDrawn(this.canvas, (canvas, colours) => this.drawing()(canvas, colours));
  }
}
