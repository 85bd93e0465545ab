/**
 * Where an angle on the rotor sits on screen, for every widget that draws an end view of a rotor (the
 * phase dial, the correction overlay, the polar plot). Framework-free, so it is tested without TestBed.
 *
 * The viewer looks at one end of the rotor. `rotation` is the way the rotor turns as seen by the viewer;
 * angles are counted from the reference mark `withRotation` or `againstRotation`; the reference mark sits
 * on screen at `zeroAtDeg`, measured clockwise from 12 o'clock (0 top, 90 right, 180 bottom, 270 left).
 */

/** The way the rotor turns, as seen by the viewer (the engine's `RotationDirection`, the same values). */
export type RotationDirection = 'clockwise' | 'counterClockwise';

/**
 * Which way the widgets count angles from the reference mark: relative to the rotation, so a value means
 * the same seen from either end. (The engine's `AngleCounting` also allows counting fixed to the screen,
 * `clockwise` or `counterClockwise`; the widgets do not, hence a name of their own.)
 */
export type RotationCounting = 'withRotation' | 'againstRotation';

/** How rotor angles map onto the screen. */
export interface DialConvention {
  readonly rotation: RotationDirection;
  readonly counting: RotationCounting;
  /** Where the reference mark sits on screen, clockwise from 12 o'clock, in degrees. */
  readonly zeroAtDeg: number;
}

/** The convention a widget uses when none is given: clockwise rotation, angles against it, zero at top. */
export const DEFAULT_DIAL_CONVENTION: DialConvention = {
  rotation: 'clockwise',
  counting: 'againstRotation',
  zeroAtDeg: 0,
};

/** A point on screen. */
export interface ScreenPoint {
  readonly x: number;
  readonly y: number;
}

/** An angle brought into [0, 360). */
export function normalizeDeg(angleDeg: number): number {
  const wrapped = angleDeg % 360;
  const positive = wrapped < 0 ? wrapped + 360 : wrapped;
  return positive === 360 || Object.is(positive, -0) ? 0 : positive;
}

/** +1 when increasing rotor angles run clockwise on screen, -1 when counter-clockwise. */
export function screenSense(convention: DialConvention): 1 | -1 {
  const clockwiseRotation = convention.rotation === 'clockwise';
  const withRotation = convention.counting === 'withRotation';
  return clockwiseRotation === withRotation ? 1 : -1;
}

/** The screen angle (clockwise from 12 o'clock) of a rotor angle. */
export function screenAngleDeg(angleDeg: number, convention: DialConvention): number {
  return normalizeDeg(convention.zeroAtDeg + screenSense(convention) * angleDeg);
}

/** The rotor angle at a screen angle (the inverse of {@link screenAngleDeg}). */
export function angleFromScreenDeg(screenDeg: number, convention: DialConvention): number {
  return normalizeDeg(screenSense(convention) * (screenDeg - convention.zeroAtDeg));
}

/** The point at `radius` from `center` in the direction of a screen angle (SVG: y grows downwards). */
export function pointAtScreenAngle(center: ScreenPoint, radius: number, screenDeg: number): ScreenPoint {
  const radians = (screenDeg * Math.PI) / 180;
  return { x: center.x + radius * Math.sin(radians), y: center.y - radius * Math.cos(radians) };
}

/** The point of a rotor angle at `radius` from `center`. */
export function pointAtAngle(
  center: ScreenPoint,
  radius: number,
  angleDeg: number,
  convention: DialConvention,
): ScreenPoint {
  return pointAtScreenAngle(center, radius, screenAngleDeg(angleDeg, convention));
}

/** The screen angle of `point` seen from `center`; 0 when they coincide. */
export function screenAngleOfPoint(center: ScreenPoint, point: ScreenPoint): number {
  const dx = point.x - center.x;
  const dy = point.y - center.y;
  if (dx === 0 && dy === 0) return 0;
  return normalizeDeg((Math.atan2(dx, -dy) * 180) / Math.PI);
}

/** The rotor angle under a screen point, e.g. where a pointer touched the dial. */
export function angleAtPoint(center: ScreenPoint, point: ScreenPoint, convention: DialConvention): number {
  return angleFromScreenDeg(screenAngleOfPoint(center, point), convention);
}

/** Discrete positions: a count of equally spaced ones from `firstDeg`, or explicit angles. */
export type DialPositions =
  number | readonly number[] | { readonly count: number; readonly firstDeg: number };

/** The angles of discrete positions, normalised and sorted; empty when there are none. */
export function expandPositions(positions: DialPositions | null | undefined): number[] {
  if (positions === null || positions === undefined) return [];
  if (typeof positions === 'number') return expandPositions({ count: positions, firstDeg: 0 });
  if ('count' in positions) {
    const count = Math.floor(positions.count);
    if (!(count >= 1)) return [];
    return Array.from({ length: count }, (_, i) => normalizeDeg(positions.firstDeg + (360 * i) / count)).sort(
      (a, b) => a - b,
    );
  }
  return [...new Set(positions.map(normalizeDeg))].sort((a, b) => a - b);
}

/** The shortest distance between two angles, in degrees (0 to 180). */
export function angularDistanceDeg(a: number, b: number): number {
  const d = Math.abs(normalizeDeg(a) - normalizeDeg(b));
  return d > 180 ? 360 - d : d;
}

/** The allowed position nearest to an angle; the angle itself when there are no positions. */
export function nearestPosition(angleDeg: number, positions: readonly number[]): number {
  let best = normalizeDeg(angleDeg);
  let bestDistance = Infinity;
  for (const position of positions) {
    const distance = angularDistanceDeg(angleDeg, position);
    if (distance < bestDistance) {
      best = position;
      bestDistance = distance;
    }
  }
  return best;
}

/** An angle snapped to the nearest allowed position, or else rounded to the step. */
export function snapAngle(
  angleDeg: number,
  options: { step?: number; positions?: readonly number[] },
): number {
  if (options.positions && options.positions.length > 0) return nearestPosition(angleDeg, options.positions);
  const step = options.step && options.step > 0 ? options.step : 1;
  return normalizeDeg(Math.round(angleDeg / step) * step);
}

/** Whether an angle is one of the positions (within a hundredth of a degree). */
export function isAllowedPosition(angleDeg: number, positions: readonly number[]): boolean {
  return positions.some((position) => angularDistanceDeg(angleDeg, position) < 0.01);
}

/** The angle in words, as a screen reader speaks it: "123 degrees, counted with rotation from the reference mark". */
export function describeAngle(angleDeg: number, counting: RotationCounting): string {
  const rounded = Math.round(angleDeg * 10) / 10;
  const direction = counting === 'withRotation' ? 'with' : 'against';
  return `${rounded} degrees, counted ${direction} rotation from the reference mark`;
}
