import { cutoffPoints, frequencyResponse, peakGainDb, stability, stepMetrics, type FilterDesign, type StepMetrics } from "@/lib/dsp";

/** The review summary stored with every revision; units in the field names. */
export interface AnalysisSummary {
  /** Every pole strictly inside the unit circle (float64 design). */
  stable: boolean;
  /** Largest pole radius, dimensionless. */
  maxPoleRadius: number;
  /** Frequencies in Hz where |H| is 3.0103 dB below its peak, ascending. */
  cutoffsHz: number[];
  /** Peak of |H| over [0, fs/2] in dB; null for an unstable design. */
  peakGainDb: number | null;
  /** Group delay at 0 Hz, in samples and in ms; null for an unstable design (it has no steady state). */
  groupDelayDcSamples: number | null;
  groupDelayDcMs: number | null;
  step: StepMetrics;
}

/**
 * Summarises a design with lib/dsp's analysis (stability, −3 dB points, DC group delay, step metrics).
 * An unstable design keeps only its stability and step summary: its frequency response describes no
 * steady state.
 */
export function analyseDesign(design: FilterDesign): AnalysisSummary {
  const { stable, maxPoleRadius } = stability(design);
  const step = stepMetrics(design);
  if (!stable) {
    return { stable, maxPoleRadius, cutoffsHz: [], peakGainDb: null, groupDelayDcSamples: null, groupDelayDcMs: null, step };
  }
  const dcDelay = frequencyResponse(design, [0]).groupDelaySamples[0];
  return {
    stable,
    maxPoleRadius,
    cutoffsHz: cutoffPoints(design),
    peakGainDb: peakGainDb(design),
    groupDelayDcSamples: dcDelay,
    groupDelayDcMs: (dcDelay / design.sampleRateHz) * 1000,
    step,
  };
}
