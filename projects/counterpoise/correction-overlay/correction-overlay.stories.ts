import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { type Meta, type StoryObj, moduleMetadata } from '@storybook/angular-vite';
import { expect, fireEvent, fn, waitFor } from 'storybook/test';
import {
  type RotationCounting,
  type RotationDirection,
  _pointAtAngle as pointAtAngle,
} from '@counterpoise/ng/core';
import { CpCorrectionOverlay } from './correction-overlay';
import {
  CALIBRATED_PHOTO,
  CORRECTION,
  CROWDED_DRUM,
  END_PLATE_PICTURE,
  HOLDERS,
  MULCHER_DEMO,
  SPLIT,
  SPLIT_AROUND_HOLDERS,
} from './correction-overlay.fixtures';
import type { OverlayPoint } from './overlay-model';

/** The client point of a rotor angle and a fraction of the radius, from what the drawing says of itself. */
function pointOnRotor(canvasElement: HTMLElement, angleDeg: number, radiusFraction: number) {
  const svg = canvasElement.querySelector<SVGSVGElement>('.cp-correction-overlay__drawing')!;
  const data = (name: string) => svg.getAttribute(`data-${name}`)!;
  const [, , width = 1] = svg.getAttribute('viewBox')!.split(' ').map(Number);
  const rect = svg.getBoundingClientRect();
  const point = pointAtAngle(
    { x: Number(data('center-x')), y: Number(data('center-y')) },
    Number(data('radius')) * radiusFraction,
    angleDeg,
    {
      rotation: data('rotation') as RotationDirection,
      counting: data('counting') as RotationCounting,
      zeroAtDeg: Number(data('zero-at-deg')),
    },
  );
  const scale = rect.width / width;
  return { clientX: rect.left + point.x * scale, clientY: rect.top + point.y * scale };
}

/** The text alternative, as a screen reader gets it. */
function description(canvasElement: HTMLElement): string {
  return canvasElement.querySelector('.cp-correction-overlay__description')?.textContent ?? '';
}

/**
 * An end view of the rotor showing where the correction weight goes: reference mark, sensor line, rotation
 * arrow, heavy spot, corrections with mass and angle, allowed positions, hatched blocked sectors and the
 * weights already on. It can lie over a photo of the technician's own rotor, calibrated by dragging three
 * handles (or moving them with the arrow keys). A click or tap marks where a weight really went; so does
 * Enter on the crosshair (Tab to it, arrows move it). Everything drawn is also said in words, and it prints
 * in black and white. Import it from `@counterpoise/ng/correction-overlay`.
 */
const meta: Meta<CpCorrectionOverlay> = {
  title: 'Widgets/Correction overlay',
  component: CpCorrectionOverlay,
  tags: ['autodocs'],
  decorators: [moduleMetadata({ imports: [ReactiveFormsModule] })],
  argTypes: {
    rotation: { control: 'inline-radio', options: ['clockwise', 'counterClockwise'] },
    counting: { control: 'inline-radio', options: ['againstRotation', 'withRotation'] },
    zeroAtDeg: { control: { type: 'number', min: 0, max: 359, step: 15 } },
    sensorAngleDeg: { control: 'number' },
    heavySpotDeg: { control: 'number' },
    corrections: { control: 'object' },
    existingWeights: { control: 'object' },
    allowedPositions: { control: 'object' },
    blockedSectors: { control: 'object' },
    photo: { control: 'object' },
    calibrating: { control: 'boolean' },
    pickable: { control: 'boolean' },
    legend: { control: 'boolean' },
    label: { control: 'text' },
  },
  args: {
    rotation: 'clockwise',
    counting: 'againstRotation',
    zeroAtDeg: 0,
    sensorAngleDeg: null,
    heavySpotDeg: null,
    corrections: [],
    existingWeights: [],
    allowedPositions: null,
    blockedSectors: [],
    photo: null,
    calibrating: false,
    pickable: true,
    legend: true,
    pointPicked: fn(),
    calibrationChange: fn(),
  },
  render: (args) => ({
    props: args,
    template: `<div style="max-width: 480px"><cp-correction-overlay ${argsToBindings(args)} /></div>`,
  }),
};

