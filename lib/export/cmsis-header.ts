import { arithmeticLabel } from "@/lib/dsp";
import { cmsisInstances, cmsisNames, type CmsisInstance, type CmsisNames, type CmsisStructure } from "./cmsis-layout";
import { describeExport, specLines, stageSource } from "./describe";
import { rateLiteral } from "./literals";
import type { PreparedExport } from "./types";

/** Block size the FIR state is sized for when the firmware does not define its own. */
export const DEFAULT_BLOCK_SIZE = 32;

const STRUCTURE_NAME: Record<CmsisStructure, string> = {
  df1: "biquads in direct form I",
  df2t: "biquads in direct form II transposed",
};

/** Identifiers of one instance: `name_i<k>` and `NAME_I<k>`. */
const ids = (n: string, i: CmsisInstance) => ({ low: `${n}_i${i.index}`, up: `${n.toUpperCase()}_I${i.index}` });

function instanceLine(p: PreparedExport, i: CmsisInstance, names: CmsisNames): string {
  const from = stageSource(p, i.stage);
  if (i.kind === "fir") {
    const pad = i.padded ? `, ${i.padded} zero coefficient${i.padded === 1 ? "" : "s"} added for ${names.fir.init}` : "";
    return `  instance ${i.index}: ${names.fir.run}, ${i.numTaps} taps (stage ${i.stage}, ${from}${pad})`;
  }
  const last = i.firstSection + i.numStages - 1;
  const secs = i.numStages === 1 ? `section ${i.firstSection}` : `sections ${i.firstSection}-${last}`;
  const shift = p.target === "f32" ? "" : `, postShift ${i.postShift}`;
  return `  instance ${i.index}: ${names.biquad.run}, ${i.numStages} biquad${i.numStages === 1 ? "" : "s"} (stage ${i.stage}, ${from}, ${secs})${shift}`;
}

/** The documented conventions the header follows, each with the documentation page it comes from. */
function conventionLines(p: PreparedExport, structure: CmsisStructure, names: CmsisNames): string[] {
  const order = p.target === "q15" ? "{b0, 0, b1, b2, a1, a2}, 6 per biquad (the 0 pads for the dual 16-bit multiply)" : "{b0, b1, b2, a1, a2}, 5 per biquad";
  const page = structure === "df1" ? "Biquad Cascade IIR Filters Using Direct Form I Structure" : "Biquad Cascade IIR Filters Using a Direct Form II Transposed Structure";
  const lines = [
    `From the library's documentation, from memory (the pages named; check them for your library version):`,
    `- "${page}":`,
    "    y[n] = b0*x[n] + b1*x[n-1] + b2*x[n-2] + a1*y[n-1] + a2*y[n-2]: the feedback is ADDED, so a1",
    "    and a2 below are Tapwright's (and scipy's) a1 and a2 NEGATED.",
    `    Coefficients ${order}, biquad 0 first.`,
    structure === "df1" ? "    State {x[n-1], x[n-2], y[n-1], y[n-2]}, 4 per biquad." : "    State {d1, d2}, 2 per biquad.",
  ];
  if (p.target !== "f32") {
    lines.push(
      `    postShift: each word is the coefficient divided by 2^postShift; the kernel shifts its`,
      `    accumulator back. One postShift per instance, so sections with different shifts are separate instances.`,
    );
  }
  lines.push(
    `- "Finite Impulse Response (FIR) Filters": coefficients in time-reversed order {h[N-1], ..., h[1], h[0]}`,
    "    (h[0] multiplies the newest input); state numTaps + blockSize - 1; no post-shift.",
  );
  if (p.target === "q15") lines.push(`    ${names.fir.init} takes an even numTaps of at least 4: zero coefficients are added at the old end.`);
  lines.push(`- Init functions take a const coefficient pointer; library versions with a non-const one need a cast.`);
  if (p.target !== "f32") {
    lines.push(
      "",
      "Arithmetic (the documented \"Scaling and Overflow Behavior\" of each kernel; Tapwright's bit-true model:",
      `simulateFixed with arithmetic "cmsis" and "cmsis-fast"):`,
      `  ${arithmeticLabel("cmsis", p.target)}`,
      `  ${arithmeticLabel("cmsis-fast", p.target)}`,
      "  The library truncates where Tapwright's own arithmetic rounds to nearest: outputs may differ by",
      "  a few LSB from the C header export, never in the coefficients.",
    );
  }
  return lines;
}

