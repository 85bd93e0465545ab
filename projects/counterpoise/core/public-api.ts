/* Public API of `@counterpoise/ng/core`: pieces every Counterpoise page shares. */
export {
  SAFETY_CAUTIONS,
  SAFETY_TOPICS,
  cautionsFor,
  type SafetyCaution,
  type SafetyTopic,
} from './safety-cautions';
export { CpSafetyNotice } from './safety-notice';
export { degreesText, formatAngle, type AngleDecimals } from './angle-format';
export {
  DEFAULT_DIAL_CONVENTION,
  angleAtPoint,
  angleFromScreenDeg,
  angularDistanceDeg,
  describeAngle,
  expandPositions,
  isAllowedPosition,
  nearestPosition,
  normalizeDeg,
  pointAtAngle,
  pointAtScreenAngle,
  screenAngleDeg,
  screenAngleOfPoint,
  screenSense,
  snapAngle,
  type RotationCounting,
  type DialConvention,
  type DialPositions,
  type RotationDirection,
  type ScreenPoint,
} from './dial-geometry';
