import type { QuantizedDesign } from "./quantize-design";

/**
 * Refuse a quantized design whose poles are not all strictly inside the unit circle
 * (BIBO stability, Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.2 — from memory). Throws naming the largest pole radius.
 */
export function assertDeployable(q: QuantizedDesign): void {
  if (q.stable && q.maxPoleRadius < 1) return;
  throw new Error(
    `quantized ${q.format} design is unstable: largest pole radius ${q.maxPoleRadius} (must be < 1; ` +
      `${q.maxPoleRadiusBefore} before quantization). Use more bits, second-order sections, or a design with poles further from the unit circle.`,
  );
}
