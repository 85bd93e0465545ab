import { provideHttpClient, withFetch } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, input, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { type Meta, type StoryObj, applicationConfig, moduleMetadata } from '@storybook/angular-vite';
import { expect, waitFor, within } from 'storybook/test';
import { provideCounterpoise } from '@counterpoise/ng/solver';
import { CpWeightCalculator } from './weight-calculator';
import { jobDraft } from './weight-calculator.fixtures';
import {
  CALC_METHODS,
  type CalcMethod,
  type WeightCalculatorDraft,
  type WeightCalculatorErrors,
  type WeightCalculatorValue,
} from './weight-calculator-model';

// Invented demo data (weight-calculator.fixtures.ts): the drum of a forestry mulcher on a carrier, worked
// from its left bearing. The readings are the API reference's examples; no real machine, shop or person
// is named anywhere.

const TRIAL_WEIGHT_JOB = jobDraft('single-plane');
const TWO_PLANE_JOB = jobDraft('multi-plane');
const AMPLITUDE_ONLY_JOB = jobDraft('four-run');

/**
 * A dealer's job form with the calculator as one of its controls, and what the form reads from it: its
 * status, the method of the draft, the calculation and the errors, as a page would show them.
 */
@Component({
  selector: 'cp-story-job-form',
  imports: [CpWeightCalculator, ReactiveFormsModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  styles: `
    .story-job__state {
      margin-top: 16px;
      padding: 12px 16px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 12px;
    }
    .story-job__state dl {
      display: grid;
      grid-template-columns: max-content 1fr;
      gap: 4px 16px;
      margin: 0;
    }
    .story-job__state dd {
      margin: 0;
    }
  `,
  template: `
    <form [formGroup]="job">
      <cp-weight-calculator formControlName="correction" [methods]="methods()" />
      <section class="story-job__state" aria-labelledby="story-job-state">
        <h3 id="story-job-state">The job form reads</h3>
        <dl>
          <dt>Status</dt>
          <dd data-testid="status">{{ state().status }}</dd>
          <dt>Method</dt>
          <dd>{{ state().method }}</dd>
          <dt>Correction</dt>
          <dd data-testid="calculation">{{ state().calculation }}</dd>
          <dt>Missing</dt>
          <dd data-testid="errors">{{ state().errors }}</dd>
        </dl>
      </section>
    </form>
  `,
})
class StoryJobForm {
  /** The methods the calculator offers. */
  readonly methods = input<readonly CalcMethod[]>(CALC_METHODS);
  /** A job the page kept, set into the form when the story starts. */
  readonly kept = input<WeightCalculatorDraft | null>(null);

  protected readonly job = new FormGroup({
    correction: new FormControl<WeightCalculatorValue | null>(null),
  });
  private readonly _events = toSignal(this.job.events, { initialValue: null });
  protected readonly state = computed(() => {
    this._events();
    const control = this.job.controls.correction;
    const errors = (control.errors ?? {}) as WeightCalculatorErrors;
    const missing = [
      ...(errors.calculatorFields?.fields.map((field) => `${field.section}: ${field.message}`) ?? []),
      ...(errors.calculatorNotComputed ? ['No correction computed for these values.'] : []),
    ];
    const calculation = control.value?.calculation;
    return {
      status: control.status,
      method: control.value?.draft.method ?? 'nothing typed yet',
      calculation:
        calculation?.method === 'single-plane'
          ? `${calculation.result.correction.mass.toFixed(1)} ${calculation.massUnit} at ` +
            `${Math.round(calculation.result.correction.angleDeg) % 360}°`
          : calculation
            ? `computed (${calculation.method})`
            : 'none',
      errors: missing.length === 0 ? 'nothing' : missing.join(' '),
    };
  });

  constructor() {
    effect(() => {
      const kept = this.kept();
      untracked(() => this.job.setValue({ correction: kept && { draft: kept, calculation: null } }));
    });
  }
}

/**
 * The correction weight calculator: one form per method a technician uses in the field, phases and angles
 * on the phase dial, and a result panel with the weight, its split onto the places a weight can go, the
 * predicted residual, the engine's warnings and an end view. It computes through `BALANCE_SOLVER`, which
 * `provideCounterpoise()` sets; these stories compute on the device unless they say otherwise. Import it
 * from `@counterpoise/ng/weight-calculator`.
 */
const meta: Meta<CpWeightCalculator> = {
  title: 'Widgets/Weight calculator',
  component: CpWeightCalculator,
  tags: ['autodocs'],
  decorators: [applicationConfig({ providers: [provideCounterpoise({ solver: 'local' })] })],
  argTypes: {
    methods: { control: 'check', options: CALC_METHODS },
    method: { control: 'select', options: CALC_METHODS },
    massUnit: { control: 'inline-radio', options: ['g', 'oz'] },
    amplitudeUnit: { control: 'inline-radio', options: ['in/s', 'mm/s'] },
    rotation: { control: 'inline-radio', options: ['clockwise', 'counterClockwise'] },
    counting: { control: 'inline-radio', options: ['againstRotation', 'withRotation'] },
    zeroAtDeg: { control: { type: 'number', min: 0, max: 359, step: 90 } },
    allowedPositions: { control: 'object' },
    blockedSectors: { control: 'object' },
    sensitivity: { control: 'object' },
    draft: { control: false },
  },
  args: {
    methods: [...CALC_METHODS],
    method: null,
    massUnit: 'g',
    amplitudeUnit: 'in/s',
    rotation: 'clockwise',
    counting: 'againstRotation',
    zeroAtDeg: 0,
    allowedPositions: null,
    blockedSectors: [],
    sensitivity: null,
    draft: null,
  },
};

export default meta;
type Story = StoryObj<CpWeightCalculator>;

/** Nothing typed yet: the first method offered, the result panel waiting. */
export const Empty: Story = {
  play: async ({ canvas }) => {
    await expect(canvas.getByRole('form', { name: 'Correction weight calculator' })).toBeVisible();
    await expect(canvas.getByText(/the correction weight appears here/)).toBeVisible();
    await expect(canvas.getByRole('radio', { name: 'Stored sensitivity' })).toBeChecked();
  },
};

/** A trial-weight job typed in and computed: the correction, the predicted residual and the end view. */
export const TrialWeightComputed: Story = {
  args: { draft: TRIAL_WEIGHT_JOB, method: 'single-plane' },
  play: async ({ canvas, userEvent }) => {
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    const result = within(canvas.getByRole('region', { name: 'Result' }));
    await expect(await result.findByRole('heading', { name: 'Correction weight' })).toBeVisible();
    await expect(result.getByText('Predicted residual')).toBeVisible();
    await expect(result.getByText('Computed on this device.')).toBeVisible();
  },
};

/** Empty and wrong fields say what is wrong, and nothing is computed until they are right. */
export const FormValidation: Story = {
  args: { method: 'single-plane' },
  play: async ({ canvas, userEvent }) => {
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    // Material fades its errors in.
    await waitFor(() => expect(canvas.getByText('Enter the initial amplitude.')).toBeVisible());
    await waitFor(() => expect(canvas.getByText('Enter the trial run phase.')).toBeVisible());
    // The first field that needs the technician takes the focus.
    const amplitude = canvas.getByRole('spinbutton', { name: 'Initial amplitude' });
    await expect(amplitude).toHaveFocus();
    await userEvent.type(amplitude, '-0.4');
    await userEvent.tab();
    await waitFor(() => expect(canvas.getByText(/initial amplitude cannot be negative/)).toBeVisible());
    await userEvent.clear(amplitude);
    await userEvent.type(amplitude, '0.52');
    await userEvent.tab();
    await waitFor(() => expect(canvas.queryByText(/initial amplitude cannot be negative/)).toBeNull());
    await expect(canvas.queryByRole('heading', { name: 'Correction weight' })).toBeNull();
  },
};

/**
 * The calculation service cannot be reached (this story's service address never resolves): the
 * calculator says why, keeps every reading, and offers to compute on the device.
 */
export const ServiceUnreachable: Story = {
  args: { draft: TRIAL_WEIGHT_JOB, method: 'single-plane' },
  decorators: [
    applicationConfig({
      providers: [
        provideHttpClient(withFetch()),
        provideCounterpoise({
          solver: 'remote',
          apiBaseUrl: 'https://calc.invalid',
          apiKey: 'cpk_DemoKeyForTheStoriesOnlyXXXXXXXXXXXXXXXXXXXX',
          timeoutMs: 5000,
        }),
      ],
    }),
  ],
  play: async ({ canvas, userEvent }) => {
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    const alert = await canvas.findByRole('alert', {}, { timeout: 8000 });
    await expect(alert).toHaveTextContent(/could not be reached|did not answer in time/);
    await expect(canvas.getByRole('spinbutton', { name: 'Initial amplitude' })).toHaveValue(0.52);
    await userEvent.click(within(alert).getByRole('button', { name: 'Compute on this device' }));
    await expect(await canvas.findByText('Computed on this device.')).toBeVisible();
    await expect(canvas.queryByRole('alert')).toBeNull();
  },
};

/** The machine family's stored sensitivity, one run, no trial weight. */
export const StoredSensitivity: Story = {
  args: {
    method: 'one-run',
    sensitivity: { massPerAmplitude: 200 },
    draft: jobDraft('one-run'),
  },
  play: async ({ canvas, userEvent }) => {
    await expect(canvas.getByRole('spinbutton', { name: 'Sensitivity' })).toHaveValue(200);
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    await expect(await canvas.findByText('Heavy spot', { selector: 'dt' })).toBeVisible();
    await expect(canvas.getByText(/does not predict the residual/)).toBeVisible();
  },
};

/** Two planes, two sensors, one trial weight per plane: a correction for each plane. */
export const TwoPlanes: Story = {
  args: { method: 'multi-plane', draft: TWO_PLANE_JOB },
  play: async ({ canvas, userEvent }) => {
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    await expect(await canvas.findByRole('heading', { name: 'Plane 1 correction' })).toBeVisible();
    await expect(canvas.getByRole('heading', { name: 'Plane 2 correction' })).toBeVisible();
    await expect(canvas.getByText('Condition number')).toBeVisible();
  },
};

/** No phase reading: the trial weight at three positions, amplitudes only. */
export const AmplitudeOnly: Story = {
  args: { method: 'four-run', draft: AMPLITUDE_ONLY_JOB },
  play: async ({ canvas, userEvent }) => {
    await expect(canvas.getByText('Run 4: trial weight at position 3')).toBeVisible();
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    await expect(await canvas.findByText('Disagreement between runs')).toBeVisible();
  },
};

/**
 * Twelve holder positions and a weld where nothing can go: the trial weight snaps to the positions and the
 * correction is split between the two either side of it.
 */
export const DiscretePositions: Story = {
  args: {
    method: 'single-plane',
    draft: TRIAL_WEIGHT_JOB,
    allowedPositions: { count: 12, firstDeg: 0 },
    blockedSectors: [{ fromDeg: 140, toDeg: 170, label: 'weld' }],
  },
  play: async ({ canvas, userEvent }) => {
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    await expect(await canvas.findByText('Where it can go, split between:')).toBeVisible();
    const parts = canvas
      .getAllByRole('listitem')
      .filter((item) => item.classList.contains('cp-weight-calculator__split-part'));
    await expect(parts).toHaveLength(2);
  },
};

/** Seen from the other end: the rotor turns counter-clockwise, angles counted with rotation, the mark on the right. */
export const CounterClockwise: Story = {
  args: {
    method: 'single-plane',
    draft: TRIAL_WEIGHT_JOB,
    rotation: 'counterClockwise',
    counting: 'withRotation',
    zeroAtDeg: 90,
  },
  play: async ({ canvas, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Initial phase' });
    await expect(dial).toHaveAttribute(
      'aria-valuetext',
      '74 degrees, counted with rotation from the reference mark',
    );
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    await expect(await canvas.findByRole('heading', { name: 'Correction weight' })).toBeVisible();
  },
};

/** The units switched to ounces and millimetres per second: labels follow, the numbers typed stay. */
export const OuncesAndMillimetres: Story = {
  args: { method: 'single-plane', draft: TRIAL_WEIGHT_JOB },
  play: async ({ canvas, userEvent }) => {
    await userEvent.click(canvas.getByRole('radio', { name: 'oz' }));
    await userEvent.click(canvas.getByRole('radio', { name: 'mm/s' }));
    await expect(canvas.getByRole('spinbutton', { name: 'Trial mass' })).toHaveValue(60);
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    await expect((await canvas.findAllByText(/^\d+\.\d{2} oz$/))[0]).toBeVisible();
  },
};

/** A closed job: the readings show, nothing can be changed or computed. */
export const Disabled: Story = {
  args: { method: 'single-plane', draft: TRIAL_WEIGHT_JOB },
  render: (args) => ({
    props: args,
    template: `<cp-weight-calculator [method]="method" [draft]="draft" [disabled]="true" />`,
  }),
  parameters: {
    // A disabled dial dims its hint with the rest of it. WCAG 1.4.3 exempts inactive components, but axe
    // does not know the hint belongs to one; only that hint is left out of the check.
    a11y: { context: { exclude: ['.cp-phase-dial--disabled .cp-phase-dial__field-hint'] } },
  },
  play: async ({ canvas }) => {
    await expect(canvas.getByRole('button', { name: 'Compute the correction' })).toBeDisabled();
    await expect(canvas.getByRole('spinbutton', { name: 'Initial amplitude' })).toBeDisabled();
  },
};

/** Keyboard alone: switch the method with the arrows, type, compute with Enter. */
export const KeyboardOnly: Story = {
  args: { methods: ['single-plane', 'four-run'], method: 'four-run', draft: AMPLITUDE_ONLY_JOB },
  play: async ({ canvas, userEvent }) => {
    await userEvent.tab();
    await expect(canvas.getByRole('radio', { name: 'Amplitude only' })).toHaveFocus();
    // One stop per toggle group (method, mass unit, amplitude unit), then the first field.
    await userEvent.tab();
    await userEvent.tab();
    await userEvent.tab();
    await expect(canvas.getByRole('spinbutton', { name: 'Initial amplitude' })).toHaveFocus();
    await userEvent.keyboard('{Enter}');
    await expect(await canvas.findByText('Disagreement between runs')).toBeVisible();
  },
};

/**
 * A dealer's own brand colours, set through the calculator's custom properties alone. In a portal's Sass
 * the same comes from `@include calculator.overrides((figure-color: #7a3e00, ...))`.
 */
export const DealerBrand: Story = {
  args: { method: 'single-plane', draft: TRIAL_WEIGHT_JOB },
  render: (args) => ({
    props: args,
    styles: [
      `.dealer-portal {
        padding: 16px;
        --cp-weight-calculator-figure-color: #7a3e00;
        --cp-weight-calculator-panel-color: #fff4e0;
        --cp-weight-calculator-shape: 0;
      }`,
    ],
    template: `
      <div class="dealer-portal">
        <cp-weight-calculator [method]="method" [draft]="draft" />
      </div>`,
  }),
  play: async ({ canvas, userEvent }) => {
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    const panel = canvas.getByRole('region', { name: 'Result' });
    const mass = await within(panel).findByText(/ g$/);
    await expect(getComputedStyle(mass).color).toBe('rgb(122, 62, 0)');
    await expect(getComputedStyle(panel).backgroundColor).toBe('rgb(255, 244, 224)');
  },
};

/** The computed result in a portal of the dark colour scheme, with its drawing. */
export const DarkScheme: Story = { ...TrialWeightComputed, globals: { scheme: 'dark' } };

/**
 * The calculator as one control of a dealer's reactive form (`formControlName="correction"`): the form's
 * value is the draft and the calculation that matches it, and the control stays invalid, saying what is
 * missing, until a correction is computed for the values typed.
 */
export const InAReactiveForm: StoryObj<StoryJobForm> = {
  decorators: [moduleMetadata({ imports: [StoryJobForm] })],
  render: () => ({
    props: { kept: TRIAL_WEIGHT_JOB, methods: ['single-plane', 'multi-plane'] },
    template: `<cp-story-job-form [kept]="kept" [methods]="methods" />`,
  }),
  play: async ({ canvas, userEvent }) => {
    await expect(canvas.getByTestId('status')).toHaveTextContent('INVALID');
    await expect(canvas.getByTestId('errors')).toHaveTextContent('No correction computed');
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    await waitFor(() => expect(canvas.getByTestId('status')).toHaveTextContent('VALID'));
    await expect(canvas.getByTestId('calculation')).toHaveTextContent(/^\d+\.\d g at \d+°$/);
    const amplitude = canvas.getByRole('spinbutton', { name: 'Initial amplitude' });
    await userEvent.clear(amplitude);
    await waitFor(() => expect(canvas.getByTestId('status')).toHaveTextContent('INVALID'));
    await expect(canvas.getByTestId('errors')).toHaveTextContent(
      'Run 1: no weight: Enter the initial amplitude.',
    );
  },
};

/** Widths of the toggles of a group, rounded to the pixel. */
function toggleWidths(group: HTMLElement): number[] {
  return [...group.querySelectorAll('.mat-button-toggle')].map((toggle) =>
    Math.round(toggle.getBoundingClientRect().width),
  );
}

/** Two methods offered: the method toggles share the width evenly, whatever their labels. */
export const TwoMethods: Story = {
  args: { methods: ['one-run', 'single-plane'], method: 'single-plane', draft: TRIAL_WEIGHT_JOB },
  play: async ({ canvas }) => {
    const methods = canvas.getByRole('radiogroup', { name: 'Method' });
    const [first, second] = toggleWidths(methods);
    await expect(first).toBeGreaterThan(0);
    await expect(first).toBe(second);
    for (const name of ['Masses in', 'Amplitudes in']) {
      const [one, other] = toggleWidths(canvas.getByRole('radiogroup', { name }));
      await expect(one).toBe(other);
    }
  },
};

/**
 * On a phone (here a 360 px column): the four methods in two even rows of two, each reading's dial under
 * its field, the result panel under the form, and nothing wider than the screen.
 */
export const PhoneWidth: Story = {
  args: { method: 'single-plane', draft: TRIAL_WEIGHT_JOB },
  render: (args) => ({
    props: args,
    styles: ['.phone { width: 360px; }'],
    template: `
      <div class="phone">
        <cp-weight-calculator [method]="method" [draft]="draft" />
      </div>`,
  }),
  play: async ({ canvas, canvasElement, userEvent }) => {
    const toggles = [
      ...canvas.getByRole('radiogroup', { name: 'Method' }).querySelectorAll('.mat-button-toggle'),
    ];
    const boxes = toggles.map((toggle) => toggle.getBoundingClientRect());
    await expect(boxes).toHaveLength(4);
    await expect(Math.round(boxes[0]!.top)).toBe(Math.round(boxes[1]!.top));
    await expect(boxes[2]!.top).toBeGreaterThan(boxes[0]!.top);
    await expect(new Set(boxes.map((box) => Math.round(box.width))).size).toBe(1);
    const calculator = canvasElement.querySelector<HTMLElement>('cp-weight-calculator')!;
    await expect(calculator.scrollWidth).toBeLessThanOrEqual(calculator.clientWidth);
    await userEvent.click(canvas.getByRole('button', { name: 'Compute the correction' }));
    await expect(await canvas.findByRole('heading', { name: 'Correction weight' })).toBeVisible();
  },
};
