import { compileKernel, numberLiteral } from "./codegen";

/**
 * FIR inner loop over a history buffer: for n in [0, count), y[yStart + n] = Σₖ h[k]·buf[newest + n − k],
 * summed from acc = 0 for k = 0 … N − 1 in that order (direct convolution, Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.7
 * [mem]), so every kernel variant gives the same bits. Unitless.
 */
export type FirKernel = (buf: Float64Array, y: Float64Array, newest: number, count: number, yStart: number) => void;

/** Up to this many taps the loop is generated with literal taps; longer filters use the generic loop. */
export const MAX_UNROLLED_TAPS = 64;

/** Generic loop reading the taps from an array. */
export function genericFirKernel(taps: Float64Array): FirKernel {
  const h = Float64Array.from(taps);
  return (buf, y, newest, count, yStart) => {
    for (let n = 0; n < count; n++) {
      let acc = 0;
      const i = newest + n;
      for (let k = 0; k < h.length; k++) acc += h[k] * buf[i - k];
      y[yStart + n] = acc;
    }
  };
}

function unrolledSource(taps: Float64Array): string {
  const terms = Array.from(taps, (h, k) => `acc += ${numberLiteral(h)} * buf[i - ${k}];`);
  return ["for (let n = 0; n < count; n++) {", "const i = newest + n;", "let acc = 0;", ...terms, "y[yStart + n] = acc;", "}"].join("\n");
}

/** The fastest kernel for these taps: generated (cached) up to MAX_UNROLLED_TAPS, otherwise generic. */
export function firKernel(taps: Float64Array): FirKernel {
  if (taps.length === 0) throw new Error("taps must have at least 1 entry (got 0)");
  if (taps.length > MAX_UNROLLED_TAPS) return genericFirKernel(taps);
  return compileKernel<FirKernel>(["buf", "y", "newest", "count", "yStart"], unrolledSource(taps)) ?? genericFirKernel(taps);
}
