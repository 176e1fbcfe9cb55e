import type { FilterDesign, StageDesign } from "./types";

/**
 * A chain's design from its running stages, in order: H(z) = Π H_stage(z) (a cascade, Oppenheim &
 * Schafer, Discrete-Time Signal Processing, 3rd ed., §6.3), so zeros and poles are the stages' together
 * and the gain is their product. Zeros are left out when a stage leaves its own out (designZeros).
 */
export function chainDesign(stages: StageDesign[], sampleRateHz: number): FilterDesign {
  if (stages.length === 0) throw new Error("a chain needs at least one running stage");
  const known = stages.every((s) => s.zeros !== undefined);
  return {
    sampleRateHz,
    stages,
    ...(known ? { zeros: stages.flatMap((s) => s.zeros ?? []) } : {}),
    poles: stages.flatMap((s) => s.poles),
    gain: stages.reduce((g, s) => g * s.gain, 1),
  };
}

/** The single designs a design runs, in order: a chain's stages, or the design itself as a chain of one. */
export function designStages(design: FilterDesign): Array<Omit<FilterDesign, "stages">> {
  if (design.stages === undefined) return [design];
  return design.stages;
}
