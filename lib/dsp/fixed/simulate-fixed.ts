/**
 * Bit-true model of the fixed-point arithmetic that firmware must match (Q15 or Q31, B = 16 or 32
 * bits, F = B − 1 fraction bits). Common embedded practice (biquad DF1 with a wide accumulator),
 * with the rounding and saturation choices stated here.
 *
 * Input: each sample x becomes the word round(x·2^F) (nearest, ties away from zero), saturated
 * to [−2^F, 2^F − 1]; a sample that hits a limit (i.e. lies outside [−1, 1 − 2^−F] after rounding)
 * counts as an overflow. Non-finite samples are rejected (firmware only ever sees words).
 *
 * Each second-order section, direct form I, state = its last two input words x1, x2 and last two
 * output words y1, y2 (all start at 0); coefficient words in OUR sign convention (see
 * QuantizedDesign; firmware storing −a1, −a2 adds those products instead):
 *   acc = b0·x + b1·x1 + b2·x2 − a1·y1 − a2·y2            (exact products, wide accumulator)
 *   acc = acc + 2^(s − 1),  s = F − shift                   (round half up …)
 *   out = acc >> s                                           (… by arithmetic shift right = floor)
 *   out = saturate(out) to [−2^F, 2^F − 1]                   (a hit counts as an overflow)
 *   x2 = x1, x1 = x, y2 = y1, y1 = out (the saturated word), and out feeds the next section.
 * FIR designs: one "section" acc = Σ h[k]·x[n − k] over the input-word history, then the same
 * rounding, shift by F − shift and saturation. The output sample is the last word · 2^−F.
 *
 * Accumulator:
 * - Q15: 64-bit in firmware. Here float64, which is exact: each product is at most
 *   2^15·2^15 = 2^30 in magnitude, a biquad sums 5 of them plus 2^(s−1) < 2^14, so |acc| < 2^33,
 *   and a FIR of N ≤ 2^22 taps stays below 2^52; every integer below 2^53 is a double, so every
 *   sum is exact, and floor(acc / 2^s) is exact too. A 64-bit accumulator never wraps here.
 * - Q31: 64-bit two's complement in firmware, as in common embedded libraries (2.62 format with
 *   one guard bit); products reach 2^62, beyond float64's 53 bits, so this model uses BigInt.
 *   The exact sum, rounding constant included, is wrapped to 64 bits (BigInt.asIntN) like the
 *   hardware would, and each wrap counts as an overflow.
 * This is the `tapwright` arithmetic; the CMSIS-DSP library's kernels (`cmsis`, `cmsis-fast`) are
 * modelled in library-kernels.ts, on the same input words.
 */
import type { FixedArithmetic } from "./arithmetic";
import { fixedStages, type FixedStage } from "./fixed-stages";
import { runLibraryKernels } from "./library-kernels";
import { fractionBits, toWord, wordLimits } from "./q-format";
import type { QuantizedDesign } from "./quantize-design";

export interface FixedSimulation {
  /** Output samples as real values (last section's words · 2^−F). */
  y: Float64Array;
  /** Saturations of inputs and section outputs, plus accumulator wraps (and, for the library's kernels, wrapped outputs). */
  overflows: number;
}

/** Q15 in exact float64 integer arithmetic. */
function runQ15(stages: FixedStage[], inputs: number[], count: { overflows: number }): number[] {
  const { min, max } = wordLimits("q15");
  const xs = stages.map((s) => new Array<number>(s.b.length).fill(0));
  const ys = stages.map(() => [0, 0]);
  return inputs.map((input) => {
    let v = input;
    stages.forEach((stage, k) => {
      const hx = xs[k];
      hx.pop();
      hx.unshift(v);
      const s = 15 - stage.shift;
      let acc = 2 ** (s - 1);
      for (let i = 0; i < hx.length; i++) acc += stage.b[i] * hx[i];
      if (stage.a.length) acc -= stage.a[0] * ys[k][0] + stage.a[1] * ys[k][1];
      let out = Math.floor(acc / 2 ** s);
      if (out > max || out < min) {
        count.overflows++;
        out = out > max ? max : min;
      }
      ys[k] = [out, ys[k][0]];
      v = out;
    });
    return v;
  });
}

/** Q31 with BigInt: exact products, 64-bit wrapping accumulator. */
function runQ31(stages: FixedStage[], inputs: number[], count: { overflows: number }): number[] {
  const { min, max } = wordLimits("q31");
  const [lo, hi] = [BigInt(min), BigInt(max)];
  const big = stages.map((s) => ({ b: s.b.map(BigInt), a: s.a.map(BigInt), s: BigInt(31 - s.shift) }));
  const xs = stages.map((s) => new Array<bigint>(s.b.length).fill(0n));
  const ys = stages.map(() => [0n, 0n]);
  return inputs.map((input) => {
    let v = BigInt(input);
    big.forEach((stage, k) => {
      const hx = xs[k];
      hx.pop();
      hx.unshift(v);
      let exact = 1n << (stage.s - 1n);
      for (let i = 0; i < hx.length; i++) exact += stage.b[i] * hx[i];
      if (stage.a.length) exact -= stage.a[0] * ys[k][0] + stage.a[1] * ys[k][1];
      const acc = BigInt.asIntN(64, exact);
      if (acc !== exact) count.overflows++;
      let out = acc >> stage.s;
      if (out > hi || out < lo) {
        count.overflows++;
        out = out > hi ? hi : lo;
      }
      ys[k] = [out, ys[k][0]];
      v = out;
    });
    return Number(v);
  });
}

/**
 * Run a Q15 or Q31 quantized design on x (real values, full scale ±1) exactly as firmware would: in
 * our arithmetic (see header), or in the CMSIS-DSP library's standard or fast kernels (library-kernels.ts).
 */
export function simulateFixed(q: QuantizedDesign, x: Float64Array, arithmetic: FixedArithmetic = "tapwright"): FixedSimulation {
  if (q.format === "f32") {
    throw new Error("simulateFixed models Q15/Q31 words; an f32 design has none (run its sos with filterSignal)");
  }
  const format = q.format;
  const stages = fixedStages(q, format);
  const count = { overflows: 0 };
  const inputs = Array.from(x, (v) => {
    const { word, saturated } = toWord(v, format);
    if (saturated) count.overflows++;
    return word;
  });
  const words =
    arithmetic !== "tapwright"
      ? runLibraryKernels(stages, format, inputs, arithmetic === "cmsis-fast", count)
      : format === "q15"
        ? runQ15(stages, inputs, count)
        : runQ31(stages, inputs, count);
  const scale = 2 ** fractionBits(format);
  return { y: Float64Array.from(words, (w) => w / scale), overflows: count.overflows };
}
