import { EngineError, requireFinite, requireNonNegative } from './errors';

/** One measured quantity and its limit (data, in one unit the caller chooses). */
export interface InspectionItem {
  name: string;
  measured: number;
  limit: number;
  unit?: string;
}

/** Outcome of one item. */
export interface InspectionItemResult {
  name: string;
  measured: number;
  limit: number;
  pass: boolean;
  reason?: string;
}

/** Result of {@link evaluateInspection}. */
export interface InspectionResult {
  pass: boolean;
  results: InspectionItemResult[];
  /** One sentence per failed item, for the technician and the report. */
  reasons: string[];
}

/**
 * Limits for the pre-balance inspection of mulcher and mower rotors, in inches (common practice, no
 * published source): bearing end play beyond 1/8 in or stub-shaft runout beyond 0.014 in means the rotor needs
 * repair before balancing. They are data; shops may use their own.
 */
export const COMMON_PRACTICE_INSPECTION_LIMITS_IN = Object.freeze({
  bearingEndPlay: 0.125,
  stubShaftRunout: 0.014,
});

/**
 * Evaluates measured inspection values against limits: pass when measured <= limit for every item,
 * fail with the reason otherwise. Source: comparison with data limits; no formula.
 */
export function evaluateInspection(input: { items: InspectionItem[] }): InspectionResult {
  const items = input?.items;
  if (!Array.isArray(items) || items.length === 0) {
    throw new EngineError('INVALID_INPUT', 'List at least one measured item with its limit.', 'items');
  }
  const results: InspectionItemResult[] = [];
  const reasons: string[] = [];
  items.forEach((item, i) => {
    const name = typeof item?.name === 'string' && item.name.trim() !== '' ? item.name : `item ${i + 1}`;
    const measured = requireNonNegative(item?.measured, `items[${i}].measured`, 'measurement');
    const limit = requireNonNegative(item?.limit, `items[${i}].limit`, 'limit');
    requireFinite(limit, `items[${i}].limit`);
    const unit = item.unit ? ` ${item.unit}` : '';
    const pass = measured <= limit;
    const r: InspectionItemResult = { name, measured, limit, pass };
    if (!pass) {
      r.reason = `${name} is ${measured}${unit}, over the limit of ${limit}${unit}: repair before balancing.`;
      reasons.push(r.reason);
    }
    results.push(r);
  });
  return { pass: reasons.length === 0, results, reasons };
}

/** Input of {@link preBalanceInspection}. */
export interface PreBalanceInspectionInput {
  bearingEndPlayIn?: number;
  stubShaftRunoutIn?: number;
  limitsIn?: { bearingEndPlay?: number; stubShaftRunout?: number };
}

/**
 * The usual pre-balance checks of a rotor: bearing end play and stub-shaft runout against limits in inches
 * (default {@link COMMON_PRACTICE_INSPECTION_LIMITS_IN}, common practice).
 */
export function preBalanceInspection(input: PreBalanceInspectionInput): InspectionResult {
  const limits = { ...COMMON_PRACTICE_INSPECTION_LIMITS_IN, ...(input?.limitsIn ?? {}) };
  const items: InspectionItem[] = [];
  if (input?.bearingEndPlayIn !== undefined) {
    items.push({
      name: 'Bearing end play',
      measured: input.bearingEndPlayIn,
      limit: limits.bearingEndPlay,
      unit: 'in',
    });
  }
  if (input?.stubShaftRunoutIn !== undefined) {
    items.push({
      name: 'Stub-shaft runout',
      measured: input.stubShaftRunoutIn,
      limit: limits.stubShaftRunout,
      unit: 'in',
    });
  }
  if (items.length === 0) {
    throw new EngineError(
      'INVALID_INPUT',
      'Enter the bearing end play, the stub-shaft runout, or both.',
      'bearingEndPlayIn',
    );
  }
  return evaluateInspection({ items });
}
