import {
  afterRenderEffect,
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  ElementRef,
  inject,
  input,
  signal,
  viewChild,
} from '@angular/core';
import { BarController, BarElement, CategoryScale, Chart, Legend, LinearScale, Tooltip } from 'chart.js';
import type { UsageSeries } from './usage-model';

// Only what the chart draws: bars on a category axis and a linear one, its legend and tooltips.
Chart.register(BarController, BarElement, CategoryScale, LinearScale, Legend, Tooltip);

/** The colours the chart reads from the app's theme, so that it follows the light and dark schemes. */
function themeColours(host: HTMLElement) {
  const style = getComputedStyle(host);
  const read = (name: string, fallback: string) => style.getPropertyValue(name).trim() || fallback;
  return {
    requests: read('--mat-sys-primary', '#36618e'),
    calculations: read('--mat-sys-tertiary', '#8b4a62'),
    errors: read('--mat-sys-error', '#ba1a1a'),
    text: read('--mat-sys-on-surface', '#1a1c1e'),
    grid: read('--mat-sys-outline-variant', '#c3c7cf'),
  };
}

/**
 * Requests, calculations and errors per day, route or key as grouped bars, drawn by chart.js on a canvas.
 * The canvas is an image to assistive technology, named by `summary`; the page's table holds every
 * figure. The series drawn are also on the host (`data-series`), so that a test can compare them with
 * the table.
 */
@Component({
  selector: 'app-usage-chart',
  template: `
    <div class="frame">
      <canvas #canvas role="img" [attr.aria-label]="summary()"></canvas>
    </div>
  `,
  styles: `
    :host {
      display: block;
    }
    .frame {
      position: relative;
      block-size: clamp(15rem, 50vw, 20rem);
      inline-size: 100%;
    }
  `,
  host: { '[attr.data-series]': 'seriesJson()' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UsageChart {
  /** What to draw. */
  readonly series = input.required<UsageSeries>();
  /** The chart in words, its accessible name. */
  readonly summary = input.required<string>();

  protected readonly seriesJson = computed(() => JSON.stringify(this.series()));
  private readonly canvas = viewChild.required<ElementRef<HTMLCanvasElement>>('canvas');
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  /** Bumped when the colour scheme changes, so that the chart reads the theme again. */
  private readonly scheme = signal(0);
  private chart: Chart<'bar', number[], string> | null = null;

  constructor() {
    const media = typeof matchMedia === 'function' ? matchMedia('(prefers-color-scheme: dark)') : null;
    const onScheme = () => this.scheme.update((n) => n + 1);
    media?.addEventListener('change', onScheme);
    inject(DestroyRef).onDestroy(() => {
      media?.removeEventListener('change', onScheme);
      this.chart?.destroy();
      this.chart = null;
    });
    afterRenderEffect({
      write: () => {
        this.scheme();
        this.draw(this.series());
      },
    });
  }

  private draw(series: UsageSeries): void {
    const canvas = this.canvas().nativeElement;
    this.chart?.destroy();
    this.chart = null;
    // No 2D context (a test's document): nothing to draw; the table and the summary still say it all.
    if (canvas.getContext('2d') === null) return;
    const colours = themeColours(this.host.nativeElement);
    const bars = (label: string, data: readonly number[], colour: string) => ({
      label,
      data: [...data],
      backgroundColor: colour,
      borderColor: colour,
      borderWidth: 1,
      maxBarThickness: 28,
    });
    this.chart = new Chart<'bar', number[], string>(canvas, {
      type: 'bar',
      data: {
        labels: [...series.labels],
        datasets: [
          bars('Requests', series.requests, colours.requests),
          bars('Calculations', series.calculations, colours.calculations),
          bars('Errors', series.errors, colours.errors),
        ],
      },
      options: {
        responsive: true,
        maintainAspectRatio: false,
        animation: false,
        color: colours.text,
        interaction: { mode: 'index', intersect: false },
        scales: {
          x: {
            ticks: { color: colours.text, autoSkip: true, maxRotation: 45 },
            grid: { display: false },
          },
          y: {
            beginAtZero: true,
            ticks: { color: colours.text, precision: 0 },
            grid: { color: colours.grid },
          },
        },
        plugins: {
          legend: { position: 'bottom', labels: { color: colours.text, boxWidth: 12, padding: 12 } },
        },
      },
    });
  }
}
