import { cutoffPoints, frequencyResponse, peakGainDb, stability, stepMetrics, type FilterDesign, type StepMetrics } from "@/lib/dsp";

/** The review summary stored with every revision; units in the field names. */
export interface AnalysisSummary {
  /** Every pole strictly inside the unit circle (float64 design). */
  stable: boolean;
  /** Largest pole radius, dimensionless. */
  maxPoleRadius: number;
  /** Frequencies in Hz where |H| is 3.0103 dB below its peak, ascending. */
  cutoffsHz: number[];
  /** Peak of |H| over [0, fs/2] in dB. */
  peakGainDb: number;
  /** Group delay at 0 Hz, in samples and in ms. */
  groupDelayDcSamples: number;
  groupDelayDcMs: number;
  step: StepMetrics;
}

/** Summarises a design with lib/dsp's analysis (stability, −3 dB points, DC group delay, step metrics). */
export function analyseDesign(design: FilterDesign): AnalysisSummary {
  const { stable, maxPoleRadius } = stability(design);
  const dcDelay = frequencyResponse(design, [0]).groupDelaySamples[0];
  return {
    stable,
    maxPoleRadius,
    cutoffsHz: stable ? cutoffPoints(design) : [],
    peakGainDb: stable ? peakGainDb(design) : Number.POSITIVE_INFINITY,
    groupDelayDcSamples: dcDelay,
    groupDelayDcMs: (dcDelay / design.sampleRateHz) * 1000,
    step: stepMetrics(design),
  };
}