/** Binds every arg the story sets, outputs included, so the stories share one template. */
function argsToBindings(args: Record<string, unknown>): string {
  return Object.keys(args)
    .map((name) =>
      name === 'pointPicked' || name === 'calibrationChange'
        ? `(${name})="${name}($event)"`
        : `[${name}]="${name}"`,
    )
    .join(' ');
}

export default meta;
type Story = StoryObj<CpCorrectionOverlay>;

/** Nothing computed yet: the rotor, its reference mark and the rotation arrow. */
export const Empty: Story = {
  play: async ({ canvas, canvasElement }) => {
    await expect(canvas.getByRole('img', { name: /end view of the rotor/ })).toBeVisible();
    await expect(description(canvasElement)).toContain('No correction weight to show.');
    await expect(description(canvasElement)).toContain("reference mark, drawn at 12 o'clock");
  },
};

/** One correction opposite the heavy spot, with the sensor line; a tap marks where the weight really went. */
export const Correction: Story = {
  args: { corrections: CORRECTION, heavySpotDeg: 280, sensorAngleDeg: 90 },
  play: async ({ args, canvas, canvasElement }) => {
    await expect(canvas.getByText('84 g at 100°')).toBeVisible();
    await expect(description(canvasElement)).toContain('Correction: 84 g at 100 degrees against rotation.');
    const stage = canvasElement.querySelector<HTMLElement>('.cp-correction-overlay__stage')!;
    await fireEvent.click(stage, pointOnRotor(canvasElement, 104, 0.9));
    await expect(args.pointPicked).toHaveBeenLastCalledWith({ angleDeg: 104, radiusFraction: 0.9 });
    await waitFor(() => expect(canvas.getByText('Marked 104°')).toBeVisible());
  },
};

/** The keyboard alone: Tab to the crosshair, arrows turn it and move it in and out, Enter marks the point. */
export const KeyboardMarking: Story = {
  args: { corrections: CORRECTION, heavySpotDeg: 280 },
  play: async ({ args, canvas, userEvent }) => {
    const crosshair = canvas.getByRole('button', { name: /Crosshair/ });
    await userEvent.tab();
    await expect(crosshair).toHaveFocus();
    await expect(canvas.getByText('100° · 90% radius')).toBeVisible();
    await userEvent.keyboard('{PageUp}{ArrowRight}{ArrowRight}{ArrowUp}');
    await expect(canvas.getByText('112° · 95% radius')).toBeVisible();
    await userEvent.keyboard('{Enter}');
    await expect(args.pointPicked).toHaveBeenLastCalledWith({ angleDeg: 112, radiusFraction: 0.95 });
  },
};

/**
 * The correction split around a tooth holder, with every element drawn: existing weight, allowed
 * positions, hatched blocked sectors, heavy spot, sensor.
 */
export const SplitAroundHolders: Story = {
  args: { ...SPLIT_AROUND_HOLDERS },
  play: async ({ canvas, canvasElement }) => {
    await expect(canvas.getByText('A: 46 g at 75°')).toBeVisible();
    await expect(canvas.getByText('B: 52 g at 135°')).toBeVisible();
    const words = description(canvasElement);
    await expect(words).toContain(
      'Blocked: holder 90 to 120 degrees; weld 170 to 185 degrees; holder 350 to 15 degrees.',
    );
    await expect(words).toContain('24 allowed positions, every 15 degrees from 0 degrees.');
    await expect(words).toContain('Existing weight: 30 g at 210 degrees against rotation.');
  },
};

/** The correction as computed falls on a tooth holder: the label is outlined and the words say so. */
export const InBlockedSector: Story = {
  args: { corrections: CORRECTION, blockedSectors: HOLDERS, heavySpotDeg: 280 },
  play: async ({ canvas, canvasElement }) => {
    await expect(canvas.getByText('Weight in a blocked sector')).toBeVisible();
    await expect(description(canvasElement)).toContain(
      'Correction: 84 g at 100 degrees against rotation, inside the blocked sector holder 90 to 120 degrees.',
    );
  },
};

