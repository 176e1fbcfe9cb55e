import { hz } from "./format";
import { numberTextError, readNumberText } from "./number-text";

/** Which frequency the bench judges attenuation at: the live spectrum's strongest peak, or one the engineer chose. */
export type NoiseLineChoice = { kind: "strongest" } | { kind: "chosen"; freqHz: number; from: "peak" | "typed" };

export const STRONGEST: NoiseLineChoice = { kind: "strongest" };

/** The line being judged, in Hz (null until the spectrum has a peak), and the sentence that says which it is. */
export interface JudgedLine {
  freqHz: number | null;
  label: string;
}

/** The judged line of a choice, given the live spectrum's peaks in Hz (strongest first). */
export function judgedLine(choice: NoiseLineChoice, peaksHz: readonly number[]): JudgedLine {
  if (choice.kind === "chosen") {
    return { freqHz: choice.freqHz, label: `${hz(choice.freqHz)} (${choice.from === "peak" ? "a peak you picked" : "a frequency you typed"})` };
  }
  const strongest = peaksHz[0];
  return strongest === undefined
    ? { freqHz: null, label: "the strongest peak, once the live spectrum has one" }
    : { freqHz: strongest, label: `${hz(strongest)} (the strongest peak)` };
}

/** A typed noise line: its frequency in Hz, or what is wrong with it in plain words (it must lie strictly between 0 and fs/2). */
export function readNoiseLine(text: string, sampleRateHz: number): { freqHz: number } | { error: string } {
  const nyquist = sampleRateHz / 2;
  const wrong = numberTextError(text);
  if (wrong) return { error: wrong };
  const f = readNumberText(text, false) ?? Number.NaN;
  if (!(f > 0 && f < nyquist)) return { error: `The noise line must lie between 0 and ${hz(nyquist)} (half the sample rate).` };
  return { freqHz: f };
}
