import { linearGrid } from "../analysis/grid";
import { frequencyResponse } from "../analysis/frequency-response";
import type { FilterDesign } from "../types";

export interface PhaseCost {
  /** Phase lag −arg F(e^{j2πf/fs}) in degrees, unwrapped from 0 Hz (negative for a lead). */
  lagDeg: number;
  /** The same lag as a time: lag/(360°·f) in ms (the phase delay at f). */
  lagMs: number;
}

/** Grid points per Nyquist band used to unwrap the phase from 0 Hz up to the frequency asked. */
const UNWRAP_POINTS_PER_BAND = 8192;

/**
 * The phase a filter adds at atHz (0 < atHz < fs/2), e.g. at a loop's crossover, where it is
 * lost from the phase margin one for one (Franklin, Powell & Emami-Naeini, Feedback Control of Dynamic Systems, 6th ed., §6.4 — from memory). A
 * pure delay of Td costs 360°·f·Td. The phase is unwrapped on a linear grid from 0 Hz.
 */
export function filterPhaseCost(design: FilterDesign, atHz: number): PhaseCost {
  const fs = design.sampleRateHz;
  if (!(Number.isFinite(atHz) && atHz > 0 && atHz < fs / 2)) {
    throw new Error(`atHz must satisfy 0 < f < fs/2 = ${fs / 2} Hz (got ${atHz})`);
  }
  const points = Math.max(64, Math.ceil((UNWRAP_POINTS_PER_BAND * atHz) / (fs / 2)));
  const grid = linearGrid(2 * atHz, points); // 0 … atHz inclusive (linearGrid spans 0 to half the rate it is given)
  const phase = frequencyResponse(design, grid).phaseRad;
  const lagDeg = (-phase[phase.length - 1] * 180) / Math.PI;
  return { lagDeg, lagMs: (lagDeg / (360 * atHz)) * 1000 };
}