/** The library calls of one header: each instance's init, and the per-block runs from in[] to out[] through tmp[]. */
function calls(p: PreparedExport, instances: CmsisInstance[], names: CmsisNames, fast: boolean): { init: string[]; run: string[] } {
  const n = p.name;
  const B = `${p.stem.toUpperCase()}_BLOCK_SIZE`;
  const init = instances.map((i) => {
    const { low, up } = ids(n, i);
    if (i.kind === "fir") return `${names.fir.init}(&${low}, ${up}_NUM_TAPS, ${low}_coeffs, ${low}_state, ${B});`;
    const shift = names.type === "float32_t" ? "" : `, ${up}_POST_SHIFT`;
    return `${names.biquad.init}(&${low}, ${up}_NUM_STAGES, ${low}_coeffs, ${low}_state${shift});`;
  });
  const last = instances.length - 1;
  const dst = (k: number) => ((last - k) % 2 === 0 ? "out" : `${n}_tmp`);
  const kernel = (i: CmsisInstance) => (i.kind === "fir" ? names.fir : names.biquad);
  const run = instances.map((i, k) => `${(fast && kernel(i).fast) || kernel(i).run}(&${ids(n, i).low}, ${k === 0 ? "in" : dst(k - 1)}, ${dst(k)}, ${B});`);
  return { init, run };
}

/** The usage comment: the stable wrappers, and the library calls they make. */
function usageLines(p: PreparedExport, instances: CmsisInstance[], names: CmsisNames): string[] {
  const { init, run } = calls(p, instances, names, false);
  const B = `${p.stem.toUpperCase()}_BLOCK_SIZE`;
  const fast = [names.biquad.fast, names.fir.fast].filter((f) => f !== null);
  return [
    `Use (C99 with the library's arm_math.h), names stable from revision to revision:`,
    `  ${p.stem}_init();            once: initialises every instance (zeroes the state)`,
    `  ${p.stem}_run(in, out);      each block of ${B} samples (${names.type} arrays)`,
    ...(fast.length ? [`  ${p.stem}_run_fast(in, out); the same with the fast kernels (${fast.join(", ")})`] : []),
    `Define ${B} before including this header to change it (default ${DEFAULT_BLOCK_SIZE}; FIR state depends on it).`,
    "Include this header in the one C file that runs the filter: it defines the arrays and instances.",
    `${p.stem}_init() makes these init calls:`,
    ...init.map((l) => `  ${l}`),
    `${p.stem}_run(in, out) makes these calls${instances.length > 1 ? ` (${p.name}_tmp holds a block between instances)` : ""}:`,
    ...run.map((l) => `  ${l}`),
  ];
}

/** Static instances and the stable wrappers that initialise and run them. */
function wrappers(p: PreparedExport, instances: CmsisInstance[], names: CmsisNames): string[] {
  const kernel = (i: CmsisInstance) => (i.kind === "fir" ? names.fir : names.biquad);
  const B = `${p.stem.toUpperCase()}_BLOCK_SIZE`;
  const body = (lines: string[]) => lines.map((l) => `    ${l}`);
  const run = (suffix: string, fast: boolean) => [
    "",
    `static inline void ${p.stem}_run${suffix}(const ${names.type} *in, ${names.type} *out)`,
    "{",
    ...body(calls(p, instances, names, fast).run),
    "}",
  ];
  const { init } = calls(p, instances, names, false);
  return [
    ...instances.map((i) => `static ${kernel(i).instance} ${ids(p.name, i).low};`),
    ...(instances.length > 1 ? [`static ${names.type} ${p.name}_tmp[${B}];`] : []),
    "",
    `static inline void ${p.stem}_init(void)`,
    "{",
    ...body(init),
    "}",
    ...run("", false),
    ...(names.biquad.fast ? run("_fast", true) : []),
  ];
}

