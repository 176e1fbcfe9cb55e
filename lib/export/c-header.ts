import { DIFFERENCE_EQUATION, SIGN_CONVENTION, describeExport, specLines, stageSource } from "./describe";
import { floatLiteral, rateLiteral, wordLiteral } from "./literals";
import type { PreparedExport } from "./types";

const FIXED = {
  q15: { word: "int16_t", bits: 15, min: "-32768", max: "32767" },
  q31: { word: "int32_t", bits: 31, min: "(-2147483647 - 1)", max: "2147483647" },
} as const;
type Fixed = (typeof FIXED)["q15" | "q31"];

/** Where each stage of the content sits in the header: its kind and the sections it owns, or its taps and state. */
type StageLayout =
  | { kind: "sections"; k: number; first: number; count: number; shifts: number[]; rows: string[][] }
  | { kind: "fir"; k: number; count: number; shift: number; taps: string[]; history: number };

/** The content's stages laid out for C: sections numbered across the whole chain, FIR histories after the section states. */
function layout(p: PreparedExport): StageLayout[] {
  let first = 0;
  let history = 0;
  return p.content.stages.map((stage, k): StageLayout => {
    if (stage.kind === "fir") {
      const taps = Array.isArray(stage.taps) ? stage.taps.map(floatLiteral) : stage.taps.words.map(wordLiteral);
      const shift = Array.isArray(stage.taps) ? 0 : stage.taps.shift;
      const out: StageLayout = { kind: "fir", k, count: taps.length, shift, taps, history };
      history += taps.length - 1;
      return out;
    }
    const rows = stage.sections.map((s) => (Array.isArray(s) ? s.map(floatLiteral) : s.words.map(wordLiteral)));
    const shifts = stage.sections.map((s) => (Array.isArray(s) ? 0 : s.shift));
    const out: StageLayout = { kind: "sections", k, first, count: rows.length, shifts, rows };
    first += rows.length;
    return out;
  });
}

function stageLines(p: PreparedExport, stages: StageLayout[]): string[] {
  return stages.map((s) =>
    s.kind === "sections"
      ? `  stage ${s.k}: ${stageSource(p, s.k)}, ${s.count === 1 ? `1 section (section ${s.first})` : `${s.count} sections (sections ${s.first}-${s.first + s.count - 1})`}`
      : `  stage ${s.k}: ${stageSource(p, s.k)}, FIR, ${s.count} tap${s.count === 1 ? "" : "s"}${p.target === "f32" ? "" : `, post-shift ${s.shift}`}`,
  );
}

function commentBlock(p: PreparedExport, stages: StageLayout[]): string[] {
  const fixed = p.target === "f32" ? null : FIXED[p.target];
  const arithmetic = fixed
    ? [
        "Arithmetic of one section (bit-true with Tapwright's fixed-point model), s = " + fixed.bits + " - shift:",
        `  acc  = b0*x + b1*x1 + b2*x2 - a1*y1 - a2*y2   exact products, 64-bit accumulator`,
        "  acc += 1 << (s - 1)                           round half up ...",
        "  y    = acc >> s                               ... by an arithmetic shift right",
        `  y    = saturate(y) to [${fixed.min}, ${fixed.max}]`,
        "  then x2 = x1, x1 = x, y2 = y1, y1 = y; y is the next section's x.",
        "Arithmetic of one FIR stage: acc = h0*x + h1*x1 + ... + h(N-1)*x(N-1) over the stage's last N - 1",
        "  input words, then the same rounding, shift and saturation with the stage's post-shift.",
        `Words: coefficient = word * 2^(shift - ${fixed.bits}); input and output are Q${fixed.bits} words.`,
        "The accumulator wraps modulo 2^64 like a 64-bit register (it only can for Q31).",
      ]
    : [
        "Arithmetic of one section, direct form II transposed, all in float (d1, d2 start at 0):",
        "  y  = b0*x + d1;  d1 = b1*x - a1*y + d2;  d2 = b2*x - a2*y",
        "Arithmetic of one FIR stage, direct form in float: y = h0*x + h1*x1 + ... + h(N-1)*x(N-1).",
        "Float literals carry 9 significant digits, so they round-trip float32 exactly.",
      ];
  const lines = [
    "Tapwright coefficient export. Generated; do not edit by hand.",
    "",
    ...describeExport(p),
    "",
    "Stages, run in this order (each stage's output is the next stage's input):",
    ...stageLines(p, stages),
    "",
    "Sign convention:",
    ...SIGN_CONVENTION.map((l) => `  ${l}`),
    `Coefficient order: five per section, b0, b1, b2, a1, a2, section 0 first (input side);`,
    "FIR taps h0 (newest input) first.",
    "",
    ...arithmetic,
    "",
    "Design inputs (spec):",
    ...specLines(p).map((l) => `  ${l}`),
  ];
  return ["/*", ...lines.map((l) => (l ? ` * ${l}` : " *")), " */"];
}

