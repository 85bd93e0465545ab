import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  type _Box as Box,
  _boxesOverlap as boxesOverlap,
  _boxInside as boxInside,
  _expandPositions as expandPositions,
} from '@counterpoise/ng/core';
import { CROWDED_DRUM, MULCHER_DEMO, type OverlayFixture } from './correction-overlay.fixtures';
import { describeOverlay } from './overlay-description';
import { fittedFrame } from './overlay-geometry';
import type { BlockedSector, OverlayWeight } from './overlay-model';
import { type OverlayScene, buildOverlayScene } from './overlay-scene';

/** The square round a glyph drawn centred on a point, `radius` being its reach from that point. */
function around(at: { x: number; y: number }, radius: number): Box {
  return { x: at.x - radius, y: at.y - radius, width: 2 * radius, height: 2 * radius };
}

/** The box of every vertex of an SVG path made of straight segments or arcs' end points. */
function pathBox(path: string): Box {
  const numbers = (path.match(/-?\d+(\.\d+)?/g) ?? []).map(Number);
  const xs: number[] = [];
  const ys: number[] = [];
  // Only the "x y" pairs after M and L commands (the arrowhead, the reference pointer) are vertices.
  for (const [, x, y] of path.matchAll(/[ML]\s*(-?[\d.]+)[ ,](-?[\d.]+)/g)) {
    xs.push(Number(x));
    ys.push(Number(y));
  }
  if (xs.length === 0) return { x: numbers[0] ?? 0, y: numbers[1] ?? 0, width: 0, height: 0 };
  return {
    x: Math.min(...xs),
    y: Math.min(...ys),
    width: Math.max(...xs) - Math.min(...xs),
    height: Math.max(...ys) - Math.min(...ys),
  };
}

/** The marks and glyphs of a scene, at the size the template draws them. */
function glyphBoxes(scene: OverlayScene): Box[] {
  const weightReach = Math.hypot(12, 7);
  return [
    ...scene.corrections.map((weight) => around(weight.glyph, weightReach)),
    ...scene.existing.map((weight) => around(weight.glyph, weightReach)),
    ...scene.allowed.map((position) => around(position, 4.5)),
    ...(scene.heavySpot ? [around(scene.heavySpot.dot, 7)] : []),
    ...(scene.sensor ? [around(scene.sensor.glyph, Math.hypot(7, 7))] : []),
    ...(scene.marked ? [around(scene.marked, 14)] : []),
    pathBox(scene.reference.pointerPath),
    pathBox(scene.rotationArrow.headPath),
  ];
}

/** Checks the promises of the label placer on a built scene. */
function expectLabelsKeepTheirPromises(scene: OverlayScene): void {
  const widget = { x: 0, y: 0, width: scene.width, height: scene.height };
  const glyphs = glyphBoxes(scene);
  scene.labels.forEach((label, i) => {
    expect(boxInside(label, widget, 1e-6), `${label.key} inside the widget`).toBe(true);
    for (const other of scene.labels.slice(i + 1)) {
      expect(boxesOverlap(label, other, 1e-6), `${label.key} over ${other.key}`).toBe(false);
    }
    for (const glyph of glyphs)
      expect(boxesOverlap(label, glyph, 1e-6), `${label.key} over a mark`).toBe(false);
  });
}

const NAMES = ['A', 'B', 'Part 1', 'Holder 12', 'Split B', 'Earlier weight'];
const weight = (unit: string) =>
  fc.record({
    mass: fc.double({ min: 0.5, max: 400, noNaN: true }),
    angleDeg: fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true }),
    unit: fc.constant(unit),
    label: fc.option(fc.constantFrom(...NAMES), { nil: undefined }),
  }) as fc.Arbitrary<OverlayWeight>;
const sector = fc.record({
  fromDeg: fc.integer({ min: 0, max: 359 }),
  toDeg: fc.integer({ min: 0, max: 359 }),
  label: fc.constantFrom('holder', 'weld', 'Drive pulley bolts', 'Repair weld', 'key'),
}) as fc.Arbitrary<BlockedSector>;
const angle = fc.option(fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true }), { nil: null });

/** Crowded scenes: many holders, split parts, blocked sectors, earlier weights, narrow and wide stages. */
const crowdedScene = fc.record({
  width: fc.integer({ min: 240, max: 1200 }),
  aspect: fc.constantFrom(1, 4 / 3, 3 / 4, 16 / 9),
  zeroAtDeg: fc.integer({ min: 0, max: 359 }),
  rotation: fc.constantFrom('clockwise' as const, 'counterClockwise' as const),
  counting: fc.constantFrom('withRotation' as const, 'againstRotation' as const),
  heavySpotDeg: angle,
  sensorAngleDeg: angle,
  corrections: fc.array(weight('g'), { minLength: 1, maxLength: 4 }),
  existingWeights: fc.array(weight('g'), { maxLength: 4 }),
  holders: fc.option(fc.integer({ min: 3, max: 40 }), { nil: null }),
  blockedSectors: fc.array(sector, { maxLength: 4 }),
  marked: fc.option(
    fc.record({
      angleDeg: fc.integer({ min: 0, max: 359 }),
      radiusFraction: fc.double({ min: 0, max: 1.2, noNaN: true }),
    }),
    { nil: null },
  ),
});

