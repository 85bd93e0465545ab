import { TestKey } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { describe, expect, it } from 'vitest';
import { type RotationCounting, type RotationDirection } from '@counterpoise/ng/core';
import { CpPolarPlotHarness } from '@counterpoise/ng/polar-plot/testing';
import { CpPolarPlot } from './polar-plot';
import { JOB } from './polar-plot.fixtures';
import { type PolarSeries } from './polar-plot-geometry';

@Component({
  imports: [CpPolarPlot],
  template: `
    <cp-polar-plot
      caption="Drum, left bearing"
      [series]="series()"
      [rotation]="rotation()"
      [counting]="counting()"
      [maxAmplitude]="maxAmplitude()"
      [(showTable)]="showTable"
    />
    <cp-polar-plot caption="Nothing yet" />
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly series = signal<readonly PolarSeries[]>(JOB);
  readonly rotation = signal<RotationDirection>('clockwise');
  readonly counting = signal<RotationCounting>('againstRotation');
  readonly maxAmplitude = signal<number | null>(null);
  readonly showTable = signal(false);
}

async function setUp() {
  const fixture = TestBed.createComponent(Host);
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const plot = await loader.getHarness(CpPolarPlotHarness.with({ caption: 'Drum, left bearing' }));
  const empty = await loader.getHarness(CpPolarPlotHarness.with({ caption: 'Nothing yet' }));
  return { fixture, plot, empty };
}

describe('CpPolarPlot', () => {
  it('lists every series in the legend and labels the rings in the first unit', async () => {
    const { plot } = await setUp();
    expect(await plot.getSeriesLabels()).toEqual([
      'Sensor A',
      'Trial effect',
      'Predicted residual',
      'Weights',
    ]);
    expect(await plot.getRingLabels()).toEqual(['0.15', '0.3', '0.45', '0.6 in/s']);
    expect(await plot.getNote()).toContain('Rings 0.15 in/s apart, outer ring 0.6 in/s.');
    expect(await plot.getPointCount()).toBe(8);
  });

  it('gives every point an accessible name with its amplitude, unit and angle', async () => {
    const { plot } = await setUp();
    expect(await plot.getPointDescriptions()).toEqual([
      'Run 1, Sensor A: 0.42 in/s at 128 degrees',
      'Run 2, Sensor A: 0.29 in/s at 196 degrees',
      'Run 3, Sensor A: 0.04 in/s at 62 degrees',
      'Trial effect: 0.411 in/s at 267.2 degrees, from 0.42 in/s at 128 degrees',
      'Predicted residual: 0.032 in/s at 56 degrees',
      'Trial, Weights: 60 g at 0 degrees',
      'Ideal, Weights: 61 g at 41 degrees',
      'Installed, Weights: 60 g at 45 degrees',
    ]);
  });

  it('shows the detail of a point on focus, and keeps one tab stop on the point last focused', async () => {
    const { plot } = await setUp();
    expect(await plot.getFocusedDetail()).toBeNull();
    expect(await plot.getTabStopIndex()).toBe(0);
    await plot.focusPoint(1);
    expect(await plot.getFocusedDetail()).toBe('Run 2, Sensor A: 0.29 in/s at 196 degrees');
    expect(await plot.getTabStopIndex()).toBe(1);
  });

  it('moves focus between points with the arrow, Home, End and Page keys', async () => {
    const { plot } = await setUp();
    await plot.focusPoint(0);
    await plot.pressKey(TestKey.RIGHT_ARROW);
    expect(await plot.getFocusedPointIndex()).toBe(1);
    await plot.pressKey(TestKey.PAGE_DOWN);
    expect(await plot.getFocusedPointIndex()).toBe(3);
    await plot.pressKey(TestKey.END);
    expect(await plot.getFocusedPointIndex()).toBe(7);
    expect(await plot.getFocusedDetail()).toBe('Installed, Weights: 60 g at 45 degrees');
    await plot.pressKey(TestKey.DOWN_ARROW);
    expect(await plot.getFocusedPointIndex()).toBe(0);
    await plot.pressKey(TestKey.LEFT_ARROW);
    expect(await plot.getFocusedPointIndex()).toBe(7);
    await plot.pressKey(TestKey.HOME);
    expect(await plot.getFocusedPointIndex()).toBe(0);
    expect(await plot.getTabStopIndex()).toBe(0);
  });

  it('shows the detail of the point under the pointer, and the hint again when it leaves', async () => {
    const { plot } = await setUp();
    await plot.hoverPoint(5);
    expect(await plot.getFocusedDetail()).toBe('Trial, Weights: 60 g at 0 degrees');
    await plot.leavePoint(5);
    expect(await plot.getFocusedDetail()).toBeNull();
  });

  it('lists every point in a table with its series, amplitude and unit, angle and start', async () => {
    const { plot } = await setUp();
    expect(await plot.getTableCaption()).toBe('Drum, left bearing: every value');
    const rows = await plot.getTableRows();
    expect(rows).toHaveLength(8);
    expect(rows[1]).toEqual({
      series: 'Sensor A',
      point: 'Run 2',
      amplitude: '0.29 in/s',
      angle: '196°',
      from: 'Origin',
    });
    expect(rows[3]).toEqual({
      series: 'Trial effect',
      point: 'Point 1',
      amplitude: '0.411 in/s',
      angle: '267.2°',
      from: '0.42 in/s at 128 degrees',
    });
  });

  it('shows the table on screen with its button, and tells the page', async () => {
    const { fixture, plot } = await setUp();
    expect(await plot.isTableShown()).toBe(false);
    await plot.toggleTable();
    expect(await plot.isTableShown()).toBe(true);
    expect(fixture.componentInstance.showTable()).toBe(true);
    fixture.componentInstance.showTable.set(false);
    expect(await plot.isTableShown()).toBe(false);
  });

  it('follows the rotation, the counting and a fixed outer ring', async () => {
    const { fixture, plot } = await setUp();
    fixture.componentInstance.rotation.set('counterClockwise');
    fixture.componentInstance.counting.set('withRotation');
    fixture.componentInstance.maxAmplitude.set(0.4);
    expect(await plot.getNote()).toContain(
      'Rotor turns counter-clockwise in this view; angles are counted with rotation from the reference mark (0°).',
    );
    expect(await plot.getRingLabels()).toEqual(['0.1', '0.2', '0.3', '0.4 in/s']);
    expect((await plot.getPointDescriptions())[0]).toBe(
      'Run 1, Sensor A: 0.42 in/s at 128 degrees, beyond the outer ring',
    );
  });

  it('has no points, rows or tab stop without series, and keeps its tab stop inside fewer points', async () => {
    const { fixture, plot, empty } = await setUp();
    expect(await empty.getPointCount()).toBe(0);
    expect(await empty.getTableRows()).toEqual([]);
    expect(await empty.getTabStopIndex()).toBeNull();
    expect(await empty.getSeriesLabels()).toEqual([]);
    await plot.focusPoint(7);
    fixture.componentInstance.series.set(JOB.slice(0, 1));
    expect(await plot.getPointCount()).toBe(3);
    expect(await plot.getTabStopIndex()).toBe(2);
  });

  it('is a figure whose chart is a group named by the caption and described by its convention', async () => {
    const { fixture } = await setUp();
    const host: HTMLElement = fixture.nativeElement.querySelector('cp-polar-plot');
    const chart = host.querySelector('svg.cp-polar-plot__chart')!;
    expect(chart.getAttribute('role')).toBe('group');
    expect(host.querySelector(`#${chart.getAttribute('aria-labelledby')}`)?.textContent?.trim()).toBe(
      'Drum, left bearing',
    );
    expect(host.querySelector(`#${chart.getAttribute('aria-describedby')}`)?.textContent).toContain(
      'Rotor turns clockwise',
    );
    expect(host.querySelector('.cp-polar-plot__table-toggle')?.getAttribute('aria-pressed')).toBe('false');
  });
});
