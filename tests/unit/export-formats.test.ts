import { describe, expect, it } from "vitest";
import { canonicalJson } from "@/lib/protocol";
import { parseCoefficientText, quantizedParts } from "@/lib/dsp";
import {
  ExportRefusal,
  commentSafe,
  contentHash,
  floatLiteral,
  identifierStem,
  prepareExport,
  renderExport,
  wordLiteral,
} from "@/lib/export";
import { humChain } from "./coefficients-support";
import { butter4, chainWithFir, sourceFor } from "./export-support";

/** Significant digits of a C float literal such as -0.0618851967f or 1.00000000e-12f. */
const significantDigits = (lit: string) => lit.replace(/[eE].*$|f$/g, "").replace(/[-.]/g, "").replace(/^0+/, "").length;
const FLOAT_LITERAL = /^-?\d+\.\d+(e[+-]\d+)?f$/;

/** A pole pair at radius 1.0001: unstable as designed (typed coefficients). */
const unstable = { kind: "coefficients" as const, sos: [[1, 0, 0, 1, -1.9, 1.0002]], sampleRateHz: 1000 };

describe("identifiers and literals", () => {
  it("makes C identifier stems from free text", () => {
    expect(identifierStem("Hum notch 50 Hz")).toBe("hum_notch_50_hz");
    expect(identifierStem("__x__")).toBe("x");
    expect(identifierStem("3-axis")).toBe("f_3_axis");
    expect(identifierStem("µ/µ")).toBe("filter");
  });

  it("writes float32 literals with 9 significant digits and an f suffix that round-trip", () => {
    for (const v of [0.1, -1.3209134312346578, 1e-12, 3.4e38, 0].map(Math.fround)) {
      const lit = floatLiteral(v);
      expect(lit).toMatch(FLOAT_LITERAL);
      if (v !== 0) expect(significantDigits(lit)).toBe(9);
      expect(Math.fround(Number(lit.slice(0, -1)))).toBe(v);
    }
  });

  it("writes INT32_MIN without a long literal, and keeps comment text inside the comment", () => {
    expect(wordLiteral(-2147483648)).toBe("(-2147483647 - 1)");
    expect(wordLiteral(-32768)).toBe("-32768");
    expect(commentSafe("a */ b\nc µ")).toBe("a * / b\\u000ac \\u00b5");
  });
});

