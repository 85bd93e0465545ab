import { EngineError, requireFinite, requireNonNegative, requirePositive } from './errors';
import { STANDARD_GRAVITY } from './tolerance';

/** Units of a vibration value: quantity, unit and detection (peak, RMS or peak-to-peak). */
export const VIBRATION_UNITS = [
  'in/s-pk',
  'in/s-rms',
  'mm/s-pk',
  'mm/s-rms',
  'mil-pp',
  'um-pp',
  'g-pk',
  'g-rms',
  'm/s2-pk',
  'm/s2-rms',
] as const;

/** One of {@link VIBRATION_UNITS}. */
export type VibrationUnit = (typeof VIBRATION_UNITS)[number];

/** ISO 10816-3 / 20816-3 zone: A new machine, B unrestricted long-term, C restricted, D damage possible. */
export type SeverityZone = 'A' | 'B' | 'C' | 'D';

/** Machine group of ISO 10816-3: 1 large (300 kW to 50 MW), 2 medium (15 kW to 300 kW). */
export type MachineGroup = 1 | 2;

/** Foundation class of ISO 10816-3. */
export type Foundation = 'rigid' | 'flexible';

const INCH = 0.0254;
const SQRT2 = Math.SQRT2;

interface UnitDef {
  kind: 'velocity' | 'displacement' | 'acceleration';
  /** SI value (m/s, m or m/s^2) of one unit, as a peak value. */
  toPeakSi: number;
}

const UNIT_DEFS: Record<VibrationUnit, UnitDef> = {
  'in/s-pk': { kind: 'velocity', toPeakSi: INCH },
  'in/s-rms': { kind: 'velocity', toPeakSi: INCH * SQRT2 },
  'mm/s-pk': { kind: 'velocity', toPeakSi: 1e-3 },
  'mm/s-rms': { kind: 'velocity', toPeakSi: 1e-3 * SQRT2 },
  'mil-pp': { kind: 'displacement', toPeakSi: (INCH * 1e-3) / 2 },
  'um-pp': { kind: 'displacement', toPeakSi: 1e-6 / 2 },
  'g-pk': { kind: 'acceleration', toPeakSi: STANDARD_GRAVITY },
  'g-rms': { kind: 'acceleration', toPeakSi: STANDARD_GRAVITY * SQRT2 },
  'm/s2-pk': { kind: 'acceleration', toPeakSi: 1 },
  'm/s2-rms': { kind: 'acceleration', toPeakSi: SQRT2 },
};

/**
 * Zone boundaries A/B, B/C, C/D of ISO 10816-3:2009, Table A.1 / A.2, velocity r.m.s. in mm/s
 * (from memory: to be checked against the standard before relying on them outside guidance).
 */
export const ISO_10816_3_ZONE_LIMITS_MM_S_RMS: Readonly<
  Record<MachineGroup, Readonly<Record<Foundation, readonly [number, number, number]>>>
> = Object.freeze({
  1: Object.freeze({ rigid: [2.3, 4.5, 7.1] as const, flexible: [3.5, 7.1, 11.0] as const }),
  2: Object.freeze({ rigid: [1.4, 2.8, 4.5] as const, flexible: [2.3, 4.5, 7.1] as const }),
});

/**
 * Converts a vibration value between units at one frequency, for a sinusoid.
 * Formulas: omega = 2 pi f; v = omega d; a = omega v (peak values); RMS = peak / sqrt 2; peak-to-peak = 2 peak;
 * 1 in = 25.4 mm; 1 mil = 0.001 in; 1 g = 9.80665 m/s^2.
 * Sources: R. B. McMillan, Rotating Machinery: Practical Solutions to Unbalance and Misalignment (Fairmont Press,
 * 2004), ch. 2, eqs. (2.8)-(2.13); NIST SP 811 (2008) for the inch and standard gravity (from memory).
 * `frequencyHz` may be omitted when both units measure the same quantity.
 */
export function convertVibration(
  value: number,
  from: VibrationUnit,
  to: VibrationUnit,
  frequencyHz?: number,
): number {
  const v = requireFinite(value, 'value');
  const a = unitDef(from, 'unit');
  const b = unitDef(to, 'to');
  let peakSi = v * a.toPeakSi;
  if (a.kind !== b.kind) {
    const f = requirePositive(frequencyHz, 'frequencyHz', 'frequency');
    const omega = 2 * Math.PI * f;
    const order = { displacement: 0, velocity: 1, acceleration: 2 } as const;
    peakSi *= Math.pow(omega, order[b.kind] - order[a.kind]);
  }
  return peakSi / b.toPeakSi;
}

/** Input of {@link vibrationSeverity}. */
export interface SeverityInput {
  value: number;
  unit: VibrationUnit;
  frequencyHz?: number;
  speedRpm?: number;
  machineGroup?: MachineGroup;
  foundation?: Foundation;
  /** The shop's own acceptance level for this machine family. */
  acceptance?: { value: number; unit: VibrationUnit };
}

