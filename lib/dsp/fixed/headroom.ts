import type { RunForm } from "../analysis/design-form";
import { referenceDb, searchGrid } from "../analysis/gain";
import { formStability } from "../analysis/stability";
import { CascadeState } from "../engine/cascade-state";

/** The level at one stage's output of a quantized chain, for a full-scale (±1) input. */
export interface StageHeadroom {
  /** Index of the stage in the chain's running stages. */
  part: number;
  /** Peak |H| of the chain up to this stage's output, in dB: the bound for a full-scale sinusoid (≤ 0 after L∞ scaling). */
  sinePeakDb: number;
  /**
   * Σ|h[n]| of the chain up to this stage's output, in dB: the bound for the worst full-scale input
   * (|y| ≤ Σ|h|·max|x|, the triangle inequality on the convolution sum; Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §6.9,
   * overflow scaling — from memory). Above 0 dB an input of that worst shape can saturate there.
   */
  worstCaseDb: number;
}

/** Samples of impulse response summed for the worst-case bound (the tail of a stable design is below 1e-9 long before). */
const MAX_IMPULSE_SAMPLES = 1 << 16;
const TAIL = 1e-9;

/** Headroom at every part's output of a run form (coefficients as they will run). */
export function stageHeadroom(form: RunForm, sampleRateHz: number): StageHeadroom[] {
  return form.map((_, k) => {
    const head = form.slice(0, k + 1);
    const sinePeakDb = referenceDb(head, sampleRateHz, searchGrid(head, sampleRateHz));
    return { part: k, sinePeakDb, worstCaseDb: 20 * Math.log10(impulseL1(head)) };
  });
}

/** Σ|h[n]| of a run form's impulse response, summed until it has decayed (Infinity when unstable). */
function impulseL1(form: RunForm): number {
  const { stable, maxPoleRadius } = formStability(form);
  if (!stable) return Infinity;
  const firLength = form.reduce((n, p) => n + (p.kind === "taps" ? p.taps.length : 0), 0);
  const decay = maxPoleRadius > 0 ? Math.ceil(Math.log(TAIL) / Math.log(maxPoleRadius)) : 0;
  const n = Math.min(MAX_IMPULSE_SAMPLES, decay + firLength + 1);
  const x = new Float64Array(n);
  x[0] = 1;
  const y = new Float64Array(n);
  new CascadeState(form, false).run(x, y, 0, n);
  return y.reduce((s, v) => s + Math.abs(v), 0);
}
