import type { RunForm } from "../analysis/design-form";
import { directFormDcGain } from "../dc-gain";
import { DirectFormState } from "./direct-form-state";
import { FirState } from "./fir-state";
import { packSos, packTaps } from "./sos-coefficients";
import { SosState } from "./sos-state";

/** What the streaming filter asks of any state: rest, steady state for a constant, and running a block. */
export interface FilterState {
  clear(): void;
  settle(v: number): void;
  run(x: Float64Array, y: Float64Array, start: number, end: number): void;
  runIfFinite(x: Float64Array, y: Float64Array, start: number, end: number): boolean;
}

interface Part {
  state: FilterState;
  /** DC gain of the part (dimensionless), to carry a constant input's steady state to the next part. */
  dcGain: number;
}

/**
 * A cascade of parts run one after the other, each over the whole block (the kernels read x[n]
 * before writing y[n], so the later parts run in place). Adjacent SOS parts are merged into one
 * kernel: a section's arithmetic depends only on its own input and state, so the output is
 * bit-identical to running them apart, and one pass over the block is cheaper than several.
 */
export class CascadeState implements FilterState {
  private readonly parts: Part[];

  constructor(form: RunForm, withStep: boolean) {
    const merged: RunForm = [];
    for (const part of form) {
      const last = merged[merged.length - 1];
      if (part.kind === "sos" && last?.kind === "sos") merged[merged.length - 1] = { kind: "sos", sos: [...last.sos, ...part.sos] };
      else merged.push(part);
    }
    this.parts = merged.map((part): Part => {
      if (part.kind === "sos") return { state: new SosState(packSos(part.sos), withStep), dcGain: sosDcGain(part.sos) };
      if (part.kind === "ba") return { state: new DirectFormState(part.b, part.a, withStep), dcGain: directFormDcGain(part.b, part.a) ?? Infinity };
      return { state: new FirState(packTaps(part.taps)), dcGain: part.taps.reduce((s, t) => s + t, 0) };
    });
  }

  /** The single state when there is only one part (no cascade overhead), else the cascade itself. */
  simplest(): FilterState {
    return this.parts.length === 1 ? this.parts[0].state : this;
  }

  clear(): void {
    for (const p of this.parts) p.state.clear();
  }

  /** Steady state for a constant input v: each part settles at its input's constant, v times the DC gain before it. */
  settle(v: number): void {
    let level = v;
    for (const p of this.parts) {
      p.state.settle(level);
      level *= p.dcGain;
    }
  }

  run(x: Float64Array, y: Float64Array, start: number, end: number): void {
    this.parts[0].state.run(x, y, start, end);
    for (let i = 1; i < this.parts.length; i++) this.parts[i].state.run(y, y, start, end);
  }

  /** The first part proves the block finite (or undoes itself); the later parts then run on its output. */
  runIfFinite(x: Float64Array, y: Float64Array, start: number, end: number): boolean {
    if (!this.parts[0].state.runIfFinite(x, y, start, end)) return false;
    for (let i = 1; i < this.parts.length; i++) this.parts[i].state.run(y, y, start, end);
    return true;
  }
}

/** Π (b0+b1+b2)/(1+a1+a2) over sections (Infinity for a pole at z = 1, which SosState already refuses for 'step'). */
function sosDcGain(sos: number[][]): number {
  return sos.reduce((g, [b0, b1, b2, , a1, a2]) => (g * (b0 + b1 + b2)) / (1 + a1 + a2), 1);
}
