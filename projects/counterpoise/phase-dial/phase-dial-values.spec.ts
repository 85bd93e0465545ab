import { describe, expect, it } from 'vitest';
import {
  NO_ANGLE_TEXT,
  describeZeroPosition,
  dialValueText,
  largeStepDeg,
  maxDialValue,
  nextDialValue,
  parseAngleText,
  phaseDialErrorMessage,
  phaseDialErrors,
  toDialAngle,
  validStep,
} from './phase-dial-values';

describe('nextDialValue without positions', () => {
  it('steps by one degree on arrows, Up and Right increasing', () => {
    expect(nextDialValue('ArrowUp', 123, {})).toBe(124);
    expect(nextDialValue('ArrowRight', 123, {})).toBe(124);
    expect(nextDialValue('ArrowDown', 123, {})).toBe(122);
    expect(nextDialValue('ArrowLeft', 123, {})).toBe(122);
  });

  it('jumps 10 degrees on Page keys, Home to 0 and End to 359', () => {
    expect(nextDialValue('PageUp', 123, {})).toBe(133);
    expect(nextDialValue('PageDown', 123, {})).toBe(113);
    expect(nextDialValue('Home', 123, {})).toBe(0);
    expect(nextDialValue('End', 123, {})).toBe(359);
  });

  it('wraps round past 359 and below 0, keeping the distance', () => {
    expect(nextDialValue('ArrowUp', 359, {})).toBe(0);
    expect(nextDialValue('ArrowDown', 0, {})).toBe(359);
    expect(nextDialValue('PageUp', 355, {})).toBe(5);
    expect(nextDialValue('PageDown', 3, {})).toBe(353);
  });

  it('moves by the step and lands back on its grid from an angle off it', () => {
    expect(nextDialValue('ArrowUp', 30, { step: 15 })).toBe(45);
    expect(nextDialValue('ArrowUp', 37.4, { step: 1 })).toBe(38);
    expect(nextDialValue('ArrowDown', 37.4, { step: 1 })).toBe(37);
    expect(nextDialValue('ArrowUp', 31, { step: 5 })).toBe(35);
    expect(nextDialValue('PageUp', 31, { step: 5 })).toBe(40);
  });

  it('keeps tenths clean over many presses', () => {
    let value: number | null = 0;
    for (let i = 0; i < 25; i++) value = nextDialValue('ArrowUp', value, { step: 0.1 })!;
    expect(value).toBe(2.5);
    expect(nextDialValue('ArrowDown', 0, { step: 0.5 })).toBe(359.5);
  });

  it('starts over at 0 when a step does not divide the turn', () => {
    expect(nextDialValue('End', null, { step: 7 })).toBe(357);
    expect(nextDialValue('ArrowUp', 357, { step: 7 })).toBe(0);
    expect(nextDialValue('ArrowDown', 0, { step: 7 })).toBe(357);
    expect(nextDialValue('PageUp', 357, { step: 7 })).toBe(0);
  });

  it('lands on 0 at the first press when no angle is set', () => {
    for (const key of ['ArrowUp', 'ArrowDown', 'PageUp', 'PageDown', 'Home']) {
      expect(nextDialValue(key, null, {})).toBe(0);
    }
    expect(nextDialValue('End', null, {})).toBe(359);
  });

  it('brings an angle from outside [0, 360) round before stepping', () => {
    expect(nextDialValue('ArrowUp', 370, {})).toBe(11);
    expect(nextDialValue('ArrowDown', -90, {})).toBe(269);
  });

  it('does not handle other keys', () => {
    for (const key of ['Enter', ' ', 'Tab', 'a', 'Escape', 'Up']) {
      expect(nextDialValue(key, 10, {})).toBeUndefined();
    }
  });
});

describe('nextDialValue with positions', () => {
  const eight = [0, 45, 90, 135, 180, 225, 270, 315];

  it('moves to the next or previous position on arrows, wrapping round', () => {
    expect(nextDialValue('ArrowUp', 45, { positions: eight })).toBe(90);
    expect(nextDialValue('ArrowLeft', 45, { positions: eight })).toBe(0);
    expect(nextDialValue('ArrowRight', 315, { positions: eight })).toBe(0);
    expect(nextDialValue('ArrowDown', 0, { positions: eight })).toBe(315);
  });

  it('moves from an angle between positions to the nearest one in the direction of the key', () => {
    expect(nextDialValue('ArrowUp', 50, { positions: eight })).toBe(90);
    expect(nextDialValue('ArrowDown', 50, { positions: eight })).toBe(45);
  });

  it('moves Page keys to the nearest position at least 10 degrees away', () => {
    const every5 = Array.from({ length: 72 }, (_, i) => i * 5);
    expect(nextDialValue('PageUp', 20, { positions: every5 })).toBe(30);
    expect(nextDialValue('PageDown', 5, { positions: every5 })).toBe(355);
    expect(nextDialValue('PageUp', 45, { positions: eight })).toBe(90);
  });

  it('goes Home to the first position and End to the last', () => {
    const holders = [30, 150, 270];
    expect(nextDialValue('Home', 200, { positions: holders })).toBe(30);
    expect(nextDialValue('End', 200, { positions: holders })).toBe(270);
    expect(nextDialValue('ArrowDown', null, { positions: holders })).toBe(30);
  });

  it('stays on a single position', () => {
    expect(nextDialValue('ArrowUp', 90, { positions: [90] })).toBe(90);
    expect(nextDialValue('PageDown', 10, { positions: [90] })).toBe(90);
  });
});

