import {
  attenuationDb,
  cutoffPoints,
  designStages,
  frequencyResponse,
  directFormSectionCount,
  stability,
  stepMetrics,
  toMs,
  type FilterDesign,
} from "@/lib/dsp";

/** The comparison table's figures of one design; units in the names; null where undefined. */
export interface CandidateFigures {
  /** Filter order: pole count for SOS designs, taps − 1 for FIR, their sum over a chain's running stages. */
  order: number;
  /** Second-order sections over every running stage (a direct form counted as the sections a device runs it as), or null when no stage has any. */
  sections: number | null;
  /** FIR taps (over every running FIR stage), or null when no stage is FIR. */
  taps: number | null;
  /** −3 dB (half-power) crossings in Hz, ascending. */
  cutoffHz: number[];
  /** Attenuation in dB below the passband peak at noiseLineHz (positive = attenuated). */
  attenuationAtNoiseDb: number | null;
  delayDcSamples: number;
  delayDcMs: number;
  delayAtSamples: number | null;
  delayAtMs: number | null;
  overshootPercent: number | null;
  settlingTimeS: number | null;
  maxPoleRadius: number;
  stable: boolean;
}

export interface FigureOptions {
  /** The strongest noise line of the live spectrum in Hz, if known. */
  noiseLineHz?: number | null;
  /** The frequency in Hz at which the engineer asks for the group delay, if any. */
  delayAtHz?: number | null;
}

/** Figures for one design, all from lib/dsp (frequencyResponse, cutoffPoints, attenuationDb, stepMetrics, stability). */
export function candidateFigures(design: FilterDesign, opts: FigureOptions = {}): CandidateFigures {
  const fs = design.sampleRateHz;
  const inBand = (f: number | null | undefined): f is number => typeof f === "number" && f >= 0 && f <= fs / 2;
  const delayAt = inBand(opts.delayAtHz) ? opts.delayAtHz : null;
  const { groupDelaySamples } = frequencyResponse(design, delayAt === null ? [0] : [0, delayAt]);
  const { stable, maxPoleRadius } = stability(design);
  const step = stepMetrics(design);
  const parts = designStages(design);
  const sum = (count: (p: (typeof parts)[number]) => number) => parts.reduce((n, p) => n + count(p), 0);
  return {
    order: sum((p) => (p.taps ? p.taps.length - 1 : p.poles.length)),
    sections: parts.some((p) => p.sos || p.ba) ? sum((p) => p.sos?.length ?? (p.ba ? directFormSectionCount(p.ba) : 0)) : null,
    taps: parts.some((p) => p.taps) ? sum((p) => p.taps?.length ?? 0) : null,
    cutoffHz: cutoffPoints(design),
    attenuationAtNoiseDb: inBand(opts.noiseLineHz) ? attenuationDb(design, [opts.noiseLineHz])[0] : null,
    delayDcSamples: groupDelaySamples[0],
    delayDcMs: toMs(groupDelaySamples[0], fs),
    delayAtSamples: delayAt === null ? null : groupDelaySamples[1],
    delayAtMs: delayAt === null ? null : toMs(groupDelaySamples[1], fs),
    overshootPercent: step.overshootPercent,
    settlingTimeS: step.settlingTimeS,
    maxPoleRadius,
    stable,
  };
}
