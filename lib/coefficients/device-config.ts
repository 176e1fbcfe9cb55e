import { quantizeDesign, stability, type FilterDesign, type QuantizedDesign } from "@/lib/dsp";
import { canonicalJson, type ChannelConfig, type ConfigFormat } from "@/lib/protocol";
import { deployability } from "./revision-content";
import { sectionsDesign } from "./sections";

/** Why a revision may not go to a channel; the message is safe to show. */
export class DeploymentRefusal extends Error {}

export interface DeploymentTarget {
  channelKey: string;
  sampleRateHz: number;
  format: ConfigFormat;
}

/**
 * Checks a design against a target channel and quantizes it for the device: refused for a sample-rate
 * mismatch (coefficients are rate-specific), an unstable design, too many sections, or coefficients
 * unstable after quantization.
 */
export function quantizeForTarget(design: FilterDesign, target: DeploymentTarget): QuantizedDesign {
  if (design.sampleRateHz !== target.sampleRateHz) {
    throw new DeploymentRefusal(
      `sample-rate mismatch: the revision is designed for ${design.sampleRateHz} Hz, ${target.channelKey} samples at ${target.sampleRateHz} Hz`,
    );
  }
  if (!stability(design).stable) throw new DeploymentRefusal("the design is unstable (a pole on or outside the unit circle)");
  let quantized: QuantizedDesign;
  try {
    quantized = quantizeDesign(sectionsDesign(design), target.format);
  } catch (err) {
    throw new DeploymentRefusal((err as Error).message);
  }
  const verdict = deployability(true, quantized);
  if (!verdict.ok) throw new DeploymentRefusal(verdict.reason);
  return quantized;
}

/**
 * One channel's entry of a device configuration (v2) for a quantized sections design. f32: SOS rows
 * with a0 = 1; Q15/Q31: words [b0, b1, b2, a1, a2] and the section's post-shift, in our sign
 * convention (y = b0·x + … − a1·y₋₁ − a2·y₋₂, lib/dsp quantizeDesign).
 */
export function channelConfigEntry(revisionId: string, target: DeploymentTarget, q: QuantizedDesign): ChannelConfig {
  const sos = q.sos ?? [];
  const base = { revisionId, sampleRateHz: target.sampleRateHz };
  if (q.format === "f32") {
    return { ...base, format: "f32", sections: sos.map((r) => [r[0], r[1], r[2], 1, r[4], r[5]]) };
  }
  const words = q.integers ?? [];
  const sections = words.map((w, i) => ({ words: w, shift: q.shifts[i] }));
  return q.format === "q15" ? { ...base, format: "q15", sections } : { ...base, format: "q31", sections };
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
