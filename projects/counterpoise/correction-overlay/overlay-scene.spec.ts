import { describe, expect, it } from 'vitest';
import {
  _boxesOverlap as boxesOverlap,
  _screenAngleDeg as screenAngleDeg,
  _screenAngleOfPoint as screenAngleOfPoint,
} from '@counterpoise/ng/core';
import { type StageSize, fittedFrame } from './overlay-geometry';
import { CORRECTION } from './correction-overlay.fixtures';
import { type OverlaySceneInput, buildOverlayScene } from './overlay-scene';

function scene(size: StageSize, extra: Partial<OverlaySceneInput> = {}) {
  return buildOverlayScene({
    size,
    frame: fittedFrame(size, 0),
    rotation: 'clockwise',
    counting: 'againstRotation',
    sensorAngleDeg: null,
    heavySpotDeg: null,
    corrections: [],
    existingWeights: [],
    allowedPositions: [],
    blockedSectors: [],
    markedPoint: null,
    ...extra,
  });
}

/** A mulcher drum with a split correction near a tooth holder: the crowded case the overlay is for. */
// Not SPLIT_AROUND_HOLDERS: this drum has an earlier weight inside a blocked sector and a marked point, which the checks need.
const crowded: Partial<OverlaySceneInput> = {
  sensorAngleDeg: 90,
  heavySpotDeg: 285,
  corrections: [
    { mass: 46, angleDeg: 90, unit: 'g', label: 'A' },
    { mass: 52, angleDeg: 120, unit: 'g', label: 'B' },
  ],
  existingWeights: [
    { mass: 30, angleDeg: 100, unit: 'g' },
    { mass: 25, angleDeg: 250, unit: 'g' },
  ],
  allowedPositions: Array.from({ length: 12 }, (_, i) => i * 30),
  blockedSectors: [
    { fromDeg: 100, toDeg: 110, label: 'holder' },
    { fromDeg: 130, toDeg: 140, label: 'holder' },
    { fromDeg: 160, toDeg: 170, label: 'weld' },
    { fromDeg: 190, toDeg: 200, label: 'holder' },
  ],
  markedPoint: { angleDeg: 95, radiusFraction: 0.9 },
};

describe('buildOverlayScene', () => {
  it('draws each correction on its angle, with its label', () => {
    const s = scene({ width: 400, height: 400 }, { corrections: CORRECTION });
    const [correction] = s.corrections;
    expect(screenAngleOfPoint(s.center, correction!.glyph)).toBeCloseTo(screenAngleDeg(100, s.convention), 9);
    expect(correction!.glyph.rotateDeg).toBeCloseTo(screenAngleDeg(100, s.convention), 9);
    expect(s.labels.filter((l) => l.kind === 'correction').map((l) => l.text)).toEqual(['84 g at 100°']);
  });

  it('puts the reference mark at the frame zero and labels it', () => {
    const size = { width: 300, height: 300 };
    const s = scene(size, { frame: fittedFrame(size, 135) });
    const [, tipX, tipY] = /^M([\d.-]+) ([\d.-]+)/.exec(s.reference.pointerPath)!.map(Number);
    expect(screenAngleOfPoint(s.center, { x: tipX!, y: tipY! })).toBeCloseTo(135, 1);
    expect(screenAngleOfPoint(s.center, { x: s.reference.line.x2, y: s.reference.line.y2 })).toBeCloseTo(
      135,
      9,
    );
    expect(s.labels.find((l) => l.kind === 'reference')?.text).toBe('Ref 0°');
  });

  it.each([240, 360, 600])('keeps every label on the stage and clear of the others at %i px', (width) => {
    const size = { width, height: width };
    const s = scene(size, crowded);
    for (const [i, a] of s.labels.entries()) {
      expect(a.x).toBeGreaterThanOrEqual(0);
      expect(a.y).toBeGreaterThanOrEqual(0);
      expect(a.x + a.width).toBeLessThanOrEqual(width);
      expect(a.y + a.height).toBeLessThanOrEqual(s.height);
      for (const b of s.labels.slice(i + 1)) expect(boxesOverlap(a, b)).toBe(false);
    }
    const kinds = s.labels.map((l) => l.kind);
    expect(kinds.filter((k) => k === 'correction')).toHaveLength(2);
    expect(kinds.filter((k) => k === 'existing')).toHaveLength(2);
    expect(kinds).toEqual(expect.arrayContaining(['marked', 'heavySpot', 'reference']));
  });

  it('flags weights that fall in a blocked sector', () => {
    const s = scene({ width: 400, height: 400 }, crowded);
    expect(s.corrections.map((c) => c.conflict)).toEqual([false, false]);
    expect(s.existing.map((e) => e.conflict)).toEqual([true, false]);
    expect(s.labels.find((l) => l.key === 'existing-0')?.conflict).toBe(true);
  });

  it('numbers the scale every 30 degrees on a large rotor and every 90 on a small one', () => {
    expect(scene({ width: 600, height: 600 }).scaleNumbers.map((n) => n.text)).toHaveLength(12);
    expect(scene({ width: 240, height: 240 }).scaleNumbers.map((n) => n.text)).toEqual([
      '0',
      '90',
      '180',
      '270',
    ]);
    expect(scene({ width: 240, height: 240 }).ticks).toHaveLength(36);
  });

  it('draws allowed positions, blocked bands, sensor, heavy spot and the marked point', () => {
    const s = scene({ width: 400, height: 400 }, crowded);
    expect(s.allowed).toHaveLength(12);
    expect(s.blocked.map((b) => b.path.startsWith('M '))).toEqual([true, true, true, true]);
    expect(s.sensor).not.toBeNull();
    expect(screenAngleOfPoint(s.center, s.heavySpot!.dot)).toBeCloseTo(screenAngleDeg(285, s.convention), 9);
    expect(Math.hypot(s.marked!.x - s.center.x, s.marked!.y - s.center.y)).toBeCloseTo(s.radius * 0.9, 9);
  });

  it('draws the rotation arrow outside the rim where there is room', () => {
    const s = scene({ width: 400, height: 400 });
    const [, x, y] = /^M ([\d.-]+) ([\d.-]+)/.exec(s.rotationArrow.arcPath)!.map(Number);
    expect(Math.hypot(x! - s.center.x, y! - s.center.y)).toBeCloseTo(s.radius + 12, 1);
  });
});
