import type { Meta, StoryObj } from '@storybook/angular-vite';
import { expect, waitFor } from 'storybook/test';
import { CpPolarPlot } from './polar-plot';
import { CROWDED_JOB, DRIVE_END_RUNS, JOB, SENSOR_A_RUNS, TWO_SENSORS } from './polar-plot.fixtures';

/**
 * Readings and weights as vectors on the rotor's end view: amplitude rings with their unit, angles from the
 * reference mark, a legend of shapes, the detail of a point on focus or hover, and a table of every value.
 * Series in another unit than the first (grams beside in/s) are drawn to their own scale, named in the
 * legend. Import it from `@counterpoise/ng/polar-plot`.
 */
const meta: Meta<CpPolarPlot> = {
  title: 'Widgets/Polar plot',
  component: CpPolarPlot,
  tags: ['autodocs'],
  argTypes: {
    rotation: { control: 'inline-radio', options: ['clockwise', 'counterClockwise'] },
    counting: { control: 'inline-radio', options: ['againstRotation', 'withRotation'] },
    zeroAtDeg: { control: { type: 'number', min: 0, max: 359, step: 15 } },
    maxAmplitude: { control: 'number' },
    ringCount: { control: { type: 'range', min: 1, max: 12 } },
    caption: { control: 'text' },
    showTable: { control: 'boolean' },
  },
  args: {
    series: JOB,
    rotation: 'clockwise',
    counting: 'againstRotation',
    zeroAtDeg: 0,
    maxAmplitude: null,
    ringCount: 4,
    caption: 'Mulcher drum, sensor A',
    showTable: false,
  },
};

export default meta;
type Story = StoryObj<CpPolarPlot>;

/**
 * A whole single-plane job: the runs, the trial effect drawn head to tail from Run 1 to Run 2, the predicted
 * residual, and the weights on their own gram scale. Tab reaches the plot, the arrows walk its points.
 */
export const Job: Story = {
  play: async ({ canvas, userEvent }) => {
    await expect(canvas.getByRole('group', { name: 'Mulcher drum, sensor A' })).toBeVisible();
    const points = canvas.getAllByRole('img');
    await expect(points).toHaveLength(8);

    await userEvent.tab();
    await expect(points[0]).toHaveFocus();
    await expect(canvas.getByText('Run 1, Sensor A: 0.42 in/s at 128 degrees')).toBeVisible();

    await userEvent.keyboard('{ArrowRight}');
    await expect(points[1]).toHaveFocus();
    await expect(canvas.getByText('Run 2, Sensor A: 0.29 in/s at 196 degrees')).toBeVisible();

    await userEvent.keyboard('{End}');
    await expect(points[7]).toHaveFocus();
    await expect(points[7]).toHaveAccessibleName('Installed, Weights: 60 g at 45 degrees');

    await userEvent.keyboard('{PageDown}');
    await expect(points[0]).toHaveFocus();
    await expect(canvas.getByText(/outer ring 80 g/)).toBeVisible();
  },
};

/** Nothing read yet: the grid and the angles, a note, and no tab stop. */
export const Empty: Story = {
  args: { series: [], caption: 'No readings yet' },
  play: async ({ canvas }) => {
    await expect(canvas.getByText('No values to plot yet')).toBeInTheDocument();
    await expect(canvas.queryAllByRole('img')).toHaveLength(0);
    await expect(canvas.getByRole('table')).toHaveTextContent('No values to plot yet.');
  },
};

/** Two sensors read in mm/s: one kind, two shades, told apart by their labels and in the legend. */
export const TwoSensors: Story = {
  args: { series: TWO_SENSORS, caption: 'Fan, initial readings' },
  play: async ({ canvas, userEvent }) => {
    const [sensorB] = canvas.getAllByRole('img').slice(1);
    await userEvent.hover(sensorB!);
    await expect(canvas.getByText('B, Sensor B, free end: 6.1 mm/s at 302 degrees')).toBeVisible();
    await userEvent.unhover(sensorB!);
    await expect(canvas.getByText(/Tap, hover or tab to a point/)).toBeVisible();
  },
};

/**
 * Seen from the other end: the rotor turns counter-clockwise, angles are counted with rotation and the
 * reference mark sits at 3 o'clock.
 */
export const CounterClockwise: Story = {
  args: {
    rotation: 'counterClockwise',
    counting: 'withRotation',
    zeroAtDeg: 90,
    caption: 'Mulcher drum, seen from the drive side',
  },
  play: async ({ canvas }) => {
    await expect(
      canvas.getByText(/Rotor turns counter-clockwise in this view; angles are counted with rotation/),
    ).toBeVisible();
  },
};

/** A fixed outer ring: a reading beyond it is drawn on the rim, with a dashed outline, and says so. */
export const FixedScale: Story = {
  args: { series: [SENSOR_A_RUNS], maxAmplitude: 0.3, ringCount: 3, caption: 'Sensor A, fixed scale' },
  play: async ({ canvas }) => {
    await expect(canvas.getAllByRole('img')[0]).toHaveAccessibleName(
      'Run 1, Sensor A: 0.42 in/s at 128 degrees, beyond the outer ring',
    );
  },
};

