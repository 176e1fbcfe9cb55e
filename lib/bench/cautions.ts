import { freqGrid, frequencyResponse, quantizeDesign, responseGrid, stability, toMs, type FilterDesign, type FilterSpec, type QuantFormat, type QuantizedDesign } from "@/lib/dsp";
import { runnable } from "./analysis";
import { hz, withUnit } from "./format";
import { notchBands, specFrequencies } from "./spec-text";
import { errorMessage } from "@/lib/errors";

/** The closing line of every caution (product safety wording). */
export const REVIEW_LINE =
  "Confirm with your team's review and the machine's safety documentation; local codes and licensed engineers decide.";

/** Thresholds (product choices, stated in the caution texts). */
export const CAUTION_LIMITS = {
  /** Largest pole radius that counts as "within 1 % of the unit circle". */
  nearUnitCircle: 0.99,
  /** Phase lag at the loop crossover that deserves a caution, in degrees. */
  loopPhaseDeg: 10,
  /** Low-frequency delay that deserves a caution when no crossover is given, in ms. */
  loopDelayMs: 2,
  /** Largest tolerated change of the magnitude response after quantization in the passband, in dB. */
  quantizationDb: 1,
  /** The passband, for judging quantization: where the float64 response lies within this of its peak, in dB (half power). */
  passbandDb: 3,
  /** Stopband attenuation a quantized filter must keep when the spec states none, in dB below the peak. */
  stopbandDb: 40,
  /** Design frequencies above this fraction of fs sit close to Nyquist. */
  nyquistFraction: 0.45,
  /** A pole radius within this of 1 counts as on the unit circle (rounding of an exact 1; product choice). */
  unitCircleTolerance: 1e-9,
} as const;

/** How loudly a caution speaks: "danger" (red) for a filter that does not settle, "warning" (amber) for a risk, "note" (quiet) for advice. */
export type CautionLevel = "danger" | "warning" | "note";

const LEVEL_ORDER: readonly CautionLevel[] = ["danger", "warning", "note"];

/** The loudest level among cautions (what a badge counting them shows), or null when there are none. */
export function highestLevel(cautions: readonly { level: CautionLevel }[]): CautionLevel | null {
  return LEVEL_ORDER.find((level) => cautions.some((c) => c.level === level)) ?? null;
}

/** A pole of this radius lies on or outside the unit circle (within CAUTION_LIMITS.unitCircleTolerance): the filter is unstable or marginal. */
export const onOrOutsideUnitCircle = (radius: number) => !(radius < 1 - CAUTION_LIMITS.unitCircleTolerance);

export type CautionKind = "poles" | "loop" | "quantization" | "arithmetic" | "nyquist" | "notch";

export interface Caution {
  kind: CautionKind;
  level: CautionLevel;
  title: string;
  /** What the risk is, with the numbers; REVIEW_LINE is appended by the caller's display. */
  text: string;
}

export interface CautionInput {
  spec: FilterSpec;
  design: FilterDesign;
  /** The channel's device coefficient format. */
  deviceFormat: QuantFormat;
  /** The control loop's crossover frequency in Hz, if the engineer gave one. */
  crossoverHz?: number | null;
}

/** Phase lag in degrees at f Hz relative to DC (positive = lag), unwrapped along a grid from 0 to f. */
export function phaseLagDeg(design: FilterDesign, freqHz: number): number {
  const steps = 64;
  const grid = Array.from({ length: steps + 1 }, (_, i) => (freqHz * i) / steps);
  const { phaseRad } = frequencyResponse(design, grid);
  return (-(phaseRad[steps] - phaseRad[0]) * 180) / Math.PI;
}

