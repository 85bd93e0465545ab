/**
 * Invented scenes of the correction overlay, shared by its specs and its stories (not part of the public
 * API). Demo data only: forestry-mulcher drums and a fan hub, in the trade's words.
 */
import type { DialPositions } from '@counterpoise/ng/core';
import type { BlockedSector, OverlayWeight, RotorPhoto } from './overlay-model';

/** One correction: 84 g at 100 degrees, opposite a heavy spot near 280. */
export const CORRECTION: readonly OverlayWeight[] = [{ mass: 84, angleDeg: 100, unit: 'g' }];

/** The same correction split across two free spots either side of a tooth holder. */
export const SPLIT: readonly OverlayWeight[] = [
  { mass: 46, angleDeg: 75, unit: 'g', label: 'A' },
  { mass: 52, angleDeg: 135, unit: 'g', label: 'B' },
];

/** A weight already on the drum. */
export const EXISTING: readonly OverlayWeight[] = [{ mass: 30, angleDeg: 210, unit: 'g' }];

/** Two tooth holders and a weld that block the rim. */
export const HOLDERS: readonly BlockedSector[] = [
  { fromDeg: 90, toDeg: 120, label: 'holder' },
  { fromDeg: 170, toDeg: 185, label: 'weld' },
  { fromDeg: 350, toDeg: 15, label: 'holder' },
];

/** The inputs of one overlay scene, as a page binds them. */
export interface OverlayFixture {
  /** The heavy spot; none when null. */
  readonly heavySpotDeg: number | null;
  /** The angle in line with the sensor; none when null. */
  readonly sensorAngleDeg: number | null;
  /** The corrections to fit. */
  readonly corrections: readonly OverlayWeight[];
  /** The weights already on. */
  readonly existingWeights: readonly OverlayWeight[];
  /** Where weights can go. */
  readonly allowedPositions: DialPositions | null;
  /** Where no weight can go. */
  readonly blockedSectors: readonly BlockedSector[];
}

/** Every element at once around the split: the scene the overlay's own specs call crowded. */
export const SPLIT_AROUND_HOLDERS: OverlayFixture = {
  corrections: SPLIT,
  existingWeights: EXISTING,
  blockedSectors: HOLDERS,
  allowedPositions: { count: 24, firstDeg: 0 },
  heavySpotDeg: 282,
  sensorAngleDeg: 90,
};

/**
 * The demo mulcher drum of the workbench's Widgets page: 36 tooth holders, a correction split between holders
 * 4 and 5 only ten degrees apart, an earlier weight and two blocked stretches of rim.
 */
export const MULCHER_DEMO: OverlayFixture = {
  heavySpotDeg: 216,
  sensorAngleDeg: 90,
  allowedPositions: { count: 36, firstDeg: 5 },
  corrections: [
    { mass: 41, angleDeg: 35, unit: 'g', label: 'Holder 4' },
    { mass: 23, angleDeg: 45, unit: 'g', label: 'Holder 5' },
  ],
  existingWeights: [{ mass: 30, angleDeg: 250, unit: 'g', label: 'Earlier weight' }],
  blockedSectors: [
    { fromDeg: 80, toDeg: 100, label: 'Drive pulley bolts' },
    { fromDeg: 170, toDeg: 190, label: 'Repair weld' },
  ],
};

/**
 * The worst a drum gives: 24 holders, a correction split three ways over neighbouring holders, two blocked
 * sectors, three earlier weights (one beside the split), the heavy spot and the sensor.
 */
export const CROWDED_DRUM: OverlayFixture = {
  heavySpotDeg: 222,
  sensorAngleDeg: 60,
  allowedPositions: { count: 24, firstDeg: 0 },
  corrections: [
    { mass: 28, angleDeg: 30, unit: 'g', label: 'Part 1' },
    { mass: 31, angleDeg: 45, unit: 'g', label: 'Part 2' },
    { mass: 26, angleDeg: 60, unit: 'g', label: 'Part 3' },
  ],
  existingWeights: [
    { mass: 30, angleDeg: 75, unit: 'g', label: 'Earlier weight' },
    { mass: 12, angleDeg: 195, unit: 'g' },
    { mass: 18, angleDeg: 300, unit: 'g' },
  ],
  blockedSectors: [
    { fromDeg: 80, toDeg: 110, label: 'Drive pulley bolts' },
    { fromDeg: 160, toDeg: 185, label: 'Repair weld' },
  ],
};

/**
 * An illustration standing in for the technician's photo: the end plate of a drum, a little off-centre,
 * with bolt heads, two tooth holders and a strip of reflective tape at the reference mark.
 */
export const END_PLATE_PICTURE = `data:image/svg+xml,${encodeURIComponent(`
<svg xmlns="http://www.w3.org/2000/svg" width="800" height="600" viewBox="0 0 800 600">
  <rect width="800" height="600" fill="#3a3f36"/>
  <rect y="430" width="800" height="170" fill="#4d5443"/>
  <circle cx="420" cy="290" r="250" fill="#6b6f72"/>
  <circle cx="420" cy="290" r="236" fill="#8a8f93"/>
  <circle cx="420" cy="290" r="70" fill="#55595c"/>
  <circle cx="420" cy="290" r="30" fill="#2e3133"/>
  ${Array.from({ length: 8 }, (_, i) => {
    const a = (i * Math.PI) / 4;
    return `<circle cx="${420 + 120 * Math.cos(a)}" cy="${290 + 120 * Math.sin(a)}" r="11" fill="#404446"/>`;
  }).join('')}
  <rect x="580" y="90" width="40" height="60" fill="#505456" transform="rotate(40 600 120)"/>
  <rect x="200" y="420" width="40" height="60" fill="#505456" transform="rotate(40 220 450)"/>
  <rect x="600" y="292" width="44" height="14" fill="#e8eef0" transform="rotate(20 420 290)"/>
</svg>`)}`;

/** The photo of the end plate, calibrated on its drum. */
export const CALIBRATED_PHOTO: RotorPhoto = {
  src: END_PLATE_PICTURE,
  calibration: {
    centre: { x: 420 / 800, y: 290 / 600 },
    rim: { x: 656 / 800, y: 290 / 600 },
    referenceMark: { x: 0.79, y: 0.6 },
  },
};
