import type { z } from "zod";
import { isBand } from "./iir/spec";
import { SPEC_LIMITS, type StageSpec } from "./spec";

/** What a design will hold, counted from its spec before anything is designed. */
export interface DesignSize {
  /** Degree of the transfer function: the number of its poles (or zeros, whichever is more). */
  order: number;
  /** Second-order sections of the recursive (IIR) part. */
  sections: number;
  /** Taps of the non-recursive (FIR) part. */
  taps: number;
}

const NONE: DesignSize = { order: 0, sections: 0, taps: 0 };

const recursive = (order: number): DesignSize => ({ order, sections: Math.ceil(order / 2), taps: 0 });
const fir = (taps: number): DesignSize => ({ order: Math.max(0, taps - 1), sections: 0, taps });

/** Whether pasted b/a is an FIR (a missing, or a0 followed only by zeros, as designFromBa reads it). */
const pastedFir = (a: number[] | undefined) => a === undefined || a.slice(1).every((c) => c === 0);

/** The size of one stage; a count on an invalid field is 0 (that field is refused on its own). */
export function stageSize(spec: StageSpec): DesignSize {
  const count = (n: number) => (Number.isInteger(n) && n > 0 ? n : 0);
  switch (spec.kind) {
    case "iir":
      return recursive(count(spec.order) * (isBand(spec.response) ? 2 : 1));
    case "biquad":
    case "notch":
      return recursive(2);
    case "comb": {
      // scipy.signal.iircomb: numerator and denominator of degree N = fs / f0.
      const n = spec.sampleRateHz / spec.fundamentalHz;
      return recursive(Number.isFinite(n) && n > 0 ? Math.round(n) : 0);
    }
    case "ema":
      return recursive(1);
    case "fir":
    case "fir-equiripple":
    case "fir-arbitrary":
      return fir(count(spec.taps));
    case "moving-average":
      return fir(count(spec.length));
    case "differentiator":
      return fir(2);
    case "analog": {
      // A constant den (after leading zeros) leaves no poles: the design is a one-tap FIR (a gain).
      const denDegree = spec.den.length - 1 - Math.max(0, spec.den.findIndex((c) => c !== 0));
      return denDegree <= 0 ? fir(1) : recursive(Math.max(spec.num.length, spec.den.length) - 1);
    }
    case "coefficients":
      if (spec.sos !== undefined) return { order: 2 * spec.sos.length, sections: spec.sos.length, taps: 0 };
      if (spec.b === undefined) return NONE;
      if (pastedFir(spec.a)) return fir(spec.b.length);
      return recursive(Math.max(spec.b.length, spec.a?.length ?? 1) - 1);
  }
}

/** The size of a whole design: the sum over its running stages (a cascade's order is the sum of its stages'). */
export function totalSize(stages: StageSpec[]): DesignSize {
  return stages.map(stageSize).reduce((t, s) => ({ order: t.order + s.order, sections: t.sections + s.sections, taps: t.taps + s.taps }), NONE);
}

/**
 * Refuses a design whose running stages together exceed the design-size limits (SPEC_LIMITS:
 * maxTotalSections, maxTotalTaps, maxTotalOrder) with a message naming the total and what to change;
 * the order is reported only when it alone is over. `path` is where the issue is reported.
 */
export function checkDesignSize(ctx: z.RefinementCtx, stages: StageSpec[], path: Array<string | number>, chain: boolean): void {
  const size = totalSize(stages);
  const { maxTotalSections, maxTotalTaps, maxTotalOrder, maxPastedDenominator } = SPEC_LIMITS;
  const what = chain ? `the chain's ${stages.length} running stages have` : "this design has";
  const refuse = (message: string) => ctx.addIssue({ code: "custom", path, message });
  const sectionsOver = size.sections > maxTotalSections;
  const tapsOver = size.taps > maxTotalTaps;
  if (sectionsOver) {
    const hint = chain
      ? "lower the stages' orders or remove stages"
      : `pasted b and a may have at most ${maxPastedDenominator} coefficients each, or give b alone for an FIR`;
    refuse(`${what} ${size.sections} second-order sections in total; at most ${maxTotalSections} are allowed in one design: ${hint}`);
  }
  if (tapsOver) {
    refuse(`${what} ${size.taps} FIR taps in total; at most ${maxTotalTaps} are allowed in one design: use fewer taps${chain ? " or fewer FIR stages" : ""}`);
  }
  if (!sectionsOver && !tapsOver && size.order > maxTotalOrder) {
    refuse(`${what} order ${size.order} in total; at most ${maxTotalOrder} is allowed in one design: use fewer taps or lower orders`);
  }
}
