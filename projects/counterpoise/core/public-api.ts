/* Public API of `@counterpoise/ng/core`: pieces every Counterpoise page shares. */
export {
  SAFETY_CAUTIONS,
  SAFETY_TOPICS,
  cautionsFor,
  type SafetyCaution,
  type SafetyTopic,
} from './safety-cautions';
export { CpSafetyNotice } from './safety-notice';
