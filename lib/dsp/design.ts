import { rbjBiquad } from "./biquad";
import { combDesign } from "./comb";
import { discretize } from "./discretize/discretize";
import { emaTransferFunction } from "./ema";
import { arbitraryFirTaps } from "./fir/arbitrary";
import { firstDifferenceTaps } from "./fir/differentiator";
import { movingAverage } from "./fir/moving-average";
import { equirippleTaps } from "./fir/remez";
import { windowedSinc } from "./fir/windowed-sinc";
import { kaiserBeta } from "./fir/windows";
import { designIir } from "./iir/design";
import { bandwidthNotchSection } from "./notch";
import { chainDesign } from "./chain";
import { activeStages, filterSpecSchema, type FilterSpec } from "./filter-spec";
import type { StageSpec } from "./spec";
import { designFromBa, designFromSos, designFromTaps, designTransferFunction } from "./transfer";
import type { FilterDesign } from "./types";

/**
 * Designs any filter request. The spec is checked with filterSpecSchema first; an invalid spec
 * throws an Error listing each refusal in the editor's words with the allowed range (a chain's prefixed "stage N:"). A chain gives one design
 * whose `stages` are its running stages in order (bypassed stages left out).
 */
export function designFilter(input: FilterSpec): FilterDesign {
  const parsed = filterSpecSchema.safeParse(input);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => (i.path[0] === "stages" && typeof i.path[1] === "number" ? `stage ${i.path[1] + 1}: ${i.message}` : i.message));
    throw new Error(`invalid filter spec:\n${lines.join("\n")}`);
  }
  const spec = parsed.data;
  if (spec.kind !== "chain") return designStage(spec);
  const stages = activeStages(spec).map(({ index, spec: stage }) => ({ ...designStage(stage), stage: index }));
  return chainDesign(stages, spec.sampleRateHz);
}

/** One already validated single-stage spec. */
function designStage(spec: StageSpec): FilterDesign {
  const fs = spec.sampleRateHz;
  switch (spec.kind) {
    case "iir":
      return designIir(spec);
    case "biquad":
      return designFromSos([rbjBiquad(spec)], fs);
    case "fir": {
      const beta = spec.kaiserBeta ?? (spec.stopbandAttenuationDb === undefined ? undefined : kaiserBeta(spec.stopbandAttenuationDb));
      return designFromTaps(windowedSinc({ ...spec, kaiserBeta: beta }), fs);
    }
    case "moving-average":
      return { sampleRateHz: fs, ...movingAverage(spec.length) };
    case "differentiator":
      return designFromTaps(firstDifferenceTaps(fs), fs);
    case "ema": {
      const { b, a } = emaTransferFunction(spec.cutoffHz, fs);
      return designFromBa(b, a, fs);
    }
    case "analog": {
      const { b, a } = discretize(spec, fs, spec.method, { prewarpHz: spec.prewarpHz });
      return designTransferFunction(b, a, fs);
    }
    case "fir-equiripple":
      return designFromTaps(equirippleTaps(spec), fs);
    case "fir-arbitrary":
      return designFromTaps(arbitraryFirTaps(spec), fs);
    case "notch":
      return designFromSos([bandwidthNotchSection(spec.shape, spec.centerHz, spec.q, fs)], fs);
    case "comb":
      return { sampleRateHz: fs, ...combDesign(spec.shape, spec.fundamentalHz, spec.q, fs) };
    case "coefficients":
      return spec.sos !== undefined ? designFromSos(spec.sos, fs) : designTransferFunction(spec.b ?? [], spec.a ?? [1], fs);
  }
}
