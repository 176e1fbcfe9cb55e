import { cAbs } from "../complex";
import type { FilterDesign } from "../types";
import { radPerSample, runForm } from "./design-form";
import { transferAt } from "./evaluate";
import { groupDelayAt } from "./group-delay";
import { magnitudeToDb } from "./units";
import { unwrappedArg } from "./unwrap";

export interface FrequencyResponse {
  /** 20·log10|H(e^{jω})| in dB, floored at MAGNITUDE_FLOOR_DB (−400 dB) so exact zeros stay finite. */
  magnitudeDb: number[];
  /** arg H in rad, unwrapped along the given frequency order (numpy.unwrap rule); 0 where H is exactly 0. */
  phaseRad: number[];
  /** −dφ/dω in samples, analytic (see group-delay.ts); finite at zeros on the unit circle. */
  groupDelaySamples: number[];
}

/**
 * Frequency response of an SOS or FIR design at the given frequencies in Hz (any order, each ≥ 0;
 * above fs/2 the response repeats with period fs). Same quantities as scipy.signal sosfreqz/freqz
 * with np.unwrap(np.angle(h)), plus group_delay (scipy.signal convention, finite at unit-circle zeros).
 */
export function frequencyResponse(design: FilterDesign, freqsHz: readonly number[]): FrequencyResponse {
  const form = runForm(design);
  const omegas = freqsHz.map((f) => radPerSample(f, design.sampleRateHz));
  const h = omegas.map((w) => transferAt(form, w));
  return {
    magnitudeDb: h.map((v) => magnitudeToDb(cAbs(v))),
    phaseRad: unwrappedArg(h),
    groupDelaySamples: groupDelayAt(form, omegas),
  };
}
