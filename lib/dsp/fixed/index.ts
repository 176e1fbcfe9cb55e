export { assertDeployable } from "./deployable";
export {
  compareStructures,
  quantizeDirectForm,
  type DirectFormQuantization,
  type StructureComparison,
} from "./direct-form";
export { quantizeGroup, quantizeSections, type QuantizedGroup, type QuantizedSections } from "./coefficient-quantizer";
export { DEVIATION_FLOOR_DB, DEVIATION_GRID_POINTS } from "./deviation";
export { spreadGain, spreadGainForm } from "./gain-spreading";
export { stageHeadroom, type StageHeadroom } from "./headroom";
export { fractionBits, roundHalfAway, toWord, wordLimits, wordToReal, type FixedFormat, type QuantFormat } from "./q-format";
export {
  quantizeDesign,
  quantizedParts,
  type QuantizedDesign,
  type QuantizedPart,
  type QuantizedStage,
} from "./quantize-design";
export { arithmeticLabel, FIXED_ARITHMETICS, libraryKernels, type FixedArithmetic } from "./arithmetic";
export { MAX_Q15_TAPS } from "./fixed-stages";
export { simulateFixed, type FixedSimulation } from "./simulate-fixed";
