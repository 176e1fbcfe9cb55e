import { describe, expect, it } from "vitest";
import { quantizedParts } from "@/lib/dsp";
import { cmsisInstances, defaultTarget, ExportRefusal, prepareExport, renderExport } from "@/lib/export";
import { exportQuerySchema } from "@/app/api/v1/revisions/[id]/export/schema";
import { butter4, chainAsymmetric, sourceFor } from "./export-support";

/** The numbers of a C array initialiser `name[...] = { … };`, comments dropped. */
function arrayWords(body: string, name: string): number[] {
  const m = new RegExp(`${name}\\[[^\\]]*\\] = \\{([\\s\\S]*?)\\};`).exec(body);
  if (!m) throw new Error(`no array ${name}`);
  return m[1].replace(/\/\*.*?\*\//g, "").split(",").map((s) => s.trim()).filter(Boolean).map((s) => Number(s.replace(/f$/, "")));
}

describe("cmsis-df1 / cmsis-df2t layouts (CMSIS-DSP documentation, from memory)", () => {
  it("Q15 biquads: {b0, 0, b1, b2, −a1, −a2} per section, one instance per run of equal post-shifts, sizes and init call", async () => {
    const p = await prepareExport(sourceFor(butter4), "q15");
    const { body, filename } = renderExport(p, "cmsis-df1");
    expect(filename).toBe("torque_lp_r3_q15_cmsis_df1.h");
    const parts = quantizedParts(p.quantized);
    const rows = parts[0].integers ?? [];
    const shifts = parts[0].shifts;
    expect(new Set(shifts).size).toBe(1); // this design's sections share one post-shift: one instance
    expect(body).toContain('#include "arm_math.h"');
    expect(body).toContain(`#define TORQUE_LP_R3_Q15_I0_NUM_STAGES ${rows.length}\n#define TORQUE_LP_R3_Q15_I0_POST_SHIFT ${shifts[0]}\n`);
    expect(arrayWords(body, "torque_lp_r3_q15_i0_coeffs")).toEqual(rows.flatMap(([b0, b1, b2, a1, a2]) => [b0, 0, b1, b2, -a1, -a2]));
    expect(body).toContain("static q15_t torque_lp_r3_q15_i0_state[4 * TORQUE_LP_R3_Q15_I0_NUM_STAGES];");
    const init = "arm_biquad_cascade_df1_init_q15(&torque_lp_r3_q15_i0, TORQUE_LP_R3_Q15_I0_NUM_STAGES, torque_lp_r3_q15_i0_coeffs, torque_lp_r3_q15_i0_state, TORQUE_LP_R3_Q15_I0_POST_SHIFT);";
    expect(body).toContain(` *   ${init}`); // in the comment …
    expect(body).toContain(`static inline void torque_lp_init(void)\n{\n    ${init}\n}`); // … and in the stable wrapper
    expect(body).toContain("static arm_biquad_casd_df1_inst_q15 torque_lp_r3_q15_i0;");
    expect(body).toContain("static inline void torque_lp_run_fast(const q15_t *in, q15_t *out)\n{\n    arm_biquad_cascade_df1_fast_q15(&torque_lp_r3_q15_i0, in, out, TORQUE_LP_BLOCK_SIZE);");
    expect(body).toContain('"Biquad Cascade IIR Filters Using Direct Form I Structure"');
  });

  it("Q31 and f32: five per section; DF2T f32 has 2 state values per section and no post-shift", async () => {
    const q31 = await prepareExport(sourceFor(butter4), "q31");
    const rows = q31.quantized.integers ?? [];
    expect(arrayWords(renderExport(q31, "cmsis-df1").body, "torque_lp_r3_q31_i0_coeffs")).toEqual(rows.flatMap(([b0, b1, b2, a1, a2]) => [b0, b1, b2, -a1, -a2]));
    const f32 = await prepareExport(sourceFor(butter4), "f32");
    const body = renderExport(f32, "cmsis-df2t").body;
    const sos = f32.quantized.sos ?? [];
    expect(arrayWords(body, "torque_lp_r3_f32_i0_coeffs").map(Math.fround)).toEqual(sos.flatMap(([b0, b1, b2, , a1, a2]) => [b0, b1, b2, -a1, -a2]));
    expect(body).toContain("static float32_t torque_lp_r3_f32_i0_state[2 * TORQUE_LP_R3_F32_I0_NUM_STAGES];");
    expect(body).not.toContain("POST_SHIFT");
    expect(body).toContain("arm_biquad_cascade_df2T_init_f32(&torque_lp_r3_f32_i0,");
    expect(body).not.toContain("_run_fast"); // the library has no fast float kernels
  });

  it("FIR stages: taps time-reversed, Q15 padded to an even count of at least 4, state numTaps + blockSize − 1", async () => {
    const p = await prepareExport(sourceFor(chainAsymmetric, "q15", "Chain"), "q15");
    const body = renderExport(p, "cmsis-df1").body;
    const taps = quantizedParts(p.quantized)[0].integers?.[0] ?? [];
    expect(taps).toHaveLength(5);
    expect(arrayWords(body, "chain_r3_q15_i0_coeffs")).toEqual([0, ...[...taps].reverse()]);
    expect(body).toContain("#define CHAIN_R3_Q15_I0_NUM_TAPS 6\n");
    expect(body).toContain("static q15_t chain_r3_q15_i0_state[CHAIN_R3_Q15_I0_NUM_TAPS + CHAIN_BLOCK_SIZE - 1];");
    expect(body).toContain("#ifndef CHAIN_BLOCK_SIZE\n#define CHAIN_BLOCK_SIZE 32\n#endif");
    const q31 = await prepareExport(sourceFor(chainAsymmetric, "q31", "Chain"), "q31");
    expect(cmsisInstances(q31, "df1")[0]).toMatchObject({ kind: "fir", numTaps: 5, padded: 0 });
    // The block runs in[] → instance 0 → tmp → instance 1 → out[].
    expect(body).toContain("    arm_fir_q15(&chain_r3_q15_i0, in, chain_r3_q15_tmp, CHAIN_BLOCK_SIZE);\n    arm_biquad_cascade_df1_q15(&chain_r3_q15_i1, chain_r3_q15_tmp, out, CHAIN_BLOCK_SIZE);");
  });

  it("refuses what the library cannot hold, with the reason", async () => {
    // Taps of magnitude ≥ 1 need a post-shift, which the library's FIR lacks.
    const diff = await prepareExport(sourceFor({ kind: "differentiator", sampleRateHz: 1000 }), "q15");
    expect(() => renderExport(diff, "cmsis-df1")).toThrow(ExportRefusal);
    expect(() => renderExport(diff, "cmsis-df1")).toThrow(/no post-shift/);
    // a1 = −1 quantizes to the word −32768 at post-shift 0: negated, it does not fit Q15.
    const edge = await prepareExport(sourceFor({ kind: "coefficients", sos: [[0.25, 0, 0, 1, -1, 0.5]], sampleRateHz: 1000 }), "q15");
    expect(edge.quantized.integers?.[0][3]).toBe(-32768);
    expect(() => renderExport(edge, "cmsis-df1")).toThrow(/no negation in Q15/);
    const q15 = await prepareExport(sourceFor(butter4), "q15");
    expect(() => renderExport(q15, "cmsis-df2t")).toThrow(/takes target f32/);
  });

  it("query: a target the format does not take is a 400 issue; no target means the device's, or f32 for DF2T", () => {
    const bad = exportQuerySchema.safeParse({ format: "cmsis-df2t", target: "q15" });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0]).toMatchObject({ path: ["target"], message: "format cmsis-df2t takes target f32 (got q15)" });
    expect(defaultTarget("cmsis-df2t", "q15")).toBe("f32");
    expect(defaultTarget("cmsis-df1", "q31")).toBe("q31");
  });
});

