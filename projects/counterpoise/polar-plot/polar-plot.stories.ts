import type { Meta, StoryObj } from '@storybook/angular-vite';
import { expect, waitFor } from 'storybook/test';
import { CpPolarPlot } from './polar-plot';
import { type PolarSeries } from './polar-plot-geometry';

// Invented demo data: a mulcher drum balanced in one plane with a trial weight. Run 1 is the initial reading,
// Run 2 the reading with a 60 g trial weight at 0 degrees, Run 3 the check after the correction weight.

const SENSOR_A_RUNS: PolarSeries = {
  id: 'sensor-a',
  label: 'Sensor A',
  kind: 'run',
  unit: 'in/s',
  points: [
    { amplitude: 0.42, angleDeg: 128, label: 'Run 1' },
    { amplitude: 0.29, angleDeg: 196, label: 'Run 2' },
    { amplitude: 0.04, angleDeg: 62, label: 'Run 3' },
  ],
};

const TRIAL_EFFECT: PolarSeries = {
  id: 'trial-effect',
  label: 'Trial effect',
  kind: 'trialEffect',
  unit: 'in/s',
  points: [{ amplitude: 0.411, angleDeg: 267.2, from: { amplitude: 0.42, angleDeg: 128 } }],
};

const RESIDUAL: PolarSeries = {
  id: 'residual',
  label: 'Predicted residual',
  kind: 'residual',
  unit: 'in/s',
  points: [{ amplitude: 0.032, angleDeg: 56 }],
};

const WEIGHTS: PolarSeries = {
  id: 'weights',
  label: 'Weights',
  kind: 'weight',
  unit: 'g',
  points: [
    { amplitude: 60, angleDeg: 0, label: 'Trial' },
    { amplitude: 61, angleDeg: 41, label: 'Ideal' },
    { amplitude: 60, angleDeg: 45, label: 'Installed' },
  ],
};

const JOB: readonly PolarSeries[] = [SENSOR_A_RUNS, TRIAL_EFFECT, RESIDUAL, WEIGHTS];

const TWO_SENSORS: readonly PolarSeries[] = [
  {
    id: 'sensor-a',
    label: 'Sensor A, drive end',
    kind: 'reading',
    unit: 'mm/s',
    points: [{ amplitude: 9.6, angleDeg: 74, label: 'A' }],
  },
  {
    id: 'sensor-b',
    label: 'Sensor B, free end',
    kind: 'reading',
    unit: 'mm/s',
    points: [{ amplitude: 6.1, angleDeg: 302, label: 'B' }],
  },
];

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
