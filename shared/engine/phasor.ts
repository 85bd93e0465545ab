import { EngineError, requireFinite, requireNonNegative } from './errors';

/** A vibration reading at 1x running speed: amplitude in the caller's unit, phase in degrees from the reference mark. */
export interface Reading {
  amplitude: number;
  phaseDeg: number;
}

/** A weight on the rotor: mass in the caller's unit, angle in degrees from the reference mark. */
export interface Weight {
  mass: number;
  angleDeg: number;
}

/** A phasor in rectangular form; used inside the engine, where angles are radians. */
export interface Phasor {
  re: number;
  im: number;
}

const DEG_PER_RAD = 180 / Math.PI;
const RAD_PER_DEG = Math.PI / 180;

/** Degrees to radians: rad = deg * pi / 180. */
export function degToRad(deg: number): number {
  return deg * RAD_PER_DEG;
}

/** Radians to degrees: deg = rad * 180 / pi. */
export function radToDeg(rad: number): number {
  return rad * DEG_PER_RAD;
}

/**
 * An angle brought into [0, 360): a = deg - 360 * floor(deg / 360).
 * Values within 1e-9 degree of 360 are returned as 0 so that round-off never shows "360.0".
 */
export function normalizeAngleDeg(deg: number): number {
  const a = deg - 360 * Math.floor(deg / 360);
  return a >= 360 - 1e-9 ? 0 : a;
}

/**
 * The signed difference b - a brought into (-180, 180]: how far, and which way, angle b lies from angle a.
 */
export function angleDifferenceDeg(a: number, b: number): number {
  const d = normalizeAngleDeg(b - a);
  return d > 180 ? d - 360 : d;
}

/** Polar to rectangular: z = A (cos phi + i sin phi), phi in degrees. */
export function phasor(amplitude: number, angleDeg: number): Phasor {
  const r = degToRad(angleDeg);
  return { re: amplitude * Math.cos(r), im: amplitude * Math.sin(r) };
}

/** A reading as a phasor: z = A e^(i phi). */
export function readingToPhasor(reading: Reading): Phasor {
  return phasor(reading.amplitude, reading.phaseDeg);
}

/** A weight as a phasor: z = m e^(i theta). */
export function weightToPhasor(weight: Weight): Phasor {
  return phasor(weight.mass, weight.angleDeg);
}

/** Magnitude |z| = sqrt(re^2 + im^2), without overflow for large parts. */
export function magnitude(z: Phasor): number {
  return Math.hypot(z.re, z.im);
}

/** Angle of z in degrees, in [0, 360); 0 for the zero phasor. */
export function angleDegOf(z: Phasor): number {
  if (z.re === 0 && z.im === 0) return 0;
  return normalizeAngleDeg(radToDeg(Math.atan2(z.im, z.re)));
}

/** Rectangular to a reading: amplitude |z|, phase arg z in [0, 360). */
export function phasorToReading(z: Phasor): Reading {
  return { amplitude: magnitude(z), phaseDeg: angleDegOf(z) };
}

/** Rectangular to a weight: mass |z|, angle arg z in [0, 360). */
export function phasorToWeight(z: Phasor): Weight {
  return { mass: magnitude(z), angleDeg: angleDegOf(z) };
}

/** Sum a + b. */
export function add(a: Phasor, b: Phasor): Phasor {
  return { re: a.re + b.re, im: a.im + b.im };
}

/** Difference a - b. */
export function subtract(a: Phasor, b: Phasor): Phasor {
  return { re: a.re - b.re, im: a.im - b.im };
}

/** Real scaling k z: the amplitude is multiplied by k, the angle kept (k >= 0). */
export function scale(z: Phasor, k: number): Phasor {
  return { re: z.re * k, im: z.im * k };
}

/** Rotation z e^(i t), t in degrees: the amplitude kept, t added to the angle. */
export function rotate(z: Phasor, angleDeg: number): Phasor {
  const r = degToRad(angleDeg);
  const c = Math.cos(r);
  const s = Math.sin(r);
  return { re: z.re * c - z.im * s, im: z.re * s + z.im * c };
}

/** Product a b: magnitudes multiply, angles add. */
export function multiply(a: Phasor, b: Phasor): Phasor {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

/** Quotient a / b = a conj(b) / |b|^2: magnitudes divide, angles subtract. Throws on b = 0. */
export function divide(a: Phasor, b: Phasor): Phasor {
  const d = b.re * b.re + b.im * b.im;
  if (d === 0 || !Number.isFinite(d)) {
    throw new EngineError('NO_SOLUTION', 'Division by a zero vector; the data do not define an answer.');
  }
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
}

/** Complex conjugate: the angle negated, as when angles are counted the other way round. */
export function conjugate(z: Phasor): Phasor {
  return { re: z.re, im: -z.im };
}

/** Negation -z: the same amplitude, 180 degrees away. */
export function negate(z: Phasor): Phasor {
  return { re: -z.re, im: -z.im };
}

/** Sum of readings as vectors (phasor addition), returned as a reading. */
export function addReadings(a: Reading, b: Reading): Reading {
  return phasorToReading(add(readingToPhasor(a), readingToPhasor(b)));
}

/** Vector difference a - b of two readings, e.g. the effect of a trial weight: (O+T) - O. */
export function subtractReadings(a: Reading, b: Reading): Reading {
  return phasorToReading(subtract(readingToPhasor(a), readingToPhasor(b)));
}

/** A reading scaled by k >= 0: amplitude k A, phase kept. */
export function scaleReading(reading: Reading, k: number): Reading {
  return { amplitude: reading.amplitude * k, phaseDeg: normalizeAngleDeg(reading.phaseDeg) };
}

/** A reading rotated by t degrees: phase phi + t, amplitude kept. */
export function rotateReading(reading: Reading, angleDeg: number): Reading {
  return { amplitude: reading.amplitude, phaseDeg: normalizeAngleDeg(reading.phaseDeg + angleDeg) };
}

/** Checks a reading at `field`: amplitude finite and >= 0, phase finite. */
export function validateReading(reading: unknown, field: string): Reading {
  if (reading === null || typeof reading !== 'object') {
    throw new EngineError('INVALID_INPUT', `${field} is missing; enter an amplitude and a phase.`, field);
  }
  const r = reading as Partial<Reading>;
  return {
    amplitude: requireNonNegative(r.amplitude, `${field}.amplitude`, 'vibration amplitude'),
    phaseDeg: requireFinite(r.phaseDeg, `${field}.phaseDeg`),
  };
}

/** Checks a weight at `field`: mass finite and >= 0, angle finite. */
export function validateWeight(weight: unknown, field: string): Weight {
  if (weight === null || typeof weight !== 'object') {
    throw new EngineError('INVALID_INPUT', `${field} is missing; enter a mass and an angle.`, field);
  }
  const w = weight as Partial<Weight>;
  return {
    mass: requireNonNegative(w.mass, `${field}.mass`, 'mass'),
    angleDeg: requireFinite(w.angleDeg, `${field}.angleDeg`),
  };
}