describe("CSV export", () => {
  it("one row per coefficient: stage, spec stage, kind, section, name, exact value, word, shift", async () => {
    const p = await prepareExport(sourceFor(chainAsymmetric, "q15", "Chain"), "q15");
    const { body, filename, contentType } = renderExport(p, "csv");
    expect(filename).toBe("chain_r3_q15.csv");
    expect(contentType).toMatch(/^text\/csv/);
    const lines = body.split("\r\n");
    expect(lines[0]).toBe("stage,spec_stage,kind,section,coefficient,value,word,shift");
    expect(lines.at(-1)).toBe("");
    const [fir, sections] = quantizedParts(p.quantized);
    const tapWords = fir.integers?.[0] ?? [];
    expect(lines[1]).toBe(`0,0,fir,,h0,${tapWords[0] * 2 ** (fir.shifts[0] - 15)},${tapWords[0]},${fir.shifts[0]}`);
    const [b0, , , a1] = sections.integers?.[0] ?? [];
    expect(lines[1 + tapWords.length]).toBe(`1,1,sections,0,b0,${b0 * 2 ** (sections.shifts[0] - 15)},${b0},${sections.shifts[0]}`);
    expect(lines[1 + tapWords.length + 3]).toMatch(new RegExp(`^1,1,sections,0,a1,[-0-9.e]+,${a1},`));
    expect(lines).toHaveLength(1 + tapWords.length + 5 + 1);
  });
});
