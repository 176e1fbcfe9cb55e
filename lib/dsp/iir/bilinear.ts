import type { Complex } from "../types";
import { cAdd, cDiv, cMul, cSub } from "../complex";
import type { Zpk } from "./zpk";

/**
 * Bilinear (Tustin) transform of an analog zpk (rad/s) to a digital zpk at sampleRateHz:
 * z = (2fs + s)/(2fs − s); zeros at infinity go to z = −1; gain k·Re(Π(2fs − zᵢ)/Π(2fs − pᵢ))
 * (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §7.2; scipy.signal bilinear_zpk convention).
 */
export function bilinearZpk(zeros: Complex[], poles: Complex[], gain: number, sampleRateHz: number): Zpk {
  if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0)) {
    throw new Error(`sampleRateHz must be a finite number > 0 (got ${sampleRateHz})`);
  }
  const degree = poles.length - zeros.length;
  if (degree < 0) throw new Error("transfer function must have at least as many poles as zeros");
  const fs2: Complex = [2 * sampleRateHz, 0];
  const map = (x: Complex): Complex => cDiv(cAdd(fs2, x), cSub(fs2, x));
  let num: Complex = [1, 0];
  let den: Complex = [1, 0];
  for (const z of zeros) num = cMul(num, cSub(fs2, z));
  for (const p of poles) den = cMul(den, cSub(fs2, p));
  return {
    zeros: [...zeros.map(map), ...Array.from({ length: degree }, (): Complex => [-1, 0])],
    poles: poles.map(map),
    gain: gain * cDiv(num, den)[0],
  };
}

