/* Public API of `@counterpoise/ng/core`: pieces every Counterpoise page shares. */
export { SAFETY_CAUTIONS, SAFETY_TOPICS, type SafetyCaution, type SafetyTopic } from './safety-cautions';
export { CpSafetyNotice } from './safety-notice';
export type { DialConvention, DialPositions, RotationCounting, RotationDirection } from './dial-geometry';

/*
 * Internal to the library, under the `_` prefix (Angular Material's mark of an internal export): the
 * end-view geometry, angle formatting and drawing kit that the other entry points of `@counterpoise/ng`
 * share through this one. Not part of the public API: a dealer must not rely on these names.
 */
export {
  degreesText as _degreesText,
  formatAngle as _formatAngle,
  type AngleDecimals as _AngleDecimals,
} from './angle-format';
export {
  DEFAULT_DIAL_CONVENTION as _DEFAULT_DIAL_CONVENTION,
  angleAtPoint as _angleAtPoint,
  angleFromScreenDeg as _angleFromScreenDeg,
  angularDistanceDeg as _angularDistanceDeg,
  describeAngle as _describeAngle,
  expandPositions as _expandPositions,
  isAllowedPosition as _isAllowedPosition,
  normalizeDeg as _normalizeDeg,
  pointAtAngle as _pointAtAngle,
  pointAtScreenAngle as _pointAtScreenAngle,
  screenAngleDeg as _screenAngleDeg,
  screenAngleOfPoint as _screenAngleOfPoint,
  screenSense as _screenSense,
  snapAngle as _snapAngle,
  type ScreenPoint as _ScreenPoint,
} from './dial-geometry';
export {
  LEADER_AFTER_PX as _LEADER_AFTER_PX,
  boxAround as _boxAround,
  boxBeside as _boxBeside,
  boxBeyondRim as _boxBeyondRim,
  boxCrossesRim as _boxCrossesRim,
  boxInside as _boxInside,
  boxesOverlap as _boxesOverlap,
  distanceToBox as _distanceToBox,
  estimateTextWidthPx as _estimateTextWidthPx,
  inflateBox as _inflateBox,
  nearestPointOnBox as _nearestPointOnBox,
  overlapArea as _overlapArea,
  placeEndViewLabels as _placeEndViewLabels,
  type Box as _Box,
  type EndViewLabelLayout as _EndViewLabelLayout,
  type EndViewLabelRequest as _EndViewLabelRequest,
  type EndViewLabelStage as _EndViewLabelStage,
  type EndViewObstacle as _EndViewObstacle,
  type EndViewRim as _EndViewRim,
  type LeaderLine as _LeaderLine,
  type PlacedEndViewLabel as _PlacedEndViewLabel,
} from './end-view-labels';
export {
  labelCentreBeside as _labelCentreBeside,
  quietestRimGap as _quietestRimGap,
  radialLine as _radialLine,
  referenceMark as _referenceMark,
  rotationArrow as _rotationArrow,
  roundPx as _roundPx,
  scaleTicks as _scaleTicks,
  type EndViewLine as _EndViewLine,
  type EndViewReferenceMark as _EndViewReferenceMark,
  type EndViewRotationArrow as _EndViewRotationArrow,
  type EndViewTick as _EndViewTick,
} from './end-view-marks';
