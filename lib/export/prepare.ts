import { sectionsDesign, deployability } from "@/lib/coefficients";
import { quantizeDesign, stability, type QuantizedDesign } from "@/lib/dsp";
import { canonicalJson } from "@/lib/protocol";
import { exportName } from "./names";
import { ExportRefusal, type CoefficientContent, type ExportSource, type ExportTarget, type PreparedExport } from "./types";

/**
 * The hashed coefficient content of a quantized sections design (see CoefficientContent): what
 * firmware loads, with nothing about who made it, so equal coefficients hash equal.
 */
export function coefficientContent(q: QuantizedDesign): CoefficientContent {
  const base = { v: 1 as const, sampleRateHz: q.sampleRateHz };
  if (q.format === "f32") {
    return { ...base, format: "f32", structure: "df2t", sections: (q.sos ?? []).map((r) => [r[0], r[1], r[2], r[4], r[5]]) };
  }
  const words = q.integers ?? [];
  return { ...base, format: q.format, structure: "df1", sections: words.map((w, i) => ({ words: w, shift: q.shifts[i] })) };
}

/** Lowercase hex SHA-256 of canonicalJson(content) (RFC 8785 rules; Web Crypto, so any runtime agrees). */
export async function contentHash(content: CoefficientContent): Promise<string> {
  const digest = await crypto.subtle.digest("SHA-256", new TextEncoder().encode(canonicalJson(content)));
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, "0")).join("");
}

/** The stored quantized form when it is for this target, else the design's sections quantized afresh. */
function quantizedFor(source: ExportSource, target: ExportTarget): QuantizedDesign {
  if (source.storedFormat === target && source.storedQuantized?.sos) return source.storedQuantized;
  try {
    return quantizeDesign(sectionsDesign(source.design), target);
  } catch (err) {
    throw new ExportRefusal(`r${source.revision} cannot be quantized for ${target}: ${(err as Error).message}`);
  }
}

/**
 * Quantizes a revision for a target and checks it: the float design and the quantized sections
 * must both be stable for the verdict `stable` (firmware formats refuse otherwise, see assertFirmwareSafe).
 */
export async function prepareExport(source: ExportSource, target: ExportTarget, prefix?: string): Promise<PreparedExport> {
  const quantized = quantizedFor(source, target);
  const verdict = deployability(stability(source.design).stable, quantized);
  const content = coefficientContent(quantized);
  return {
    source,
    target,
    quantized,
    stable: verdict.ok,
    instability: verdict.ok ? undefined : verdict.reason,
    content,
    contentHash: await contentHash(content),
    name: exportName(source.setName, source.revision, target, prefix),
  };
}

/** Throws ExportRefusal for an export that must not reach firmware. */
export function assertFirmwareSafe(p: PreparedExport): void {
  if (!p.stable) {
    throw new ExportRefusal(`r${p.source.revision} is not exported for firmware (${p.target}): ${p.instability}.`);
  }
}
