/* Test harness of `@counterpoise/ng/weight-calculator`, for our specs and for dealers' own tests. */
export {
  CpWeightCalculatorHarness,
  type WeightCalculatorCorrectionInfo,
  type WeightCalculatorFailureInfo,
  type WeightCalculatorFieldValue,
  type WeightCalculatorHarnessFilters,
  type WeightCalculatorResultInfo,
} from './weight-calculator-harness';
