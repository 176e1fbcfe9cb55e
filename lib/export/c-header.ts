import { DIFFERENCE_EQUATION, SIGN_CONVENTION, describeExport, specLines } from "./describe";
import { floatLiteral, wordLiteral } from "./literals";
import type { PreparedExport } from "./types";

const FIXED = {
  q15: { word: "int16_t", bits: 15, min: "-32768", max: "32767" },
  q31: { word: "int32_t", bits: 31, min: "(-2147483647 - 1)", max: "2147483647" },
} as const;

function commentBlock(p: PreparedExport): string[] {
  const fixed = p.target === "f32" ? null : FIXED[p.target];
  const arithmetic = fixed
    ? [
        "Arithmetic of one section (bit-true with Tapwright's fixed-point model), s = " + fixed.bits + " - shift:",
        `  acc  = b0*x + b1*x1 + b2*x2 - a1*y1 - a2*y2   exact products, 64-bit accumulator`,
        "  acc += 1 << (s - 1)                           round half up ...",
        "  y    = acc >> s                               ... by an arithmetic shift right",
        `  y    = saturate(y) to [${fixed.min}, ${fixed.max}]`,
        "  then x2 = x1, x1 = x, y2 = y1, y1 = y; y is the next section's x.",
        `Words: coefficient = word * 2^(shift - ${fixed.bits}); input and output are Q${fixed.bits} words.`,
        "The accumulator wraps modulo 2^64 like a 64-bit register (it only can for Q31).",
      ]
    : [
        "Arithmetic of one section, direct form II transposed, all in float (d1, d2 start at 0):",
        "  y  = b0*x + d1;  d1 = b1*x - a1*y + d2;  d2 = b2*x - a2*y",
        "Float literals carry 9 significant digits, so they round-trip float32 exactly.",
      ];
  const lines = [
    "Tapwright coefficient export. Generated; do not edit by hand.",
    "",
    ...describeExport(p),
    "",
    "Sign convention:",
    ...SIGN_CONVENTION.map((l) => `  ${l}`),
    `Coefficient order: five per section, b0, b1, b2, a1, a2, section 0 first (input side).`,
    "",
    ...arithmetic,
    "",
    "Design inputs (spec):",
    ...specLines(p).map((l) => `  ${l}`),
  ];
  return ["/*", ...lines.map((l) => (l ? ` * ${l}` : " *")), " */"];
}

function coefficientRows(p: PreparedExport): string[] {
  const q = p.quantized;
  if (p.target === "f32") {
    return (q.sos ?? []).map((r, k) => `    /* section ${k} */ ${[r[0], r[1], r[2], r[4], r[5]].map(floatLiteral).join(", ")},`);
  }
  return (q.integers ?? []).map((w, k) => `    /* section ${k} */ ${w.map(wordLiteral).join(", ")},`);
}

function fixedStep(n: string, N: string, fixed: (typeof FIXED)["q15" | "q31"]): string[] {
  return [
    `/* Reference step: one input word through every section, as documented above.`,
    ` * state: ${N}_STATE_WORDS words, 4 per section {x1, x2, y1, y2}, all 0 at start.`,
    ` * Needs an arithmetic right shift of negative int64_t and modulo conversion from uint64_t,`,
    ` * which GCC, Clang and the usual embedded compilers provide on two's-complement targets. */`,
    `static inline ${fixed.word} ${n}_step(${fixed.word} state[], ${fixed.word} x)`,
    "{",
    "    int64_t v = x;",
    `    for (int k = 0; k < ${N}_SECTIONS; k++) {`,
    `        const ${fixed.word} *c = &${n}_coeffs[5 * k];`,
    `        ${fixed.word} *st = &state[4 * k];`,
    `        const int s = ${fixed.bits} - ${n}_shifts[k];`,
    "        uint64_t acc = (uint64_t)1 << (s - 1);",
    "        acc += (uint64_t)((int64_t)c[0] * v);",
    "        acc += (uint64_t)((int64_t)c[1] * st[0]);",
    "        acc += (uint64_t)((int64_t)c[2] * st[1]);",
    "        acc -= (uint64_t)((int64_t)c[3] * st[2]);  /* a1: subtracted */",
    "        acc -= (uint64_t)((int64_t)c[4] * st[3]);  /* a2: subtracted */",
    "        int64_t y = (int64_t)acc >> s;",
    `        if (y > ${fixed.max}) y = ${fixed.max};`,
    `        if (y < ${fixed.min}) y = ${fixed.min};`,
    "        st[1] = st[0];",
    `        st[0] = (${fixed.word})v;`,
    "        st[3] = st[2];",
    `        st[2] = (${fixed.word})y;`,
    "        v = y;",
    "    }",
    `    return (${fixed.word})v;`,
    "}",
  ];
}

