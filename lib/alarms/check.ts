import type { FilterDesign } from "@/lib/dsp";
import { finiteRuns, replayThrough } from "@/lib/recordings/replay";
import { countRaised } from "./replay";
import type { AlarmRule } from "./rule";

/** What a filter would have done to a channel's filtered-signal rules over some samples. */
export interface FilterCheck {
  /** Raw excursions the filtered signal did not follow (the filter hid them). */
  masked: number;
  /** Alarms the filtered signal raised. */
  caught: number;
  /** Samples looked at (missing ones left out). */
  samples: number;
}

/**
 * Replays raw samples through a filter (each stretch between missing samples on its own, from the
 * steady state of its first sample) and counts, for the rules on the filtered signal, the alarms the
 * filtered signal raises and the excursions it hides. `design` null means no filter (nothing hidden).
 */
export function checkFilter(rules: readonly AlarmRule[], design: FilterDesign | null, raw: Float64Array, sampleRateHz: number): FilterCheck {
  const watched = rules.filter((r) => r.enabled && r.signal === "filtered");
  const filtered = design ? replayThrough(design, raw) : raw;
  const dtMs = 1000 / sampleRateHz;
  const total: FilterCheck = { masked: 0, caught: 0, samples: 0 };
  for (const { from, to } of finiteRuns(raw)) {
    const counts = countRaised(watched, { t0: from * dtMs, dtMs, raw: raw.subarray(from, to), filtered: design ? filtered.subarray(from, to) : null });
    total.masked += counts.masked;
    total.caught += counts.limit;
    total.samples += to - from;
  }
  return total;
}
