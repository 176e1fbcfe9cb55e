import { wordLimits } from "@/lib/dsp";
import { floatLiteral, wordLiteral } from "./literals";
import { ExportRefusal, FORMAT_TARGETS, type ExportTarget, type PreparedExport } from "./types";

/**
 * The layouts of the open-source CMSIS-DSP library's filter kernels, from its documentation as we
 * remember it (pages named beside each rule; from memory, the library was not at hand):
 * - "Biquad Cascade IIR Filters Using Direct Form I Structure": each biquad computes
 *   y = b0·x + b1·x1 + b2·x2 + a1·y1 + a2·y2 (feedback ADDED, so a1, a2 are ours negated); Q15
 *   coefficients {b0, 0, b1, b2, a1, a2} per biquad (6, the 0 pads for the dual 16-bit multiply), Q31
 *   and f32 {b0, b1, b2, a1, a2} (5); state {x1, x2, y1, y2} per biquad (4·numStages); one postShift
 *   per instance for Q15/Q31, the words holding each coefficient divided by 2^postShift.
 * - "Biquad Cascade IIR Filters Using a Direct Form II Transposed Structure": f32 only here,
 *   {b0, b1, b2, a1, a2} per biquad with a1, a2 negated likewise; state {d1, d2} per biquad (2·numStages).
 * - "Finite Impulse Response (FIR) Filters": coefficients in time-reversed order
 *   {h[N−1], …, h[1], h[0]}; state numTaps + blockSize − 1; no post-shift; arm_fir_init_q15 wants
 *   numTaps even and at least 4 (pad with zero coefficients, which leaves the response unchanged).
 */
export type CmsisStructure = "df1" | "df2t";

/** One library instance: a biquad cascade (a run of sections sharing a post-shift) or an FIR. */
export type CmsisInstance =
  | { kind: "biquad"; index: number; stage: number; firstSection: number; numStages: number; postShift: number; rows: string[][] }
  | { kind: "fir"; index: number; stage: number; numTaps: number; padded: number; coeffs: string[] };

/** The library's names for one target and structure. */
export interface CmsisNames {
  type: string;
  biquad: { run: string; fast: string | null; init: string; instance: string; coeffsPerStage: number; statePerStage: number };
  fir: { run: string; fast: string | null; init: string; instance: string };
}

const TYPES: Record<ExportTarget, string> = { q15: "q15_t", q31: "q31_t", f32: "float32_t" };

/** Function, type and size names of the library for a target (CMSIS-DSP naming, from memory). */
export function cmsisNames(structure: CmsisStructure, target: ExportTarget): CmsisNames {
  const fixed = target !== "f32";
  const biquad =
    structure === "df1"
      ? {
          run: `arm_biquad_cascade_df1_${target}`,
          fast: fixed ? `arm_biquad_cascade_df1_fast_${target}` : null,
          init: `arm_biquad_cascade_df1_init_${target}`,
          instance: `arm_biquad_casd_df1_inst_${target}`,
          coeffsPerStage: target === "q15" ? 6 : 5,
          statePerStage: 4,
        }
      : {
          run: `arm_biquad_cascade_df2T_${target}`,
          fast: null,
          init: `arm_biquad_cascade_df2T_init_${target}`,
          instance: `arm_biquad_cascade_df2T_instance_${target}`,
          coeffsPerStage: 5,
          statePerStage: 2,
        };
  const fir = { run: `arm_fir_${target}`, fast: fixed ? `arm_fir_fast_${target}` : null, init: `arm_fir_init_${target}`, instance: `arm_fir_instance_${target}` };
  return { type: TYPES[target], biquad, fir };
}

/** A word negated for the library's added feedback; −2^F has no negation in range. */
function negatedWord(w: number, p: PreparedExport, where: string): string {
  if (p.target === "f32") throw new Error("negatedWord takes Q15/Q31 words");
  if (w === wordLimits(p.target).min) {
    throw new ExportRefusal(`${where}: the word ${w} has no negation in ${p.target.toUpperCase()}, which the library's biquad needs (it adds the feedback terms).`);
  }
  return wordLiteral(-w);
}

/** Q15 FIR length for arm_fir_init_q15: even and at least 4 (from memory of its page). */
const q15FirLength = (n: number) => Math.max(4, n + (n % 2));

/**
 * The library instances of a prepared export, in the order they run: each sections stage split into
 * runs of sections that share a post-shift (the library has one postShift per instance; the words stay
 * exactly the reviewed ones), each FIR stage one instance. Throws ExportRefusal for what the library
 * cannot hold (an FIR quantized with a post-shift, a feedback word −2^F, a structure/target pair it lacks).
 */
export function cmsisInstances(p: PreparedExport, structure: CmsisStructure): CmsisInstance[] {
  const allowed = FORMAT_TARGETS[`cmsis-${structure}`];
  if (!allowed.includes(p.target)) throw new ExportRefusal(`cmsis-${structure} takes target ${allowed.join(" or ")} (got ${p.target}).`);
  const out: CmsisInstance[] = [];
  p.content.stages.forEach((stage, k) => {
    if (stage.kind === "fir") {
      const words = Array.isArray(stage.taps) ? null : stage.taps;
      if (words && words.shift !== 0) {
        throw new ExportRefusal(
          `stage ${k} is an FIR with taps of magnitude 1 or more (post-shift ${words.shift}); the library's ${p.target.toUpperCase()} FIR has no post-shift. Export it as f32, or lower that stage's gain.`,
        );
      }
      const taps = words ? words.words.map(wordLiteral) : (stage.taps as number[]).map(floatLiteral);
      const length = p.target === "q15" ? q15FirLength(taps.length) : taps.length;
      const zero = p.target === "f32" ? floatLiteral(0) : "0";
      const coeffs = [...Array<string>(length - taps.length).fill(zero), ...taps.reverse()];
      out.push({ kind: "fir", index: out.length, stage: k, numTaps: length, padded: length - taps.length, coeffs });
      return;
    }
    const sections = stage.sections.map((s, i) => {
      const where = `stage ${k}, section ${i}`;
      if (Array.isArray(s)) return { shift: 0, row: [s[0], s[1], s[2], -s[3], -s[4]].map(floatLiteral) };
      const [b0, b1, b2, a1, a2] = s.words;
      const b = [b0, b1, b2].map(wordLiteral);
      const a = [negatedWord(a1, p, `${where}, a1`), negatedWord(a2, p, `${where}, a2`)];
      return { shift: s.shift, row: p.target === "q15" ? [b[0], "0", b[1], b[2], ...a] : [...b, ...a] };
    });
    sections.forEach((s, i) => {
      const last = out[out.length - 1];
      if (i > 0 && last?.kind === "biquad" && last.postShift === s.shift) {
        last.numStages++;
        last.rows.push(s.row);
      } else {
        out.push({ kind: "biquad", index: out.length, stage: k, firstSection: i, numStages: 1, postShift: s.shift, rows: [s.row] });
      }
    });
  });
  return out;
}