function floatStep(n: string, N: string): string[] {
  return [
    "/* Reference step: one input sample through every section, direct form II transposed.",
    ` * state: ${N}_STATE_WORDS floats, 2 per section {d1, d2}, all 0 at start. */`,
    `static inline float ${n}_step(float state[], float x)`,
    "{",
    "    float v = x;",
    `    for (int k = 0; k < ${N}_SECTIONS; k++) {`,
    `        const float *c = &${n}_coeffs[5 * k];`,
    "        float *d = &state[2 * k];",
    "        const float y = c[0] * v + d[0];",
    "        d[0] = c[1] * v - c[3] * y + d[1];  /* a1: subtracted */",
    "        d[1] = c[2] * v - c[4] * y;         /* a2: subtracted */",
    "        v = y;",
    "    }",
    "    return v;",
    "}",
  ];
}

/**
 * The C header of a prepared export: include guard, comment block (provenance, hash, sign
 * convention, arithmetic, spec), #defines, the coefficient and shift arrays, and a static inline
 * reference step function. C99 with <stdint.h>.
 */
export function renderCHeader(p: PreparedExport): string {
  const n = p.name;
  const N = n.toUpperCase();
  const guard = `TAPWRIGHT_${N}_H`;
  const sections = p.quantized.shifts.length;
  const fixed = p.target === "f32" ? null : FIXED[p.target];
  const statePerSection = fixed ? 4 : 2;
  const defines = [
    `#define ${N}_SECTIONS ${sections}`,
    `#define ${N}_SAMPLE_RATE_HZ ${Number.isInteger(p.quantized.sampleRateHz) ? p.quantized.sampleRateHz.toFixed(1) : p.quantized.sampleRateHz}`,
    `#define ${N}_STATE_WORDS (${statePerSection} * ${N}_SECTIONS)`,
    ...(fixed
      ? [`#define ${N}_FRACTION_BITS ${fixed.bits}`, ...p.quantized.shifts.map((s, k) => `#define ${N}_SHIFT_${k} ${s}`)]
      : []),
  ];
  const arrays = [
    `/* Five coefficients per section: b0, b1, b2, a1, a2. a1 and a2 are NOT negated: ${DIFFERENCE_EQUATION}. */`,
    `static const ${fixed ? fixed.word : "float"} ${n}_coeffs[5 * ${N}_SECTIONS] = {`,
    ...coefficientRows(p),
    "};",
    ...(fixed
      ? [
          "",
          `/* Post-shift per section: the words hold each coefficient divided by 2^shift. */`,
          `static const uint8_t ${n}_shifts[${N}_SECTIONS] = { ${p.quantized.shifts.map((_, k) => `${N}_SHIFT_${k}`).join(", ")} };`,
        ]
      : []),
  ];
  return [
    ...commentBlock(p),
    `#ifndef ${guard}`,
    `#define ${guard}`,
    "",
    ...(fixed ? ["#include <stdint.h>", ""] : []),
    ...defines,
    "",
    ...arrays,
    "",
    ...(fixed ? fixedStep(n, N, fixed) : floatStep(n, N)),
    "",
    `#endif /* ${guard} */`,
    "",
  ].join("\n");
}