describe('steps and limits', () => {
  it('falls back to a step of 1 for a step that cannot be used', () => {
    expect(validStep(0)).toBe(1);
    expect(validStep(-5)).toBe(1);
    expect(validStep(Number.NaN)).toBe(1);
    expect(validStep(720)).toBe(1);
    expect(validStep(null)).toBe(1);
    expect(validStep(2.5)).toBe(2.5);
  });

  it('reaches at most the last angle of the step grid below a full turn', () => {
    expect(maxDialValue()).toBe(359);
    expect(maxDialValue(15)).toBe(345);
    expect(maxDialValue(0.1)).toBe(359.9);
    expect(maxDialValue(360)).toBe(0);
  });

  it('makes the Page step about 10 degrees and a whole number of steps', () => {
    expect(largeStepDeg(1)).toBe(10);
    expect(largeStepDeg(0.5)).toBe(10);
    expect(largeStepDeg(3)).toBe(9);
    expect(largeStepDeg(15)).toBe(15);
  });
});

describe('phaseDialErrors', () => {
  it('asks for an angle only when one is required', () => {
    expect(phaseDialErrors(null, { required: true })).toEqual({ required: true });
    expect(phaseDialErrors(undefined, { required: true })).toEqual({ required: true });
    expect(phaseDialErrors(Number.NaN, { required: true })).toEqual({ required: true });
    expect(phaseDialErrors(null, { required: false })).toBeNull();
    expect(phaseDialErrors(0, { required: true })).toBeNull();
  });

  it('lists the allowed positions when an angle is off them', () => {
    expect(phaseDialErrors(100, { positions: [0, 120, 240] })).toEqual({
      cpPhasePosition: { allowed: [0, 120, 240] },
    });
    expect(phaseDialErrors(480, { positions: [0, 120, 240] })).toBeNull();
    expect(phaseDialErrors(null, { positions: [0, 120, 240] })).toBeNull();
    expect(phaseDialErrors(100, { positions: [] })).toBeNull();
  });

  it('tells a value that is not a number from an empty one', () => {
    expect(phaseDialErrors('north', { required: true })).toEqual({ cpPhaseNumber: { text: 'north' } });
    expect(phaseDialErrors('', { required: true })).toEqual({ required: true });
    expect(phaseDialErrors('', {})).toBeNull();
  });

  it('reports typed text that is not a number, whatever the value behind it', () => {
    expect(phaseDialErrors(120, { typedText: '12a' })).toEqual({ cpPhaseNumber: { text: '12a' } });
    expect(phaseDialErrors(null, { typedText: '-', required: true })).toEqual({
      cpPhaseNumber: { text: '-' },
    });
    expect(phaseDialErrors(12.5, { typedText: '12,5' })).toBeNull();
    expect(phaseDialErrors(null, { typedText: '', required: true })).toEqual({ required: true });
    expect(phaseDialErrors(12, { typedText: null })).toBeNull();
  });
});

describe('phaseDialErrorMessage', () => {
  it('says in words why the angle is not accepted', () => {
    expect(phaseDialErrorMessage({ required: true })).toBe('Enter an angle, or set it on the dial.');
    expect(phaseDialErrorMessage({ cpPhaseNumber: { text: '12a' } })).toBe(
      'Type the angle as a number of degrees, such as 45 or 127.5.',
    );
    expect(phaseDialErrorMessage({ cpPhasePosition: { allowed: [0, 22.5, 240] } })).toBe(
      'Choose one of the allowed positions: 0°, 22.5°, 240°.',
    );
  });

  it('counts the positions instead of listing many, and has a word for the page own validators', () => {
    const allowed = Array.from({ length: 24 }, (_, index) => index * 15);
    expect(phaseDialErrorMessage({ cpPhasePosition: { allowed } })).toBe(
      'Choose one of the 24 allowed positions.',
    );
    expect(phaseDialErrorMessage({ min: { min: 0, actual: -5 } })).toBe('This angle is not accepted here.');
  });

  it('gives the first that applies, and nothing without errors', () => {
    expect(phaseDialErrorMessage({ required: true, min: { min: 0, actual: -5 } })).toBe(
      'Enter an angle, or set it on the dial.',
    );
    expect(phaseDialErrorMessage(null)).toBeNull();
    expect(phaseDialErrorMessage({})).toBeNull();
  });
});

describe('text', () => {
  it('speaks the angle with its counting, or that none is set', () => {
    expect(dialValueText(123, 'withRotation')).toBe(
      '123 degrees, counted with rotation from the reference mark',
    );
    expect(dialValueText(7.5, 'againstRotation')).toBe(
      '7.5 degrees, counted against rotation from the reference mark',
    );
    expect(dialValueText(null, 'withRotation')).toBe(NO_ANGLE_TEXT);
  });

  it('reads typed angles, coming round from 360 and below 0', () => {
    expect(parseAngleText(' 212 ')).toBe(212);
    expect(parseAngleText('12,5')).toBe(12.5);
    expect(parseAngleText('.5')).toBe(0.5);
    expect(parseAngleText('360')).toBe(0);
    expect(parseAngleText('-90')).toBe(270);
    expect(parseAngleText('')).toBeNull();
    expect(parseAngleText('-')).toBeUndefined();
    expect(parseAngleText('12a')).toBeUndefined();
    expect(parseAngleText('1e3')).toBeUndefined();
  });

  it('takes only finite numbers as angles', () => {
    expect(toDialAngle(400)).toBe(40);
    expect(toDialAngle('40')).toBeNull();
    expect(toDialAngle(Number.POSITIVE_INFINITY)).toBeNull();
    expect(toDialAngle(null)).toBeNull();
  });

  it('names where the reference mark sits on screen', () => {
    expect(describeZeroPosition(0)).toBe('at the top');
    expect(describeZeroPosition(-90)).toBe('on the left');
    expect(describeZeroPosition(45)).toBe('45 degrees clockwise from the top');
  });
});
