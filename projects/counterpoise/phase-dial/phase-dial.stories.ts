import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { type Meta, type StoryObj, moduleMetadata } from '@storybook/angular-vite';
import { expect, waitFor } from 'storybook/test';
import { CpPhaseDial } from './phase-dial';
import {
  INITIAL_RUN_PHASE_MESSAGE,
  SCALE_LABEL_MIN_PX,
  SIX_HOLDERS,
  THUMB_DIAL_MIN_PX,
  TRIAL_RUN_MARKERS,
} from './phase-dial.fixtures';
import { DIAL_VIEW_SIZE } from './phase-dial-drawing';
import { phaseDialErrorMessage } from './phase-dial-values';

/** What the dial says, in its own words, when an angle is required and none is set. */
const REQUIRED_MESSAGE = phaseDialErrorMessage({ required: true })!;

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
  decorators: [moduleMetadata({ imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule] })],
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
    errorText: { control: 'text' },
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

/**
 * Compact: a Material outlined field to type the angle off the meter's display (a decimal keypad on a
 * phone), and a thumb-sized dial beside it. Tab into the field, type, Tab on to the dial and use arrows.
 */
export const Compact: Story = {
  args: { label: 'Phase, left bearing', compact: true, counting: 'withRotation' },
  play: async ({ canvas, userEvent }) => {
    const field = canvas.getByRole('textbox', { name: 'Phase, left bearing' });
    const dial = canvas.getByRole('slider', { name: 'Phase, left bearing' });
    await expect(field).toHaveAttribute('inputmode', 'decimal');
    await expect(field).toHaveAccessibleDescription('Degrees with rotation from the mark');
    await userEvent.tab();
    await expect(field).toHaveFocus();
    await userEvent.keyboard('212');
    await expect(dial).toHaveAttribute('aria-valuenow', '212');
    await userEvent.clear(field);
    await userEvent.type(field, '372{Tab}');
    await expect(dial).toHaveFocus();
    await expect(dial).toHaveAttribute('aria-valuenow', '12');
    await expect(field).toHaveValue('12');
    await userEvent.keyboard('{ArrowUp}{PageUp}');
    await expect(field).toHaveValue('23');
  },
};

/**
 * Compact, required and left empty: the field turns to Material's error colours and says why under it,
 * here in the page's own words (`errorText`), linked to the field and the dial by `aria-describedby`.
 */
export const CompactWithError: Story = {
  render: (args) => ({
    props: { ...args, phase: new FormControl<number | null>(null, Validators.required) },
    template: `
      <cp-phase-dial [formControl]="phase" [label]="label" [compact]="true" [errorText]="errorText" />`,
  }),
  args: { label: 'Phase, run 1', errorText: INITIAL_RUN_PHASE_MESSAGE },
  play: async ({ canvas, userEvent }) => {
    const field = canvas.getByRole('textbox', { name: 'Phase, run 1' });
    const dial = canvas.getByRole('slider', { name: 'Phase, run 1' });
    await expect(field).toBeRequired();
    await userEvent.tab();
    await userEvent.tab();
    await userEvent.tab();
    await expect(dial).toHaveAttribute('aria-invalid', 'true');
    await expect(field).toHaveAccessibleDescription(INITIAL_RUN_PHASE_MESSAGE);
    await expect(dial).toHaveAccessibleDescription(new RegExp(`${INITIAL_RUN_PHASE_MESSAGE}$`));
    await userEvent.type(field, '4o{Tab}');
    await expect(field).toHaveValue('4o');
    await expect(field).toHaveAttribute('aria-invalid', 'true');
    await expect(field).toHaveAccessibleDescription(INITIAL_RUN_PHASE_MESSAGE);
  },
};

