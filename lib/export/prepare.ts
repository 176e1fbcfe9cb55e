import { deployability, fixedConfigStage, floatConfigStage, quantizationFor } from "@/lib/coefficients";
import { quantizedParts, stability, type QuantizedDesign, type QuantizedPart } from "@/lib/dsp";
import { canonicalJson } from "@/lib/protocol";
import { exportName, identifierStem } from "./names";
import {
  ExportRefusal,
  type CoefficientContent,
  type ExportSource,
  type ExportTarget,
  type FloatContentStage,
  type PreparedExport,
} from "./types";

/** An f32 stage as exported: the configuration stage with each row's a0 = 1 left out ([b0, b1, b2, a1, a2]). */
function floatStage(part: QuantizedPart): FloatContentStage {
  const stage = floatConfigStage(part);
  return stage.kind === "fir" ? stage : { kind: "sections", sections: stage.sections.map((r) => [r[0], r[1], r[2], r[4], r[5]]) };
}

/**
 * The hashed coefficient content of a quantized design (see CoefficientContent): every stage in the
 * order it runs, what firmware loads, with nothing about who made it, so equal coefficients hash equal.
 */
export function coefficientContent(q: QuantizedDesign): CoefficientContent {
  const parts = quantizedParts(q);
  const base = { v: 2 as const, sampleRateHz: q.sampleRateHz };
  if (q.format === "f32") return { ...base, format: "f32", structure: "df2t", stages: parts.map(floatStage) };
  return { ...base, format: q.format, structure: "df1", stages: parts.map(fixedConfigStage) };
}

/** Lowercase hex SHA-256 of canonicalJson(content) (RFC 8785 rules; Web Crypto, so any runtime agrees). */
export async function contentHash(content: CoefficientContent): Promise<string> {
  const digest = await crypto.subtle.digest("SHA-256", new TextEncoder().encode(canonicalJson(content)));
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, "0")).join("");
}

/** The revision's coefficients for the target (the stored ones for the format it was saved for, see quantizationFor). */
function quantizedFor(source: ExportSource, target: ExportTarget): QuantizedDesign {
  try {
    return quantizationFor({ design: source.design, format: source.storedFormat, quantized: source.storedQuantized }, target);
  } catch (err) {
    throw new ExportRefusal(`r${source.revision} cannot be quantized for ${target}: ${(err as Error).message}`);
  }
}

/**
 * Quantizes a revision for a target and checks it: the float design and the quantized coefficients
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
    stem: identifierStem(prefix ?? source.setName),
    specStages: quantized.stages?.map((s) => s.stage) ?? [0],
  };
}

/** Throws ExportRefusal for an export that must not reach firmware. */
export function assertFirmwareSafe(p: PreparedExport): void {
  if (!p.stable) {
    throw new ExportRefusal(`r${p.source.revision} is not exported for firmware (${p.target}): ${p.instability}.`);
  }
}