describe("C header text", () => {
  it("q15: guard, defines, five words per section, shifts, comment fields and the sign convention", async () => {
    const p = await prepareExport(sourceFor(butter4), "q15");
    const { body, filename, contentType } = renderExport(p, "c-header");
    expect(filename).toBe("torque_lp_r3_q15.h");
    expect(contentType).toMatch(/^text\/x-c/);
    expect(body).toMatch(/#ifndef TAPWRIGHT_TORQUE_LP_R3_Q15_H\n#define TAPWRIGHT_TORQUE_LP_R3_Q15_H\n/);
    expect(body.trimEnd().endsWith("#endif /* TAPWRIGHT_TORQUE_LP_R3_Q15_H */")).toBe(true);
    expect(body).toContain("#define TORQUE_LP_R3_Q15_SECTIONS 2\n");
    expect(body).toContain("#define TORQUE_LP_R3_Q15_SAMPLE_RATE_HZ 1000.0\n");
    p.quantized.shifts.forEach((s, k) => expect(body).toContain(`#define TORQUE_LP_R3_Q15_SHIFT_${k} ${s}\n`));
    const array = /static const int16_t torque_lp_r3_q15_coeffs\[5 \* TORQUE_LP_R3_Q15_SECTIONS\] = \{([\s\S]*?)\};/.exec(body);
    const words = (array?.[1] ?? "").replace(/\/\*.*?\*\//g, "").split(",").map((s) => s.trim()).filter(Boolean).map(Number);
    expect(words).toEqual(p.quantized.integers?.flat());
    expect(words).toHaveLength(10);
    for (const field of [
      'Set:          "Torque LP" (set id 7)',
      "Revision:     r3 (revision id 41)",
      "Channel:      gearbox-endurance/torque-node/input-torque",
      "Sample rate:  1000 Hz",
      "DF1 with a 64-bit accumulator",
      `Post-shifts:  ${p.quantized.shifts.join(", ")}`,
      "Approved:     by Lena Lead at 2026-11-30 09:15:00 UTC",
      `Content hash: sha256:${p.contentHash}`,
      "y[n] = b0*x[n] + b1*x[n-1] + b2*x[n-2] - a1*y[n-1] - a2*y[n-2]",
      "NOT negated",
      '"cutoffHz": 100',
    ]) {
      expect(body).toContain(field);
    }
    expect(body).toContain("static inline int16_t torque_lp_r3_q15_step(int16_t state[], int16_t x)");
  });

  it("f32: float array of 5 per section, every literal with 9 digits and an f suffix", async () => {
    const p = await prepareExport(sourceFor(butter4), "f32");
    const body = renderExport(p, "c-header").body;
    const array = /static const float torque_lp_r3_f32_coeffs\[5 \* TORQUE_LP_R3_F32_SECTIONS\] = \{([\s\S]*?)\};/.exec(body);
    const literals = (array?.[1] ?? "").replace(/\/\*.*?\*\//g, "").split(",").map((s) => s.trim()).filter(Boolean);
    expect(literals).toHaveLength(10);
    literals.forEach((l) => {
      expect(l).toMatch(FLOAT_LITERAL);
      expect(significantDigits(l)).toBe(9);
    });
    const rows = p.quantized.sos ?? [];
    expect(literals.map((l) => Math.fround(Number(l.slice(0, -1))))).toEqual(rows.flatMap((r) => [r[0], r[1], r[2], r[4], r[5]]));
    expect(body).toContain("direct form II transposed");
    expect(body).not.toContain("SHIFT_");
  });

  it("says 'not approved' without an approval, and escapes the set name in the comment", async () => {
    const p = await prepareExport({ ...sourceFor(butter4), approval: null, setName: "x */ y" }, "q31");
    const body = renderExport(p, "c-header").body;
    expect(body).toContain("Approved:     not approved");
    expect(body.indexOf("*/")).toBe(body.indexOf(" */\n#ifndef") + 1);
  });

it("chain, q15: the header holds every stage in order, with the FIR's taps as their own array", async () => {
    const p = await prepareExport(sourceFor(chainWithFir, "q15", "Chain"), "q15");
    const body = renderExport(p, "c-header").body;
    expect(body).toContain("#define CHAIN_R3_Q15_STAGES 4\n");
    expect(body).toContain("#define CHAIN_R3_Q15_SECTIONS 4\n");
    expect(body).toContain("#define CHAIN_R3_Q15_TAPS 63\n");
    expect(body).toContain(`#define CHAIN_R3_Q15_STAGE_1_SHIFT ${p.quantized.stages?.[1].shifts[0]}\n`);
    const taps = /chain_r3_q15_stage_1_taps\[CHAIN_R3_Q15_STAGE_1_TAPS\] = \{([\s\S]*?)\};/.exec(body)?.[1] ?? "";
    expect(taps.split(",").map((t) => t.trim()).filter(Boolean).map(Number)).toEqual(p.quantized.stages?.[1].integers?.[0].map((w) => w + 0)); // -0 words print as 0
    expect(body.indexOf("chain_r3_q15_sections(v, CHAIN_R3_Q15_STAGE_0_FIRST")).toBeLessThan(body.indexOf("chain_r3_q15_fir(v, chain_r3_q15_stage_1_taps"));
    expect(body.indexOf("chain_r3_q15_fir(v, chain_r3_q15_stage_1_taps")).toBeLessThan(body.indexOf("chain_r3_q15_sections(v, CHAIN_R3_Q15_STAGE_2_FIRST"));
  });

  it("refuses firmware formats for an unstable design, but still writes scipy arrays with a warning", async () => {
    const p = await prepareExport(sourceFor(unstable, "f32"), "f32");
    expect(p.stable).toBe(false);
    expect(() => renderExport(p, "c-header")).toThrow(ExportRefusal);
    expect(() => renderExport(p, "json")).toThrow(/not exported for firmware/);
    expect(renderExport(p, "scipy").body).toContain("WARNING:      NOT STABLE");
  });
});

describe("JSON and scipy forms", () => {
  it("JSON carries the header's fields, and its coefficients object is what the hash covers", async () => {
    const p = await prepareExport(sourceFor(butter4), "q15");
    const doc = JSON.parse(renderExport(p, "json").body);
    expect(doc).toMatchObject({
      name: "torque_lp_r3_q15",
      set: { id: 7, name: "Torque LP" },
      revision: { id: 41, number: 3 },
      channel: "gearbox-endurance/torque-node/input-torque",
      sampleRateHz: 1000,
      target: "q15",
      structure: "df1",
      fractionBits: 15,
      signConvention: { order: ["b0", "b1", "b2", "a1", "a2"], feedbackNegated: false },
      approval: { by: "Lena Lead", at: "2026-11-30T09:15:00.000Z" },
      spec: butter4,
    });
    expect(doc).toMatchObject({ v: 2, specStages: [0], coefficients: { v: 2, format: "q15", structure: "df1", sampleRateHz: 1000 } });
    expect(doc.coefficients.stages).toHaveLength(1);
    expect(doc.coefficients.stages[0].sections.map((s: { words: number[] }) => s.words)).toEqual(p.quantized.integers);
    expect(doc.coefficients.stages[0].sections.map((s: { shift: number }) => s.shift)).toEqual(p.quantized.shifts);
    expect(doc.contentHash).toBe(await contentHash(doc.coefficients));
    const bytes = new TextEncoder().encode(canonicalJson(doc.coefficients));
    const digest = Buffer.from(await crypto.subtle.digest("SHA-256", bytes)).toString("hex");
    expect(doc.contentHash).toBe(digest);
  });

  it("scipy form parses back with parseCoefficientText to the exact quantized sos, with fs", async () => {
    for (const target of ["f32", "q15", "q31"] as const) {
      const p = await prepareExport(sourceFor(butter4), target);
      const file = renderExport(p, "scipy");
      expect(file.contentType).toMatch(/^text\/x-python/);
      expect(file.filename).toBe(`torque_lp_r3_${target}_sos.py`);
      expect(file.body).toContain("fs = 1000.0  # Hz\n");
      expect(parseCoefficientText(file.body.slice(file.body.indexOf("sos = ")))).toEqual(p.quantized.sos);
    }
  });

  it("JSON of a chain: every stage in order with the spec stage it comes from, FIR taps as one word list with one shift", async () => {
    const bypassed = { ...chainWithFir, stages: chainWithFir.kind === "chain" ? [{ ...chainWithFir.stages[0], bypassed: true }, ...chainWithFir.stages.slice(1)] : [] };
    const p = await prepareExport(sourceFor(bypassed, "q31", "Chain"), "q31");
    const doc = JSON.parse(renderExport(p, "json").body);
    expect(doc.specStages).toEqual([1, 2, 3]);
    expect(doc.coefficients.stages.map((s: { kind: string }) => s.kind)).toEqual(["fir", "sections", "sections"]);
    expect(doc.coefficients.stages[0].taps).toEqual({ words: p.quantized.stages?.[0].integers?.[0].map((w) => w + 0), shift: p.quantized.stages?.[0].shifts[0] });
    expect(doc.coefficients.stages[2].sections).toHaveLength(2);
    expect(doc.contentHash).toBe(await contentHash(doc.coefficients));
  });

  it("scipy form of a chain: one sos list of every section when there is no FIR stage, stage lists and `stages` otherwise", async () => {
    const sections = await prepareExport(sourceFor(humChain, "q15", "Chain"), "q15");
    const body = renderExport(sections, "scipy").body;
    expect(body).toContain("    # stage 2 (spec.stages[2]): 2 sections\n");
    expect(parseCoefficientText(body.slice(body.indexOf("sos = ")))).toEqual(quantizedParts(sections.quantized).flatMap((part) => part.sos ?? []));
    const withFir = await prepareExport(sourceFor(chainWithFir, "f32", "Chain"), "f32");
    const text = renderExport(withFir, "scipy").body;
    expect(text).not.toContain("sos = ");
    expect(text).toContain('stages = [("sos", stage_0), ("fir", stage_1), ("sos", stage_2), ("sos", stage_3)]\n');
    const fir = /stage_1 = (\[[^\n]*\])\n/.exec(text)?.[1] ?? "";
    expect(parseCoefficientText(fir)).toEqual(withFir.quantized.stages?.[1].taps);
  });

  it("uses the stored quantized form for its own format and requantizes for another", async () => {
    const source = sourceFor(butter4, "q15");
    expect((await prepareExport(source, "q15")).quantized).toBe(source.storedQuantized);
    expect((await prepareExport(source, "q31")).quantized.format).toBe("q31");
  });
});