/** Seen from the other end: the rotor turns counter-clockwise, angles count with rotation, zero at 3 o'clock. */
export const CounterClockwise: Story = {
  args: {
    rotation: 'counterClockwise',
    counting: 'withRotation',
    zeroAtDeg: 90,
    corrections: CORRECTION,
    heavySpotDeg: 280,
    sensorAngleDeg: 0,
  },
  play: async ({ args, canvasElement }) => {
    await expect(description(canvasElement)).toContain(
      "turning counter-clockwise. Angles are counted with rotation from the reference mark, drawn at 3 o'clock.",
    );
    const stage = canvasElement.querySelector<HTMLElement>('.cp-correction-overlay__stage')!;
    await fireEvent.click(stage, pointOnRotor(canvasElement, 250, 0.8));
    await expect(args.pointPicked).toHaveBeenLastCalledWith({ angleDeg: 250, radiusFraction: 0.8 });
  },
};

/** A fan hub with eight bolt holes: the correction sits on a hole, the marked point on another. */
export const DiscretePositions: Story = {
  args: {
    corrections: [{ mass: 12, angleDeg: 157.5, unit: 'g' }],
    allowedPositions: { count: 8, firstDeg: 22.5 },
    heavySpotDeg: 337.5,
    markedPoint: { angleDeg: 202, radiusFraction: 0.9 },
  },
  play: async ({ canvas, canvasElement }) => {
    await expect(canvas.getByText('12 g at 157.5°')).toBeVisible();
    await expect(canvas.getByText('Marked 202°')).toBeVisible();
    await expect(description(canvasElement)).toContain(
      '8 allowed positions, at 22.5, 67.5, 112.5, 157.5, 202.5, 247.5, 292.5, 337.5 degrees.',
    );
  },
};

/** Over the technician's own photo, calibrated: the drawing takes its centre, radius and zero from it. */
export const OverPhoto: Story = {
  args: {
    photo: CALIBRATED_PHOTO,
    corrections: SPLIT,
    blockedSectors: HOLDERS,
    heavySpotDeg: 282,
  },
  play: async ({ canvasElement }) => {
    await expect(description(canvasElement)).toContain('Drawn over a calibrated photo of the rotor.');
    await expect(description(canvasElement)).toContain("drawn at 4 o'clock");
  },
};

/**
 * Calibrating a new photo: drag the centre onto the shaft, the rim handle onto the circle where weights go,
 * the mark handle onto the reflective tape; or Tab to a handle and use the arrow keys.
 */
export const Calibrating: Story = {
  args: {
    photo: { src: END_PLATE_PICTURE },
    calibrating: true,
    corrections: CORRECTION,
  },
  play: async ({ args, canvas, userEvent }) => {
    const centre = await canvas.findByRole('button', { name: /^Centre handle/ });
    await userEvent.tab();
    await expect(centre).toHaveFocus();
    await userEvent.keyboard('{ArrowLeft}{ArrowLeft}{ArrowUp}{ArrowUp}');
    await expect(args.calibrationChange).toHaveBeenCalledTimes(4);
    await expect(centre).toHaveAccessibleName('Centre handle: 49% across, 49% down');

    const rim = canvas.getByRole('button', { name: /^Rim handle/ });
    const box = rim.getBoundingClientRect();
    const from = {
      clientX: box.left + box.width / 2,
      clientY: box.top + box.height / 2,
      pointerId: 1,
      button: 0,
    };
    const to = { ...from, clientX: from.clientX + 30 };
    await fireEvent.pointerDown(rim, from);
    await fireEvent.pointerMove(rim, to);
    await fireEvent.pointerUp(rim, to);
    await expect(args.calibrationChange).toHaveBeenCalledTimes(5);
    await expect(canvas.queryByRole('button', { name: /Crosshair/ })).toBeNull();
  },
};

