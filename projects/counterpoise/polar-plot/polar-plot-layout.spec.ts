import { describe, expect, it } from 'vitest';
import {
  type DialConvention,
  _boxesOverlap as boxesOverlap,
  _estimateTextWidthPx as estimateTextWidth,
  _screenAngleOfPoint as screenAngleOfPoint,
} from '@counterpoise/ng/core';
import { type PolarSeries, segmentHitsBox } from './polar-plot-geometry';
import { layoutPolarPlot, PLOT_FONT_SIZE } from './polar-plot-layout';
import { SENSOR_A_RUNS, TRIAL_EFFECT } from './polar-plot.fixtures';

const convention: DialConvention = { rotation: 'clockwise', counting: 'againstRotation', zeroAtDeg: 0 };

const runs = SENSOR_A_RUNS;
const otherSensor: PolarSeries = {
  id: 'b',
  label: 'Sensor B',
  kind: 'run',
  unit: 'in/s',
  points: [{ amplitude: 0.18, angleDeg: 300, label: 'B1' }],
};
const weights: PolarSeries = {
  id: 'w',
  label: 'Weights',
  kind: 'weight',
  unit: 'g',
  points: [{ amplitude: 60, angleDeg: 0, label: 'Trial' }],
};

function layout(series: readonly PolarSeries[], size = 400, more: Partial<DialConvention> = {}) {
  return layoutPolarPlot({
    series,
    convention: { ...convention, ...more },
    maxAmplitude: null,
    ringCount: 4,
    size,
  });
}

