/**
 * The value logic of the phase dial: what a key does to the angle, what the dial reports to forms and
 * what a screen reader hears. Framework-free, so it is tested without TestBed; the component is a thin
 * shell over it.
 */
import {
  type RotationCounting,
  _describeAngle as describeAngle,
  _formatAngle as formatAngle,
  _normalizeDeg as normalizeDeg,
  _isAllowedPosition as isAllowedPosition,
} from '@counterpoise/ng/core';

/** What a marker on the dial stands for. */
export type PhaseDialMarkerKind = 'heavySpot' | 'trialWeight' | 'correction' | 'reading';

/** Every marker kind, in the order a legend lists them. */
export const PHASE_DIAL_MARKER_KINDS: readonly PhaseDialMarkerKind[] = [
  'reading',
  'heavySpot',
  'trialWeight',
  'correction',
];

/** A marker drawn on the dial, such as the heavy spot or where the trial weight went. */
export interface PhaseDialMarker {
  /** What the marker stands for; sets its shape. */
  readonly kind: PhaseDialMarkerKind;
  /** Its angle on the rotor, in degrees from the reference mark. */
  readonly angleDeg: number;
  /** A short detail shown beside the kind in the legend, such as "Run 2" or "40 g". */
  readonly label?: string;
}

/** The name of each marker kind, as the legend shows it. */
export const PHASE_DIAL_MARKER_NAMES: Readonly<Record<PhaseDialMarkerKind, string>> = {
  reading: 'Reading',
  heavySpot: 'Heavy spot',
  trialWeight: 'Trial weight',
  correction: 'Correction',
};

/** How the dial steps: the step in degrees and the allowed positions (sorted, in [0, 360)), if any. */
export interface DialValueOptions {
  /** Degrees per arrow key press and the pointer's resolution when there are no positions. */
  readonly step?: number;
  /** The allowed positions; when given, arrows move between them and the pointer snaps to them. */
  readonly positions?: readonly number[];
}

/** The errors the dial reports to forms. */
export interface PhaseDialErrors {
  /** No angle is set and one is required. */
  required?: true;
  /** The value is not a number: the form holds something else, or the typed text is not one. */
  cpPhaseNumber?: { text: string };
  /** The angle is not one of the allowed positions. */
  cpPhasePosition?: { allowed: number[] };
}

/** How many decimals the dial writes an angle with: as many as a technician types off a meter. */
export const DIAL_ANGLE_DECIMALS = 2;

/** More positions than this are not listed one by one in an error message. */
const MAX_LISTED_POSITIONS = 12;

/** What a screen reader hears when no angle is set. */
export const NO_ANGLE_TEXT = 'no angle set';

/** Page keys move at least this far. */
const LARGE_STEP_DEG = 10;
/** Angles closer than this are the same angle (floating-point noise of repeated steps). */
const EPSILON = 1e-9;

/** A step that can be used: a positive finite number of degrees up to a full turn, or 1. */
export function validStep(step: number | null | undefined): number {
  return typeof step === 'number' && Number.isFinite(step) && step > 0 && step <= 360 ? step : 1;
}

/** Rounds away the floating-point noise that repeated steps of e.g. 0.1 degree leave. */
function clean(angleDeg: number): number {
  const rounded = Math.round(angleDeg * 1e9) / 1e9;
  return Object.is(rounded, -0) ? 0 : rounded;
}

/** Whether whole steps fit a turn exactly, so that stepping past 359 comes round onto the same grid. */
function stepDividesTurn(step: number): boolean {
  const steps = 360 / step;
  return Math.abs(steps - Math.round(steps)) < EPSILON;
}

/** The largest angle on the step grid below a full turn: 359 for a step of 1, 357 for a step of 7. */
export function maxDialValue(step?: number): number {
  const size = validStep(step);
  return clean((Math.ceil(360 / size - EPSILON) - 1) * size);
}

/** The Page keys' step: about 10 degrees, a whole number of steps, and never less than one step. */
export function largeStepDeg(step?: number): number {
  const size = validStep(step);
  return clean(size * Math.max(1, Math.round(LARGE_STEP_DEG / size)));
}

/** Brings an angle that ran past either end of the step grid round the dial. */
function wrapOnGrid(angleDeg: number, step: number): number {
  const max = maxDialValue(step);
  if (angleDeg > max + EPSILON) return stepDividesTurn(step) ? clean(normalizeDeg(angleDeg)) : 0;
  if (angleDeg < -EPSILON) return stepDividesTurn(step) ? clean(normalizeDeg(angleDeg)) : max;
  return clean(angleDeg);
}

/** The next angle on the step grid strictly above (direction 1) or below (-1) an angle. */
function stepOnGrid(angleDeg: number, direction: 1 | -1, step: number, distance: number): number {
  const onGrid =
    direction === 1
      ? (Math.floor(angleDeg / step + EPSILON) + 1) * step
      : (Math.ceil(angleDeg / step - EPSILON) - 1) * step;
  return wrapOnGrid(onGrid + direction * (distance - step), step);
}

/** The next position round the dial from an angle, in a direction; the first when there is no angle. */
function nextPosition(angleDeg: number, direction: 1 | -1, positions: readonly number[], minimum: number) {
  const ahead = positions
    .map((position) => ({ position, distance: normalizeDeg(direction * (position - angleDeg)) }))
    .filter(({ distance }) => distance > EPSILON);
  if (ahead.length === 0) return positions[0]!;
  const farEnough = ahead.filter(({ distance }) => distance >= minimum - EPSILON);
  const candidates = farEnough.length > 0 ? farEnough : ahead;
  return candidates.reduce((best, next) => (next.distance < best.distance ? next : best)).position;
}

