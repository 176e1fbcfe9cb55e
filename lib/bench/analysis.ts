import {
  analogPrototypeZpk,
  analogResponse,
  frequencyResponse,
  impulseResponse,
  polyRoots,
  quantizeDesign,
  responseGrid,
  stepMetrics,
  specStages,
  stepResponse,
  type AnalogSystem,
  type Complex,
  type FilterDesign,
  type FilterSpec,
  type QuantFormat,
  type QuantizedDesign,
  type QuantizedPart,
  type StageHeadroom,
  type StepMetrics,
} from "@/lib/dsp";
import { stageSummary } from "./spec-text";
import { errorMessage } from "@/lib/errors";

/** The analog system behind a spec, for drawing beside the digital response: an IIR's prototype at 2π·cutoff, or an analog H(s). */
export function analogSystemFor(spec: FilterSpec): AnalogSystem | null {
  if (spec.kind === "iir") return analogPrototypeZpk(spec);
  if (spec.kind === "analog") return { num: spec.num, den: spec.den };
  return null;
}

/** s-plane zeros and poles in rad/s of the analog system behind a spec, or null. */
export function sPlaneRoots(spec: FilterSpec): { zeros: Complex[]; poles: Complex[] } | null {
  const system = analogSystemFor(spec);
  if (!system) return null;
  if ("zeros" in system) return { zeros: system.zeros, poles: system.poles };
  const trim = (p: number[]) => p.slice(p.findIndex((c) => c !== 0));
  const roots = (p: number[]) => (trim(p).length > 1 ? polyRoots(trim(p)) : []);
  return { zeros: roots(system.num), poles: roots(system.den) };
}

/**
 * The plot frequencies in Hz for several designs on one channel: each design's root-aware grid
 * (responseGrid: n log-spaced points plus points at and around its zeros and poles near the unit circle)
 * over `range` (a zoom, clipped to the channel's band) or the whole band, merged.
 */
export function plotGrid(designs: readonly FilterDesign[], sampleRateHz: number, n: number, range: readonly [number, number] | null): number[] {
  const nyquist = sampleRateHz / 2;
  const clipped: [number, number] | undefined = range ? [Math.max(range[0], nyquist * 1e-6), Math.min(range[1], nyquist)] : undefined;
  const band = clipped && clipped[1] > clipped[0] ? clipped : undefined;
  const shown: FilterDesign[] = designs.length > 0 ? [...designs] : [{ sampleRateHz, poles: [], gain: 1 }];
  const all = shown.flatMap((d) => responseGrid({ ...d, sampleRateHz }, n, band)).sort((a, b) => a - b);
  return all.filter((f, i) => i === 0 || f !== all[i - 1]);
}

export interface ResponseCurves {
  magnitudeDb: number[];
  phaseDeg: number[];
  groupDelaySamples: number[];
  analogMagnitudeDb: number[] | null;
  analogPhaseDeg: number[] | null;
}

const toDeg = (rad: number[]) => rad.map((r) => (r * 180) / Math.PI);

/** The summary line of stage i (index in the spec) of a spec, or "stage i+1" when the spec is not at hand. */
export function stageName(spec: FilterSpec | null, i: number): string {
  const stage = spec ? specStages(spec)[i] : undefined;
  return stage ? stageSummary(stage) : `stage ${i + 1}`;
}

/** One running stage of a chain on its own: its index in the spec, its summary line and its digital response. */
export interface StageCurves {
  stage: number;
  summary: string;
  curves: ResponseCurves;
}

/**
 * The response of each running stage of a chain alone (for the dashed breakdown under the total);
 * empty for a single design or a chain with one running stage, where the total says it all.
 */
export function stageCurves(spec: FilterSpec | null, design: FilterDesign, freqsHz: number[]): StageCurves[] {
  if (!design.stages || design.stages.length < 2) return [];
  return design.stages.map((s) => ({ stage: s.stage, summary: stageName(spec, s.stage), curves: responseCurves(null, s, freqsHz) }));
}

