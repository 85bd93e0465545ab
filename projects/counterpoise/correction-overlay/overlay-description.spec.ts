import { describe, expect, it } from 'vitest';
import {
  type OverlayDescriptionInput,
  clockPosition,
  describeOverlay,
  describePositions,
  weightLabel,
} from './overlay-description';

const base: OverlayDescriptionInput = {
  rotation: 'clockwise',
  counting: 'againstRotation',
  zeroScreenDeg: 0,
  sensorAngleDeg: null,
  heavySpotDeg: null,
  corrections: [],
  existingWeights: [],
  allowedPositions: [],
  blockedSectors: [],
  markedPoint: null,
  photo: 'none',
  calibrating: false,
};

describe('labels', () => {
  it('says mass, unit and angle, after the weight name when there is one', () => {
    expect(weightLabel({ mass: 84, angleDeg: 100, unit: 'g' })).toBe('84 g at 100°');
    expect(weightLabel({ mass: 12.46, angleDeg: 397.54, unit: 'oz', label: 'Split A' })).toBe(
      'Split A: 12.5 oz at 37.5°',
    );
  });

  it('writes angles by the one rule of the library: one turn, at most one decimal', () => {
    expect(weightLabel({ mass: 5, angleDeg: 360, unit: 'g' })).toBe('5 g at 0°');
    expect(weightLabel({ mass: 5, angleDeg: -90, unit: 'g' })).toBe('5 g at 270°');
    expect(weightLabel({ mass: 5, angleDeg: 12.34, unit: 'g' })).toBe('5 g at 12.3°');
    expect(weightLabel({ mass: 5, angleDeg: 359.99, unit: 'g' })).toBe('5 g at 0°');
  });

  it('names screen angles by the hour of a clock face', () => {
    expect(clockPosition(0)).toBe("12 o'clock");
    expect(clockPosition(90)).toBe("3 o'clock");
    expect(clockPosition(200)).toBe("7 o'clock");
    expect(clockPosition(350)).toBe("12 o'clock");
  });
});

describe('describePositions', () => {
  it('lists a few positions and summarises many evenly spread ones', () => {
    expect(describePositions([0, 120, 240])).toBe('3 allowed positions, at 0, 120, 240 degrees.');
    expect(describePositions([45])).toBe('One allowed position, at 45 degrees.');
    expect(describePositions(Array.from({ length: 24 }, (_, i) => 7.5 + i * 15))).toBe(
      '24 allowed positions, every 15 degrees from 7.5 degrees.',
    );
    const uneven = [0, 10, 20, 30, 40, 50, 60, 70, 200];
    expect(describePositions(uneven)).toBe(`9 allowed positions, at ${uneven.join(', ')} degrees.`);
  });
});

describe('describeOverlay', () => {
  it('first says how to read the angles, then the correction and the blocked sectors', () => {
    const lines = describeOverlay({
      ...base,
      corrections: [{ mass: 84, angleDeg: 100, unit: 'g' }],
      blockedSectors: [
        { fromDeg: 20, toDeg: 40, label: 'holder' },
        { fromDeg: 350, toDeg: 5, label: 'weld' },
      ],
    });
    expect(lines).toEqual([
      "End view of the rotor, turning clockwise. Angles are counted against rotation from the reference mark, drawn at 12 o'clock.",
      'Correction: 84 g at 100 degrees against rotation.',
      'Blocked: holder 20 to 40 degrees; weld 350 to 5 degrees.',
    ]);
  });

  it('speaks of every element drawn', () => {
    const lines = describeOverlay({
      ...base,
      rotation: 'counterClockwise',
      counting: 'withRotation',
      zeroScreenDeg: 90,
      sensorAngleDeg: 270,
      heavySpotDeg: 280,
      corrections: [
        { mass: 40, angleDeg: 90, unit: 'g', label: 'A' },
        { mass: 45, angleDeg: 120, unit: 'g', label: 'B' },
      ],
      existingWeights: [{ mass: 30, angleDeg: 200, unit: 'g' }],
      allowedPositions: [0, 90, 180, 270],
      markedPoint: { angleDeg: 102, radiusFraction: 0.95 },
      photo: 'calibrated',
    });
    expect(lines).toEqual([
      "End view of the rotor, turning counter-clockwise. Angles are counted with rotation from the reference mark, drawn at 3 o'clock.",
      'Correction A: 40 g at 90 degrees with rotation.',
      'Correction B: 45 g at 120 degrees with rotation.',
      'Existing weight: 30 g at 200 degrees with rotation.',
      'Heavy spot at 280 degrees.',
      'Sensor in line with 270 degrees.',
      '4 allowed positions, at 0, 90, 180, 270 degrees.',
      'Marked point: 102 degrees, at 95% of the radius.',
      'Drawn over a calibrated photo of the rotor.',
    ]);
  });

  it('warns when a weight falls in a blocked sector', () => {
    const lines = describeOverlay({
      ...base,
      corrections: [{ mass: 84, angleDeg: 30, unit: 'g' }],
      blockedSectors: [{ fromDeg: 20, toDeg: 40, label: 'holder' }],
    });
    expect(lines[1]).toBe(
      'Correction: 84 g at 30 degrees against rotation, inside the blocked sector holder 20 to 40 degrees.',
    );
  });

  it('says when there is nothing to fit yet, and what state the photo is in', () => {
    expect(describeOverlay(base)).toContain('No correction weight to show.');
    expect(describeOverlay({ ...base, photo: 'uncalibrated', calibrating: true }).slice(-2)).toEqual([
      'Drawn over a photo of the rotor that is not calibrated yet: the drawing is centred on the photo.',
      'Calibrating: move the centre, rim and reference-mark handles onto the photo.',
    ]);
    expect(describeOverlay({ ...base, photo: 'failed', calibrating: true }).at(-1)).toBe(
      'The photo of the rotor could not be loaded.',
    );
    expect(describeOverlay({ ...base, calibrating: true }).join(' ')).not.toContain('Calibrating');
  });
});
