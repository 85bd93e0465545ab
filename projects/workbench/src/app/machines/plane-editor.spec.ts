import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { CpCorrectionOverlayHarness } from '@counterpoise/ng/correction-overlay/testing';
import { describe, expect, it } from 'vitest';
import { planeGroup } from './machine-form-model';
import { PlaneEditor } from './plane-editor';

/** The left plane of a drum turning clockwise seen from the left. */
@Component({
  selector: 'app-plane-editor-host',
  imports: [PlaneEditor],
  template: `<app-plane-editor
    [group]="plane"
    [index]="0"
    [planeCount]="2"
    rotation="clockwise"
    seenFrom="left"
  />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class PlaneEditorHost {
  readonly plane = planeGroup({ correctionRadiusMm: 240 });
}

describe('PlaneEditor', { timeout: 20_000 }, () => {
  async function render() {
    const fixture = TestBed.createComponent(PlaneEditorHost);
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const overlay = await loader.getHarness(CpCorrectionOverlayHarness);
    const button = (text: string | RegExp) => loader.getHarness(MatButtonHarness.with({ text }));
    return { fixture, loader, overlay, button, plane: fixture.componentInstance.plane };
  }

  it('draws the plane as seen from its end, with nothing allowed or blocked yet', async () => {
    const { overlay, button } = await render();
    expect(await overlay.getLabel()).toBe('Left plane, seen from the left end: where weights can go');
    expect(await overlay.getDescription()).toContain('End view of the rotor, turning clockwise.');
    expect(await (await button(/Set first position here/)).isDisabled()).toBe(true);
    expect(await (await button(/Start a blocked sector here/)).isDisabled()).toBe(true);
  });

  it('sets the first of the fixed positions where the keyboard marked it', async () => {
    const { overlay, button, plane, loader } = await render();
    await overlay.moveCrosshair(40);
    await overlay.markWithKeyboard();
    await (await button(/Set first position here/)).click();
    expect(plane.controls.positions.getRawValue()).toEqual({ fixed: true, count: 12, firstDeg: 40 });
    expect(
      await (
        await loader.getHarness(MatButtonToggleHarness.with({ text: 'At fixed positions' }))
      ).isChecked(),
    ).toBe(true);
    expect(await overlay.getDescription()).toContain(
      // The drawing lists evenly spaced positions from the lowest angle: 40° less one step.
      '12 allowed positions, every 30 degrees from 10 degrees.',
    );

    // The numbers stay editable, and the drawing follows them.
    const count = await loader.getHarness(MatInputHarness.with({ selector: '#plane-0-count' }));
    await count.setValue('8');
    expect(await overlay.getDescription()).toContain('8 allowed positions, at 40, 85, 130');
  });

  it('draws a blocked sector from two tapped points and asks what blocks it', async () => {
    const { overlay, button, plane, fixture, loader } = await render();
    await overlay.pickAt(350, 0.9);
    await (await button(/Start a blocked sector here/)).click();
    expect((fixture.nativeElement as HTMLElement).textContent).toContain(
      'The sector starts at 350°. Mark where it ends.',
    );
    await overlay.pickAt(10, 0.9);
    await (await button(/End the sector here/)).click();
    await fixture.whenStable();
    expect(plane.controls.blockedSectors.getRawValue()).toEqual([{ fromDeg: 350, toDeg: 10, label: '' }]);
    const label = await loader.getHarness(MatInputHarness.with({ selector: '#plane-0-sector-0-label' }));
    expect(await label.isFocused()).toBe(true);
    await label.setValue('holder');
    expect(await overlay.getDescription()).toContain('Blocked: holder 350 to 10 degrees.');
    expect(await overlay.getBlockedSectorLabels()).toEqual(['holder']);
  });

  it('adds a sector by its angles alone, and removes it', async () => {
    const { button, plane, loader } = await render();
    await (await button(/Add a sector by its angles/)).click();
    expect(plane.controls.blockedSectors.length).toBe(1);
    expect(
      await (
        await loader.getHarness(MatInputHarness.with({ selector: '#plane-0-sector-0-from' }))
      ).isFocused(),
    ).toBe(true);
    await (
      await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label^="Remove blocked sector 1"]' }))
    ).click();
    expect(plane.controls.blockedSectors.length).toBe(0);
  });
});
