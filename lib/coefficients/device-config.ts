import { quantizeDesign, stability, type FilterDesign, type QuantizedDesign } from "@/lib/dsp";
import { canonicalJson, checksumSubject, type ConfigFormat, type DeviceConfig, type UnsignedDeviceConfig } from "@/lib/protocol";
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
 * The device config v1 for a quantized sections design, without its checksum. f32: SOS rows with
 * a0 = 1; Q15/Q31: words [b0, b1, b2, a1, a2] and the section's post-shift, in our sign convention
 * (y = b0·x + … − a1·y₋₁ − a2·y₋₂, lib/dsp quantizeDesign).
 */
export function unsignedDeviceConfig(revisionId: string, target: DeploymentTarget, q: QuantizedDesign): UnsignedDeviceConfig {
  const sos = q.sos ?? [];
  const base = { v: 1 as const, revisionId, channel: target.channelKey, sampleRateHz: target.sampleRateHz };
  if (q.format === "f32") {
    return { ...base, format: "f32", sections: sos.map((r) => [r[0], r[1], r[2], 1, r[4], r[5]]) };
  }
  const words = q.integers ?? [];
  const sections = words.map((w, i) => ({ words: w, shift: q.shifts[i] }));
  return q.format === "q15" ? { ...base, format: "q15", sections } : { ...base, format: "q31", sections };
}

/** Lowercase hex SHA-256 of the canonical JSON of the config without its checksum (Web Crypto, so browser and Node agree). */
export async function configChecksum(config: DeviceConfig | UnsignedDeviceConfig): Promise<string> {
  const bytes = new TextEncoder().encode(canonicalJson(checksumSubject(config)));
  const digest = await crypto.subtle.digest("SHA-256", bytes);
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, "0")).join("");
}

/** The config with its checksum, ready to publish. */
export async function signDeviceConfig(config: UnsignedDeviceConfig): Promise<DeviceConfig> {
  return { ...config, checksum: await configChecksum(config) } as DeviceConfig;
}
