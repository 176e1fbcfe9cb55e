import { freqGrid, parseCoefficientText, polyRoots, type Complex, type FilterDesign } from "@/lib/dsp";
import {
  closedLoopPoles,
  closedLoopStep,
  loopBlocks,
  loopModelSchema,
  loopPolynomials,
  loopResponse,
  rootLocus,
  stabilityMargins,
  type ClosedLoopPoles,
  type ClosedLoopStep,
  type LoopModel,
  type LoopResponse,
  type StabilityMargins,
} from "@/lib/dsp/loop";
import type { LoopInputs } from "./defaults";

/** Points of the Bode plots (log grid up to just below Nyquist). */
export const BODE_POINTS = 600;
/** Gains of the root locus, as multiples of the loop gain: log-spaced from 1/100 to 100, with 0 and 1. */
const LOCUS_DECADES = 2;

export type ParsedInputs = { ok: true; model: Omit<LoopModel, "filter"> } | { ok: false; errors: { path: string; message: string }[] };

function numbers(text: string): number[] | string {
  try {
    const v = parseCoefficientText(text);
    if (v.some((x) => Array.isArray(x))) return "give one list of numbers";
    return v as number[];
  } catch (err) {
    return err instanceof Error ? err.message : "not a list of numbers";
  }
}

const num = (text: string) => (text.trim() === "" ? NaN : Number(text));

/** The typed plant and controller as a loop model without a filter, or the refusals per field. */
export function parseInputs(inputs: LoopInputs, sampleRateHz: number): ParsedInputs {
  const errors: { path: string; message: string }[] = [];
  const list = (path: string, text: string) => {
    const v = numbers(text);
    if (typeof v === "string") {
      errors.push({ path, message: v });
      return [NaN];
    }
    return v;
  };
  const prewarp = inputs.method === "tustin-prewarp" ? { prewarpHz: num(inputs.prewarpHz) } : {};
  const controller =
    inputs.mode === "pid"
      ? { kind: "pid" as const, kp: num(inputs.kp), ki: num(inputs.ki), kd: num(inputs.kd), n: num(inputs.n), method: inputs.method, ...prewarp }
      : { kind: "tf" as const, num: list("controller.num", inputs.ctrlNum), den: list("controller.den", inputs.ctrlDen), method: inputs.method, ...prewarp };
  const candidate = {
    sampleRateHz,
    plant: { num: list("plant.num", inputs.plantNum), den: list("plant.den", inputs.plantDen) },
    controller,
    delaySamples: num(inputs.delaySamples),
    filter: null,
  };
  if (errors.length > 0) return { ok: false, errors };
  const parsed = loopModelSchema.safeParse(candidate);
  if (!parsed.success) return { ok: false, errors: parsed.error.issues.map((i) => ({ path: i.path.join("."), message: i.message })) };
  const { filter: _none, ...model } = parsed.data;
  return { ok: true, model };
}

export interface LoopAnalysis {
  response: LoopResponse;
  margins: StabilityMargins;
  poles: ClosedLoopPoles;
  step: ClosedLoopStep;
}

/** Bode, margins (unless already known), closed-loop poles and step of one loop (with or without the filter). */
export function analyseLoop(model: LoopModel, freqs: number[], stepSamples: number, margins: StabilityMargins = stabilityMargins(model)): LoopAnalysis {
  return {
    response: loopResponse(model, freqs),
    margins,
    poles: closedLoopPoles(model),
    step: closedLoopStep(model, stepSamples),
  };
}

export function bodeFrequencies(sampleRateHz: number): number[] {
  return freqGrid(sampleRateHz, BODE_POINTS, "log");
}

/** About eight periods of the crossover (at least 100 samples, at most 20 000). */
export function stepLength(sampleRateHz: number, crossoverHz: number | null): number {
  const seconds = crossoverHz ? 8 / crossoverHz : 1;
  return Math.min(20_000, Math.max(100, Math.round(seconds * sampleRateHz)));
}

export interface LocusData {
  /** Poles for each gain multiple (k from 0 to 100). */
  branches: Complex[][];
  openLoopPoles: Complex[];
  zeros: Complex[];
  /** Poles at the nominal gain k = 1. */
  current: Complex[];
}

/** The root locus of 1 + k·L(z); fewer gains for high-order loops so a long FIR stays responsive. */
export function locusData(model: LoopModel): LocusData {
  const { num } = loopPolynomials(loopBlocks(model));
  const degree = num.length - 1;
  const count = degree > 40 ? 24 : 96;
  const gains = [0, ...Array.from({ length: count }, (_, i) => 10 ** (-LOCUS_DECADES + (2 * LOCUS_DECADES * i) / (count - 1)))];
  const branches = rootLocus(model, gains);
  return { branches, openLoopPoles: branches[0], zeros: polyRoots(num), current: rootLocus(model, [1])[0] };
}

/** The model with a sensor filter (or none). */
export function withFilter(model: Omit<LoopModel, "filter">, filter: FilterDesign | null): LoopModel {
  return { ...model, filter };
}
