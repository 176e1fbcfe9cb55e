import { compileKernel, numberLiteral } from "./codegen";

/**
 * Inner loops for a cascade of second-order sections in direct form II transposed, with the
 * arithmetic order of scipy.signal `sosfilt` (per section: t = b0·x + z0;
 * z0 = b1·x − a1·t + z1; z1 = b2·x − a2·t), so results agree bit for bit on IEEE-754 doubles.
 * A kernel filters x[start..end) into y[start..end) and carries 2 states per section in `z`.
 */
export type SosKernel = (
  x: Float64Array,
  y: Float64Array,
  start: number,
  end: number,
  z: Float64Array,
) => void;

/** Above this many sections the generic loop is used (generated source grows linearly). */
export const MAX_UNROLLED_SECTIONS = 48;

/**
 * Source of a kernel whose coefficients are literal constants and whose states are locals, so
 * the JIT keeps them in registers; states are written back once per block. The sample loop is
 * unrolled by two (then one sample if the count is odd): each sample still runs every section in
 * order with the same operations, so the output is the same bit for bit, but the loop overhead is
 * halved and the CPU can overlap section s of sample n + 1 with the later sections of sample n.
 */
function unrolledSource(packed: Float64Array): string {
  const sections = packed.length / 5;
  const sample = (at: string): string[] => {
    const lines = [`c = x[${at}];`];
    for (let s = 0; s < sections; s++) {
      const [b0, b1, b2, a1, a2] = Array.from(packed.subarray(s * 5, s * 5 + 5), numberLiteral);
      lines.push(`t = ${b0} * c + p${s};`, `p${s} = ${b1} * c - ${a1} * t + q${s};`, `q${s} = ${b2} * c - ${a2} * t;`, "c = t;");
    }
    lines.push(`y[${at}] = c;`);
    return lines;
  };
  const lines: string[] = [];
  for (let s = 0; s < sections; s++) lines.push(`let p${s} = z[${2 * s}], q${s} = z[${2 * s + 1}];`);
  lines.push("let c, t, n = start;");
  lines.push("for (; n + 1 < end; n += 2) {", ...sample("n"), ...sample("n + 1"), "}");
  lines.push("if (n < end) {", ...sample("n"), "}");
  for (let s = 0; s < sections; s++) lines.push(`z[${2 * s}] = p${s}; z[${2 * s + 1}] = q${s};`);
  return lines.join("\n");
}

/** Generic loop over sections, for very long cascades or where code generation is refused. */
export function genericSosKernel(packed: Float64Array): SosKernel {
  const coeffs = Float64Array.from(packed);
  const sections = coeffs.length / 5;
  return (x, y, start, end, z) => {
    for (let n = start; n < end; n++) {
      let c = x[n];
      for (let s = 0, k = 0; s < sections; s++, k += 5) {
        const t = coeffs[k] * c + z[2 * s];
        z[2 * s] = coeffs[k + 1] * c - coeffs[k + 3] * t + z[2 * s + 1];
        z[2 * s + 1] = coeffs[k + 2] * c - coeffs[k + 4] * t;
        c = t;
      }
      y[n] = c;
    }
  };
}

/**
 * The fastest kernel available for these packed sections ([b0, b1, b2, a1, a2] per section):
 * a generated, cached one up to MAX_UNROLLED_SECTIONS, otherwise the generic loop.
 */
export function sosKernel(packed: Float64Array): SosKernel {
  if (packed.length === 0 || packed.length % 5 !== 0) {
    throw new Error(`packed sections need 5 coefficients each (got ${packed.length})`);
  }
  if (packed.length / 5 > MAX_UNROLLED_SECTIONS) return genericSosKernel(packed);
  return compileKernel<SosKernel>(["x", "y", "start", "end", "z"], unrolledSource(packed)) ?? genericSosKernel(packed);
}
