import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { type Meta, type StoryObj, moduleMetadata } from '@storybook/angular-vite';
import { expect, waitFor } from 'storybook/test';
import { CpPhaseDial } from './phase-dial';
import { type PhaseDialMarker } from './phase-dial-values';

// Invented demo data: the left bearing of a mulcher drum, balanced in one plane with a trial weight. The
// reading of run 1, the heavy spot the influence coefficient puts behind it, the 40 g trial weight of run 2
// and the correction weight the calculation asks for.
const TRIAL_RUN_MARKERS: readonly PhaseDialMarker[] = [
  { kind: 'reading', angleDeg: 212, label: 'Run 1' },
  { kind: 'heavySpot', angleDeg: 247 },
  { kind: 'trialWeight', angleDeg: 90, label: '40 g' },
  { kind: 'correction', angleDeg: 67, label: '58 g' },
];

/** The centre of the slider on screen, and a point at `share` of its radius towards a screen angle. */
function pointOn(slider: HTMLElement, screenDeg: number, share = 0.7) {
  const rect = slider.getBoundingClientRect();
  const radians = (screenDeg * Math.PI) / 180;
  const radius = (rect.width / 2) * share;
  return {
    clientX: rect.left + rect.width / 2 + radius * Math.sin(radians),
    clientY: rect.top + rect.height / 2 - radius * Math.cos(radians),
  };
}

/**
 * An end view of the rotor to read or set an angle: the phase of a reading, where the trial weight went,
 * where the correction goes. Tap or drag anywhere on the dial (gloved hands need no aim), use the arrows
 * (1 step), Page keys (10 degrees) and Home/End, or type in the compact variant. A form control with
 * `required` and allowed-position validation. Import it from `@counterpoise/ng/phase-dial`.
 */
const meta: Meta<CpPhaseDial> = {
  title: 'Widgets/Phase dial',
  component: CpPhaseDial,
  tags: ['autodocs'],
  decorators: [moduleMetadata({ imports: [ReactiveFormsModule] })],
  argTypes: {
    value: { control: { type: 'number', min: 0, max: 359 } },
    rotation: { control: 'inline-radio', options: ['clockwise', 'counterClockwise'] },
    counting: { control: 'inline-radio', options: ['againstRotation', 'withRotation'] },
    zeroAtDeg: { control: { type: 'number', min: 0, max: 359, step: 90 } },
    step: { control: { type: 'number', min: 0.1, max: 90 } },
    positions: { control: 'object' },
    markers: { control: 'object' },
    compact: { control: 'boolean' },
    readonly: { control: 'boolean' },
    required: { control: 'boolean' },
    label: { control: 'text' },
    size: { control: { type: 'range', min: 160, max: 320, step: 8 } },
  },
  args: {
    label: 'Trial weight angle',
    rotation: 'clockwise',
    counting: 'againstRotation',
    zeroAtDeg: 0,
    step: 1,
    positions: null,
    markers: [],
    compact: false,
    readonly: false,
    required: false,
  },
};

export default meta;
type Story = StoryObj<CpPhaseDial>;

