import { describe, expect, it } from 'vitest';
import { EngineError } from './errors';
import { COMMON_PRACTICE_INSPECTION_LIMITS_IN, evaluateInspection, preBalanceInspection } from './inspection';

describe('pre-balance inspection', () => {
  it('passes within limits and fails with the reason beyond (common practice: 1/8 in end play, 0.014 in runout)', () => {
    expect(COMMON_PRACTICE_INSPECTION_LIMITS_IN).toEqual({ bearingEndPlay: 0.125, stubShaftRunout: 0.014 });
    expect(preBalanceInspection({ bearingEndPlayIn: 0.1, stubShaftRunoutIn: 0.01 }).pass).toBe(true);
    const r = preBalanceInspection({ bearingEndPlayIn: 0.15, stubShaftRunoutIn: 0.014 });
    expect(r.pass).toBe(false);
    expect(r.reasons).toEqual([
      'Bearing end play is 0.15 in, over the limit of 0.125 in: repair before balancing.',
    ]);
    expect(preBalanceInspection({ stubShaftRunoutIn: 0.02 }).pass).toBe(false);
    expect(preBalanceInspection({ stubShaftRunoutIn: 0.02, limitsIn: { stubShaftRunout: 0.025 } }).pass).toBe(
      true,
    );
  });

  it('evaluates any listed items and refuses bad ones', () => {
    expect(
      evaluateInspection({ items: [{ name: 'Belt deflection', measured: 12, limit: 10, unit: 'mm' }] })
        .reasons[0],
    ).toMatch(/Belt deflection/);
    expect(() => evaluateInspection({ items: [] })).toThrowError(EngineError);
    expect(() => preBalanceInspection({})).toThrowError(EngineError);
    expect(() => evaluateInspection({ items: [{ name: 'x', measured: Number.NaN, limit: 1 }] })).toThrowError(
      /items\[0\]\.measured/,
    );
  });
});