/**
 * In a reactive form, on one of six holder positions, with no messages of the page's own: touched and
 * empty, or off the holders, the dial says why in its own words; a holder clears it.
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
      </form>`,
  }),
  args: { label: 'Correction angle', positions: SIX_HOLDERS, compact: true },
  play: async ({ canvas, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Correction angle' });
    const field = canvas.getByRole('textbox', { name: 'Correction angle' });
    await expect(dial).toHaveAttribute('aria-required', 'true');
    await userEvent.tab();
    await userEvent.tab();
    await userEvent.tab();
    await expect(dial).toHaveAttribute('aria-invalid', 'true');
    await expect(field).toHaveAccessibleDescription(REQUIRED_MESSAGE);

    await userEvent.type(field, '100{Tab}');
    await expect(field).toHaveAccessibleDescription(
      phaseDialErrorMessage({ cpPhasePosition: { allowed: [0, 60, 120, 180, 240, 300] } })!,
    );
    await userEvent.keyboard('{ArrowUp}');
    await expect(dial).toHaveAttribute('aria-valuenow', '120');
    await waitFor(() => expect(dial).not.toHaveAttribute('aria-invalid'));
    await expect(canvas.queryByText(/Choose one/)).toBeNull();
  },
};

/**
 * The full-size dial in error: the message sits under the dial in the form field's error style, in a
 * polite live region, and the dial's `aria-describedby` and `aria-invalid` point at it.
 */