function poleCaution(maxPoleRadius: number): Caution | null {
  const r = withUnit(maxPoleRadius, "", 4);
  if (maxPoleRadius > 1 + CAUTION_LIMITS.unitCircleTolerance) {
    return { kind: "poles", level: "danger", title: "Unstable filter", text: `A pole lies at radius ${r}, outside the unit circle: the output grows without bound.` };
  }
  if (onOrOutsideUnitCircle(maxPoleRadius)) {
    return {
      kind: "poles",
      level: "danger",
      title: "Marginally stable filter",
      text: `A pole lies on the unit circle (radius ${r}), as in an integrator: the output does not settle, and any offset or rounding error in the input makes it drift without bound.`,
    };
  }
  if (maxPoleRadius < CAUTION_LIMITS.nearUnitCircle) return null;
  return {
    kind: "poles",
    level: "warning",
    title: "Poles close to the unit circle",
    text: `The largest pole radius is ${r}, within 1 % of the unit circle. The filter rings for a long time, and small coefficient errors can make it unstable.`,
  };
}

function loopCaution(design: FilterDesign, crossoverHz: number | null | undefined): Caution | null {
  const fs = design.sampleRateHz;
  const delayMs = toMs(frequencyResponse(design, [0]).groupDelaySamples[0], fs);
  const delay = withUnit(delayMs, "ms");
  if (crossoverHz && crossoverHz > 0 && crossoverHz < fs / 2) {
    const lag = phaseLagDeg(design, crossoverHz);
    if (lag < CAUTION_LIMITS.loopPhaseDeg) return null;
    return {
      kind: "loop",
      level: "warning",
      title: "Delay inside a control loop",
      text: `If this filter sits inside a control loop, it delays the signal by about ${delay} and costs ${withUnit(lag, "", 2)}° of phase at the ${hz(crossoverHz)} crossover, which comes straight off the phase margin.`,
    };
  }
  if (delayMs < CAUTION_LIMITS.loopDelayMs) return null;
  return {
    kind: "loop",
    level: "note",
    title: "Delay inside a control loop",
    text: `This filter delays low frequencies by about ${delay}. If it sits inside a control loop, enter the loop's crossover frequency to see the phase it costs there.`,
  };
}

/** The stopband attenuation a spec states (Kaiser FIR, Chebyshev II, elliptic), in dB, or null. */
function statedStopbandDb(spec: FilterSpec): number | null {
  return "stopbandAttenuationDb" in spec && typeof spec.stopbandAttenuationDb === "number" ? spec.stopbandAttenuationDb : null;
}

/** What rounding to a device format does where it matters: the passband change and the stopband level reached. */
export interface QuantizationImpact {
  /** Largest |ΔdB| where the float64 response is within CAUTION_LIMITS.passbandDb of its peak. */
  passbandDeviationDb: number;
  /** The attenuation the stopband must keep, in dB below the peak (stated by the spec, else CAUTION_LIMITS.stopbandDb). */
  stopbandLimitDb: number;
  /** Highest quantized level, in dB relative to the float64 peak, where the float64 response is below the stopband limit; null when it never is. */
  stopbandLevelDb: number | null;
}

/**
 * The change quantization makes, judged where it matters: in the passband (float64 within 3 dB of its peak) and
 * against the stopband limit (where float64 lies below it, the quantized response must too). Deviations deep in a
 * stopband (a notch's −∞ dB becoming −70 dB, a −58 dB FIR floor moving to −62 dB) change nothing an engineer sees.
 * Evaluated on a 4097-point linear grid plus the points around zeros and poles near the unit circle (responseGrid).
 */
export function quantizationImpact(spec: FilterSpec, design: FilterDesign, q: QuantizedDesign): QuantizationImpact {
  const fs = design.sampleRateHz;
  const freqs = [...freqGrid(fs, 4097, "linear"), ...responseGrid(design, 64)].sort((a, b) => a - b);
  const ref = frequencyResponse(design, freqs).magnitudeDb;
  const got = frequencyResponse(runnable(q), freqs).magnitudeDb;
  const peak = Math.max(...ref);
  const stopbandLimitDb = statedStopbandDb(spec) ?? CAUTION_LIMITS.stopbandDb;
  let passbandDeviationDb = 0;
  let stopbandLevelDb: number | null = null;
  ref.forEach((r, i) => {
    if (r >= peak - CAUTION_LIMITS.passbandDb) passbandDeviationDb = Math.max(passbandDeviationDb, Math.abs(got[i] - r));
    else if (r <= peak - stopbandLimitDb) stopbandLevelDb = Math.max(stopbandLevelDb ?? -Infinity, got[i] - peak);
  });
  return { passbandDeviationDb, stopbandLimitDb, stopbandLevelDb };
}

