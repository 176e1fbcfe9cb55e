import { cAbs, cArg } from "../complex";
import { loopBlocks } from "./blocks";
import { loopEvaluator, type LoopEvaluator } from "./response";
import { parseLoopModel } from "./schema";

/** The search grid: MARGIN_GRID_POINTS log-spaced frequencies from fs·10^−MARGIN_GRID_DECADES_BELOW_FS to just below fs/2. */
export const MARGIN_GRID_POINTS = 4000;
export const MARGIN_GRID_DECADES_BELOW_FS = 7;
const BISECTION_STEPS = 60;
/** Below this |L| the loop passes through 0 (a zero on the unit circle); such a crossing of the negative real axis is no phase crossover. */
export const ZERO_LOOP_GAIN = 1e-10;

export interface Crossing {
  hz: number;
  /** Gain margin in dB at a phase crossover, phase margin in degrees at a gain crossover. */
  margin: number;
}

export interface StabilityMargins {
  /** −20·log10|L| at the phase crossover nearest in dB to 0 (the smallest gain change to instability), or null. */
  gainMarginDb: number | null;
  phaseCrossoverHz: number | null;
  /** 180° + arg L, wrapped to (−180°, 180°], at the gain crossover where it is smallest, or null. */
  phaseMarginDeg: number | null;
  gainCrossoverHz: number | null;
  /** min over gain crossovers of PM/(360°·f) in ms; null without a crossover or when some PM ≤ 0. */
  delayMarginMs: number | null;
  /** Every crossing found, lowest frequency first. */
  gainCrossovers: Crossing[];
  phaseCrossovers: Crossing[];
}

const wrapDeg = (d: number) => d - 360 * Math.ceil((d - 180) / 360);

/** Bisection in log f on a sign change of g between lo and hi Hz (g(lo) and g(hi) of opposite sign). */
function bisect(g: (hz: number) => number, lo: number, hi: number): number {
  let a = lo;
  let b = hi;
  const ga = g(a) > 0;
  for (let i = 0; i < BISECTION_STEPS; i++) {
    const mid = Math.sqrt(a * b);
    if (g(mid) > 0 === ga) a = mid;
    else b = mid;
  }
  return Math.sqrt(a * b);
}

/**
 * Gain crossovers (|L| = 1) and phase crossovers (L on the negative real axis: Im L = 0, Re L < 0)
 * found as sign changes on the grid, refined by bisection; plus Nyquist, where L is real, when
 * L(−1) < 0. Crossings where |L| < ZERO_LOOP_GAIN are left out. Two crossings closer than one grid step are not separated.
 */
export function findCrossings(at: LoopEvaluator, fs: number): { gain: Crossing[]; phase: Crossing[] } {
  const toOmega = (hz: number) => (2 * Math.PI * hz) / fs;
  const logMag = (hz: number) => Math.log(cAbs(at(toOmega(hz))));
  const imag = (hz: number) => at(toOmega(hz))[1];
  const lo = Math.log10(fs) - MARGIN_GRID_DECADES_BELOW_FS;
  const hi = Math.log10((fs / 2) * (1 - 1e-9));
  const grid = Array.from({ length: MARGIN_GRID_POINTS }, (_, i) => 10 ** (lo + ((hi - lo) * i) / (MARGIN_GRID_POINTS - 1)));
  const values = grid.map((hz) => at(toOmega(hz)));
  const gain: Crossing[] = [];
  const phase: Crossing[] = [];
  for (let i = 0; i + 1 < grid.length; i++) {
    const [v0, v1] = [values[i], values[i + 1]];
    if (cAbs(v0) > 1 !== cAbs(v1) > 1) {
      const hz = bisect(logMag, grid[i], grid[i + 1]);
      gain.push({ hz, margin: wrapDeg(180 + (cArg(at(toOmega(hz))) * 180) / Math.PI) });
    }
    if (v0[1] > 0 !== v1[1] > 0 && (v0[0] < 0 || v1[0] < 0)) {
      const hz = bisect(imag, grid[i], grid[i + 1]);
      const l = at(toOmega(hz));
      if (l[0] < 0 && cAbs(l) > ZERO_LOOP_GAIN) phase.push({ hz, margin: -20 * Math.log10(cAbs(l)) });
    }
  }
  const nyquist = at(Math.PI)[0];
  const last = phase[phase.length - 1];
  if (nyquist < -ZERO_LOOP_GAIN && !(last && last.hz > grid[grid.length - 2])) {
    phase.push({ hz: fs / 2, margin: -20 * Math.log10(-nyquist) });
  }
  return { gain, phase };
}

/**
 * Gain margin, phase margin and delay margin of the loop L = C·z⁻ᵈ·P·F (Franklin, Powell &
 * Emami-Naeini, Feedback Control of Dynamic Systems, 6th ed., §6.4; delay margin PM/ωc, Åström & Murray,
 * Feedback Systems: An Introduction for Scientists and Engineers, §10.3 — from memory). With several crossings the worst is reported: the smallest
 * phase margin, and the gain margin nearest 0 dB (negative when the loop only tolerates a gain
 * reduction). The margins read the Nyquist plot; they presume a closed loop that is stable at the
 * nominal gain — check closedLoopPoles.
 */
export function stabilityMargins(model: unknown): StabilityMargins {
  const m = parseLoopModel(model);
  const { gain, phase } = findCrossings(loopEvaluator(loopBlocks(m)), m.sampleRateHz);
  const worstPhase = phase.reduce<Crossing | null>((w, c) => (w === null || Math.abs(c.margin) < Math.abs(w.margin) ? c : w), null);
  const worstGain = gain.reduce<Crossing | null>((w, c) => (w === null || c.margin < w.margin ? c : w), null);
  const delays = gain.map((c) => (c.margin / (360 * c.hz)) * 1000);
  return {
    gainMarginDb: worstPhase?.margin ?? null,
    phaseCrossoverHz: worstPhase?.hz ?? null,
    phaseMarginDeg: worstGain?.margin ?? null,
    gainCrossoverHz: worstGain?.hz ?? null,
    delayMarginMs: gain.length > 0 && gain.every((c) => c.margin > 0) ? Math.min(...delays) : null,
    gainCrossovers: gain,
    phaseCrossovers: phase,
  };
}
