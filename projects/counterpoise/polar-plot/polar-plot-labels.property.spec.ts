import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  type _Box as Box,
  _boxesOverlap as boxesOverlap,
  _boxInside as boxInside,
  _estimateTextWidthPx as estimateTextWidthPx,
} from '@counterpoise/ng/core';
import { CROWDED_JOB, DRIVE_END_RUNS, JOB, TWO_SENSORS } from './polar-plot.fixtures';
import { POLAR_SERIES_KINDS, type PolarSeries } from './polar-plot-geometry';
import { FOCUS_RING_RADIUS, type PolarPlotLayout, layoutPolarPlot } from './polar-plot-layout';
import { plottedPoints } from './polar-plot-model';

/** The vertices of an SVG path of straight segments, as a box. */
function pathBox(path: string): Box {
  const points = [...path.matchAll(/[ML]\s*(-?[\d.]+)[ ,](-?[\d.]+)/g)].map(([, x, y]) => ({
    x: Number(x),
    y: Number(y),
  }));
  const xs = points.map((p) => p.x);
  const ys = points.map((p) => p.y);
  return {
    x: Math.min(...xs),
    y: Math.min(...ys),
    width: Math.max(...xs) - Math.min(...xs),
    height: Math.max(...ys) - Math.min(...ys),
  };
}

/** What the plot draws that a label must never cover: markers with their focus rings, scale text, marks. */
function markBoxes(layout: PolarPlotLayout): Box[] {
  const text = (x: number, y: number, label: string) => {
    const width = estimateTextWidthPx(label, layout.fontSize);
    const height = layout.fontSize * 1.2;
    return { x: x - width / 2, y: y - height / 2, width, height };
  };
  return [
    ...layout.points.map((point) => ({
      x: point.head.x - FOCUS_RING_RADIUS,
      y: point.head.y - FOCUS_RING_RADIUS,
      width: 2 * FOCUS_RING_RADIUS,
      height: 2 * FOCUS_RING_RADIUS,
    })),
    ...layout.angleLabels.map((label) => text(label.x, label.y, label.text)),
    ...layout.rings.filter((ring) => ring.label).map((ring) => text(ring.x, ring.y, ring.label!)),
    pathBox(layout.referenceMarkPath),
    pathBox(layout.rotationGlyph.headPath),
  ];
}

/** The layout writes the scale's text positions rounded to hundredths of a pixel; boxes rebuilt from them may touch by that much. */
const ROUNDING_PX = 0.01;

function expectLabelsKeepTheirPromises(layout: PolarPlotLayout): void {
  const widget = { x: 0, y: 0, width: layout.size, height: layout.height };
  const labels = layout.points.flatMap((point) => (point.label ? [point.label.box] : []));
  const marks = markBoxes(layout);
  const faults: string[] = [];
  labels.forEach((label, i) => {
    if (!boxInside(label, widget, 1e-6)) faults.push(`label ${i} outside the plot`);
    labels.slice(i + 1).forEach((other, j) => {
      if (boxesOverlap(label, other, 1e-6)) faults.push(`label ${i} over label ${i + 1 + j}`);
    });
    marks.forEach((mark, j) => {
      if (boxesOverlap(label, mark, ROUNDING_PX)) faults.push(`label ${i} over mark ${j}`);
    });
  });
  expect(faults).toEqual([]);
}

const point = fc.record({
  amplitude: fc.double({ min: 0, max: 20, noNaN: true }),
  angleDeg: fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true }),
  label: fc.option(
    fc.constantFrom('Run 1', 'Run 2', 'Run 3', 'Trial', 'Ideal', 'Drive end', 'B1', 'Installed'),
    {
      nil: undefined,
    },
  ),
});
const series = fc.record({
  label: fc.constantFrom('Sensor A', 'Sensor B', 'Weights', 'Drive end', 'Run 1'),
  kind: fc.constantFrom(...POLAR_SERIES_KINDS),
  unit: fc.constantFrom('in/s', 'mm/s', 'g'),
  points: fc.array(point, { minLength: 1, maxLength: 10 }),
});

describe('polar plot labels (property)', () => {
  it('never overlap, never cover a marker or the scale, and stay inside the plot, however many points', () => {
    fc.assert(
      fc.property(
        fc.array(series, { minLength: 1, maxLength: 5 }),
        fc.integer({ min: 200, max: 600 }),
        fc.integer({ min: 0, max: 359 }),
        fc.constantFrom('clockwise' as const, 'counterClockwise' as const),
        fc.integer({ min: 1, max: 12 }),
        (drafts, size, zeroAtDeg, rotation, ringCount) => {
          const all: PolarSeries[] = drafts.map((draft, i) => ({ id: `s${i}`, ...draft }));
          const layout = layoutPolarPlot({
            series: all,
            convention: { rotation, counting: 'againstRotation', zeroAtDeg },
            maxAmplitude: null,
            ringCount,
            size,
          });
          expectLabelsKeepTheirPromises(layout);
          // The drawing leaves labels out, the words never: every point keeps its name in its detail.
          for (const [i, plotted] of plottedPoints(all).entries()) {
            if (plotted.point.label) expect(layout.points[i]!.detail).toContain(plotted.point.label);
          }
        },
      ),
      {
        numRuns: 150,
        examples: [
          // Found by an earlier run: a label placed flush against the 330° angle label, whose box this
          // spec rebuilds from the rounded text position (hence ROUNDING_PX).
          [
            [
              {
                label: 'Sensor A',
                kind: 'reading',
                unit: 'in/s',
                points: [
                  { amplitude: 5.24e-322, angleDeg: 0, label: undefined },
                  { amplitude: 5e-324, angleDeg: 0, label: 'Run 1' },
                ],
              },
            ],
            539,
            27,
            'clockwise',
            7,
          ],
        ],
      },
    );
  });
});

describe('polar plot labels of the shared series', () => {
  const layout = (series: readonly PolarSeries[], size: number) =>
    layoutPolarPlot({
      series,
      convention: { rotation: 'clockwise', counting: 'againstRotation', zeroAtDeg: 0 },
      maxAmplitude: null,
      ringCount: 4,
      size,
    });

  it.each([200, 320, 600])('draw no label that every run shares ("Drive end") at %i px', (size) => {
    const drawn = layout(DRIVE_END_RUNS, size);
    expect(drawn.points.filter((point) => point.label)).toEqual([]);
    expect(drawn.points[0]!.detail).toBe('Drive end, Initial run: 0.52 in/s at 74 degrees');
  });

  it.each([200, 320, 600])('keep the labels of a crowded job apart at %i px', (size) => {
    for (const series of [CROWDED_JOB, JOB, TWO_SENSORS]) expectLabelsKeepTheirPromises(layout(series, size));
  });

  it('gives a label that moved away from its point a leader line back to it', () => {
    const drawn = layout(CROWDED_JOB, 240);
    const moved = drawn.points.filter((point) => point.label?.leader);
    expect(moved.length).toBeGreaterThan(0);
    for (const point of moved) {
      expect(point.label!.leader!.x1).toBeCloseTo(point.head.x, 1);
      expect(point.label!.leader!.y1).toBeCloseTo(point.head.y, 1);
    }
  });
});
