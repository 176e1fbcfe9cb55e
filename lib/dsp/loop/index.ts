/** Loop check: what a sensor filter does to the control loop it sits in (margins, root locus, closed-loop step). */
export {
  loopModelSchema,
  pidControllerSchema,
  tfControllerSchema,
  controllerSchema,
  parseLoopModel,
  LOOP_LIMITS,
  type LoopModel,
  type LoopController,
  type PidController,
  type TfController,
} from "./schema";
export { controllerTf, filterTf, loopBlocks, type DigitalTf, type LoopBlocks } from "./blocks";
export { loopEvaluator, loopResponse, type LoopEvaluator, type LoopResponse } from "./response";
export {
  findCrossings,
  stabilityMargins,
  MARGIN_GRID_POINTS,
  MARGIN_GRID_DECADES_BELOW_FS,
  ZERO_LOOP_GAIN,
  type Crossing,
  type StabilityMargins,
} from "./margins";
export { closedLoopPoles, loopPolynomials, rootLocus, POLE_WARNING_DEGREE, type ClosedLoopPoles } from "./poles";
export { closedLoopStep, MAX_LOOP_STEP_SAMPLES, type ClosedLoopStep } from "./step";
export { filterPhaseCost, type PhaseCost } from "./phase-cost";
