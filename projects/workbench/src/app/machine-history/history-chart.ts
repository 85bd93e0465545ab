import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import {
  Chart,
  type ChartDataset,
  Legend,
  LinearScale,
  LineController,
  LineElement,
  PointElement,
  type PointStyle,
  Tooltip,
} from 'chart.js';
import { jobDate } from '../jobs/job-dates';
import { type ChartDrawing, ThemedChart, type ThemeColours } from '../shell/themed-chart';
import {
  formatAmplitude,
  type HistoryPoint,
  type HistorySeries,
  historySeries,
  historySummary,
  unitLabel,
} from './history-chart-model';
import type { MachineHistory } from './machine-history.api';

// Only what the chart draws: a line chart on two linear scales, its legend and tooltips.
Chart.register(LineController, LineElement, PointElement, LinearScale, Legend, Tooltip);

/** The shape of each side's points (circle left, diamond right): the sides differ without colour. */
const SIDE_POINTS: Readonly<Record<'left' | 'right', PointStyle>> = { left: 'circle', right: 'rectRot' };

/** A series as chart.js draws it: before dashed with hollow points, after solid and filled, limits dotted. */
function datasetOf(series: HistorySeries, colours: ThemeColours): ChartDataset<'line', HistoryPoint[]> {
  // The left side in the theme's primary colour, the right in its tertiary, the limits in its error colour.
  const colour =
    series.stage === 'limit' || series.side === null
      ? colours.error
      : series.side === 'left'
        ? colours.primary
        : colours.tertiary;
  if (series.stage === 'limit') {
    return {
      label: series.label,
      data: [...series.points],
      borderColor: colour,
      backgroundColor: colour,
      borderWidth: 2,
      borderDash: series.side === 'right' ? [2, 6] : [2, 3],
      pointStyle: 'line',
      // A line needs two jobs: the one job of a new machine's history gets its limit as a dash instead.
      pointRadius: series.points.length === 1 ? 10 : 0,
      pointHoverRadius: 4,
      stepped: 'middle',
    };
  }
  const after = series.stage === 'after';
  return {
    label: series.label,
    data: [...series.points],
    borderColor: colour,
    backgroundColor: after ? colour : colours.surface,
    borderWidth: after ? 2.5 : 1.5,
    borderDash: after ? [] : [7, 5],
    pointStyle: SIDE_POINTS[series.side!],
    pointRadius: 5,
    pointHoverRadius: 7,
    pointBorderWidth: 2,
    tension: 0,
  };
}

/**
 * The amplitude of each side before and after every job on a machine, over the jobs' dates, with the
 * acceptance limit, drawn by chart.js on a canvas (`ThemedChart`) named by a summary; the page's table
 * holds every figure.
 */
@Component({
  selector: 'app-history-chart',
  imports: [ThemedChart],
  template: `<app-themed-chart [label]="summary()" [drawing]="drawing()" />`,
  styles: `
    :host {
      display: block;
      --themed-chart-block-size: clamp(16rem, 55vw, 22rem);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HistoryChart {
  /** The machine's history. */
  readonly history = input.required<MachineHistory>();

  protected readonly summary = computed(() => historySummary(this.history()));
  protected readonly drawing = computed<ChartDrawing>(() => {
    const history = this.history();
    return (canvas, colours) => this.draw(canvas, history, colours);
  });

  private draw(canvas: HTMLCanvasElement, history: MachineHistory, colours: ThemeColours) {
    const series = historySeries(history);
    const unit = unitLabel(history.unit);
    return new Chart<'line', HistoryPoint[]>(canvas, {
      type: 'line',
      data: { datasets: series.map((one) => datasetOf(one, colours)) },
      options: {
        responsive: true,
        maintainAspectRatio: false,
        animation: false,
        parsing: false,
        normalized: true,
        color: colours.text,
        interaction: { mode: 'nearest', intersect: false },
        scales: {
          x: {
            type: 'linear',
            title: { display: true, text: 'Date of the job', color: colours.text },
            ticks: {
              color: colours.text,
              maxTicksLimit: 5,
              callback: (value) => jobDate(new Date(Number(value)).toISOString().slice(0, 10)),
            },
            grid: { color: colours.grid },
            // Half a month either side at least, so that the first and last points do not sit on the frame.
            // From the data's own limits: chart.js has already widened one date alone by 5 % of its value
            // (years, counted from 1970) by the time this runs.
            afterDataLimits: (scale) => {
              const { min, max } = scale.getMinMax(false);
              if (!Number.isFinite(min) || !Number.isFinite(max)) return;
              const pad = Math.max(15 * 86_400_000, (max - min) * 0.05);
              scale.min = min - pad;
              scale.max = max + pad;
            },
          },
          y: {
            type: 'linear',
            beginAtZero: true,
            title: { display: true, text: `Amplitude (${unit})`, color: colours.text },
            ticks: { color: colours.text, callback: (value) => formatAmplitude(Number(value)) },
            grid: { color: colours.grid },
          },
        },
        plugins: {
          legend: {
            position: 'bottom',
            labels: { usePointStyle: true, color: colours.text, boxWidth: 10, padding: 12 },
          },
          tooltip: {
            usePointStyle: true,
            callbacks: {
              title: (items) => {
                const point = items[0]?.raw as HistoryPoint | undefined;
                return point === undefined
                  ? ''
                  : `Job no. ${point.jobId}, ${jobDate(new Date(point.x).toISOString().slice(0, 10))}`;
              },
              label: (item) =>
                `${item.dataset.label}: ${formatAmplitude((item.raw as HistoryPoint).y)} ${unit}`,
            },
          },
        },
      },
    });
  }
}
