import { z } from "zod";
import { chainDesign, designStages, type FilterDesign } from "@/lib/dsp";
import { channelConfigSchema, fixedSectionSchema, floatSectionSchema, type ChannelConfig, type FixedStage, type FloatStage } from "@/lib/protocol";

/**
 * A channel entry as deployments stored it before chains (configuration v2): one list of sections,
 * never on the wire any more but kept as it was stored, with the checksum computed over it.
 */
const legacyChannelConfigSchema = z.discriminatedUnion("format", [
  z.object({ revisionId: z.string(), sampleRateHz: z.number(), format: z.literal("f32"), sections: z.array(floatSectionSchema) }).strict(),
  z.object({ revisionId: z.string(), sampleRateHz: z.number(), format: z.literal("q15"), sections: z.array(fixedSectionSchema(15)) }).strict(),
  z.object({ revisionId: z.string(), sampleRateHz: z.number(), format: z.literal("q31"), sections: z.array(fixedSectionSchema(31)) }).strict(),
]);
type LegacyChannelConfig = z.infer<typeof legacyChannelConfigSchema>;

/** A deployment's stored channel entry: the current form, or the v2 form of deployments made before chains. */
export type StoredChannelConfig = ChannelConfig | LegacyChannelConfig;

/** Checks a stored channel entry in either form (db/json-columns.ts reads deployments.config with it). */
export const storedChannelConfigSchema: z.ZodType<StoredChannelConfig> = z.union([channelConfigSchema, legacyChannelConfigSchema]);

/**
 * The current (v3) form of a stored entry: a legacy entry's sections become one sections stage (an
 * empty list stays a unit filter), every word and row exactly as stored. Throws when the entry is
 * neither form.
 */
export function currentChannelConfig(stored: unknown): ChannelConfig {
  const current = channelConfigSchema.safeParse(stored);
  if (current.success) return current.data;
  const legacy = legacyChannelConfigSchema.parse(stored);
  const base = { revisionId: legacy.revisionId, sampleRateHz: legacy.sampleRateHz };
  if (legacy.format === "f32") return { ...base, format: "f32", stages: legacy.sections.length ? [{ kind: "sections", sections: legacy.sections }] : [] };
  const stages = legacy.sections.length ? [{ kind: "sections" as const, sections: legacy.sections }] : [];
  return legacy.format === "q15" ? { ...base, format: "q15", stages } : { ...base, format: "q31", stages };
}

/** Words at their real values, word · 2^(shift − n) (n = 15 or 31 fraction bits; exact in float64). */
function realValues(group: { words: number[]; shift: number }, bits: 15 | 31): number[] {
  return group.words.map((w) => w * 2 ** (group.shift - bits));
}

type Coefficients = { sos: number[][]; taps?: undefined } | { taps: number[]; sos?: undefined };

function floatCoefficients(stage: FloatStage): Coefficients {
  return stage.kind === "fir" ? { taps: stage.taps } : { sos: stage.sections };
}

function fixedCoefficients(stage: FixedStage, bits: 15 | 31): Coefficients {
  if (stage.kind === "fir") return { taps: realValues(stage.taps, bits) };
  const sos = stage.sections.map((section) => {
    const [b0, b1, b2, a1, a2] = realValues(section, bits);
    return [b0, b1, b2, 1, a1, a2];
  });
  return { sos };
}

/**
 * The filter a channel entry makes its device run: its coefficients at their real values (Q15/Q31
 * words exactly), one design for one stage, a chain for several, null for a unit filter. Zeros, poles
 * and gain are those of `reference`, the float design the entry was quantized from (stage by stage),
 * so nothing is factored again on the way to the live pipeline.
 */
export function entryDesign(entry: ChannelConfig, reference: FilterDesign): FilterDesign | null {
  const fs = entry.sampleRateHz;
  const parts =
    entry.format === "f32"
      ? entry.stages.map(floatCoefficients)
      : entry.stages.map((stage) => fixedCoefficients(stage, entry.format === "q15" ? 15 : 31));
  if (parts.length === 0) return null;
  const refs = designStages(reference);
  if (refs.length !== parts.length) {
    throw new Error(`the entry of revision ${entry.revisionId} has ${parts.length} stages but its design has ${refs.length}`);
  }
  const stages = parts.map((part, k) => ({ ...part, sampleRateHz: fs, zeros: refs[k].zeros, poles: refs[k].poles, gain: refs[k].gain }));
  if (stages.length === 1) return stages[0];
  return chainDesign(stages.map((s, k) => ({ ...s, stage: reference.stages?.[k].stage ?? k })), fs);
}

/**
 * The production filter a deployment makes its channel run: exactly what its device acknowledged, the
 * stored entry's coefficients at their real values (a chain for several stages); null for a unit filter.
 */
export function deployedDesign(d: { config: StoredChannelConfig; design: FilterDesign }): FilterDesign | null {
  return entryDesign(currentChannelConfig(d.config), d.design);
}
