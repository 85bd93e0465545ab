/**
 * How every Counterpoise widget writes an angle: one rule, so the dial, the overlay, the polar plot and the
 * calculator never show one angle two ways. Framework-free.
 */
import { normalizeDeg } from './dial-geometry';

/** How many decimals an angle is written with: whole degrees on a drawing, tenths for readings. */
export type AngleDecimals = 0 | 1 | 2;

/**
 * An angle as written: brought into [0, 360) after rounding (359.96 at one decimal is "0", never "360"),
 * rounded half away from zero to `decimals` places, trailing zeros dropped ("90", "12.5"). A value that is
 * not a finite number is written as a dash, so a drawing never shows "NaN".
 */
export function formatAngle(angleDeg: number, decimals: AngleDecimals = 1): string {
  if (!Number.isFinite(angleDeg)) return '–';
  const factor = 10 ** decimals;
  const rounded = normalizeDeg(Math.sign(angleDeg) * (Math.round(Math.abs(angleDeg) * factor) / factor));
  // normalizeDeg may leave float noise (e.g. 359.9 - 360 * 1); rounding again keeps the text short.
  const text = String(Math.round(rounded * factor) / factor);
  return text === '360' ? '0' : text;
}

/** The angle with its degree sign: "123°". */
export function degreesText(angleDeg: number, decimals: AngleDecimals = 1): string {
  const text = formatAngle(angleDeg, decimals);
  return text === '–' ? text : `${text}°`;
}