function defines(p: PreparedExport, N: string, stages: StageLayout[], fixed: Fixed | null): string[] {
  const sections = stages.reduce((n, s) => n + (s.kind === "sections" ? s.count : 0), 0);
  const firs = stages.filter((s) => s.kind === "fir");
  const history = firs.map((s) => `(${N}_STAGE_${s.k}_TAPS - 1)`);
  return [
    `#define ${N}_STAGES ${stages.length}`,
    `#define ${N}_SECTIONS ${sections}`,
    `#define ${N}_TAPS ${firs.reduce((n, s) => n + s.count, 0)}`,
    `#define ${N}_SAMPLE_RATE_HZ ${rateLiteral(p.quantized.sampleRateHz)}`,
    `#define ${N}_STATE_WORDS (${[`${fixed ? 4 : 2} * ${N}_SECTIONS`, ...history].join(" + ")})`,
    ...(fixed ? [`#define ${N}_FRACTION_BITS ${fixed.bits}`] : []),
    ...stages.flatMap((s) =>
      s.kind === "sections"
        ? [`#define ${N}_STAGE_${s.k}_SECTIONS ${s.count}`, `#define ${N}_STAGE_${s.k}_FIRST ${s.first}`]
        : [`#define ${N}_STAGE_${s.k}_TAPS ${s.count}`, ...(fixed ? [`#define ${N}_STAGE_${s.k}_SHIFT ${s.shift}`] : [])],
    ),
    ...(fixed ? stages.flatMap((s) => (s.kind === "sections" ? s.shifts.map((shift, i) => `#define ${N}_SHIFT_${s.first + i} ${shift}`) : [])) : []),
  ];
}

function arrays(n: string, N: string, stages: StageLayout[], fixed: Fixed | null): string[] {
  const type = fixed ? fixed.word : "float";
  const sectionStages = stages.filter((s) => s.kind === "sections");
  const out: string[] = [];
  if (sectionStages.length) {
    out.push(
      `/* Five coefficients per section: b0, b1, b2, a1, a2. a1 and a2 are NOT negated: ${DIFFERENCE_EQUATION}. */`,
      `static const ${type} ${n}_coeffs[5 * ${N}_SECTIONS] = {`,
      ...sectionStages.flatMap((s) => s.rows.map((r, i) => `    /* stage ${s.k}, section ${s.first + i} */ ${r.join(", ")},`)),
      "};",
    );
    if (fixed) {
      const names = sectionStages.flatMap((s) => s.shifts.map((_, i) => `${N}_SHIFT_${s.first + i}`));
      out.push("", `/* Post-shift per section: the words hold each coefficient divided by 2^shift. */`, `static const uint8_t ${n}_shifts[${N}_SECTIONS] = { ${names.join(", ")} };`);
    }
  }
  for (const s of stages) {
    if (s.kind !== "fir") continue;
    const rows = Array.from({ length: Math.ceil(s.taps.length / 8) }, (_, r) => `    ${s.taps.slice(8 * r, 8 * r + 8).join(", ")},`);
    if (out.length) out.push("");
    out.push(
      `/* Stage ${s.k}: FIR taps h0 (newest input) ... h${s.count - 1}${fixed ? `, each word the tap divided by 2^${N}_STAGE_${s.k}_SHIFT` : ""}. */`,
      `static const ${type} ${n}_stage_${s.k}_taps[${N}_STAGE_${s.k}_TAPS] = {`,
      ...rows,
      "};",
    );
  }
  return out;
}

