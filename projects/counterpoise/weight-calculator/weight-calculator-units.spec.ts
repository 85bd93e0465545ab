import { describe, expect, it } from 'vitest';
import {
  amplitudeStep,
  formatAmplitude,
  formatMass,
  influenceUnit,
  massStep,
  sensitivityUnit,
  spokenMass,
} from './weight-calculator-units';

describe('weight calculator units', () => {
  it('shows masses and amplitudes with the decimals their unit deserves', () => {
    expect(formatMass(84.237, 'g')).toBe('84.2 g');
    expect(formatMass(2.9714, 'oz')).toBe('2.97 oz');
    expect(formatAmplitude(0.05237, 'in/s')).toBe('0.052 in/s');
    expect(formatAmplitude(1.3249, 'mm/s')).toBe('1.32 mm/s');
    expect(formatMass(-0.01, 'g')).toBe('0.0 g');
  });

  it('spells units out for screen readers', () => {
    expect(spokenMass(84.237, 'g')).toBe('84.2 grams');
    expect(spokenMass(2.9714, 'oz')).toBe('2.97 ounces');
  });

  it('names compound units and steps by one shown decimal', () => {
    expect(sensitivityUnit('oz', 'mm/s')).toBe('oz per mm/s');
    expect(influenceUnit('g', 'in/s')).toBe('in/s per g');
    expect(massStep('g')).toBeCloseTo(0.1, 12);
    expect(amplitudeStep('in/s')).toBeCloseTo(0.001, 12);
  });
});