describe('layoutPolarPlot', () => {
  it('labels the rings in the first unit, with the unit on the outer ring', () => {
    const { rings } = layout([runs, weights]);
    expect(rings.map((ring) => ring.label)).toEqual(['0.15', '0.3', '0.45', '0.6 in/s']);
    expect(rings.at(-1)?.radius).toBeCloseTo(layout([runs]).radius, 9);
  });

  it('leaves out inner ring labels that would collide on a small plot', () => {
    const { rings } = layoutPolarPlot({
      series: [runs],
      convention,
      maxAmplitude: null,
      ringCount: 10,
      size: 240,
    });
    const shown = rings.filter((ring) => ring.label !== null);
    expect(shown.length).toBeLessThan(rings.length);
    expect(shown.at(-1)?.label).toBe('0.5 in/s');
  });

  it('names the kind, the unit and the scale of every other unit in the legend', () => {
    const effect: PolarSeries = {
      id: 't',
      label: 'Trial effect',
      kind: 'trialEffect',
      unit: 'in/s',
      points: [],
    };
    const { legend } = layout([runs, weights, effect]);
    expect(legend.map((entry) => entry.scaleNote)).toEqual([null, 'outer ring 60 g', null]);
    expect(legend.map((entry) => entry.meta)).toEqual(['Run, in/s', 'g (outer ring 60 g)', 'in/s']);
  });

  it('keeps ring labels off the vectors when some direction allows it', () => {
    const effect = TRIAL_EFFECT;
    const drawn = layout([runs, effect], 400);
    const segments = drawn.points.map((point) => {
      const [x1, y1, x2, y2] = point.linePath.match(/-?\d+(\.\d+)?/g)!.map(Number);
      return [
        { x: x1!, y: y1! },
        { x: x2!, y: y2! },
      ] as const;
    });
    for (const ring of drawn.rings.filter((r) => r.label)) {
      const width = estimateTextWidth(ring.label!, PLOT_FONT_SIZE);
      const box = {
        x: ring.x - width / 2,
        y: ring.y - PLOT_FONT_SIZE * 0.6,
        width,
        height: PLOT_FONT_SIZE * 1.2,
      };
      for (const [a, b] of segments) expect(segmentHitsBox(a, b, box)).toBe(false);
    }
  });

  it('stops an arrowhead short of the marker it points at', () => {
    const effect = TRIAL_EFFECT;
    const drawn = layout([runs, effect], 400);
    const run2 = drawn.points[1]!.head;
    const arrow = drawn.points[3]!.head;
    const gap = Math.hypot(run2.x - arrow.x, run2.y - arrow.y);
    expect(gap).toBeGreaterThan(10);
    expect(gap).toBeLessThan(14);
  });

  it('shades a second series of the same kind differently', () => {
    const { legend, points } = layout([runs, otherSensor, weights]);
    expect(legend.map((entry) => entry.shade)).toEqual([0, 1, 0]);
    expect(points.map((point) => point.shade)).toEqual([0, 0, 0, 1, 0]);
  });

  it('labels every 90 degrees on a small plot and every 30 on a large one', () => {
    expect(layout([runs], 240).angleLabels.map((label) => label.text)).toEqual(['0°', '90°', '180°', '270°']);
    expect(layout([runs], 480).angleLabels).toHaveLength(12);
  });

  it('puts the reference mark where zeroAtDeg says and counts round the way the convention says', () => {
    const right = layout([runs], 400, { zeroAtDeg: 90 });
    const zero = right.angleLabels.find((label) => label.text === '0°')!;
    expect(zero.reference).toBe(true);
    const zeroWidth = estimateTextWidth(zero.text, PLOT_FONT_SIZE);
    expect(zero.x - zeroWidth / 2).toBeGreaterThan(right.center.x + right.radius);
    expect(zero.textAnchor).toBe('middle');
    // Against a clockwise rotor, 90 degrees is a quarter turn counter-clockwise from the mark: at the top.
    const ninety = right.angleLabels.find((label) => label.text === '90°')!;
    expect(ninety.y).toBeLessThan(right.center.y - right.radius);
    const withRotation = layout([runs], 400, { zeroAtDeg: 90, counting: 'withRotation' });
    expect(withRotation.angleLabels.find((label) => label.text === '90°')!.y).toBeGreaterThan(
      withRotation.center.y + withRotation.radius,
    );
  });

  it('places point labels clear of each other and inside the plot', () => {
    const { points, size, height } = layout([runs, otherSensor, weights], 280);
    const boxes = points
      .filter((point) => point.label)
      .map((point) => {
        const width = estimateTextWidth(point.label!.text, PLOT_FONT_SIZE);
        const x = point.label!.x - width / 2;
        return { x, y: point.label!.y - PLOT_FONT_SIZE * 0.6, width, height: PLOT_FONT_SIZE * 1.2 };
      });
    expect(points.every((point) => point.label?.textAnchor !== 'start')).toBe(true);
    expect(boxes).toHaveLength(5);
    for (const box of boxes) {
      expect(box.x).toBeGreaterThanOrEqual(0);
      expect(box.x + box.width).toBeLessThanOrEqual(size);
      expect(box.y + box.height).toBeLessThanOrEqual(height);
    }
    for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) expect(boxesOverlap(boxes[i]!, boxes[j]!)).toBe(false);
    }
  });

  it('describes each point and flags one beyond a fixed outer ring', () => {
    const fixed = layoutPolarPlot({ series: [runs], convention, maxAmplitude: 0.3, ringCount: 3, size: 320 });
    expect(fixed.rings.map((ring) => ring.label)).toEqual(['0.1', '0.2', '0.3 in/s']);
    expect(fixed.points.map((point) => point.offScale)).toEqual([true, false, false]);
    expect(fixed.points[0]!.detail).toBe('Run 1, Sensor A: 0.42 in/s at 128 degrees, beyond the outer ring');
  });

  it('draws nothing but the grid when there are no points', () => {
    const empty = layout([]);
    expect(empty.points).toEqual([]);
    expect(empty.legend).toEqual([]);
    expect(empty.rings).toHaveLength(4);
    expect(empty.rings.every((ring) => ring.label === null)).toBe(true);
    expect(empty.spokes).toHaveLength(12);
  });
});

describe('rotation arrow', () => {
  it('sweeps just outside the outer ring the way the rotor turns', () => {
    const clockwise = layout([runs], 400);
    const counter = layout([runs], 400, { rotation: 'counterClockwise' });
    expect(clockwise.rotationGlyph.arcPath).toMatch(/ 0 0 1 /);
    expect(counter.rotationGlyph.arcPath).toMatch(/ 0 0 0 /);
    const [, x, y] = /^M ([\d.-]+) ([\d.-]+)/.exec(clockwise.rotationGlyph.arcPath)!.map(Number);
    const reach = Math.hypot(x! - clockwise.center.x, y! - clockwise.center.y);
    expect(reach).toBeGreaterThan(clockwise.radius);
    expect(reach).toBeLessThan(clockwise.radius + 11);
  });

  it('keeps clear of the directions the data takes', () => {
    const { rotationGlyph, center, points } = layout([runs], 400);
    const [, x, y] = /^M ([\d.-]+) ([\d.-]+)/.exec(rotationGlyph.arcPath)!.map(Number);
    const arcDeg = screenAngleOfPoint(center, { x: x!, y: y! });
    for (const point of points) {
      const pointDeg = screenAngleOfPoint(center, point.head);
      const apart = Math.min(Math.abs(arcDeg - pointDeg), 360 - Math.abs(arcDeg - pointDeg));
      expect(apart).toBeGreaterThan(5);
    }
  });
});