function arrays(p: PreparedExport, i: CmsisInstance, names: CmsisNames): string[] {
  const { low, up } = ids(p.name, i);
  const B = `${p.stem.toUpperCase()}_BLOCK_SIZE`;
  if (i.kind === "fir") {
    const rows = Array.from({ length: Math.ceil(i.coeffs.length / 8) }, (_, r) => `    ${i.coeffs.slice(8 * r, 8 * r + 8).join(", ")},`);
    return [
      `#define ${up}_NUM_TAPS ${i.numTaps}`,
      `/* Instance ${i.index}: FIR taps time-reversed, h[${i.numTaps - 1}] first and h[0] (newest input) last. */`,
      `static const ${names.type} ${low}_coeffs[${up}_NUM_TAPS] = {`,
      ...rows,
      "};",
      `static ${names.type} ${low}_state[${up}_NUM_TAPS + ${B} - 1];`,
    ];
  }
  const b = names.biquad;
  const order = b.coeffsPerStage === 6 ? "b0, 0, b1, b2, a1, a2" : "b0, b1, b2, a1, a2";
  return [
    `#define ${up}_NUM_STAGES ${i.numStages}`,
    ...(names.type === "float32_t" ? [] : [`#define ${up}_POST_SHIFT ${i.postShift}`]),
    `/* Instance ${i.index}: per biquad ${order}; a1 and a2 NEGATED (the library adds the feedback terms). */`,
    `static const ${names.type} ${low}_coeffs[${b.coeffsPerStage} * ${up}_NUM_STAGES] = {`,
    ...i.rows.map((r, k) => `    /* section ${i.firstSection + k} */ ${r.join(", ")},`),
    "};",
    `static ${names.type} ${low}_state[${b.statePerStage} * ${up}_NUM_STAGES];`,
  ];
}

/**
 * A C header in the layouts of the CMSIS-DSP library's kernels (cmsis-layout.ts): provenance, the
 * documented conventions with their sources, a usage comment with the init calls, then per instance its
 * size constants, coefficient array and state array, in the order the instances run, and the library
 * instances with wrappers of stable names (<stem>_init, <stem>_run, <stem>_run_fast) that make those calls.
 */
export function renderCmsisHeader(p: PreparedExport, structure: CmsisStructure): string {
  const instances = cmsisInstances(p, structure);
  const names = cmsisNames(structure, p.target);
  const n = p.name;
  const N = n.toUpperCase();
  const guard = `TAPWRIGHT_${N}_CMSIS_${structure.toUpperCase()}_H`;
  const comment = [
    "Tapwright coefficient export in the layouts of the open-source CMSIS-DSP library. Generated; do not edit by hand.",
    "",
    ...describeExport(p, `CMSIS-DSP ${STRUCTURE_NAME[structure]} (${names.biquad.run}) and FIR stages (${names.fir.run})`),
    "",
    "Library instances, run in this order (each one's output is the next one's input):",
    ...instances.map((i) => instanceLine(p, i, names)),
    "",
    ...conventionLines(p, structure, names),
    "",
    ...usageLines(p, instances, names),
    "",
    "Design inputs (spec):",
    ...specLines(p).map((l) => `  ${l}`),
  ];
  return [
    "/*",
    ...comment.map((l) => (l ? ` * ${l}` : " *")),
    " */",
    `#ifndef ${guard}`,
    `#define ${guard}`,
    "",
    '#include "arm_math.h"',
    "",
    `#ifndef ${p.stem.toUpperCase()}_BLOCK_SIZE`,
    `#define ${p.stem.toUpperCase()}_BLOCK_SIZE ${DEFAULT_BLOCK_SIZE}`,
    "#endif",
    `#define ${N}_INSTANCES ${instances.length}`,
    `#define ${N}_SAMPLE_RATE_HZ ${rateLiteral(p.quantized.sampleRateHz)}`,
    "",
    ...instances.flatMap((i, k) => [...(k ? [""] : []), ...arrays(p, i, names)]),
    "",
    ...wrappers(p, instances, names),
    "",
    `#endif /* ${guard} */`,
    "",
  ].join("\n");
}
