import type { FixedFormat } from "./q-format";

/**
 * Whose fixed-point arithmetic a bit-true run models:
 * - `tapwright`: our own (see simulate-fixed.ts): DF1 with a 64-bit accumulator, rounded to nearest
 *   (half up) before the post-shift, saturated; FIR stages alike.
 * - `cmsis`: the kernels of the open-source CMSIS-DSP library, as its documentation describes them
 *   (arm_biquad_cascade_df1_q15/_q31, arm_fir_q15/_q31): truncation, no rounding; see library-kernels.ts.
 * - `cmsis-fast`: the library's "fast" kernels (arm_biquad_cascade_df1_fast_q15/_q31,
 *   arm_fir_fast_q15/_q31), with narrower 32-bit accumulators that wrap.
 */
export const FIXED_ARITHMETICS = ["tapwright", "cmsis", "cmsis-fast"] as const;
export type FixedArithmetic = (typeof FIXED_ARITHMETICS)[number];

/** The library kernels an arithmetic stands for, per kind of stage (the CMSIS-DSP function names). */
export function libraryKernels(arithmetic: Exclude<FixedArithmetic, "tapwright">, format: FixedFormat): { sections: string; fir: string } {
  const fast = arithmetic === "cmsis-fast" ? "fast_" : "";
  return { sections: `arm_biquad_cascade_df1_${fast}${format}`, fir: `arm_fir_${fast}${format}` };
}

/**
 * One line saying which arithmetic a fixed-point result shows, for the bench, the set page and the
 * export comments, e.g. "CMSIS-DSP arm_biquad_cascade_df1_q15 / arm_fir_q15: 64-bit accumulator, truncated, saturated".
 */
export function arithmeticLabel(arithmetic: FixedArithmetic, format: FixedFormat): string {
  const q = format.toUpperCase();
  if (arithmetic === "tapwright") return `Tapwright ${q}: DF1, 64-bit accumulator, rounded to nearest, saturated`;
  const { sections, fir } = libraryKernels(arithmetic, format);
  const how = {
    cmsis: { q15: "64-bit accumulator, truncated, saturated", q31: "64-bit accumulator (wraps), truncated; biquad output wraps, FIR output saturates" },
    "cmsis-fast": { q15: "32-bit accumulator (wraps), truncated, saturated", q31: "products truncated to 32 bits, 32-bit accumulator (wraps), saturated" },
  }[arithmetic][format];
  return `CMSIS-DSP ${sections} / ${fir}: ${how}`;
}