/** Digital response (and the analog one where a spec has it) on a frequency grid in Hz. */
export function responseCurves(spec: FilterSpec | null, design: FilterDesign, freqsHz: number[]): ResponseCurves {
  const r = frequencyResponse(design, freqsHz);
  const system = spec ? analogSystemFor(spec) : null;
  const a = system ? analogResponse(system, freqsHz) : null;
  return {
    magnitudeDb: r.magnitudeDb,
    phaseDeg: toDeg(r.phaseRad),
    groupDelaySamples: r.groupDelaySamples,
    analogMagnitudeDb: a ? a.magnitudeDb : null,
    analogPhaseDeg: a ? toDeg(a.phaseRad) : null,
  };
}

export interface TimeCurves {
  /** Sample times in s. */
  timeS: number[];
  step: number[];
  impulse: number[];
  metrics: StepMetrics;
}

/** Longest step/impulse response drawn, in samples. */
export const MAX_PLOT_SAMPLES = 8192;

/** Step and impulse responses long enough to show settling (1.5× the settling time, 64 … MAX_PLOT_SAMPLES samples). */
export function timeCurves(design: FilterDesign): TimeCurves {
  const fs = design.sampleRateHz;
  const metrics = stepMetrics(design);
  const settle = metrics.settlingTimeS ?? (design.taps ? design.taps.length / fs : 256 / fs);
  const n = Math.min(MAX_PLOT_SAMPLES, Math.max(64, Math.ceil(1.5 * settle * fs) + 8));
  return {
    timeS: Array.from({ length: n }, (_, k) => k / fs),
    step: Array.from(stepResponse(design, n)),
    impulse: Array.from(impulseResponse(design, n)),
    metrics,
  };
}

export const FIXED_FORMATS: QuantFormat[] = ["f32", "q31", "q15"];

export interface FixedPreview {
  format: QuantFormat;
  /** The design quantized to this format, or null when it cannot be. */
  quantized: QuantizedDesign | null;
  magnitudeDb: number[] | null;
  stable: boolean | null;
  maxDeviationDb: number | null;
  /** Why the design could not be quantized in this format, in plain words. */
  error: string | null;
}

/** A quantized design as it runs (its rounded coefficient values), for its response after quantization. */
export function runnable(q: QuantizedDesign): FilterDesign {
  const part = (p: QuantizedPart) => ({ sampleRateHz: q.sampleRateHz, sos: p.sos, taps: p.taps, zeros: [], poles: [], gain: 1 });
  return q.stages ? { sampleRateHz: q.sampleRateHz, stages: q.stages.map((s) => ({ ...part(s), stage: s.stage })), zeros: [], poles: [], gain: 1 } : part(q);
}

/** Magnitude of the design quantized to each device format, with stability and the largest deviation from float64. */
export function fixedPreview(design: FilterDesign, freqsHz: number[]): FixedPreview[] {
  return FIXED_FORMATS.map((format) => {
    try {
      const q = quantizeDesign(design, format);
      return { format, quantized: q, magnitudeDb: frequencyResponse(runnable(q), freqsHz).magnitudeDb, stable: q.stable, maxDeviationDb: q.maxDeviationDb, error: null };
    } catch (err) {
      return { format, quantized: null, magnitudeDb: null, stable: null, maxDeviationDb: null, error: errorMessage(err) };
    }
  });
}

/** The level at one running stage's output of a quantized chain, named for the engineer. */
export interface StageLevel extends StageHeadroom {
  /** Index of the stage in the chain spec. */
  stage: number;
  summary: string;
  /** The worst full-scale input can saturate this stage (worst-case level above 0 dB). */
  mayOverflow: boolean;
}

/**
 * Headroom at every running stage's output of a quantized chain (quantizeDesign's L∞ scaling; see
 * lib/dsp/fixed/headroom.ts for the two bounds), each stage named from its spec; empty for a single design.
 */
export function stageLevels(spec: FilterSpec | null, q: QuantizedDesign): StageLevel[] {
  return (q.headroom ?? []).map((h) => {
    const stage = q.stages?.[h.part]?.stage ?? h.part;
    return { ...h, stage, summary: stageName(spec, stage), mayOverflow: h.worstCaseDb > 0 };
  });
}
