/* Public API of `@counterpoise/ng/phase-dial`: the dial to read or set an angle, and its logic. */
export { CpPhaseDial } from './phase-dial';
export {
  NO_ANGLE_TEXT,
  PHASE_DIAL_MARKER_KINDS,
  PHASE_DIAL_MARKER_NAMES,
  dialValueText,
  describeZeroPosition,
  formatAngle,
  largeStepDeg,
  maxDialValue,
  nextDialValue,
  parseAngleText,
  phaseDialErrors,
  toDialAngle,
  validStep,
  type DialValueOptions,
  type PhaseDialErrors,
  type PhaseDialKey,
  type PhaseDialMarker,
  type PhaseDialMarkerKind,
} from './phase-dial-values';
export { MARKER_GLYPHS, type MarkerGlyph } from './phase-dial-drawing';
export type { RotationCounting, DialPositions, RotationDirection } from '@counterpoise/ng/core';
