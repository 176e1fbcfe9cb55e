import { quantizedParts, stability, type QuantizedDesign, type QuantizedPart } from "@/lib/dsp";
import { canonicalJson, type ChannelConfig, type ConfigFormat, type FixedStage, type FloatStage } from "@/lib/protocol";
import { deployability, quantizationFor, type StoredCoefficients } from "./revision-content";
import { countOf } from "@/lib/format/plural";

/** Why a revision may not go to a channel; the message is safe to show. */
export class DeploymentRefusal extends Error {}

/** How much filter one device channel runs: sections and FIR taps over all the stages of its chain. */
export interface ChannelCapacity {
  maxSections: number;
  maxFirTaps: number;
}

export interface DeploymentTarget {
  /** `<device>/<channel>`, as refusals name it. */
  label: string;
  sampleRateHz: number;
  format: ConfigFormat;
  capacity: ChannelCapacity;
}

/** Sections and FIR taps a quantized design runs, over all its stages. */
export function quantizedCounts(q: QuantizedDesign): { sections: number; taps: number } {
  let sections = 0;
  let taps = 0;
  for (const part of quantizedParts(q)) {
    if (part.taps) taps += part.taps.length;
    else sections += part.sos?.length ?? 0;
  }
  return { sections, taps };
}

/** Refuses a quantized design that needs more sections or FIR taps than the channel runs, with both sets of numbers. */
function assertFits(q: QuantizedDesign, target: Pick<DeploymentTarget, "label" | "capacity">): void {
  const needs = quantizedCounts(q);
  const { maxSections, maxFirTaps } = target.capacity;
  if (needs.sections <= maxSections && needs.taps <= maxFirTaps) return;
  throw new DeploymentRefusal(
    `the filter needs ${countOf(needs.sections, "section")} and ${countOf(needs.taps, "FIR tap")}; ` +
      `${target.label} takes at most ${countOf(maxSections, "section")} and ${countOf(maxFirTaps, "FIR tap")}`,
  );
}

/**
 * Checks a revision against a target channel and gives the coefficients the device will run, in the
 * order a reviewer would check: the sample rate (coefficients are rate-specific), the float design's
 * stability, the coefficients in the channel's format (the stored ones when the revision was saved for
 * that format, see quantizationFor) and their stability, then the channel's capacity.
 */
export function quantizeForTarget(rev: StoredCoefficients, target: DeploymentTarget): QuantizedDesign {
  const { design } = rev;
  if (design.sampleRateHz !== target.sampleRateHz) {
    throw new DeploymentRefusal(
      `sample-rate mismatch: the revision is designed for ${design.sampleRateHz} Hz, ${target.label} samples at ${target.sampleRateHz} Hz`,
    );
  }
  if (!stability(design).stable) throw new DeploymentRefusal("the design is unstable (a pole on or outside the unit circle)");
  let quantized: QuantizedDesign;
  try {
    quantized = quantizationFor(rev, target.format);
  } catch (err) {
    throw new DeploymentRefusal((err as Error).message);
  }
  const verdict = deployability(true, quantized);
  if (!verdict.ok) throw new DeploymentRefusal(verdict.reason);
  assertFits(quantized, target);
  return quantized;
}

/** A quantized part as an f32 stage of a device configuration: SOS rows with a0 = 1, or float taps. */
export function floatConfigStage(part: QuantizedPart): FloatStage {
  if (part.taps) return { kind: "fir", taps: part.taps };
  return { kind: "sections", sections: (part.sos ?? []).map((r) => [r[0], r[1], r[2], 1, r[4], r[5]]) };
}

/** A quantized part as a Q15/Q31 stage: `{words, shift}` per section, or the tap words with their one post-shift. */
export function fixedConfigStage(part: QuantizedPart): FixedStage {
  const words = part.integers ?? [];
  if (part.taps) return { kind: "fir", taps: { words: words[0] ?? [], shift: part.shifts[0] } };
  return { kind: "sections", sections: words.map((w, i) => ({ words: w, shift: part.shifts[i] })) };
}

/**
 * One channel's entry of a device configuration (v3): the quantized design's stages in order. f32:
 * SOS rows with a0 = 1 and float taps; Q15/Q31: words [b0, b1, b2, a1, a2] with the section's
 * post-shift, and tap words with the stage's post-shift, in our sign convention
 * (y = b0·x + … − a1·y₋₁ − a2·y₋₂, lib/dsp quantizeDesign).
 */
export function channelConfigEntry(revisionId: string, target: Pick<DeploymentTarget, "sampleRateHz">, q: QuantizedDesign): ChannelConfig {
  const parts = quantizedParts(q);
  const base = { revisionId, sampleRateHz: target.sampleRateHz };
  if (q.format === "f32") return { ...base, format: "f32", stages: parts.map(floatConfigStage) };
  const stages = parts.map(fixedConfigStage);
  return q.format === "q15" ? { ...base, format: "q15", stages } : { ...base, format: "q31", stages };
}

/**
 * The content hash recorded with a deployment: lowercase hex SHA-256 of canonicalJson(entry), through
 * Web Crypto so browser and Node agree (the same rules as the device configuration's checksum).
 */
export async function channelConfigChecksum(entry: ChannelConfig): Promise<string> {
  const bytes = new TextEncoder().encode(canonicalJson(entry));
  const digest = await crypto.subtle.digest("SHA-256", bytes);
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, "0")).join("");
}