function quantizationCaution(spec: FilterSpec, design: FilterDesign, format: QuantFormat): Caution | null {
  const name = format.toUpperCase();
  let q;
  try {
    q = quantizeDesign(design, format);
  } catch (err) {
    return { kind: "quantization", level: "danger", title: `Not representable in ${name}`, text: errorMessage(err) };
  }
  if (!q.stable) {
    return {
      kind: "quantization",
      level: "danger",
      title: `Unstable in ${name}`,
      text: `Rounded to the device's ${name} format, a pole moves to radius ${withUnit(q.maxPoleRadius, "", 5)}: the filter that runs on the device is unstable.`,
    };
  }
  const impact = quantizationImpact(spec, design, q);
  const passband = impact.passbandDeviationDb > CAUTION_LIMITS.quantizationDb;
  const stopband = impact.stopbandLevelDb !== null && impact.stopbandLevelDb > -impact.stopbandLimitDb;
  if (!passband && !stopband) return null;
  const found = [
    passband ? `the passband (within ${CAUTION_LIMITS.passbandDb} dB of the peak) moves by up to ${withUnit(impact.passbandDeviationDb, "dB")}, more than ${CAUTION_LIMITS.quantizationDb} dB` : null,
    stopband ? `the stopband rises to ${withUnit(impact.stopbandLevelDb, "dB")}, above the ${withUnit(-impact.stopbandLimitDb, "dB")} it must stay below` : null,
  ].filter((t): t is string => t !== null);
  return {
    kind: "quantization",
    level: "warning",
    title: `Response moves in ${name}`,
    text: `Rounded to the device's ${name} format, ${found.join(", and ")}: the device would not run the filter shown here. Changes deeper in the stopband are not counted.`,
  };
}

function nyquistCaution(spec: FilterSpec): Caution | null {
  const limit = CAUTION_LIMITS.nyquistFraction * spec.sampleRateHz;
  const high = specFrequencies(spec).filter((f) => f > limit);
  if (high.length === 0) return null;
  return {
    kind: "nyquist",
    level: "warning",
    title: "Close to Nyquist",
    text: `${high.map((f) => hz(f)).join(" and ")} lies above ${CAUTION_LIMITS.nyquistFraction}·fs = ${hz(limit)}. The bilinear warping is strong there, the response differs from the analog intent, and aliased content cannot be removed by any digital filter.`,
  };
}

function notchCaution(spec: FilterSpec): Caution | null {
  const bands = notchBands(spec);
  if (bands.length === 0) return null;
  const list = bands.map(([lo, hi]) => `${hz(lo)}–${hz(hi)}`);
  const removed = list.length === 1 ? list[0] : `${list.slice(0, -1).join(", ")} and ${list[list.length - 1]}`;
  return {
    kind: "notch",
    level: "warning",
    title: bands.length === 1 ? "A notch may hide a fault" : "Notches may hide a fault",
    text: `This filter removes ${removed}. A running-speed harmonic, a bearing or gear-mesh tone or a structural resonance in ${bands.length === 1 ? "that band" : "those bands"} would vanish from the filtered signal. Keep protection and alarm paths on the raw signal.`,
  };
}

/**
 * Every caution that applies to a candidate, most severe kinds first. A filter with a pole on or outside
 * the unit circle has no steady delay or quantized response to judge, so it gets only the pole caution
 * and the ones read from its spec.
 */
export function cautionsFor(input: CautionInput): Caution[] {
  const { maxPoleRadius } = stability(input.design);
  const settles = !onOrOutsideUnitCircle(maxPoleRadius);
  const found = [
    poleCaution(maxPoleRadius),
    settles ? quantizationCaution(input.spec, input.design, input.deviceFormat) : null,
    settles ? loopCaution(input.design, input.crossoverHz) : null,
    nyquistCaution(input.spec),
    notchCaution(input.spec),
  ];
  return found.filter((c): c is Caution => c !== null);
}