function fixedHelpers(n: string, stages: StageLayout[], fixed: Fixed): string[] {
  const w = fixed.word;
  const saturate = [`    if (y > ${fixed.max}) y = ${fixed.max};`, `    if (y < ${fixed.min}) y = ${fixed.min};`];
  const out: string[] = [];
  if (stages.some((s) => s.kind === "sections")) {
    out.push(
      `/* Sections first ... first + count - 1, each with 4 state words {x1, x2, y1, y2} at state[4 * k]. */`,
      `static inline int64_t ${n}_sections(int64_t v, int first, int count, ${w} state[])`,
      "{",
      "    for (int k = first; k < first + count; k++) {",
      `        const ${w} *c = &${n}_coeffs[5 * k];`,
      `        ${w} *st = &state[4 * k];`,
      `        const int s = ${fixed.bits} - ${n}_shifts[k];`,
      "        uint64_t acc = (uint64_t)1 << (s - 1);",
      "        acc += (uint64_t)((int64_t)c[0] * v);",
      "        acc += (uint64_t)((int64_t)c[1] * st[0]);",
      "        acc += (uint64_t)((int64_t)c[2] * st[1]);",
      "        acc -= (uint64_t)((int64_t)c[3] * st[2]);  /* a1: subtracted */",
      "        acc -= (uint64_t)((int64_t)c[4] * st[3]);  /* a2: subtracted */",
      "        int64_t y = (int64_t)acc >> s;",
      ...saturate.map((l) => `    ${l}`),
      "        st[1] = st[0];",
      `        st[0] = (${w})v;`,
      "        st[3] = st[2];",
      `        st[2] = (${w})y;`,
      "        v = y;",
      "    }",
      "    return v;",
      "}",
    );
  }
  if (stages.some((s) => s.kind === "fir")) {
    if (out.length) out.push("");
    out.push(
      `/* One FIR stage of n taps; hist holds its last n - 1 input words, newest first. */`,
      `static inline int64_t ${n}_fir(int64_t v, const ${w} taps[], int n, int shift, ${w} hist[])`,
      "{",
      `    const int s = ${fixed.bits} - shift;`,
      "    uint64_t acc = (uint64_t)1 << (s - 1);",
      "    acc += (uint64_t)((int64_t)taps[0] * v);",
      "    for (int i = 1; i < n; i++) acc += (uint64_t)((int64_t)taps[i] * hist[i - 1]);",
      "    for (int i = n - 1; i > 1; i--) hist[i - 1] = hist[i - 2];",
      `    if (n > 1) hist[0] = (${w})v;`,
      "    int64_t y = (int64_t)acc >> s;",
      ...saturate,
      "    return y;",
      "}",
    );
  }
  return out;
}

