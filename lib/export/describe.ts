import { quantizedCounts } from "@/lib/coefficients";
import { quantizedParts } from "@/lib/dsp";
import { commentSafe } from "./names";
import type { ExportTarget, PreparedExport } from "./types";
import { formatDateTime } from "@/lib/format/date-time";

/** The difference equation every export states, in ASCII (a0 = 1). */
export const DIFFERENCE_EQUATION = "y[n] = b0*x[n] + b1*x[n-1] + b2*x[n-2] - a1*y[n-1] - a2*y[n-2]";

/** Our sign convention, in words: the same as scipy.signal sos rows and the RBJ cookbook. */
export const SIGN_CONVENTION = [
  `Each section computes ${DIFFERENCE_EQUATION}, with a0 = 1 (not stored).`,
  "a1 and a2 are stored exactly as they appear in that equation, NOT negated: the feedback terms",
  "are SUBTRACTED. Code that adds the feedback terms must use -a1 and -a2 instead.",
];

const FORMAT_TEXT: Record<ExportTarget, string> = {
  f32: "f32 (IEEE-754 single precision, float)",
  q15: "Q15 (int16_t words, 15 fraction bits)",
  q31: "Q31 (int32_t words, 31 fraction bits)",
};

const STRUCTURE_TEXT: Record<ExportTarget, string> = {
  f32: "sections in direct form II transposed, 2 float states per section; FIR stages in direct form",
  q15: "sections in direct form I (DF1 with a 64-bit accumulator), 4 word states per section; FIR stages in direct form",
  q31: "sections in direct form I (DF1 with a 64-bit accumulator), 4 word states per section; FIR stages in direct form",
};


/** Name-value lines describing an export, for the comment blocks of the C headers and the scipy file. */
export function describeExport(p: PreparedExport, structure = STRUCTURE_TEXT[p.target]): string[] {
  const s = p.source;
  const q = p.quantized;
  const parts = quantizedParts(q);
  const { sections, taps } = quantizedCounts(q);
  const lines = [
    `Set:          ${commentSafe(JSON.stringify(s.setName))} (set id ${s.setId})`,
    `Revision:     r${s.revision} (revision id ${s.revisionId})`,
    `Channel:      ${commentSafe(s.channel)}`,
    `Sample rate:  ${q.sampleRateHz} Hz`,
    `Structure:    ${structure}`,
    `Format:       ${FORMAT_TEXT[p.target]}`,
    `Stages:       ${parts.length}`,
    `Sections:     ${sections}`,
    `FIR taps:     ${taps}`,
    `Post-shifts:  ${p.target === "f32" ? "none (f32)" : parts.flatMap((part) => part.shifts).join(", ")}`,
    `Approved:     ${s.approval ? `by ${commentSafe(s.approval.by)} at ${formatDateTime(s.approval.at)}` : "not approved"}`,
    `Content hash: sha256:${p.contentHash}`,
    "              (SHA-256 of the RFC 8785 canonical JSON of the json export's \"coefficients\" object)",
  ];
  if (s.deployment) lines.push(`Production:   active deployment ${s.deployment.id}, deployment checksum ${s.deployment.checksum}`);
  if (!p.stable) lines.push(`WARNING:      NOT STABLE - ${commentSafe(p.instability ?? "")}`);
  return lines;
}

/** The design inputs as indented JSON lines, safe inside comments. */
export function specLines(p: PreparedExport): string[] {
  return JSON.stringify(p.source.spec, null, 2).split("\n").map(commentSafe);
}

/** Where stage k of an export comes from in its spec: `spec.stages[i]` of a chain, or the single spec. */
export function stageSource(p: PreparedExport, k: number): string {
  return p.source.spec.kind === "chain" ? `spec.stages[${p.specStages[k]}]` : "the spec";
}