export const FullSizeWithError: Story = {
  render: (args) => ({
    props: { ...args, angle: new FormControl<number | null>(null, Validators.required) },
    template: `<cp-phase-dial [formControl]="angle" [label]="label" [required]="true" />`,
  }),
  args: { label: 'Trial weight angle' },
  play: async ({ canvas, canvasElement, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Trial weight angle' });
    await userEvent.tab();
    await userEvent.tab();
    await expect(dial).toHaveAttribute('aria-invalid', 'true');
    const error = canvas.getByText(REQUIRED_MESSAGE);
    await expect(dial).toHaveAccessibleDescription(new RegExp(`${REQUIRED_MESSAGE}$`));
    await expect(error.closest('[aria-live="polite"]')).not.toBeNull();
    await expect(canvasElement.querySelector('[role="alert"]')).toBeNull();
    // The message stays up for the eye; FormValidation shows a valid angle clearing it.
    await expect(error).toBeVisible();
    await expect(getComputedStyle(error).fontSize).toBe('12px');
  },
};

/**
 * A reading in a row of the page's own outlined Material fields: the phase field has their height, label
 * and error style, and its outline lines up with theirs; all three say why when the form is submitted.
 */
export const CompactInFieldRow: Story = {
  render: () => ({
    props: {
      reading: new FormGroup({
        amplitude: new FormControl<number | null>(null, Validators.required),
        phase: new FormControl<number | null>(null, Validators.required),
        mass: new FormControl<number | null>(null, Validators.required),
      }),
      phaseMessage: INITIAL_RUN_PHASE_MESSAGE,
    },
    template: `
      <form [formGroup]="reading" style="display: flex; flex-wrap: wrap; gap: 16px; align-items: flex-start">
        <mat-form-field appearance="outline" subscriptSizing="dynamic" style="flex: 1 1 10rem">
          <mat-label>Amplitude</mat-label>
          <input matInput formControlName="amplitude" inputmode="decimal" />
          <span matTextSuffix>mm/s</span>
          <mat-error>Enter the amplitude of the initial run</mat-error>
        </mat-form-field>
        <cp-phase-dial formControlName="phase" label="Phase" [compact]="true" [required]="true"
          [errorText]="phaseMessage" style="flex: 2 1 20rem" />
        <mat-form-field appearance="outline" subscriptSizing="dynamic" style="flex: 1 1 10rem">
          <mat-label>Trial mass</mat-label>
          <input matInput formControlName="mass" inputmode="decimal" />
          <span matTextSuffix>g</span>
          <mat-error>Enter the trial mass</mat-error>
        </mat-form-field>
        <button type="submit">Calculate</button>
      </form>`,
  }),
  play: async ({ canvas, canvasElement, userEvent }) => {
    const boxes = Array.from(canvasElement.querySelectorAll('.mdc-notched-outline')).map((outline) =>
      outline.getBoundingClientRect(),
    );
    await expect(boxes).toHaveLength(3);
    // Side by side (a tablet) the three outlines share their top; on a phone each field has its own line.
    const oneRow = boxes[2]!.top < boxes[0]!.bottom;
    for (const box of boxes.slice(1)) {
      if (oneRow) await expect(box.top).toBeCloseTo(boxes[0]!.top, 0);
      await expect(box.height).toBeCloseTo(boxes[0]!.height, 0);
    }
    await userEvent.click(canvas.getByRole('button', { name: 'Calculate' }));
    // The form field fades its error in; wait until it is there to be seen.
    await waitFor(() => expect(canvas.getByText(INITIAL_RUN_PHASE_MESSAGE)).toBeVisible());
    const errors = Array.from(canvasElement.querySelectorAll('mat-error')).map((error) => ({
      top: Math.round(error.getBoundingClientRect().top),
      font: getComputedStyle(error).font,
      color: getComputedStyle(error).color,
    }));
    await expect(errors).toHaveLength(3);
    await expect(new Set(errors.map((error) => JSON.stringify(error))).size).toBe(1);
  },
};

/**
 * The compact dial at its default size on a tablet: wide enough to drag with a thumb (the whole dial is
 * the target), with scale labels of at least 12 px.
 */
export const TabletCompact: Story = {
  args: { label: 'Phase, right bearing', compact: true, value: 130 },
  globals: { viewport: { value: 'tablet' } },
  play: async ({ canvas, canvasElement, userEvent }) => {
    const dial = canvas.getByRole('slider', { name: 'Phase, right bearing' });
    const width = dial.getBoundingClientRect().width;
    await expect(width).toBeGreaterThanOrEqual(THUMB_DIAL_MIN_PX);
    const label = canvasElement.querySelector('.cp-phase-dial__label')!;
    const renderedPx = (Number.parseFloat(getComputedStyle(label).fontSize) * width) / DIAL_VIEW_SIZE;
    await expect(renderedPx).toBeGreaterThanOrEqual(SCALE_LABEL_MIN_PX);
    // Counted against a clockwise rotor, a touch at 9 o'clock is 90 degrees.
    await userEvent.pointer({ keys: '[MouseLeft]', target: dial, coords: pointOn(dial, 270) });
    await expect(dial).toHaveAttribute('aria-valuenow', '90');
    await expect(canvas.getByRole('textbox', { name: 'Phase, right bearing' })).toHaveValue('90');
  },
};

/**
 * On a phone (a 390 px screen less the page's margins) the dial goes under its field, which takes the
 * whole width as the page's other fields do; nothing runs off the screen.
 */
export const PhoneCompact: Story = {
  render: (args) => ({
    props: args,
    template: `
      <div style="width: 358px; outline: 1px dashed var(--mat-sys-outline-variant)">
        <cp-phase-dial [label]="label" [compact]="true" [value]="value" />
      </div>`,
  }),
  args: { label: 'Phase, left bearing', value: 212 },
  play: async ({ canvas, canvasElement }) => {
    const dial = canvas.getByRole('slider', { name: 'Phase, left bearing' });
    const field = canvasElement.querySelector('.mat-mdc-form-field')!;
    const host = canvasElement.querySelector('cp-phase-dial')!;
    await expect(dial.getBoundingClientRect().top).toBeGreaterThanOrEqual(
      field.getBoundingClientRect().bottom,
    );
    await expect(field.getBoundingClientRect().width).toBeCloseTo(host.getBoundingClientRect().width, 0);
    await expect(host.scrollWidth).toBeLessThanOrEqual(host.clientWidth);
    await expect(host.getBoundingClientRect().right).toBeLessThanOrEqual(
      host.parentElement!.getBoundingClientRect().right,
    );
  },
};

/** The smallest and the largest dial the layout is made for, and the compact one's default, side by side. */
export const Sizes: Story = {
  render: (args) => ({
    props: args,
    template: `
      <div style="display: flex; flex-wrap: wrap; gap: 24px; align-items: flex-start">
        <cp-phase-dial label="Small dial" [size]="160" [value]="value" [markers]="markers" />
        <cp-phase-dial label="Large dial" [size]="320" [value]="value" [markers]="markers" />
        <cp-phase-dial label="Compact dial" [compact]="true" [value]="value" />
      </div>`,
  }),
  args: { value: 67, markers: TRIAL_RUN_MARKERS },
  play: async ({ canvas }) => {
    const small = canvas.getByRole('slider', { name: 'Small dial' });
    const large = canvas.getByRole('slider', { name: 'Large dial' });
    await expect(small.getBoundingClientRect().width).toBe(160);
    await expect(large.getBoundingClientRect().width).toBe(320);
    const compact = canvas.getByRole('slider', { name: 'Compact dial' });
    await expect(compact.getBoundingClientRect().width).toBe(160);
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

/** The compact dial with its error in a portal of the dark colour scheme: the form field's own dark tokens. */
export const CompactWithErrorDarkScheme: Story = { ...CompactWithError, globals: { scheme: 'dark' } };
