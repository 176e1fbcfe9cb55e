import { frequencyResponse, type FilterDesign } from "@/lib/dsp";

export interface FieldChange {
  /** Dotted path of the field, e.g. `cutoffHz` or `sos.0.4`. */
  field: string;
  before: unknown;
  after: unknown;
}

function flatten(value: unknown, prefix: string, out: Map<string, unknown>): Map<string, unknown> {
  if (value !== null && typeof value === "object") {
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) flatten(v, prefix ? `${prefix}.${k}` : k, out);
  } else out.set(prefix, value);
  return out;
}

/** Spec fields that differ between two revisions (added or removed fields show `undefined` on one side), sorted by path. */
export function diffSpecs(before: unknown, after: unknown): FieldChange[] {
  const a = flatten(before, "", new Map());
  const b = flatten(after, "", new Map());
  const fields = [...new Set([...a.keys(), ...b.keys()])].sort();
  return fields.filter((f) => !Object.is(a.get(f), b.get(f))).map((f) => ({ field: f, before: a.get(f), after: b.get(f) }));
}

/** Frequencies in Hz for a magnitude plot: `n` points log-spaced from fs/10⁴ to just below fs/2. */
export function plotFrequencies(sampleRateHz: number, n = 240): number[] {
  const lo = Math.log10(sampleRateHz / 1e4);
  const hi = Math.log10(sampleRateHz / 2);
  return Array.from({ length: n }, (_, i) => 10 ** (lo + ((hi - lo) * i) / (n - 1)));
}

/** Magnitude responses in dB of several designs on one frequency grid (column per series, uPlot style). */
export function magnitudeSeries(designs: FilterDesign[], freqsHz: number[]): number[][] {
  return designs.map((d) => frequencyResponse(d, freqsHz).magnitudeDb);
}
