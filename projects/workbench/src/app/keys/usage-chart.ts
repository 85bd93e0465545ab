import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { BarController, BarElement, CategoryScale, Chart, Legend, LinearScale, Tooltip } from 'chart.js';
import { type ChartDrawing, ThemedChart, type ThemeColours } from '../shell/themed-chart';
import type { UsageSeries } from './usage-model';

// Only what the chart draws: bars on a category axis and a linear one, its legend and tooltips.
Chart.register(BarController, BarElement, CategoryScale, LinearScale, Legend, Tooltip);

/**
 * Requests, calculations and errors per day, route or key as grouped bars, drawn by chart.js on a canvas
 * (`ThemedChart`) named by `summary`; the page's table holds every figure. The series drawn are also on the host (`data-series`), so that a test can compare them with
 * the table.
 */
@Component({
  selector: 'app-usage-chart',
  imports: [ThemedChart],
  template: `<app-themed-chart [label]="summary()" [drawing]="drawing()" />`,
  styles: `
    :host {
      display: block;
      --themed-chart-block-size: clamp(15rem, 50vw, 20rem);
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
  protected readonly drawing = computed<ChartDrawing>(() => {
    const series = this.series();
    return (canvas, colours) => this.draw(canvas, series, colours);
  });

  private draw(canvas: HTMLCanvasElement, series: UsageSeries, colours: ThemeColours) {
    const bars = (label: string, data: readonly number[], colour: string) => ({
      label,
      data: [...data],
      backgroundColor: colour,
      borderColor: colour,
      borderWidth: 1,
      maxBarThickness: 28,
    });
    return new Chart<'bar', number[], string>(canvas, {
      type: 'bar',
      data: {
        labels: [...series.labels],
        datasets: [
          bars('Requests', series.requests, colours.primary),
          bars('Calculations', series.calculations, colours.tertiary),
          bars('Errors', series.errors, colours.error),
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
