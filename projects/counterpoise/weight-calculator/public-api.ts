/*
 * Public API of `@counterpoise/ng/weight-calculator`: the correction weight calculator, and the types and
 * constants of its inputs, outputs and form value. Its form, request builders, result text and units stay
 * inside the library; the harness is in `@counterpoise/ng/weight-calculator/testing`.
 */
export { CpWeightCalculator } from './weight-calculator';
export {
  CALC_METHODS,
  METHOD_INFO,
  type AmplitudeRunDraft,
  type AmplitudeUnit,
  type CalcMethod,
  type CorrectionPlacement,
  type FourRunDraft,
  type MassUnit,
  type MethodInfo,
  type MethodRequest,
  type MethodResult,
  type MultiPlaneDraft,
  type MultiPlaneRunDraft,
  type OneRunDraft,
  type ReadingDraft,
  type SensitivityPreset,
  type SinglePlaneDraft,
  type WeightCalculation,
  type WeightCalculatorDraft,
  type WeightCalculatorErrors,
  type WeightCalculatorFieldError,
  type WeightCalculatorValue,
  type WeightDraft,
} from './weight-calculator-model';
