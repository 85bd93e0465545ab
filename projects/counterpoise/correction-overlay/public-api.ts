/* Public API of `@counterpoise/ng/correction-overlay`: where the correction weight goes, on an end view of the rotor. */
export { CpCorrectionOverlay } from './correction-overlay';
export {
  CALIBRATION_HANDLES,
  type BlockedSector,
  type CalibrationHandle,
  type OverlayPoint,
  type OverlayWeight,
  type PhotoCalibration,
  type PhotoPoint,
  type RotorPhoto,
} from './overlay-model';