function floatHelpers(n: string, stages: StageLayout[]): string[] {
  const out: string[] = [];
  if (stages.some((s) => s.kind === "sections")) {
    out.push(
      `/* Sections first ... first + count - 1, direct form II transposed, 2 state floats {d1, d2} at state[2 * k]. */`,
      `static inline float ${n}_sections(float v, int first, int count, float state[])`,
      "{",
      "    for (int k = first; k < first + count; k++) {",
      `        const float *c = &${n}_coeffs[5 * k];`,
      "        float *d = &state[2 * k];",
      "        const float y = c[0] * v + d[0];",
      "        d[0] = c[1] * v - c[3] * y + d[1];  /* a1: subtracted */",
      "        d[1] = c[2] * v - c[4] * y;         /* a2: subtracted */",
      "        v = y;",
      "    }",
      "    return v;",
      "}",
    );
  }
  if (stages.some((s) => s.kind === "fir")) {
    if (out.length) out.push("");
    out.push(
      `/* One FIR stage of n taps; hist holds its last n - 1 inputs, newest first. */`,
      `static inline float ${n}_fir(float v, const float taps[], int n, float hist[])`,
      "{",
      "    float y = taps[0] * v;",
      "    for (int i = 1; i < n; i++) y += taps[i] * hist[i - 1];",
      "    for (int i = n - 1; i > 1; i--) hist[i - 1] = hist[i - 2];",
      "    if (n > 1) hist[0] = v;",
      "    return y;",
      "}",
    );
  }
  return out;
}

/** The reference step: one input through every stage in order, each with its part of the state. */
function step(n: string, N: string, stages: StageLayout[], fixed: Fixed | null): string[] {
  const type = fixed ? fixed.word : "float";
  const perSection = fixed ? 4 : 2;
  const calls = stages.map((s) => {
    if (s.kind === "sections") return `    v = ${n}_sections(v, ${N}_STAGE_${s.k}_FIRST, ${N}_STAGE_${s.k}_SECTIONS, state);`;
    const hist = `&state[${perSection} * ${N}_SECTIONS + ${s.history}]`;
    const shift = fixed ? `${N}_STAGE_${s.k}_SHIFT, ` : "";
    return `    v = ${n}_fir(v, ${n}_stage_${s.k}_taps, ${N}_STAGE_${s.k}_TAPS, ${shift}${hist});`;
  });
  return [
    `/* Reference step: one input ${fixed ? "word" : "sample"} through every stage in order, as documented above.`,
    ` * state: ${N}_STATE_WORDS ${fixed ? "words" : "floats"}, all 0 at start: ${perSection} per section (section k at ${perSection} * k),`,
    ` * then each FIR stage's last N - 1 inputs.${fixed ? "" : " */"}`,
    ...(fixed
      ? [
          ` * Needs an arithmetic right shift of negative int64_t and modulo conversion from uint64_t,`,
          ` * which GCC, Clang and the usual embedded compilers provide on two's-complement targets. */`,
        ]
      : []),
    `static inline ${type} ${n}_step(${type} state[], ${type} x)`,
    "{",
    `    ${fixed ? "int64_t" : "float"} v = x;`,
    ...calls,
    `    return ${fixed ? `(${type})v` : "v"};`,
    "}",
  ];
}

/**
 * The C header of a prepared export: include guard, comment block (provenance, hash, stages, sign
 * convention, arithmetic, spec), #defines (stage counts, sections, taps, shifts), the coefficient,
 * shift and per-FIR-stage tap arrays, and static inline reference functions running every stage in
 * order. C99 with <stdint.h>.
 */
export function renderCHeader(p: PreparedExport): string {
  const n = p.name;
  const N = n.toUpperCase();
  const guard = `TAPWRIGHT_${N}_H`;
  const fixed = p.target === "f32" ? null : FIXED[p.target];
  const stages = layout(p);
  return [
    ...commentBlock(p, stages),
    `#ifndef ${guard}`,
    `#define ${guard}`,
    "",
    ...(fixed ? ["#include <stdint.h>", ""] : []),
    ...defines(p, N, stages, fixed),
    "",
    ...arrays(n, N, stages, fixed),
    "",
    ...(fixed ? fixedHelpers(n, stages, fixed) : floatHelpers(n, stages)),
    "",
    ...step(n, N, stages, fixed),
    "",
    `#endif /* ${guard} */`,
    "",
  ].join("\n");
}
