/**
 * Bit-true model of the fixed-point kernels of the open-source CMSIS-DSP library, written from its
 * documentation as we remember it (the "Scaling and Overflow Behavior" notes of each function's page
 * in the groups "Biquad Cascade IIR Filters Using Direct Form I Structure" and "Finite Impulse
 * Response (FIR) Filters" — from memory; the library itself was not at hand). F = 15 or 31.
 *
 * Every kernel ADDS its feedback terms (y = b0·x + b1·x1 + b2·x2 + a1·y1 + a2·y2), so the library
 * stores −a1, −a2 of our (scipy) convention; a word −2^F has no negation in range and is refused.
 * Products are exact integers; "truncated" is an arithmetic shift right (floor). State is the last
 * input words and the last OUTPUT words after saturation or wrap, as in our model.
 *
 * Biquads (one post-shift p per section, the library's postShift):
 * - arm_biquad_cascade_df1_q15: 64-bit accumulator (34.30), y = sat16(acc >> (15 − p)).
 * - arm_biquad_cascade_df1_fast_q15: 32-bit accumulator (2.30) that wraps, y = sat16(acc >> (15 − p)).
 * - arm_biquad_cascade_df1_q31: 64-bit accumulator (2.62) that wraps, y = the low 32 bits of
 *   acc >> (31 − p) ("truncated to 1.31 by discarding the low 32 bits": no saturation, it wraps).
 * - arm_biquad_cascade_df1_fast_q31: each product keeps its high 32 bits (floor(b·x / 2^32), 2.30),
 *   summed in a 32-bit accumulator that wraps, y = sat32(acc · 2^(p + 1)).
 * FIR (no post-shift in the library; a stage quantized with one is refused):
 * - arm_fir_q15: 64-bit accumulator, y = sat16(acc >> 15).
 * - arm_fir_fast_q15: 32-bit accumulator that wraps, y = sat16(acc >> 15).
 * - arm_fir_q31: 64-bit accumulator (2.62) that wraps, y = sat32(acc >> 31).
 * - arm_fir_fast_q31: products as the fast biquad, 32-bit accumulator that wraps, y = sat32(acc · 2).
 * Overflows counted: every accumulator wrap, every saturated or wrapped output. Where the model and a
 * library build could differ (a documented "saturated" that a build wraps, or the reverse), the output
 * left the word range, so a run with no overflows is the same under either reading.
 *
 * Q15 sums stay exact in float64 (|acc| < 2^53 for up to 2^22 taps, see simulate-fixed.ts); Q31 uses BigInt.
 */
import type { FixedStage } from "./fixed-stages";
import { wordLimits, type FixedFormat } from "./q-format";

/** A stage as the library runs it: feedback words negated, the right shift of its output, FIR or not. */
interface LibraryStage {
  b: number[];
  a: number[];
  shift: number;
  fir: boolean;
}

/** The library's form of our stages; throws for what the library cannot hold (see the header). */
function libraryStages(stages: FixedStage[], format: FixedFormat): LibraryStage[] {
  const { min } = wordLimits(format);
  return stages.map((s, k) => {
    const fir = s.a.length === 0;
    if (fir && s.shift !== 0) {
      throw new Error(
        `stage ${k} is an FIR quantized with post-shift ${s.shift} (a tap of magnitude 1 or more); the library's ${format} FIR has no post-shift`,
      );
    }
    const a = s.a.map((w, i) => {
      if (w === min) throw new Error(`section ${k}: a${i + 1} word ${w} has no negation in ${format}, which the library's biquad needs`);
      return -w;
    });
    return { b: s.b, a, shift: s.shift, fir };
  });
}

/** v wrapped to a `bits`-bit two's-complement integer (v an integer below 2^53 in magnitude; exact). */
function wrapInt(v: number, bits: number): number {
  const m = 2 ** bits;
  const r = v - Math.floor(v / m) * m;
  return r >= m / 2 ? r - m : r;
}

interface Count {
  overflows: number;
}

/** Runs word histories through each stage in turn; `step` computes one stage's output from its histories. */
function runStages<S extends { b: readonly unknown[] }, T>(stages: S[], inputs: T[], zero: T, step: (stage: S, x: T[], y: T[]) => T): T[] {
  const xs = stages.map((s) => new Array<T>(s.b.length).fill(zero));
  const ys = stages.map(() => [zero, zero]);
  return inputs.map((input) => {
    let v = input;
    stages.forEach((stage, k) => {
      xs[k].pop();
      xs[k].unshift(v);
      const out = step(stage, xs[k], ys[k]);
      ys[k] = [out, ys[k][0]];
      v = out;
    });
    return v;
  });
}

function q15Kernels(stages: LibraryStage[], inputs: number[], fast: boolean, count: Count): number[] {
  const { min, max } = wordLimits("q15");
  return runStages(stages, inputs, 0, (stage, x, y) => {
    let exact = 0;
    for (let i = 0; i < x.length; i++) exact += stage.b[i] * x[i];
    for (let i = 0; i < stage.a.length; i++) exact += stage.a[i] * y[i];
    const acc = fast ? wrapInt(exact, 32) : exact;
    if (acc !== exact) count.overflows++;
    const out = Math.floor(acc / 2 ** (stage.fir ? 15 : 15 - stage.shift));
    if (out >= min && out <= max) return out;
    count.overflows++;
    return out > max ? max : min;
  });
}

function q31Kernels(stages: LibraryStage[], inputs: bigint[], fast: boolean, count: Count): bigint[] {
  const { min, max } = wordLimits("q31");
  const [lo, hi] = [BigInt(min), BigInt(max)];
  const saturate = (v: bigint) => {
    if (v >= lo && v <= hi) return v;
    count.overflows++;
    return v > hi ? hi : lo;
  };
  const wrapped = (v: bigint, bits: number) => {
    const w = BigInt.asIntN(bits, v);
    if (w !== v) count.overflows++;
    return w;
  };
  const big = stages.map((s) => ({ ...s, bb: s.b.map(BigInt), ab: s.a.map(BigInt) }));
  return runStages(big, inputs, 0n, ({ bb, ab, shift, fir }, x, y) => {
    const product = (c: bigint, v: bigint) => (fast ? (c * v) >> 32n : c * v);
    let exact = 0n;
    for (let i = 0; i < x.length; i++) exact += product(bb[i], x[i]);
    for (let i = 0; i < ab.length; i++) exact += product(ab[i], y[i]);
    if (fast) return saturate(wrapped(exact, 32) << BigInt(shift + 1));
    const shifted = wrapped(exact, 64) >> BigInt(31 - shift);
    return fir ? saturate(shifted) : wrapped(shifted, 32);
  });
}

/** Runs input words through the library's kernels (standard or fast); counts overflows into `count`. */
export function runLibraryKernels(stages: FixedStage[], format: FixedFormat, inputs: number[], fast: boolean, count: Count): number[] {
  const lib = libraryStages(stages, format);
  if (format === "q15") return q15Kernels(lib, inputs, fast, count);
  return q31Kernels(lib, inputs.map(BigInt), fast, count).map(Number);
}
