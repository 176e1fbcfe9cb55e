import type { FilterDesign } from "../types";

/**
 * Filter a whole signal at once (units: samples in, samples out at the design's rate).
 * SOS: direct form II transposed per section in scipy.signal `sosfilt` arithmetic order;
 * FIR taps: direct convolution. initial 'zero' starts from rest; 'step' starts from the
 * steady state for a constant input equal to x[0] (scipy.signal `sosfilt_zi`/`lfilter_zi` convention).
 */
export function filterSignal(
  design: FilterDesign,
  x: Float64Array,
  opts: { initial?: "zero" | "step" } = {},
): Float64Array {
  const y = new Float64Array(x.length);
  const step = opts.initial === "step" && x.length > 0;
  if (design.sos) {
    const sos = design.sos;
    const z = new Float64Array(sos.length * 2);
    if (step) {
      let scale = x[0];
      sos.forEach(([b0, b1, b2, , a1, a2], s) => {
        const h = (b0 + b1 + b2) / (1 + a1 + a2);
        z[2 * s] = (h - b0) * scale;
        z[2 * s + 1] = (b2 - a2 * h) * scale;
        scale *= h;
      });
    }
    for (let n = 0; n < x.length; n++) {
      let cur = x[n];
      for (let s = 0; s < sos.length; s++) {
        const r = sos[s];
        const next = r[0] * cur + z[2 * s];
        z[2 * s] = r[1] * cur - r[4] * next + z[2 * s + 1];
        z[2 * s + 1] = r[2] * cur - r[5] * next;
        cur = next;
      }
      y[n] = cur;
    }
    return y;
  }
  const taps = design.taps ?? [];
  for (let n = 0; n < x.length; n++) {
    let acc = 0;
    for (let k = 0; k < taps.length; k++) acc += taps[k] * (n - k >= 0 ? x[n - k] : step ? x[0] : 0);
    y[n] = acc;
  }
  return y;
}
