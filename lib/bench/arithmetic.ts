import {
  arithmeticLabel,
  filterSignal,
  fractionBits,
  simulateFixed,
  type FilterDesign,
  type FixedArithmetic,
  type QuantizedDesign,
} from "@/lib/dsp";
import type { Caution } from "./cautions";

/** Samples of the test signal the device arithmetic is compared on (bounded work for every edit). */
export const ARITHMETIC_TEST_SAMPLES = 1024;

/**
 * The test signal: half-scale steps up and down, then a half-scale chirp from DC to fs/2 (a linear
 * sweep), so both the settled level and every frequency pass through the arithmetic. Unitless, full scale ±1.
 */
export function arithmeticTestSignal(n = ARITHMETIC_TEST_SAMPLES): Float64Array {
  const half = Math.floor(n / 2);
  return Float64Array.from({ length: n }, (_, k) => {
    if (k < half) return k < half / 2 ? 0.5 : -0.5;
    const t = k - half;
    return 0.5 * Math.cos((Math.PI * t * t) / (2 * (n - half)));
  });
}

/** How the device's arithmetic compares with the float design on the test signal. */
export interface ArithmeticComparison {
  /** Which arithmetic was run, in words (arithmeticLabel). */
  label: string;
  /** Largest |device − float64| over the test signal, in dB relative to full scale (null when they agree exactly). */
  worstDbfs: number | null;
  /** The same in LSB of the format. */
  worstLsb: number;
  /** Saturations and wraps the run counted. */
  overflows: number;
}

/**
 * Runs the quantized design bit-true in an arithmetic (simulateFixed) and the float64 design
 * (filterSignal) on the test signal and gives the worst difference; throws what simulateFixed throws
 * (for example an FIR with a post-shift in the library's arithmetic).
 */
export function compareArithmetic(design: FilterDesign, q: QuantizedDesign, arithmetic: FixedArithmetic): ArithmeticComparison {
  if (q.format === "f32") throw new Error("f32 runs in float; there is no fixed-point arithmetic to compare");
  const x = arithmeticTestSignal();
  const device = simulateFixed(q, x, arithmetic);
  const float = filterSignal(design, x);
  const worst = device.y.reduce((m, v, i) => Math.max(m, Math.abs(v - float[i])), 0);
  return {
    label: arithmeticLabel(arithmetic, q.format),
    worstDbfs: worst > 0 ? 20 * Math.log10(worst) : null,
    worstLsb: worst * 2 ** fractionBits(q.format),
    overflows: device.overflows,
  };
}

/** Worst difference from the float design, in dBFS, above which the device's arithmetic deserves a caution (product choice: 0.1 % of full scale). */
export const ARITHMETIC_CAUTION_DBFS = -60;

/** A caution when the device's arithmetic strays from the float design on the test signal, or saturates or wraps; null otherwise. */
export function arithmeticCaution(c: ArithmeticComparison): Caution | null {
  const strays = c.worstDbfs !== null && c.worstDbfs > ARITHMETIC_CAUTION_DBFS;
  if (!strays && c.overflows === 0) return null;
  const worst = c.worstDbfs === null ? "not at all" : `by up to ${c.worstDbfs.toFixed(1)} dBFS (${c.worstLsb.toPrecision(3)} LSB)`;
  const overflow = c.overflows ? `; ${c.overflows} saturation${c.overflows === 1 ? "" : "s"} or wrap${c.overflows === 1 ? "" : "s"} on the way` : "";
  return {
    kind: "arithmetic",
    level: "warning",
    title: "The device's arithmetic strays from the float design",
    text: `Run in ${c.label}, the output differs from the float design ${worst} on half-scale steps and a half-scale chirp${overflow}. What the device computes is not the filter shown here.`,
  };
}
