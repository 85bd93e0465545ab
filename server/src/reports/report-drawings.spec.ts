import { describe, expect, it } from 'vitest';
import { endViewSvg, escapeXml, formatFigure, niceScale, pointAt, polarPlotSvg } from './report-drawings';

const centre = { x: 100, y: 100 };

describe('pointAt', () => {
  it('puts 0° at the top and counts the way the drawing says', () => {
    expect(pointAt(centre, 50, 0, 'clockwise')).toEqual({ x: 100, y: 50 });
    expect(pointAt(centre, 50, 90, 'clockwise')).toEqual({ x: 150, y: 100 });
    expect(pointAt(centre, 50, 90, 'counterClockwise')).toEqual({ x: 50, y: 100 });
    expect(pointAt(centre, 50, 180, 'counterClockwise')).toEqual({ x: 100, y: 150 });
    expect(pointAt(centre, 50, 270, 'clockwise')).toEqual({ x: 50, y: 100 });
  });

  it('mirrors an angle when the counting turns the other way', () => {
    for (const angle of [17, 133, 251, 344]) {
      const clockwise = pointAt(centre, 40, angle, 'clockwise');
      const counter = pointAt(centre, 40, angle, 'counterClockwise');
      expect(clockwise.y).toBe(counter.y);
      expect(clockwise.x - centre.x).toBeCloseTo(centre.x - counter.x, 6);
    }
  });
});

describe('formatFigure and niceScale', () => {
  it('prints at most three significant digits, never in exponent form', () => {
    expect(formatFigure(0.23149)).toBe('0.231');
    expect(formatFigure(2150, 5)).toBe('2150');
    expect(formatFigure(5.55e-17)).toBe('0');
    expect(formatFigure(Number.NaN)).toBe('–');
  });

  it('finds the 1-2-5 full scale at or above the largest value', () => {
    expect(niceScale(0.42)).toBe(0.5);
    expect(niceScale(0.5)).toBe(0.5);
    expect(niceScale(3.1)).toBe(5);
    expect(niceScale(7)).toBe(10);
    expect(niceScale(0)).toBe(1);
  });
});

describe('polarPlotSvg', () => {
  it('draws each reading as an arrow to its amplitude and phase, and one without phase as a dashed ring', () => {
    const svg = polarPlotSvg({
      size: 200,
      unit: 'in/s peak',
      counting: 'clockwise',
      points: [
        { label: 'before', kind: 'before', amplitude: 0.4, phaseDeg: 90 },
        { label: 'after', kind: 'after', amplitude: 0.05, phaseDeg: null },
      ],
    });
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('0.5 in/s peak');
    expect(svg).toContain('>before<');
    expect(svg).toContain('>after<');
    expect(svg).toContain('stroke-dasharray="3 2"');
    // The before reading at 90° clockwise lies right of the centre, at 0.4 / 0.5 of the outer ring.
    const centreX = 100;
    const arrow = /<line x1="100" y1="([\d.]+)" x2="([\d.]+)" y2="([\d.]+)" stroke="#b54708"/.exec(svg)!;
    expect(Number(arrow[2])).toBeGreaterThan(centreX);
    expect(Number(arrow[3])).toBeCloseTo(Number(arrow[1]), 1);
  });
});

describe('endViewSvg', () => {
  it('marks the reference at 0°, draws every weight as a dot with its label, and escapes the text', () => {
    const svg = endViewSvg({
      size: 230,
      rotation: 'counterClockwise',
      counting: 'clockwise',
      weights: [
        { label: 'W1 125 g at 210°', angleDeg: 210 },
        { label: 'W2 <40 g> at 215°', angleDeg: 215 },
      ],
    });
    expect(svg).toContain('0° ref. mark');
    expect(svg.match(/<circle [^>]*r="4.5"/g)).toHaveLength(2);
    expect(svg).toContain('W1 125 g at 210°');
    expect(svg).toContain(escapeXml('W2 <40 g> at 215°'));
    expect(svg).not.toContain('<40 g>');
    // Two weights 5° apart: the second label steps inwards, so their labels do not share a spot.
    const labels = [...svg.matchAll(/<text x="([\d.-]+)" y="([\d.-]+)"[^>]*fill="#175cd3">/g)].map((m) => [
      Number(m[1]),
      Number(m[2]),
    ]);
    expect(labels).toHaveLength(2);
    expect(Math.hypot(labels[0]![0]! - labels[1]![0]!, labels[0]![1]! - labels[1]![1]!)).toBeGreaterThan(8);
  });
});