/** Result of {@link vibrationSeverity}. */
export interface SeverityResult {
  conversions: Partial<Record<VibrationUnit, number>>;
  zone?: SeverityZone;
  /** true when the value is at or below the shop's acceptance level. */
  acceptable?: boolean;
  warnings: string[];
}

/**
 * Vibration units and severity: the value in every unit, its ISO 10816-3 / 20816-3 zone when a machine group
 * and foundation are given, and pass or fail against a shop's acceptance level.
 * Zone rule: velocity r.m.s. v <= A/B boundary is zone A, <= B/C is B, <= C/D is C, above is D.
 * The standard judges broadband r.m.s. velocity (10 Hz to 1 kHz) of industrial machines on stationary
 * foundations: a 1x reading of mobile machinery is shown as guidance only.
 * Sources: see {@link convertVibration} and {@link ISO_10816_3_ZONE_LIMITS_MM_S_RMS}.
 */
export function vibrationSeverity(input: SeverityInput): SeverityResult {
  const value = requireNonNegative(input?.value, 'value', 'vibration value');
  unitDef(input.unit, 'unit');
  let f: number | undefined;
  if (input.frequencyHz !== undefined) f = requirePositive(input.frequencyHz, 'frequencyHz', 'frequency');
  else if (input.speedRpm !== undefined) f = requirePositive(input.speedRpm, 'speedRpm', 'speed') / 60;
  const warnings: string[] = [];
  const conversions: Partial<Record<VibrationUnit, number>> = {};
  const kind = UNIT_DEFS[input.unit].kind;
  for (const u of VIBRATION_UNITS) {
    if (UNIT_DEFS[u].kind === kind || f !== undefined)
      conversions[u] = convertVibration(value, input.unit, u, f);
  }
  if (f === undefined && kind !== 'velocity') {
    warnings.push(
      'Without the frequency or speed only units of the same quantity can be shown, and no zone can be given.',
    );
  } else if (f === undefined) {
    warnings.push('Give the frequency or speed to convert to displacement and acceleration.');
  }
  const result: SeverityResult = { conversions, warnings };
  const rms = conversions['mm/s-rms'];
  if (input.machineGroup !== undefined || input.foundation !== undefined) {
    if (input.machineGroup !== 1 && input.machineGroup !== 2) {
      throw new EngineError(
        'INVALID_INPUT',
        'machineGroup must be 1 (large machines) or 2 (medium machines).',
        'machineGroup',
      );
    }
    if (input.foundation !== 'rigid' && input.foundation !== 'flexible') {
      throw new EngineError('INVALID_INPUT', 'foundation must be "rigid" or "flexible".', 'foundation');
    }
    if (rms !== undefined) {
      result.zone = severityZone(rms, input.machineGroup, input.foundation);
      warnings.push(
        'Zones of ISO 10816-3 apply to industrial machines on stationary foundations; for mobile machinery they are guidance only.',
      );
    }
  }
  if (input.acceptance !== undefined) {
    const limit = requireNonNegative(input.acceptance?.value, 'acceptance.value', 'acceptance level');
    const limitUnit = unitDef(input.acceptance.unit, 'acceptance.unit');
    const here =
      limitUnit.kind === kind
        ? convertVibration(value, input.unit, input.acceptance.unit)
        : conversions[input.acceptance.unit];
    if (here === undefined) {
      throw new EngineError(
        'INVALID_INPUT',
        'Give the frequency or speed to compare with an acceptance level in another quantity.',
        'acceptance.unit',
      );
    }
    result.acceptable = here <= limit * (1 + 1e-12);
  }
  return result;
}

/** The ISO 10816-3 zone of a velocity r.m.s. value in mm/s (boundaries: {@link ISO_10816_3_ZONE_LIMITS_MM_S_RMS}). */
export function severityZone(
  velocityMmSRms: number,
  group: MachineGroup,
  foundation: Foundation,
): SeverityZone {
  const v = requireNonNegative(velocityMmSRms, 'velocityMmSRms', 'velocity');
  const [ab, bc, cd] = ISO_10816_3_ZONE_LIMITS_MM_S_RMS[group][foundation];
  if (v <= ab) return 'A';
  if (v <= bc) return 'B';
  if (v <= cd) return 'C';
  return 'D';
}

function unitDef(unit: unknown, field: string): UnitDef {
  const def = typeof unit === 'string' ? UNIT_DEFS[unit as VibrationUnit] : undefined;
  if (!def) {
    throw new EngineError(
      'UNKNOWN_UNIT',
      `"${String(unit)}" is not a vibration unit; use one of ${VIBRATION_UNITS.join(', ')}.`,
      field,
    );
  }
  return def;
}
