import { CAUTION_LIMITS } from "@/lib/bench/cautions";
import { withUnit } from "@/lib/bench/format";
import type { PhaseCost } from "@/lib/dsp/loop";
import type { LoopAnalysis } from "./analysis";

/** Typical targets (Franklin, Powell & Emami-Naeini, Feedback Control of Dynamic Systems, 6th ed. — from memory). */
export const LOOP_TARGETS = { phaseMarginDeg: 45, gainMarginDb: 6 } as const;

export interface LoopCaution {
  id: string;
  title: string;
  text: string;
}

/** Plain-words cautions about one loop ("with the filter" or "without it"); the review line is appended on display. */
function marginCautions(a: LoopAnalysis, tag: string): LoopCaution[] {
  const out: LoopCaution[] = [];
  const { phaseMarginDeg: pm, gainMarginDb: gm } = a.margins;
  if (!a.poles.stable) {
    out.push({
      id: `unstable-${tag}`,
      title: `The closed loop ${tag} is unstable`,
      text: `A closed-loop pole lies at |z| = ${withUnit(a.poles.maxRadius, "", 4)}, on or outside the unit circle: the axis would oscillate or run away. Lower the gains, speed up the filter, or remove it from the loop.`,
    });
  }
  if (pm !== null && pm < LOOP_TARGETS.phaseMarginDeg) {
    out.push({
      id: `pm-${tag}`,
      title: `Phase margin ${tag} is ${withUnit(pm, "°", 3)}`,
      text: `Below the typical target of ${LOOP_TARGETS.phaseMarginDeg}°: expect overshoot and ringing in the step, and little room for extra delay or a slower valve.`,
    });
  }
  if (gm !== null && Math.abs(gm) < LOOP_TARGETS.gainMarginDb) {
    out.push({
      id: `gm-${tag}`,
      title: `Gain margin ${tag} is ${withUnit(gm, "dB", 3)}`,
      text: `Within ${LOOP_TARGETS.gainMarginDb} dB of instability: a gain change of that size (supply pressure, load, wear) would put a closed-loop pole on the unit circle.`,
    });
  }
  return out;
}

/** Cautions for the loop with the filter, the base loop's own shortfalls, and the filter's lag at the crossover. */
export function loopCautions(without: LoopAnalysis, withF: LoopAnalysis | null, lag: PhaseCost | null, crossoverHz: number | null): LoopCaution[] {
  const out = withF ? marginCautions(withF, "with the filter") : [];
  out.push(...marginCautions(without, "without the filter"));
  if (lag && crossoverHz !== null && lag.lagDeg > CAUTION_LIMITS.loopPhaseDeg) {
    out.push({
      id: "lag",
      title: `The filter adds ${withUnit(lag.lagDeg, "°", 3)} of lag at the crossover`,
      text: `At ${withUnit(crossoverHz, "Hz", 3)} the filter delays the measurement by ${withUnit(lag.lagMs, "ms", 3)}; more than ${CAUTION_LIMITS.loopPhaseDeg}° comes straight off the phase margin. A higher cutoff or a lower order costs less.`,
    });
  }
  return out;
}
