import { createStreamingFilter, type StreamingFilter } from "../engine/streaming-filter";
import { designFromBa } from "../transfer";
import { loopBlocks, type DigitalTf } from "./blocks";
import { parseLoopModel } from "./schema";

/** The longest closed-loop step simulated, in samples. */
export const MAX_LOOP_STEP_SAMPLES = 200_000;

export interface ClosedLoopStep {
  /** Sample times in s (k/fs). */
  timeS: number[];
  /** Plant output y[k] in plant units for a unit reference step (the true position, before the sensor filter). */
  output: number[];
  /** Controller output u[k] applied to the plant (after the delay). */
  control: number[];
}

/** Leading zero coefficients of b: whole samples of delay a block contributes. */
function leadingZeros(b: readonly number[]): number {
  const i = b.findIndex((c) => c !== 0);
  return i < 0 ? b.length : i;
}

/** A streaming runner for b/a with its leading zeros removed (they are counted as delay instead). */
function runner(tf: DigitalTf, fs: number): StreamingFilter {
  return createStreamingFilter(designFromBa(tf.b.slice(leadingZeros(tf.b)), tf.a, fs));
}

/**
 * First n samples of the closed-loop response to a unit reference step r[k] = 1, k ≥ 0, from rest:
 * e = r − F·y, u = z⁻ᵈ·C·e, y = P·u (the sensor filter sits in the feedback path, so y settles at
 * 1/F(1)). Simulated sample by sample with each block's difference equation (lib/dsp streaming
 * filters, DF2T); the leading zeros of C and P join the delay d, which the schema keeps ≥ 1 so the
 * loop is causal (Franklin, Powell & Workman, Digital Control of Dynamic Systems, 3rd ed., ch. 8 — from memory).
 * An unstable loop grows without bound; samples may reach ±Infinity or NaN.
 */
export function closedLoopStep(model: unknown, n: number): ClosedLoopStep {
  if (!Number.isInteger(n) || n < 1 || n > MAX_LOOP_STEP_SAMPLES) {
    throw new Error(`n must be an integer from 1 to ${MAX_LOOP_STEP_SAMPLES} samples (got ${n})`);
  }
  const m = parseLoopModel(model);
  const b = loopBlocks(m);
  const fs = b.sampleRateHz;
  const delay = b.delaySamples + leadingZeros(b.controller.b) + leadingZeros(b.plant.b);
  const controller = runner(b.controller, fs);
  const plant = runner(b.plant, fs);
  const sensor = b.filter ? createStreamingFilter(b.filter) : null;
  const pending = new Array<number>(delay).fill(0);
  const one = new Float64Array(1);
  const step = (f: StreamingFilter | null, x: number) => {
    if (!f) return x;
    one[0] = x;
    return f.process(one)[0];
  };
  const timeS: number[] = [];
  const output: number[] = [];
  const control: number[] = [];
  for (let k = 0; k < n; k++) {
    const u = pending.shift() as number;
    const y = step(plant, u);
    const e = 1 - step(sensor, y);
    pending.push(step(controller, e));
    timeS.push(k / fs);
    output.push(y);
    control.push(u);
  }
  return { timeS, output, control };
}
