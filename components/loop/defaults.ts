import type { FilterSpec } from "@/lib/dsp";
import type { LoopController } from "@/lib/dsp/loop";

/** The plant and controller as the engineer types them (text, so half-typed values stay on screen). */
export interface LoopInputs {
  plantNum: string;
  plantDen: string;
  mode: "pid" | "tf";
  kp: string;
  ki: string;
  kd: string;
  n: string;
  ctrlNum: string;
  ctrlDen: string;
  method: LoopController["method"];
  prewarpHz: string;
  delaySamples: string;
}

/**
 * The demo axis of hydraulic-press/press-ctl/ram-position (invented): a valve-controlled cylinder seen as
 * P(s) = K/(s(τs + 1)), K = 40 mm/s per V, τ = 20 ms; a parallel PID Kp = 2 V/mm, Ki = 5 V/(mm·s),
 * Kd = 0.01 V·s/mm, N = 10, Tustin, one sample of computation delay at 2 kHz. Without a sensor filter it
 * crosses over near 8.8 Hz with about 53° of phase margin and 36 dB of gain margin.
 */
export const DEMO_INPUTS: LoopInputs = {
  plantNum: "40",
  plantDen: "0.02, 1, 0",
  mode: "pid",
  kp: "2",
  ki: "5",
  kd: "0.01",
  n: "10",
  ctrlNum: "0.15, 3",
  ctrlDen: "0.005, 1",
  method: "tustin",
  prewarpHz: "",
  delaySamples: "1",
};

/** The typed filter the page starts from: a 2nd-order Butterworth low-pass at 50 Hz (or fs/20 below 1 kHz). */
export function startingSpec(fs: number): FilterSpec {
  return { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: fs >= 1000 ? 50 : Math.max(1, Math.round(fs / 20)), sampleRateHz: fs };
}
