import { commentSafe } from "./names";
import type { ExportTarget, PreparedExport } from "./types";

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
  f32: "direct form II transposed, 2 float states per section",
  q15: "direct form I (DF1 with a 64-bit accumulator), 4 word states per section",
  q31: "direct form I (DF1 with a 64-bit accumulator), 4 word states per section",
};

const utc = (d: Date) => `${d.toISOString().slice(0, 19).replace("T", " ")} UTC`;

/** Name-value lines describing an export, for the comment block of the C header and the scipy file. */
export function describeExport(p: PreparedExport): string[] {
  const s = p.source;
  const q = p.quantized;
  const lines = [
    `Set:          ${commentSafe(JSON.stringify(s.setName))} (set id ${s.setId})`,
    `Revision:     r${s.revision} (revision id ${s.revisionId})`,
    `Channel:      ${commentSafe(s.channel)}`,
    `Sample rate:  ${q.sampleRateHz} Hz`,
    `Structure:    ${STRUCTURE_TEXT[p.target]}`,
    `Format:       ${FORMAT_TEXT[p.target]}`,
    `Sections:     ${q.shifts.length}`,
    `Post-shifts:  ${p.target === "f32" ? "none (f32)" : q.shifts.join(", ")}`,
    `Approved:     ${s.approval ? `by ${commentSafe(s.approval.by)} at ${utc(s.approval.at)}` : "not approved"}`,
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
