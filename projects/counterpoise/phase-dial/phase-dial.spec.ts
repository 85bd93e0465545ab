import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import type { ErrorStateMatcher } from '@angular/material/core';
import type { RotationCounting, DialPositions, RotationDirection } from '@counterpoise/ng/core';
import { CpPhaseDialHarness } from '@counterpoise/ng/phase-dial/testing';
import { describe, expect, it } from 'vitest';
import { CpPhaseDial } from './phase-dial';
import { INITIAL_RUN_PHASE_MESSAGE } from './phase-dial.fixtures';
import type { PhaseDialMarker } from './phase-dial-values';

@Component({
  imports: [CpPhaseDial, ReactiveFormsModule],
  template: `
    <cp-phase-dial
      label="Trial weight angle"
      [formControl]="angle"
      [required]="required()"
      [rotation]="rotation()"
      [counting]="counting()"
      [zeroAtDeg]="zeroAtDeg()"
      [step]="step()"
      [positions]="positions()"
      [markers]="markers()"
      [compact]="compact()"
      [readonly]="readonly()"
      [errorText]="errorText()"
      (valueCommit)="commits.push($event)"
    />
    <cp-phase-dial label="Heavy spot" [value]="212" [disabled]="true" />
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly angle = new FormControl<number | null>(null, Validators.min(0));
  readonly required = signal(true);
  readonly rotation = signal<RotationDirection>('clockwise');
  readonly counting = signal<RotationCounting>('againstRotation');
  readonly zeroAtDeg = signal(0);
  readonly step = signal(1);
  readonly positions = signal<DialPositions | null>(null);
  readonly markers = signal<readonly PhaseDialMarker[]>([]);
  readonly compact = signal(false);
  readonly readonly = signal(false);
  readonly errorText = signal<string | null>(null);
  readonly commits: (number | null)[] = [];
}

@Component({
  imports: [CpPhaseDial, ReactiveFormsModule],
  template: `
    <form [formGroup]="form">
      <cp-phase-dial
        label="Phase of run 1"
        formControlName="phaseDeg"
        [required]="true"
        [compact]="compact()"
      />
      <cp-phase-dial
        label="Phase of run 2"
        formControlName="laterDeg"
        [required]="true"
        [errorStateMatcher]="dirty"
      />
      <button type="submit">Calculate</button>
    </form>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class FormHost {
  readonly form = new FormGroup({
    phaseDeg: new FormControl<number | null>(null),
    laterDeg: new FormControl<number | null>(null),
  });
  readonly compact = signal(false);
  /** A page that shows errors only once the technician changed the value, even after submitting. */
  readonly dirty: ErrorStateMatcher = { isErrorState: (control) => !!control?.invalid && control.dirty };
}

async function setUp() {
  const fixture = TestBed.createComponent(Host);
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const dial = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Trial weight angle' }));
  const host = fixture.componentInstance;
  /** Changes a host signal and lets the dial see it. */
  const change = async (apply: () => void) => {
    apply();
    await fixture.whenStable();
  };
  return { fixture, loader, dial, host, change };
}

describe('CpPhaseDial', () => {
  it('is a slider named by its label that speaks its angle and how it is counted', async () => {
    const { fixture, dial, host } = await setUp();
    const slider: HTMLElement = fixture.nativeElement.querySelector('[role="slider"]');
    expect(slider.getAttribute('aria-label')).toBe('Trial weight angle');
    expect(slider.getAttribute('aria-valuemin')).toBe('0');
    expect(slider.getAttribute('aria-valuemax')).toBe('359');
    expect(slider.tabIndex).toBe(0);
    expect(await dial.getValue()).toBeNull();
    expect(await dial.getValueText()).toBe('no angle set');

    host.angle.setValue(123);
    expect(await dial.getValue()).toBe(123);
    expect(await dial.getValueText()).toBe('123 degrees, counted against rotation from the reference mark');
    expect(slider.getAttribute('aria-valuenow')).toBe('123');
  });

  it('steps with the keyboard and reports every change to the form', async () => {
    const { dial, host } = await setUp();
    await dial.pressKey('ArrowRight');
    expect(host.angle.value).toBe(0);
    await dial.pressKey('PageUp');
    await dial.pressKey('ArrowUp');
    expect(host.angle.value).toBe(11);
    await dial.pressKey('ArrowLeft');
    await dial.pressKey('ArrowDown');
    expect(host.angle.value).toBe(9);
    await dial.pressKey('End');
    expect(host.angle.value).toBe(359);
    await dial.pressKey('ArrowUp');
    expect(host.angle.value).toBe(0);
    expect(host.angle.dirty).toBe(true);
  });

  it('commits once per key press, not for keys it ignores', async () => {
    const { dial, host } = await setUp();
    host.angle.setValue(40);
    await dial.pressKey('ArrowUp');
    await dial.pressKey('Home');
    await dial.pressKey('Home');
    await dial.pressKey('ArrowUp', { control: true });
    await dial.pressKey('PageUp', { shift: true });
    expect(host.commits).toEqual([41, 0]);
    expect(host.angle.value).toBe(0);
  });

  it('leaves the default action of keys it does not handle', async () => {
    const { fixture } = await setUp();
    const slider: HTMLElement = fixture.nativeElement.querySelector('[role="slider"]');
    const press = (key: string, init: KeyboardEventInit = {}) => {
      const event = new KeyboardEvent('keydown', { key, cancelable: true, bubbles: true, ...init });
      slider.dispatchEvent(event);
      return event.defaultPrevented;
    };
    expect(press('ArrowUp')).toBe(true);
    expect(press('Tab')).toBe(false);
    expect(press('ArrowUp', { altKey: true })).toBe(false);
    expect(press('Home', { metaKey: true })).toBe(false);
  });

  it('sets an angle from the keyboard through the harness, by the step', async () => {
    const { dial, host, change } = await setUp();
    await dial.setValue(123);
    expect(host.angle.value).toBe(123);
    await change(() => host.step.set(15));
    expect(await dial.getMax()).toBe(345);
    await dial.setValue(285);
    expect(host.angle.value).toBe(285);
    await expect(dial.setValue(100)).rejects.toThrow(/cannot reach 100 degrees/);
  });

  it('follows a drag to the angle under the pointer, committing once at the end', async () => {
    const { dial, host } = await setUp();
    await dial.dragTo(90);
    expect(host.angle.value).toBe(90);
    await dial.dragTo(300);
    expect(host.angle.value).toBe(300);
    expect(host.commits).toEqual([90, 300]);
    expect(await dial.isFocused()).toBe(true);
  });

  it('maps the pointer through the rotation, the counting and the reference mark', async () => {
    const { fixture, dial, host, change } = await setUp();
    await change(() => {
      host.rotation.set('counterClockwise');
      host.counting.set('withRotation');
      host.zeroAtDeg.set(90);
    });
    const slider: HTMLElement = fixture.nativeElement.querySelector('[role="slider"]');
    expect(slider.dataset['rotation']).toBe('counterClockwise');
    // With a counter-clockwise rotor, 90 degrees with rotation is a quarter turn counter-clockwise of 3 o'clock: 12 o'clock.
    const point = { clientX: 0, clientY: -100, pointerId: 1, button: 0 };
    slider.dispatchEvent(Object.assign(new Event('pointerdown'), point));
    slider.dispatchEvent(Object.assign(new Event('pointerup'), point));
    await fixture.whenStable();
    expect(host.angle.value).toBe(90);
    await dial.dragTo(200);
    expect(await dial.getValue()).toBe(200);
  });

  it('snaps to positions, steps between them and draws a tick for each', async () => {
    const { fixture, dial, host, change } = await setUp();
    await change(() => host.positions.set({ count: 6, firstDeg: 30 }));
    await dial.dragTo(100);
    expect(host.angle.value).toBe(90);
    await dial.pressKey('ArrowUp');
    expect(host.angle.value).toBe(150);
    await dial.pressKey('End');
    expect(host.angle.value).toBe(330);
    await dial.pressKey('Home');
    expect(host.angle.value).toBe(30);
    expect(await dial.getMax()).toBe(330);
    expect(fixture.nativeElement.querySelectorAll('.cp-phase-dial__tick--position')).toHaveLength(6);
    expect(await dial.getDescription()).toContain('6 allowed positions: 30, 90, 150, 210, 270, 330.');
  });

  it('validates required and the allowed positions, keeping the form validators', async () => {
    const { dial, host, change } = await setUp();
    expect(host.angle.errors).toEqual({ required: true });
    expect(await dial.isRequired()).toBe(true);
    await change(() => host.required.set(false));
    expect(host.angle.errors).toBeNull();

    await change(() => host.positions.set([0, 120, 240]));
    host.angle.setValue(100);
    expect(host.angle.errors).toEqual({ cpPhasePosition: { allowed: [0, 120, 240] } });
    host.angle.setValue(240);
    expect(host.angle.valid).toBe(true);
    host.angle.setValue(-5);
    expect(host.angle.errors).toEqual({
      min: { min: 0, actual: -5 },
      cpPhasePosition: { allowed: [0, 120, 240] },
    });
  });

  it('shows the error once the control is touched', async () => {
    const { dial, host } = await setUp();
    expect(await dial.isInvalid()).toBe(false);
    await dial.focus();
    await dial.blur();
    expect(host.angle.touched).toBe(true);
    expect(await dial.isInvalid()).toBe(true);
    await dial.pressKey('Home');
    expect(await dial.isInvalid()).toBe(false);
  });

  it('is disabled by its form control, and then ignores keys and pointer', async () => {
    const { fixture, dial, host } = await setUp();
    host.angle.setValue(45);
    host.angle.disable();
    expect(await dial.isDisabled()).toBe(true);
    const slider: HTMLElement = fixture.nativeElement.querySelector('[role="slider"]');
    expect(slider.tabIndex).toBe(-1);
    await dial.pressKey('ArrowUp');
    await dial.dragTo(200);
    expect(host.angle.value).toBe(45);
    host.angle.enable();
    expect(await dial.isDisabled()).toBe(false);
  });

  it('is disabled by its input', async () => {
    const { loader } = await setUp();
    const heavySpot = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Heavy spot' }));
    expect(await heavySpot.isDisabled()).toBe(true);
    expect(await heavySpot.getValue()).toBe(212);
    await expect(heavySpot.setValue(10)).rejects.toThrow(/disabled or read-only/);
  });

  it('can be read but not changed when read-only, and draws a needle tip instead of a thumb', async () => {
    const { fixture, dial, host, change } = await setUp();
    host.angle.setValue(75);
    await change(() => host.readonly.set(true));
    expect(await dial.isReadonly()).toBe(true);
    await dial.pressKey('ArrowUp');
    await dial.dragTo(180);
    expect(host.angle.value).toBe(75);
    await dial.focus();
    expect(await dial.isFocused()).toBe(true);
    const element: HTMLElement = fixture.nativeElement.querySelector('cp-phase-dial');
    expect(element.querySelector('.cp-phase-dial__thumb')).toBeNull();
    expect(element.querySelector('.cp-phase-dial__needle-tip')).not.toBeNull();
  });

  it('lists its markers with their kind, detail and angle', async () => {
    const { dial, host, change } = await setUp();
    await change(() =>
      host.markers.set([
        { kind: 'reading', angleDeg: 212, label: 'Run 1' },
        { kind: 'heavySpot', angleDeg: 250 },
        { kind: 'trialWeight', angleDeg: 90, label: '40 g' },
        { kind: 'correction', angleDeg: 430.5 },
      ]),
    );
    expect(await dial.getMarkers()).toEqual([
      { kind: 'reading', label: 'Run 1', angleDeg: 212 },
      { kind: 'heavySpot', label: '', angleDeg: 250 },
      { kind: 'trialWeight', label: '40 g', angleDeg: 90 },
      { kind: 'correction', label: '', angleDeg: 70.5 },
    ]);
  });

  it('takes a typed angle in the compact variant and rewrites it once committed', async () => {
    const { dial, host, change } = await setUp();
    await change(() => host.compact.set(true));
    expect(await dial.isCompact()).toBe(true);
    await dial.typeInField('212');
    expect(host.angle.value).toBe(212);
    expect(await dial.getValue()).toBe(212);
    await dial.typeInField('370');
    expect(host.angle.value).toBe(10);
    expect(await dial.getFieldText()).toBe('10');
    await dial.pressKey('ArrowUp');
    expect(await dial.getFieldText()).toBe('11');
    await dial.typeInField('');
    expect(host.angle.value).toBeNull();
    expect(host.commits).toEqual([212, 10, 11, null]);
    expect(host.angle.touched).toBe(true);
  });

  it('follows the form value written while the technician is away from the field', async () => {
    const { dial, host, change } = await setUp();
    await change(() => host.compact.set(true));
    host.angle.setValue(33.25);
    expect(await dial.getFieldText()).toBe('33.25');
    host.angle.reset();
    expect(await dial.getFieldText()).toBe('');
  });

  it('describes the rotation and where the reference mark sits', async () => {
    const { dial, host, change } = await setUp();
    await change(() => {
      host.rotation.set('counterClockwise');
      host.zeroAtDeg.set(270);
    });
    expect(await dial.getDescription()).toBe(
      'The rotor turns counter-clockwise as seen here. The reference mark is on the left.',
    );
  });

  it('says why it is invalid in its own words once touched, and points the slider at the message', async () => {
    const { fixture, dial, host, change } = await setUp();
    const slider: HTMLElement = fixture.nativeElement.querySelector('[role="slider"]');
    const descriptionId = slider.getAttribute('aria-describedby');
    expect(await dial.getErrorText()).toBeNull();
    expect(slider.hasAttribute('aria-invalid')).toBe(false);

    await dial.focus();
    await dial.blur();
    expect(await dial.getErrorText()).toBe('Enter an angle, or set it on the dial.');
    expect(await dial.isInvalid()).toBe(true);
    const [, errorId] = slider.getAttribute('aria-describedby')!.split(' ');
    const error: HTMLElement = fixture.nativeElement.querySelector(`#${errorId}`);
    expect(error.textContent?.trim()).toBe('Enter an angle, or set it on the dial.');
    expect(error.closest('[aria-live="polite"]')).not.toBeNull();
    expect(fixture.nativeElement.querySelector('[role="alert"]')).toBeNull();

    await change(() => host.positions.set({ count: 3, firstDeg: 0 }));
    host.angle.setValue(100);
    expect(await dial.getErrorText()).toBe('Choose one of the allowed positions: 0°, 120°, 240°.');
    await dial.pressKey('ArrowUp');
    expect(await dial.getErrorText()).toBeNull();
    expect(slider.getAttribute('aria-describedby')).toBe(descriptionId);
    expect(slider.hasAttribute('aria-invalid')).toBe(false);
  });

  it("shows the page's own message in place of its own, and only in error state", async () => {
    const { dial, host, change } = await setUp();
    await change(() => host.errorText.set(INITIAL_RUN_PHASE_MESSAGE));
    expect(await dial.getErrorText()).toBeNull();
    host.angle.markAsTouched();
    expect(await dial.getErrorText()).toBe(INITIAL_RUN_PHASE_MESSAGE);
    await change(() => host.errorText.set(null));
    expect(await dial.getErrorText()).toBe('Enter an angle, or set it on the dial.');
    await change(() => host.errorText.set(INITIAL_RUN_PHASE_MESSAGE));
    await dial.pressKey('Home');
    expect(await dial.getErrorText()).toBeNull();
  });

  it('puts its numeric field in a Material outlined form field with its label, unit and error', async () => {
    const { fixture, dial, host, change } = await setUp();
    expect(await dial.getFormField()).toBeNull();
    await change(() => host.compact.set(true));
    const formField = (await dial.getFormField())!;
    expect(await formField.getAppearance()).toBe('outline');
    expect(await formField.getLabel()).toBe('Trial weight angle');
    expect(await formField.hasErrors()).toBe(false);
    expect(await formField.getTextHints()).toEqual(['Degrees against rotation from the mark']);
    const input: HTMLInputElement = fixture.nativeElement.querySelector('input');
    expect(input.getAttribute('inputmode')).toBe('decimal');
    expect(input.getAttribute('aria-required')).toBe('true');
    expect(fixture.nativeElement.querySelector('.mat-mdc-form-field-text-suffix').textContent.trim()).toBe(
      '°',
    );

    await dial.typeInField('');
    expect(await formField.getTextErrors()).toEqual(['Enter an angle, or set it on the dial.']);
    expect(await dial.getErrorText()).toBe('Enter an angle, or set it on the dial.');
    // As Material's inputs do, an empty required field is announced as required rather than invalid.
    expect(input.getAttribute('aria-invalid')).toBeNull();
    expect(await dial.isInvalid()).toBe(true);
    const errorId = fixture.nativeElement.querySelector('mat-error').id;
    expect(input.getAttribute('aria-describedby')).toContain(errorId);
    const slider: HTMLElement = fixture.nativeElement.querySelector('[role="slider"]');
    expect(slider.getAttribute('aria-describedby')).toContain(errorId);
  });

  it('keeps typed text that is not a number, and says so', async () => {
    const { fixture, dial, host, change } = await setUp();
    await change(() => host.compact.set(true));
    host.angle.setValue(40);
    await dial.typeInField('4o');
    expect(await dial.getFieldText()).toBe('4o');
    expect(host.angle.errors).toEqual({ cpPhaseNumber: { text: '4o' } });
    expect(await dial.getErrorText()).toBe('Type the angle as a number of degrees, such as 45 or 127.5.');
    expect(fixture.nativeElement.querySelector('input').getAttribute('aria-invalid')).toBe('true');
    await dial.typeInField('45');
    expect(host.angle.value).toBe(45);
    expect(host.angle.valid).toBe(true);
    expect(await dial.getErrorText()).toBeNull();
    expect(host.commits).toEqual([45]);
  });

  it('shows the error once its form is submitted, or as its own error state matcher says', async () => {
    const fixture = TestBed.createComponent(FormHost);
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const first = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Phase of run 1' }));
    const second = await loader.getHarness(CpPhaseDialHarness.with({ label: 'Phase of run 2' }));
    expect(await first.getErrorText()).toBeNull();
    fixture.nativeElement.querySelector('button').click();
    await fixture.whenStable();
    expect(await first.isInvalid()).toBe(true);
    expect(await first.getErrorText()).toBe('Enter an angle, or set it on the dial.');
    // Its matcher shows errors on dirty only: submitting the form does not make it dirty.
    expect(await second.getErrorText()).toBeNull();
    await second.pressKey('Home');
    fixture.componentInstance.form.controls.laterDeg.setValue(null);
    fixture.componentInstance.form.controls.laterDeg.markAsDirty();
    expect(await second.getErrorText()).toBe('Enter an angle, or set it on the dial.');

    fixture.componentInstance.compact.set(true);
    const formField = (await first.getFormField())!;
    expect(await formField.getTextErrors()).toEqual(['Enter an angle, or set it on the dial.']);
  });

  it('takes its diameter from the size input, through the custom property', async () => {
    const { fixture } = await setUp();
    const disabledDial: HTMLElement = fixture.nativeElement.querySelectorAll('cp-phase-dial')[1];
    expect(disabledDial.style.getPropertyValue('--cp-phase-dial-size')).toBe('');
    fixture.componentRef.changeDetectorRef.detectChanges();
    const sized = TestBed.createComponent(CpPhaseDial);
    sized.componentRef.setInput('size', 200);
    await sized.whenStable();
    expect(sized.nativeElement.style.getPropertyValue('--cp-phase-dial-size')).toBe('200px');
  });
});
