import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { describe, expect, it } from 'vitest';
import type { RotationCounting, RotationDirection } from '@counterpoise/ng/core';
import { CpCorrectionOverlayHarness } from '@counterpoise/ng/correction-overlay/testing';
import { CpCorrectionOverlay } from './correction-overlay';
import { CORRECTION, EXISTING } from './correction-overlay.fixtures';
import type {
  BlockedSector,
  OverlayPoint,
  OverlayWeight,
  PhotoCalibration,
  RotorPhoto,
} from './overlay-model';

/** A 1x1 transparent image, so no test reaches the network. */
const PIXEL = 'data:image/gif;base64,R0lGODlhAQABAAAAACH5BAEKAAEALAAAAAABAAEAAAICTAEAOw==';

@Component({
  imports: [CpCorrectionOverlay, ReactiveFormsModule],
  template: `
    <cp-correction-overlay
      [rotation]="rotation()"
      [counting]="counting()"
      [zeroAtDeg]="zeroAtDeg()"
      [sensorAngleDeg]="sensorAngleDeg()"
      [heavySpotDeg]="heavySpotDeg()"
      [corrections]="corrections()"
      [existingWeights]="existingWeights()"
      [allowedPositions]="allowedPositions()"
      [blockedSectors]="blockedSectors()"
      [photo]="photo()"
      [calibrating]="calibrating()"
      [pickable]="pickable()"
      [formControl]="marked"
      (pointPicked)="picked.push($event)"
      (calibrationChange)="calibrations.push($event)"
    />
    <cp-correction-overlay label="Second plane" [pickable]="false" />
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly rotation = signal<RotationDirection>('clockwise');
  readonly counting = signal<RotationCounting>('againstRotation');
  readonly zeroAtDeg = signal(0);
  readonly sensorAngleDeg = signal<number | null>(90);
  readonly heavySpotDeg = signal<number | null>(280);
  readonly corrections = signal<readonly OverlayWeight[]>(CORRECTION);
  readonly existingWeights = signal<readonly OverlayWeight[]>(EXISTING);
  readonly allowedPositions = signal<number | null>(null);
  readonly blockedSectors = signal<readonly BlockedSector[]>([{ fromDeg: 20, toDeg: 40, label: 'holder' }]);
  readonly photo = signal<RotorPhoto | null>(null);
  readonly calibrating = signal(false);
  readonly pickable = signal(true);
  readonly marked = new FormControl<OverlayPoint | null>(null);
  readonly picked: OverlayPoint[] = [];
  readonly calibrations: PhotoCalibration[] = [];
}

async function setUp() {
  const fixture = TestBed.createComponent(Host);
  const host = fixture.componentInstance;
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const overlay = await loader.getHarness(
    CpCorrectionOverlayHarness.with({ label: /^Where the correction weight goes/ }),
  );
  return { fixture, host, loader, overlay };
}

describe('CpCorrectionOverlay', () => {
  it('says in words everything it draws', async () => {
    const { overlay } = await setUp();
    expect(await overlay.getDescriptionLines()).toEqual([
      "End view of the rotor, turning clockwise. Angles are counted against rotation from the reference mark, drawn at 12 o'clock.",
      'Correction: 84 g at 100 degrees against rotation.',
      'Existing weight: 30 g at 210 degrees against rotation.',
      'Heavy spot at 280 degrees.',
      'Sensor in line with 90 degrees.',
      'Blocked: holder 20 to 40 degrees.',
    ]);
  });

  it('is an image named by its label and described by its text alternative', async () => {
    const { fixture, overlay } = await setUp();
    const svg: SVGElement = fixture.nativeElement.querySelector('.cp-correction-overlay__drawing');
    expect(svg.getAttribute('role')).toBe('img');
    expect(await overlay.getLabel()).toBe('Where the correction weight goes, end view of the rotor');
    const description = fixture.nativeElement.querySelector(`#${svg.getAttribute('aria-describedby')}`);
    expect(description?.textContent).toContain('Correction: 84 g at 100 degrees against rotation.');
  });

  it('labels the corrections with mass and angle and follows their changes', async () => {
    const { host, overlay } = await setUp();
    expect(await overlay.getCorrectionLabels()).toEqual(['84 g at 100°']);
    expect(await overlay.getExistingWeightLabels()).toEqual(['30 g at 210°']);
    host.corrections.set([
      { mass: 40, angleDeg: 90, unit: 'g', label: 'A' },
      { mass: 45, angleDeg: 30, unit: 'g', label: 'B' },
    ]);
    expect(await overlay.getCorrectionLabels()).toEqual(['A: 40 g at 90°', 'B: 45 g at 30°']);
    expect(await overlay.isCorrectionBlocked(0)).toBe(false);
    expect(await overlay.isCorrectionBlocked(1)).toBe(true);
    expect(await overlay.getLegend()).toContain('Weight in a blocked sector');
    expect(await overlay.getDescription()).toContain('inside the blocked sector holder 20 to 40 degrees');
  });

  it('keys only the symbols that are drawn', async () => {
    const { host, overlay } = await setUp();
    expect(await overlay.getLegend()).toEqual([
      'Correction',
      'Existing weight',
      'Heavy spot',
      'Sensor',
      'Reference mark',
      'Rotation',
      'Blocked',
    ]);
    host.existingWeights.set([]);
    host.heavySpotDeg.set(null);
    host.allowedPositions.set(6);
    expect(await overlay.getLegend()).toEqual([
      'Correction',
      'Sensor',
      'Reference mark',
      'Rotation',
      'Allowed position',
      'Blocked',
    ]);
    expect(await overlay.getDescription()).toContain(
      '6 allowed positions, at 0, 60, 120, 180, 240, 300 degrees.',
    );
  });

  it.each([
    ['clockwise', 'againstRotation', 0],
    ['counterClockwise', 'withRotation', 90],
    ['clockwise', 'withRotation', 200],
  ] as const)('reports the angle clicked (%s, counted %s, zero at %i)', async (rotation, counting, zero) => {
    const { host, overlay } = await setUp();
    host.rotation.set(rotation);
    host.counting.set(counting);
    host.zeroAtDeg.set(zero);
    await overlay.pickAt(100, 0.9);
    await overlay.pickAt(315, 0.5);
    expect(host.picked.map((p) => p.angleDeg)).toEqual([100, 315]);
    expect(host.picked[0]!.radiusFraction).toBeCloseTo(0.9, 1);
    expect(host.picked[1]!.radiusFraction).toBeCloseTo(0.5, 1);
  });

  it('marks a point with the keyboard crosshair, starting at the correction', async () => {
    const { host, overlay } = await setUp();
    expect(await overlay.getCrosshair()).toEqual({ angleDeg: 100, radiusFraction: 0.9 });
    await overlay.moveCrosshair(3, 1);
    await overlay.moveCrosshair(-5, -3);
    expect(await overlay.getCrosshair()).toEqual({ angleDeg: 98, radiusFraction: 0.8 });
    expect(host.picked).toEqual([]);
    await overlay.markWithKeyboard();
    expect(host.picked).toEqual([{ angleDeg: 98, radiusFraction: 0.8 }]);
    expect(await overlay.getDescription()).toContain('Marked point: 98 degrees, at 80% of the radius.');
  });

  it('sends the crosshair home to the reference mark and leaves keys with modifiers alone', async () => {
    const { fixture, overlay } = await setUp();
    const crosshair: HTMLElement = fixture.nativeElement.querySelector('.cp-correction-overlay__crosshair');
    const press = (key: string, init: KeyboardEventInit = {}) => {
      const event = new KeyboardEvent('keydown', { key, bubbles: true, cancelable: true, ...init });
      crosshair.dispatchEvent(event);
      return event.defaultPrevented;
    };
    expect(press('ArrowRight', { ctrlKey: true })).toBe(false);
    expect(press('a')).toBe(false);
    expect(await overlay.getCrosshair()).toEqual({ angleDeg: 100, radiusFraction: 0.9 });
    expect(press('Home')).toBe(true);
    expect(await overlay.getCrosshair()).toEqual({ angleDeg: 0, radiusFraction: 0.9 });
  });

  it('turns the crosshair through zero', async () => {
    const { host, overlay } = await setUp();
    host.corrections.set([{ mass: 10, angleDeg: 1, unit: 'g' }]);
    await overlay.moveCrosshair(-3);
    expect((await overlay.getCrosshair()).angleDeg).toBe(358);
  });

  it('works as a form control: the value is the marked point', async () => {
    const { host, overlay } = await setUp();
    await overlay.pickAt(150, 1);
    expect(host.marked.value?.angleDeg).toBe(150);
    expect(host.marked.dirty).toBe(true);
    expect(host.marked.touched).toBe(true);

    host.marked.setValue({ angleDeg: 45, radiusFraction: 0.75 });
    expect(await overlay.getDescription()).toContain('Marked point: 45 degrees, at 75% of the radius.');
    expect(await overlay.getCrosshair()).toEqual({ angleDeg: 45, radiusFraction: 0.75 });

    host.marked.disable();
    expect(await overlay.isPickable()).toBe(false);
    await overlay.pickAt(200, 0.9);
    expect(host.marked.value).toEqual({ angleDeg: 45, radiusFraction: 0.75 });
    expect(host.picked).toHaveLength(1);
  });

  it('ignores clicks and offers no crosshair when not pickable', async () => {
    const { host, overlay } = await setUp();
    host.pickable.set(false);
    expect(await overlay.isPickable()).toBe(false);
    await overlay.pickAt(100, 0.9);
    expect(host.picked).toEqual([]);
  });

  it('calibrates a photo with handles moved by keys and by dragging', async () => {
    const { host, overlay } = await setUp();
    host.calibrating.set(true);
    expect(await overlay.isCalibrating()).toBe(false);

    host.photo.set({ src: PIXEL, aspectRatio: 4 / 3 });
    expect(await overlay.isCalibrating()).toBe(true);
    expect(await overlay.isPickable()).toBe(false);
    expect(await overlay.getHandlePosition('centre')).toEqual({ x: 0.5, y: 0.5 });

    await overlay.moveHandle('centre', 4, -2);
    const afterKeys = host.calibrations.at(-1)!;
    expect(afterKeys.centre.x).toBeCloseTo(0.52, 9);
    expect(afterKeys.centre.y).toBeCloseTo(0.49, 9);
    expect(host.calibrations).toHaveLength(6);

    await overlay.dragHandle('rim', { x: 0.9, y: 0.49 });
    await overlay.dragHandle('referenceMark', { x: 0.52, y: 0.9 });
    const last = host.calibrations.at(-1)!;
    expect(last.centre).toEqual(afterKeys.centre);
    expect(last.rim.x).toBeCloseTo(0.9, 9);
    expect(last.rim.y).toBeCloseTo(0.49, 9);
    expect(last.referenceMark.x).toBeCloseTo(0.52, 9);
    expect(last.referenceMark.y).toBeCloseTo(0.9, 9);
    expect(await overlay.getDescription()).toContain("reference mark, drawn at 6 o'clock");
    expect(await overlay.getDescription()).toContain(
      'Calibrating: move the centre, rim and reference-mark handles',
    );
  });

  it('draws over a calibrated photo with its centre, radius and zero', async () => {
    const { fixture, host, overlay } = await setUp();
    host.photo.set({
      src: PIXEL,
      aspectRatio: 4 / 3,
      calibration: { centre: { x: 0.4, y: 0.5 }, rim: { x: 0.7, y: 0.5 }, referenceMark: { x: 0.4, y: 0.8 } },
    });
    await fixture.whenStable();
    const svg: SVGElement = fixture.nativeElement.querySelector('.cp-correction-overlay__drawing');
    const [, , width, height] = svg.getAttribute('viewBox')!.split(' ').map(Number);
    expect(width! / height!).toBeCloseTo(4 / 3, 2);
    expect(Number(svg.getAttribute('data-center-x'))).toBeCloseTo(0.4 * width!, 6);
    expect(Number(svg.getAttribute('data-radius'))).toBeCloseTo(0.3 * width!, 6);
    expect(Number(svg.getAttribute('data-zero-at-deg'))).toBe(180);
    expect(await overlay.getDescription()).toContain('Drawn over a calibrated photo of the rotor.');
    await overlay.pickAt(0, 1);
    expect(host.picked[0]).toEqual({ angleDeg: 0, radiusFraction: 1 });
  });

  it('keeps a name when given an empty label', async () => {
    const fixture = TestBed.createComponent(CpCorrectionOverlay);
    fixture.componentRef.setInput('label', '  ');
    const overlay = await TestbedHarnessEnvironment.harnessForFixture(fixture, CpCorrectionOverlayHarness);
    expect(await overlay.getLabel()).toBe('Where the correction weight goes, end view of the rotor');
  });

  it('finds overlays by their accessible name', async () => {
    const { loader } = await setUp();
    const second = await loader.getHarness(CpCorrectionOverlayHarness.with({ label: 'Second plane' }));
    expect(await second.getDescriptionLines()).toContain('No correction weight to show.');
    expect(await second.isPickable()).toBe(false);
    expect(await loader.getAllHarnesses(CpCorrectionOverlayHarness)).toHaveLength(2);
  });
});