/** A record in a report: the marked point is shown, nothing can be marked. */
export const ReadOnly: Story = {
  args: {
    corrections: CORRECTION,
    existingWeights: [{ mass: 84, angleDeg: 104, unit: 'g', label: 'Fitted' }],
    markedPoint: { angleDeg: 104, radiusFraction: 0.9 },
    heavySpotDeg: 280,
    pickable: false,
  },
  play: async ({ args, canvas, canvasElement }) => {
    await expect(canvas.queryByRole('button')).toBeNull();
    const stage = canvasElement.querySelector<HTMLElement>('.cp-correction-overlay__stage')!;
    await fireEvent.click(stage, pointOnRotor(canvasElement, 30, 0.9));
    await expect(args.pointPicked).not.toHaveBeenCalled();
  },
};

/** Disabled, as when the job is closed: no crosshair, taps do nothing. */
export const Disabled: Story = {
  args: { corrections: CORRECTION, heavySpotDeg: 280 },
  render: (args) => ({
    props: args,
    template: `<div style="max-width: 480px">
      <cp-correction-overlay [corrections]="corrections" [heavySpotDeg]="heavySpotDeg" [disabled]="true"
        (pointPicked)="pointPicked($event)" />
    </div>`,
  }),
  play: async ({ args, canvas, canvasElement }) => {
    await expect(canvas.queryByRole('button', { name: /Crosshair/ })).toBeNull();
    const stage = canvasElement.querySelector<HTMLElement>('.cp-correction-overlay__stage')!;
    await fireEvent.click(stage, pointOnRotor(canvasElement, 100, 0.9));
    await expect(args.pointPicked).not.toHaveBeenCalled();
  },
};

/** In a reactive form: the marked point is the value, `required` until the technician marks one. */
export const InAForm: Story = {
  args: { corrections: CORRECTION, heavySpotDeg: 280 },
  render: (args) => ({
    props: { ...args, fitted: new FormControl<OverlayPoint | null>(null, Validators.required) },
    template: `<div style="max-width: 480px">
      <cp-correction-overlay [corrections]="corrections" [heavySpotDeg]="heavySpotDeg" [formControl]="fitted" />
      <p>Where the weight went: {{ fitted.value ? fitted.value.angleDeg + ' degrees' : 'not marked yet' }}
        ({{ fitted.valid ? 'valid' : 'required' }})</p>
    </div>`,
  }),
  play: async ({ canvas, canvasElement }) => {
    await expect(canvas.getByText(/not marked yet \(required\)/)).toBeVisible();
    const stage = canvasElement.querySelector<HTMLElement>('.cp-correction-overlay__stage')!;
    await fireEvent.click(stage, pointOnRotor(canvasElement, 96, 0.85));
    await waitFor(() => expect(canvas.getByText(/96 degrees \(valid\)/)).toBeVisible());
  },
};

/** A phone held upright, the narrowest width supported: labels move inside the rim rather than off the edge. */
export const Narrow: Story = {
  args: { ...SplitAroundHolders.args },
  render: (args) => ({
    props: args,
    template: `<div style="width: 240px"><cp-correction-overlay ${argsToBindings(args)} /></div>`,
  }),
  play: async ({ canvas, canvasElement }) => {
    const svg = canvasElement.querySelector('svg')!;
    const bounds = svg.getBoundingClientRect();
    for (const text of ['A: 46 g at 75°', 'B: 52 g at 135°']) {
      const label = canvas.getByText(text).getBoundingClientRect();
      await expect(label.left).toBeGreaterThanOrEqual(bounds.left);
      await expect(label.right).toBeLessThanOrEqual(bounds.right);
    }
  },
};

/**
 * A dealer's own brand colours, set through the overlay's custom properties alone. In a portal's Sass the
 * same comes from `@include overlay.overrides((correction-color: #7a3e00, ...))` of
 * `_correction-overlay-theme.scss`.
 */
