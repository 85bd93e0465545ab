/* Public API of `@counterpoise/ng/phase-dial`: the dial to read or set an angle, and the types of its inputs. */
export { CpPhaseDial } from './phase-dial';
export {
  PHASE_DIAL_MARKER_KINDS,
  type PhaseDialErrors,
  type PhaseDialMarker,
  type PhaseDialMarkerKind,
} from './phase-dial-values';
export type { RotationCounting, DialPositions, RotationDirection } from '@counterpoise/ng/core';