/**
 * The angle after a key press: arrows move one step (Up and Right increase), Page keys about 10 degrees,
 * Home goes to 0 and End to 359 (or the largest angle on the step grid); with positions, arrows move to
 * the next or previous position, Page keys to the nearest one at least 10 degrees away, Home and End to
 * the first and last. The dial wraps round. The first press on a dial without an angle lands on 0 (or
 * the first position). `undefined` means the dial does not handle the key.
 */
export function nextDialValue(
  key: string,
  value: number | null,
  options: DialValueOptions = {},
): number | undefined {
  const step = validStep(options.step);
  const positions = options.positions ?? [];
  const first = positions.length > 0 ? positions[0]! : 0;
  const last = positions.length > 0 ? positions[positions.length - 1]! : maxDialValue(step);
  let direction: 1 | -1;
  let distance: number;
  switch (key) {
    case 'Home':
      return first;
    case 'End':
      return last;
    case 'ArrowUp':
    case 'ArrowRight':
      [direction, distance] = [1, step];
      break;
    case 'ArrowDown':
    case 'ArrowLeft':
      [direction, distance] = [-1, step];
      break;
    case 'PageUp':
      [direction, distance] = [1, largeStepDeg(step)];
      break;
    case 'PageDown':
      [direction, distance] = [-1, largeStepDeg(step)];
      break;
    default:
      return undefined;
  }
  if (value === null || !Number.isFinite(value)) return first;
  const angle = normalizeDeg(value);
  if (positions.length > 0) {
    return nextPosition(angle, direction, positions, distance === step ? 0 : LARGE_STEP_DEG);
  }
  return stepOnGrid(angle, direction, step, distance);
}

/** A value from a form or a binding as an angle in [0, 360), or null when it is not a number. */
export function toDialAngle(value: unknown): number | null {
  return typeof value === 'number' && Number.isFinite(value) ? normalizeDeg(value) : null;
}

/**
 * The errors of a value: `required` when none is set, `cpPhaseNumber` when the form holds something that
 * is not a number or the field holds text that is not one (`typedText`), `cpPhasePosition` when it is off
 * every position. Any finite number is an angle: 480 and -90 come round, as a technician means them.
 */
export function phaseDialErrors(
  value: unknown,
  rules: {
    readonly required?: boolean;
    readonly positions?: readonly number[];
    readonly typedText?: string | null;
  },
): PhaseDialErrors | null {
  const typed = rules.typedText;
  if (typed !== undefined && typed !== null && parseAngleText(typed) === undefined) {
    return { cpPhaseNumber: { text: typed } };
  }
  if (value !== null && value !== undefined && value !== '' && typeof value !== 'number') {
    return { cpPhaseNumber: { text: String(value) } };
  }
  const angle = toDialAngle(value);
  if (angle === null) return rules.required ? { required: true } : null;
  const positions = rules.positions ?? [];
  if (positions.length > 0 && !isAllowedPosition(angle, positions)) {
    return { cpPhasePosition: { allowed: [...positions] } };
  }
  return null;
}

/**
 * The sentence the dial shows under itself for a control's errors, the first that applies: its own
 * errors in plain words, and a general one for a validator of the page that brought no message of its
 * own. Null when there is no error.
 */
export function phaseDialErrorMessage(errors: Readonly<Record<string, unknown>> | null): string | null {
  if (errors === null || Object.keys(errors).length === 0) return null;
  const own = errors as PhaseDialErrors;
  if (own.required) return 'Enter an angle, or set it on the dial.';
  if (own.cpPhaseNumber) return 'Type the angle as a number of degrees, such as 45 or 127.5.';
  if (own.cpPhasePosition) {
    const allowed = own.cpPhasePosition.allowed;
    return allowed.length > MAX_LISTED_POSITIONS
      ? `Choose one of the ${allowed.length} allowed positions.`
      : `Choose one of the allowed positions: ${allowed.map((angle) => `${formatAngle(angle, DIAL_ANGLE_DECIMALS)}°`).join(', ')}.`;
  }
  return 'This angle is not accepted here.';
}

/** What a screen reader hears: "123 degrees, counted with rotation from the reference mark", or that none is set. */
export function dialValueText(value: number | null, counting: RotationCounting): string {
  return value === null ? NO_ANGLE_TEXT : describeAngle(value, counting);
}

/**
 * What a technician typed in the numeric field: an angle in [0, 360) (360 and -90 come round), null for
 * an empty field, undefined while the text is not a number yet (a lone "-", say). A decimal comma counts
 * as a point, as many tablets' number pads offer one.
 */
export function parseAngleText(text: string): number | null | undefined {
  const trimmed = text.trim().replace(',', '.');
  if (trimmed === '') return null;
  if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(trimmed)) return undefined;
  return normalizeDeg(Number(trimmed));
}

/** Where the reference mark sits on screen, in words for the dial's description. */
export function describeZeroPosition(zeroAtDeg: number): string {
  const screen = normalizeDeg(zeroAtDeg);
  const named: Record<number, string> = {
    0: 'at the top',
    90: 'on the right',
    180: 'at the bottom',
    270: 'on the left',
  };
  return named[screen] ?? `${formatAngle(screen, DIAL_ANGLE_DECIMALS)} degrees clockwise from the top`;
}