/** No angle yet: the first key press lands on the reference mark, and arrows step from there. */
export const Empty: Story = {
  play: async ({ canvas, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Trial weight angle' });
    await expect(dial).toHaveAttribute('aria-valuetext', 'no angle set');
    await userEvent.tab();
    await expect(dial).toHaveFocus();
    await userEvent.keyboard('{ArrowRight}');
    await expect(dial).toHaveAttribute('aria-valuenow', '0');
    await userEvent.keyboard('{PageUp}{PageUp}{ArrowUp}');
    await expect(dial).toHaveAttribute(
      'aria-valuetext',
      '21 degrees, counted against rotation from the reference mark',
    );
    await userEvent.keyboard('{ArrowDown}{ArrowDown}{Home}');
    await expect(dial).toHaveAttribute('aria-valuenow', '0');
    await userEvent.keyboard('{End}');
    await expect(dial).toHaveAttribute('aria-valuenow', '359');
  },
};

/** An angle set: the pointer with its thumb on the rim, the angle read out in the middle. */
export const Filled: Story = {
  args: { value: 212 },
  play: async ({ canvas }) => {
    const dial = canvas.getByRole('slider', { name: 'Trial weight angle' });
    await expect(dial).toHaveAttribute(
      'aria-valuetext',
      '212 degrees, counted against rotation from the reference mark',
    );
    await expect(dial).toHaveTextContent('212°');
  },
};

/** After the trial run: each marker with its own shape and a legend that names it. */
export const Markers: Story = {
  args: { label: 'Correction angle', value: 67, markers: TRIAL_RUN_MARKERS, readonly: true },
  play: async ({ canvas }) => {
    const legend = canvas.getByRole('list', { name: 'Correction angle markers' });
    const items = Array.from(legend.querySelectorAll('li')).map((item) =>
      item.textContent?.replace(/\s+/g, ' ').trim(),
    );
    await expect(items).toEqual([
      'Reading Run 1 212°',
      'Heavy spot 247°',
      'Trial weight 40 g 90°',
      'Correction 58 g 67°',
    ]);
  },
};

/**
 * Seen from the other end: the rotor turns counter-clockwise, angles count with it and the reference mark
 * sits at 3 o'clock. Dragging from 12 o'clock to 9 o'clock follows the convention.
 */
export const CounterClockwise: Story = {
  args: { rotation: 'counterClockwise', counting: 'withRotation', zeroAtDeg: 90, value: 30 },
  play: async ({ canvas, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Trial weight angle' });
    await expect(dial).toHaveAccessibleDescription(/turns counter-clockwise as seen here.*on the right/);
    await userEvent.pointer([
      { keys: '[MouseLeft>]', target: dial, coords: pointOn(dial, 0) },
      { target: dial, coords: pointOn(dial, 315) },
      { target: dial, coords: pointOn(dial, 270) },
      { keys: '[/MouseLeft]', target: dial, coords: pointOn(dial, 270) },
    ]);
    await expect(dial).toHaveAttribute('aria-valuenow', '180');
    await expect(dial).toHaveFocus();
  },
};

/** Twelve bolt holes on a fan hub: the dial snaps to them, and arrows move from hole to hole. */
export const DiscretePositions: Story = {
  args: { label: 'Bolt hole', positions: 12, value: 60 },
  play: async ({ canvas, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Bolt hole' });
    await expect(dial).toHaveAttribute('aria-valuemax', '330');
    dial.focus();
    await userEvent.keyboard('{ArrowUp}');
    await expect(dial).toHaveAttribute('aria-valuenow', '90');
    await userEvent.keyboard('{ArrowLeft}{ArrowLeft}{ArrowLeft}{ArrowLeft}');
    await expect(dial).toHaveAttribute('aria-valuenow', '330');
    // Counted against a clockwise rotor, a touch a little past 3 o'clock is near 260 degrees: hole 270.
    await userEvent.pointer({ keys: '[MouseLeft]', target: dial, coords: pointOn(dial, 100) });
    await expect(dial).toHaveAttribute('aria-valuenow', '270');
  },
};

/** Three holders on one ring of a mulcher drum: few positions are labelled one by one. */
export const HolderPositions: Story = {
  args: { label: 'Holder', positions: { count: 3, firstDeg: 40 }, value: 160, size: 200 },
  play: async ({ canvas, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Holder' });
    await expect(dial).toHaveAccessibleDescription(/3 allowed positions: 40, 160, 280\./);
    dial.focus();
    await userEvent.keyboard('{Home}');
    await expect(dial).toHaveAttribute('aria-valuenow', '40');
  },
};

/** Disabled: shown, not focusable, not changed by keys or pointer. */
export const Disabled: Story = {
  render: (args) => ({
    props: args,
    template: `<cp-phase-dial [label]="label" [value]="value" [disabled]="true" />`,
  }),
  args: { value: 135 },
  play: async ({ canvas, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Trial weight angle' });
    await expect(dial).toHaveAttribute('aria-disabled', 'true');
    await userEvent.tab();
    await expect(dial).not.toHaveFocus();
    await userEvent.pointer({ keys: '[MouseLeft]', target: dial, coords: pointOn(dial, 270) });
    await expect(dial).toHaveAttribute('aria-valuenow', '135');
  },
};

/** Read-only: a reading to look at, focusable and spoken, with a needle tip instead of a thumb. */
export const ReadOnly: Story = {
  args: { label: 'Phase, left bearing', value: 212, readonly: true, markers: TRIAL_RUN_MARKERS.slice(0, 2) },
  play: async ({ canvas, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Phase, left bearing' });
    await expect(dial).toHaveAttribute('aria-readonly', 'true');
    await userEvent.tab();
    await expect(dial).toHaveFocus();
    await userEvent.keyboard('{ArrowUp}{PageUp}');
    await expect(dial).toHaveAttribute('aria-valuenow', '212');
  },
};

/** Compact: a small dial with a numeric field beside it, for typing the angle off the meter's display. */
export const Compact: Story = {
  args: { label: 'Phase, left bearing', compact: true, counting: 'withRotation' },
  play: async ({ canvas, userEvent }) => {
    const field = canvas.getByRole('textbox', { name: 'Phase, left bearing' });
    const dial = canvas.getByRole('slider', { name: 'Phase, left bearing' });
    await expect(field).toHaveAccessibleDescription('Degrees with rotation from the mark');
    await userEvent.type(field, '212');
    await expect(dial).toHaveAttribute('aria-valuenow', '212');
    await userEvent.clear(field);
    await userEvent.type(field, '372{Tab}');
    await expect(dial).toHaveAttribute('aria-valuenow', '12');
    await expect(field).toHaveValue('12');
  },
};

/**
 * In a reactive form: required, and on one of six holder positions. Touched and empty, the dial shows the
 * error; a position clears it. The message is the page's own, tied to the form control's errors.
 */
export const FormValidation: Story = {
  render: (args) => ({
    props: { ...args, angle: new FormControl<number | null>(null, Validators.required) },
    template: `
      <form style="display: grid; gap: 12px; justify-items: start">
        <cp-phase-dial
          [formControl]="angle"
          [label]="label"
          [positions]="positions"
          [compact]="compact"
          [required]="true"
        />
        @if (angle.touched && angle.errors?.['required']) {
          <p role="alert" style="margin: 0; color: var(--mat-sys-error)">Set the angle of the correction weight.</p>
        }
        @if (angle.errors?.['cpPhasePosition']) {
          <p role="alert" style="margin: 0; color: var(--mat-sys-error)">Choose one of the six holder positions.</p>
        }
      </form>`,
  }),
  args: { label: 'Correction angle', positions: { count: 6, firstDeg: 0 }, compact: true },
  play: async ({ canvas, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Correction angle' });
    const field = canvas.getByRole('textbox', { name: 'Correction angle' });
    await expect(dial).toHaveAttribute('aria-required', 'true');
    await userEvent.tab();
    await userEvent.tab();
    await userEvent.tab();
    await expect(dial).toHaveAttribute('aria-invalid', 'true');
    await expect(canvas.getByRole('alert')).toHaveTextContent('Set the angle of the correction weight.');

    await userEvent.type(field, '100{Tab}');
    await expect(canvas.getByRole('alert')).toHaveTextContent('Choose one of the six holder positions.');
    dial.focus();
    await userEvent.keyboard('{ArrowUp}');
    await expect(dial).toHaveAttribute('aria-valuenow', '120');
    await waitFor(() => expect(canvas.queryByRole('alert')).toBeNull());
    await expect(dial).not.toHaveAttribute('aria-invalid');
  },
};

/** The smallest and the largest dial the layout is made for, side by side. */
export const Sizes: Story = {
  render: (args) => ({
    props: args,
    template: `
      <div style="display: flex; flex-wrap: wrap; gap: 24px; align-items: flex-start">
        <cp-phase-dial label="Small dial" [size]="160" [value]="value" [markers]="markers" />
        <cp-phase-dial label="Large dial" [size]="320" [value]="value" [markers]="markers" />
      </div>`,
  }),
  args: { value: 67, markers: TRIAL_RUN_MARKERS },
  play: async ({ canvas }) => {
    const small = canvas.getByRole('slider', { name: 'Small dial' });
    const large = canvas.getByRole('slider', { name: 'Large dial' });
    await expect(small.getBoundingClientRect().width).toBe(160);
    await expect(large.getBoundingClientRect().width).toBe(320);
  },
};

/**
 * A dealer's own brand colours, set through the dial's custom properties alone. In a portal's Sass the same
 * comes from `@include phase-dial.overrides((pointer-color: #0b5cad, ...))` of `_phase-dial-theme.scss`.
 */
export const DealerBrand: Story = {
  render: (args) => ({
    props: args,
    styles: [
      `.dealer-portal {
        --cp-phase-dial-pointer-color: #0b5cad;
        --cp-phase-dial-face-color: #eef4fb;
        --cp-phase-dial-rim-color: #0b5cad;
        --cp-phase-dial-reference-color: #7a3e00;
        --cp-phase-dial-size: 280px;
      }`,
    ],
    template: `
      <div class="dealer-portal">
        <cp-phase-dial [label]="label" [value]="value" [markers]="markers" />
      </div>`,
  }),
  args: { label: 'Correction angle', value: 67, markers: TRIAL_RUN_MARKERS },
  play: async ({ canvasElement, canvas }) => {
    const dial = canvas.getByRole('slider', { name: 'Correction angle' });
    const thumb = canvasElement.querySelector('.cp-phase-dial__thumb')!;
    const face = canvasElement.querySelector('.cp-phase-dial__face')!;
    await expect(getComputedStyle(thumb).fill).toBe('rgb(11, 92, 173)');
    await expect(getComputedStyle(face).fill).toBe('rgb(238, 244, 251)');
    await expect(dial.getBoundingClientRect().width).toBe(280);
  },
};

/** The markers in a portal of the dark colour scheme: every colour comes from the theme's tokens. */
export const DarkScheme: Story = { ...Markers, globals: { scheme: 'dark' } };
