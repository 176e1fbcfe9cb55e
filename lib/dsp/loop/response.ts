import { radPerSample, runForm, type RunForm } from "../analysis/design-form";
import { ascendingPolyAt, transferAt } from "../analysis/evaluate";
import { magnitudeToDb } from "../analysis/units";
import { unwrappedArg } from "../analysis/unwrap";
import { cAbs, cDiv, cMul } from "../complex";
import type { Complex } from "../types";
import { loopBlocks, type LoopBlocks } from "./blocks";
import { parseLoopModel } from "./schema";

/** L(e^{jω}) as a function of ω in rad/sample (dimensionless complex gain). */
export type LoopEvaluator = (omega: number) => Complex;

/**
 * L(e^{jω}) = C·e^{−jωd}·P·F evaluated factor by factor on the unit circle, F from its own sections
 * or taps (no polynomial expansion); z = e^{jω} (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.1).
 */
export function loopEvaluator(blocks: LoopBlocks): LoopEvaluator {
  const filter: RunForm | null = blocks.filter ? runForm(blocks.filter) : null;
  const { controller: c, plant: p, delaySamples: d } = blocks;
  return (omega) => {
    const x: Complex = [Math.cos(omega), -Math.sin(omega)];
    let l = cMul(cDiv(ascendingPolyAt(c.b, x), ascendingPolyAt(c.a, x)), cDiv(ascendingPolyAt(p.b, x), ascendingPolyAt(p.a, x)));
    l = cMul(l, [Math.cos(d * omega), -Math.sin(d * omega)]);
    return filter ? cMul(l, transferAt(filter, omega)) : l;
  };
}

export interface LoopResponse {
  /** 20·log10|L| in dB, floored at MAGNITUDE_FLOOR_DB like the filter analysis. */
  magnitudeDb: number[];
  /** arg L in degrees, unwrapped along the given frequency order (numpy.unwrap rule). */
  phaseDeg: number[];
}

/** Open-loop response L(e^{j2πf/fs}) at the given frequencies in Hz (each ≥ 0), model validated first. */
export function loopResponse(model: unknown, freqsHz: readonly number[]): LoopResponse {
  const m = parseLoopModel(model);
  const at = loopEvaluator(loopBlocks(m));
  const values = freqsHz.map((f) => at(radPerSample(f, m.sampleRateHz)));
  return {
    magnitudeDb: values.map((v) => magnitudeToDb(cAbs(v))),
    phaseDeg: unwrappedArg(values).map((r) => (r * 180) / Math.PI),
  };
}