/** The table of values on screen, as a technician may want it in bright sun; the button hides it again. */
export const TableShown: Story = {
  args: { showTable: true },
  play: async ({ canvas, userEvent }) => {
    const table = canvas.getByRole('table', { name: 'Mulcher drum, sensor A: every value' });
    await expect(table).toBeVisible();
    await expect(canvas.getAllByRole('row')).toHaveLength(9);
    const toggle = canvas.getByRole('button', { name: 'Table of values' });
    await expect(toggle).toHaveAttribute('aria-pressed', 'true');
    await userEvent.click(toggle);
    await expect(toggle).toHaveAttribute('aria-pressed', 'false');
    await waitFor(() => expect(table.parentElement!.getBoundingClientRect().width).toBeLessThanOrEqual(1));
  },
};

/** On a phone held upright, or a narrow sidebar: 240 px wide, angle labels every quarter turn. */
export const Narrow: Story = {
  render: (args) => ({
    props: args,
    template: `
      <div style="max-width: 240px">
        <cp-polar-plot [series]="series" [caption]="caption" [rotation]="rotation" [counting]="counting"
          [zeroAtDeg]="zeroAtDeg" [maxAmplitude]="maxAmplitude" [ringCount]="ringCount" [showTable]="showTable" />
      </div>`,
  }),
  play: async ({ canvasElement }) => {
    const angleLabels = () =>
      [...canvasElement.querySelectorAll('.cp-polar-plot__angle-label')].map((label) =>
        label.textContent?.trim(),
      );
    await waitFor(() => expect(angleLabels()).toEqual(['0°', '90°', '180°', '270°']));
    await expect(canvasElement.querySelector('svg')!.getBoundingClientRect().width).toBeLessThanOrEqual(240);
  },
};

/**
 * A dealer's own colours, set through the plot's custom properties alone. In a portal's Sass the same comes
 * from `@include polar-plot.overrides((reading-color: #0b4f8a, ...))` of `_polar-plot-theme.scss`.
 */
export const DealerBrand: Story = {
  args: { caption: 'Service report, drum balance' },
  render: (args) => ({
    props: args,
    styles: [
      `.dealer-portal {
        --cp-polar-plot-run-color: #0b4f8a;
        --cp-polar-plot-trial-effect-color: #a33a00;
        --cp-polar-plot-weight-color: #3b2a6b;
        --cp-polar-plot-detail-container-color: #fff4e0;
        --cp-polar-plot-shape: 0;
      }`,
    ],
    template: `
      <div class="dealer-portal">
        <cp-polar-plot [series]="series" [caption]="caption" [rotation]="rotation" [counting]="counting"
          [zeroAtDeg]="zeroAtDeg" [maxAmplitude]="maxAmplitude" [ringCount]="ringCount" [showTable]="showTable" />
      </div>`,
  }),
  play: async ({ canvasElement }) => {
    const run = canvasElement.querySelector('.cp-polar-plot__vector.cp-polar-plot--run')!;
    await expect(getComputedStyle(run).stroke).toBe('rgb(11, 79, 138)');
    const detail = canvasElement.querySelector('.cp-polar-plot__detail')!;
    await expect(getComputedStyle(detail).backgroundColor).toBe('rgb(255, 244, 224)');
  },
};

/** The job in a portal of the dark colour scheme: every colour comes from the theme's tokens. */
export const DarkScheme: Story = { ...Job, globals: { scheme: 'dark' } };

/** The client rectangles of the point labels drawn, and of the chart. */
function pointLabelRects(canvasElement: HTMLElement) {
  const chart = canvasElement.querySelector('.cp-polar-plot__chart')!.getBoundingClientRect();
  const labels = [...canvasElement.querySelectorAll('.cp-polar-plot__point-label')].map((label) =>
    label.getBoundingClientRect(),
  );
  return { chart, labels };
}

/**
 * The runs of the workbench's Widgets page, all read at the drive end: a label every point shares tells no
 * point apart, so none is drawn; the table and each point's name still say "Drive end".
 */
export const DriveEndRuns: Story = {
  args: { series: DRIVE_END_RUNS, caption: 'Drive-end readings' },
  play: async ({ canvas, canvasElement }) => {
    await expect(canvasElement.querySelectorAll('.cp-polar-plot__point-label')).toHaveLength(0);
    await expect(canvas.getAllByRole('img')[0]).toHaveAccessibleName(
      'Drive end, Initial run: 0.52 in/s at 74 degrees',
    );
  },
};

/** Two sensors with eight runs each, bunched together, on a phone: every label clear of every other. */
export const CrowdedJob: Story = {
  args: { series: CROWDED_JOB, caption: 'Flail mower, two sensors' },
  render: (args) => ({
    props: args,
    template: `
      <div style="max-width: 320px">
        <cp-polar-plot [series]="series" [caption]="caption" [rotation]="rotation" [counting]="counting"
          [zeroAtDeg]="zeroAtDeg" [maxAmplitude]="maxAmplitude" [ringCount]="ringCount" [showTable]="showTable" />
      </div>`,
  }),
  play: async ({ canvasElement }) => {
    const { chart, labels } = pointLabelRects(canvasElement);
    await expect(labels.length).toBeGreaterThan(0);
    for (const [i, a] of labels.entries()) {
      await expect(a.left).toBeGreaterThanOrEqual(chart.left - 0.5);
      await expect(a.right).toBeLessThanOrEqual(chart.right + 0.5);
      await expect(a.bottom).toBeLessThanOrEqual(chart.bottom + 0.5);
      for (const b of labels.slice(i + 1)) {
        const apart =
          a.right <= b.left + 0.5 ||
          b.right <= a.left + 0.5 ||
          a.bottom <= b.top + 0.5 ||
          b.bottom <= a.top + 0.5;
        await expect(apart).toBe(true);
      }
    }
  },
};