describe('overlay labels (property)', () => {
  it('never overlap, never cover a mark and stay inside the widget, however crowded the drum', () => {
    fc.assert(
      fc.property(crowdedScene, (scene) => {
        const size = { width: scene.width, height: Math.round(scene.width / scene.aspect) };
        const built = buildOverlayScene({
          size,
          frame: fittedFrame(size, scene.zeroAtDeg),
          rotation: scene.rotation,
          counting: scene.counting,
          sensorAngleDeg: scene.sensorAngleDeg,
          heavySpotDeg: scene.heavySpotDeg,
          corrections: scene.corrections,
          existingWeights: scene.existingWeights,
          allowedPositions: expandPositions(scene.holders),
          blockedSectors: scene.blockedSectors,
          markedPoint: scene.marked,
        });
        expectLabelsKeepTheirPromises(built);
        // Every required label is drawn; only the optional names of the sensor and of sectors may go.
        const keys = built.labels.map((label) => label.key);
        for (const i of scene.corrections.keys()) expect(keys).toContain(`correction-${i}`);
        for (const i of scene.existingWeights.keys()) expect(keys).toContain(`existing-${i}`);
        expect(keys).toContain('reference');
        for (const key of built.droppedLabels) expect(key).toMatch(/^(sensor|blocked-\d+)$/);
      }),
      { numRuns: 150 },
    );
  });
});

describe('overlay labels of the shared scenes', () => {
  const build = (fixture: OverlayFixture, width: number) => {
    const size = { width, height: width };
    return buildOverlayScene({
      size,
      frame: fittedFrame(size, 0),
      rotation: 'clockwise',
      counting: 'againstRotation',
      sensorAngleDeg: fixture.sensorAngleDeg,
      heavySpotDeg: fixture.heavySpotDeg,
      corrections: fixture.corrections,
      existingWeights: fixture.existingWeights,
      allowedPositions: expandPositions(fixture.allowedPositions),
      blockedSectors: fixture.blockedSectors,
      markedPoint: null,
    });
  };

  it.each([240, 320, 390, 480, 820])('keep the two holders of the demo drum apart at %i px', (width) => {
    const scene = build(MULCHER_DEMO, width);
    expectLabelsKeepTheirPromises(scene);
    const texts = scene.labels.map((label) => label.text);
    expect(texts).toEqual(expect.arrayContaining(['Holder 4: 41 g at 35°', 'Holder 5: 23 g at 45°']));
  });

  it.each([240, 320, 480])('keep every part of a three-way split off the rim at %i px', (width) => {
    const scene = build(CROWDED_DRUM, width);
    expectLabelsKeepTheirPromises(scene);
    const band = { inner: scene.radius - 22, outer: scene.radius + 4 };
    for (const label of scene.labels.filter((l) => l.kind === 'correction')) {
      const nearest = Math.hypot(
        Math.min(Math.max(scene.center.x, label.x), label.x + label.width) - scene.center.x,
        Math.min(Math.max(scene.center.y, label.y), label.y + label.height) - scene.center.y,
      );
      const farthest = Math.hypot(
        Math.max(Math.abs(label.x - scene.center.x), Math.abs(label.x + label.width - scene.center.x)),
        Math.max(Math.abs(label.y - scene.center.y), Math.abs(label.y + label.height - scene.center.y)),
      );
      expect(nearest >= band.outer - 1e-6 || farthest <= band.inner + 1e-6).toBe(true);
    }
  });

  it('still names in words every label the drawing left out', () => {
    const scene = build(CROWDED_DRUM, 240);
    const words = describeOverlay({
      rotation: 'clockwise',
      counting: 'againstRotation',
      zeroScreenDeg: 0,
      sensorAngleDeg: CROWDED_DRUM.sensorAngleDeg,
      heavySpotDeg: CROWDED_DRUM.heavySpotDeg,
      corrections: CROWDED_DRUM.corrections,
      existingWeights: CROWDED_DRUM.existingWeights,
      allowedPositions: expandPositions(CROWDED_DRUM.allowedPositions),
      blockedSectors: CROWDED_DRUM.blockedSectors,
      markedPoint: null,
      photo: 'none',
      calibrating: false,
    }).join(' ');
    for (const key of scene.droppedLabels) {
      const named =
        key === 'sensor' ? 'Sensor' : CROWDED_DRUM.blockedSectors[Number(key.split('-')[1])]!.label;
      expect(words).toContain(named);
    }
    for (const [i, sector] of CROWDED_DRUM.blockedSectors.entries()) {
      expect(words).toContain(sector.label);
      expect(
        scene.droppedLabels.includes(`blocked-${i}`) || scene.labels.some((l) => l.text === sector.label),
      ).toBe(true);
    }
  });
});