export const DealerBrand: Story = {
  args: { corrections: CORRECTION, heavySpotDeg: 280, blockedSectors: [HOLDERS[1]!] },
  render: (args) => ({
    props: args,
    styles: [
      `.dealer-portal {
        --cp-correction-overlay-correction-color: #7a3e00;
        --cp-correction-overlay-on-correction-color: #ffffff;
        --cp-correction-overlay-disk-color: #fff4e0;
        --cp-correction-overlay-blocked-color: #5c3d12;
      }`,
    ],
    template: `<div class="dealer-portal" style="max-width: 480px">
      <cp-correction-overlay [corrections]="corrections" [heavySpotDeg]="heavySpotDeg" [blockedSectors]="blockedSectors" />
    </div>`,
  }),
  play: async ({ canvasElement }) => {
    const weight = canvasElement.querySelector('.cp-correction-overlay__correction')!;
    await expect(getComputedStyle(weight).fill).toBe('rgb(122, 62, 0)');
    const disk = canvasElement.querySelector('.cp-correction-overlay__disk')!;
    await expect(getComputedStyle(disk).fill).toBe('rgb(255, 244, 224)');
  },
};

/** The split in a portal of the dark colour scheme: every colour comes from the theme's tokens. */
export const DarkScheme: Story = { ...SplitAroundHolders, globals: { scheme: 'dark' } };

/** The client rectangles of every label drawn, and of the drawing. */
function labelRects(canvasElement: HTMLElement) {
  const svg = canvasElement.querySelector('.cp-correction-overlay__drawing')!;
  const boxes = [...canvasElement.querySelectorAll('.cp-correction-overlay__label-box')];
  return { drawing: svg.getBoundingClientRect(), labels: boxes.map((box) => box.getBoundingClientRect()) };
}

/** Checks what a crowded drawing promises: labels inside the drawing, and no two over each other. */
async function expectLabelsApart(canvasElement: HTMLElement) {
  const { drawing, labels } = labelRects(canvasElement);
  for (const [i, a] of labels.entries()) {
    await expect(a.left).toBeGreaterThanOrEqual(drawing.left - 0.5);
    await expect(a.right).toBeLessThanOrEqual(drawing.right + 0.5);
    await expect(a.top).toBeGreaterThanOrEqual(drawing.top - 0.5);
    await expect(a.bottom).toBeLessThanOrEqual(drawing.bottom + 0.5);
    for (const b of labels.slice(i + 1)) {
      const apart =
        a.right <= b.left + 0.5 ||
        b.right <= a.left + 0.5 ||
        a.bottom <= b.top + 0.5 ||
        b.bottom <= a.top + 0.5;
      await expect(apart).toBe(true);
    }
  }
}

/**
 * The demo drum of the workbench: a correction split between two holders only ten degrees apart. Each part
 * keeps its own label, clear of the other's and of the rim, with a leader line when it had to move.
 */
export const MulcherDemo: Story = {
  args: { ...MULCHER_DEMO },
  play: async ({ canvas, canvasElement }) => {
    await expect(canvas.getByText('Holder 4: 41 g at 35°')).toBeVisible();
    await expect(canvas.getByText('Holder 5: 23 g at 45°')).toBeVisible();
    await expectLabelsApart(canvasElement);
  },
};

/**
 * The most crowded drum: 24 holders, a correction split three ways over neighbouring holders, two blocked
 * sectors, earlier weights, the heavy spot and the sensor, on a phone held upright.
 */
export const CrowdedDrum: Story = {
  args: { ...CROWDED_DRUM },
  render: (args) => ({
    props: args,
    template: `<div style="width: 320px"><cp-correction-overlay ${argsToBindings(args)} /></div>`,
  }),
  play: async ({ canvas, canvasElement }) => {
    for (const text of ['Part 1: 28 g at 30°', 'Part 2: 31 g at 45°', 'Part 3: 26 g at 60°']) {
      await expect(canvas.getByText(text)).toBeVisible();
    }
    await expectLabelsApart(canvasElement);
    await expect(description(canvasElement)).toContain(
      'Blocked: Drive pulley bolts 80 to 110 degrees; Repair weld 160 to 185 degrees.',
    );
  },
};
