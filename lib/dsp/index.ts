/** Public contract of lib/dsp: design requests, designs, discretisation, paste parsing, analysis and running. */
export type { Complex, DirectForm, FilterDesign, StageDesign } from "./types";

export * from "./spec";
export * from "./filter-spec";
export { designFilter } from "./design";
export { liveDesign, type LiveDesign } from "./live-design";
export { chainDesign, designStages } from "./chain";
export {
  designDirectForm,
  designFromBa,
  designFromSos,
  designFromTaps,
  designTransferFunction,
  directFormSectionCount,
  directFormSections,
  MAX_DIRECT_FORM_ORDER,
} from "./transfer";
export { designZeros } from "./zeros";
export { directFormDcGain } from "./dc-gain";
export { accurateSum } from "./accurate-sum";

export { iirSpecSchema, IIR_FAMILIES, IIR_RESPONSES, MAX_ORDER, type IirSpec, type IirFamily, type IirResponse } from "./iir/spec";
export { designIir, analogPrototypeZpk } from "./iir/design";
export {
  estimateOrder,
  orderRequirementSchema,
  type OrderRequirement,
  type OrderEstimate,
} from "./iir/order";
export { zpk2sos } from "./iir/zpk2sos";
export { bilinearZpk } from "./iir/bilinear";

export { biquadShapes, gainShapes, rbjBiquad, type BiquadShape, type BiquadParams } from "./biquad";
export { bandwidthNotchSection, notchShapes, type NotchShape } from "./notch";
export { notchSpecSchema, NOTCH_LIMITS, type NotchSpec } from "./notch-spec";
export { combDesign, combOrder, COMB_DIVISIBILITY_TOLERANCE } from "./comb";
export { combSpecSchema, COMB_LIMITS, type CombSpec } from "./comb-spec";
export { firResponses, windowedSinc, type FirResponse, type WindowedSincParams } from "./fir/windowed-sinc";
export { firWindows, firWindow, kaiserBeta, besselI0, type FirWindow } from "./fir/windows";
export { movingAverage } from "./fir/moving-average";
export { equirippleTaps, REMEZ_GRID_DENSITY, REMEZ_MAX_ITERATIONS, type EquirippleParams } from "./fir/remez";
export { arbitraryFirTaps, type ArbitraryFirParams } from "./fir/arbitrary";
export { estimateFirOrder, firOrderRequirementSchema, MIN_KAISER_RIPPLE_DB, type FirOrderRequirement } from "./fir/kaiser-order";
export {
  FIR_DESIGN_LIMITS,
  firArbitrarySpecSchema,
  firEquirippleSpecSchema,
  type FirArbitrarySpec,
  type FirEquirippleSpec,
} from "./fir-design-spec";
export { firstDifferenceTaps } from "./fir/differentiator";
export { emaAlpha, emaTransferFunction } from "./ema";

export {
  discretize,
  discretizationMethods,
  type DiscretizationMethod,
  type DiscretizeOptions,
} from "./discretize/discretize";
export { MAX_ANALOG_ORDER, type AnalogTransferFunction } from "./discretize/rational";

export { parseCoefficientText, CoefficientParseError } from "./coefficients";

export { cAdd, cSub, cMul, cDiv, cScale, cNeg, cConj, cAbs, cArg, cExp, cSqrt } from "./complex";
export { polyMul, polyFromRoots, polyRoots, polyEval } from "./poly";
export { expm, type Matrix } from "./linalg";

export * from "./analysis";
export * from "./engine";
export * from "./fixed";
export * from "./loop";
