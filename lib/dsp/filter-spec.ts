import { z } from "zod";
import { checkDesignSize } from "./design-size";
import { SPEC_LIMITS, stageSpecSchema, type StageSpec } from "./spec";

const STAGE_KINDS = stageSpecSchema.options.map((o) => o.shape.kind.value).join(", ");

/** One stage of a chain: any single-stage spec, optionally bypassed (kept in the chain, not run). */
export const chainStageSchema = z.intersection(
  z.discriminatedUnion("kind", stageSpecSchema.options, {
    error: (issue) =>
      issue.input !== null && typeof issue.input === "object" && "kind" in issue.input && issue.input.kind === "chain"
        ? "a chain cannot hold another chain; add its stages to this chain instead"
        : `a stage needs a kind, one of: ${STAGE_KINDS}`,
  }),
  z.object({ bypassed: z.boolean({ error: "Bypassed must be true or false" }).optional() }),
);

/**
 * An ordered chain of 1–8 stages run one after the other (a cascade: H = Π H_stage). Every stage
 * carries the chain's sampleRateHz; at least one stage must be active.
 */
export const chainSpecSchema = z
  .object({
    kind: z.literal("chain"),
    sampleRateHz: z.number({ error: "The sample rate must be a finite number" }).positive({
      error: "The sample rate must be a finite number above 0 Hz",
    }),
    stages: z
      .array(chainStageSchema, { error: "stages must be a list of filter specs" })
      .min(1, { error: "a chain needs at least 1 stage (got 0)" })
      .max(SPEC_LIMITS.maxChainStages, {
        error: (issue) =>
          `a chain holds at most ${SPEC_LIMITS.maxChainStages} stages (got ${Array.isArray(issue.input) ? issue.input.length : "more"})`,
      }),
  })
  .superRefine((spec, ctx) => {
    spec.stages.forEach((stage, i) => {
      if (stage.sampleRateHz !== spec.sampleRateHz) {
        ctx.addIssue({
          code: "custom",
          path: ["stages", i, "sampleRateHz"],
          message: `stage ${i + 1} is designed for ${stage.sampleRateHz} Hz but the chain runs at ${spec.sampleRateHz} Hz; every stage must use the chain's sample rate`,
        });
      }
    });
    if (spec.stages.length > 0 && spec.stages.every((s) => s.bypassed === true)) {
      ctx.addIssue({ code: "custom", path: ["stages"], message: "every stage is bypassed; at least one stage must run" });
    }
  });

/**
 * Every filter design request: a single stage, or a chain of them, told apart by `kind`; its running
 * stages together stay within the design-size limits (SPEC_LIMITS.maxTotal…).
 */
export const filterSpecSchema = z
  .discriminatedUnion("kind", [...stageSpecSchema.options, chainSpecSchema])
  .superRefine((spec, ctx) => {
    const running = activeStages(spec).map((s) => s.spec);
    const path = spec.kind === "chain" ? ["stages"] : spec.kind === "coefficients" ? [spec.sos ? "sos" : "b"] : [];
    checkDesignSize(ctx, running, path, spec.kind === "chain");
  });

export type ChainStage = z.infer<typeof chainStageSchema>;
export type ChainSpec = z.infer<typeof chainSpecSchema>;
export type FilterSpec = z.infer<typeof filterSpecSchema>;

/** A spec as the list of its stages: a chain's own stages, or a single spec as a chain of one. */
export function specStages(spec: FilterSpec): ChainStage[] {
  return spec.kind === "chain" ? spec.stages : [spec];
}

/** The stages of a spec that run, each with its index in the chain. */
export function activeStages(spec: FilterSpec): Array<{ index: number; spec: StageSpec }> {
  return specStages(spec).flatMap((stage, index) => {
    if (stage.bypassed === true) return [];
    const { bypassed: _bypassed, ...single } = stage;
    return [{ index, spec: single }];
  });
}
