import { quantizedParts, type QuantizedPart } from "@/lib/dsp";
import { describeExport, DIFFERENCE_EQUATION, stageSource } from "./describe";
import { pythonFloat } from "./literals";
import type { PreparedExport } from "./types";
import { countOf } from "@/lib/format/plural";

const sosRows = (part: QuantizedPart) => (part.sos ?? []).map((r) => `    [${r.map(pythonFloat).join(", ")}],`);

/**
 * Python-pasteable `fs` and coefficients for analysis, the target's quantized coefficients as exact
 * real values (section rows in the scipy.signal sos layout [b0, b1, b2, a0, a1, a2], a0 = 1). A filter
 * of sections only is one `sos` list, stage by stage (for sosfilt and sosfreqz); a filter with FIR
 * stages is one list per stage and `stages`, every stage in order with its kind.
 */
export function renderScipy(p: PreparedExport): string {
  const parts = quantizedParts(p.quantized);
  const title = (k: number) => {
    const part = parts[k];
    const size = part.taps ? `FIR, ${countOf(part.taps.length, "tap")}` : countOf(part.sos?.length ?? 0, "section");
    return `stage ${k} (${stageSource(p, k)}): ${size}`;
  };
  const body = parts.every((part) => !part.taps)
    ? [
        "# Use: scipy.signal.sosfilt(sos, x) or scipy.signal.sosfreqz(sos, fs=fs)",
        "sos = [",
        ...parts.flatMap((part, k) => [...(parts.length > 1 ? [`    # ${title(k)}`] : []), ...sosRows(part)]),
        "]",
      ]
    : [
        "# Use, every stage in order: for kind, c in stages:",
        '#   x = scipy.signal.sosfilt(c, x) if kind == "sos" else scipy.signal.lfilter(c, [1.0], x)',
        ...parts.flatMap((part, k) =>
          part.taps
            ? [`# ${title(k)}`, `stage_${k} = [${part.taps.map(pythonFloat).join(", ")}]`]
            : [`# ${title(k)}`, `stage_${k} = [`, ...sosRows(part), "]"],
        ),
        `stages = [${parts.map((part, k) => `("${part.taps ? "fir" : "sos"}", stage_${k})`).join(", ")}]`,
      ];
  return [
    "# Tapwright coefficient export for analysis. Generated; do not edit by hand.",
    "#",
    ...describeExport(p).map((l) => `# ${l}`),
    "#",
    `# The ${p.target} quantized coefficients as exact real values; section rows [b0, b1, b2, a0, a1, a2]:`,
    `#   ${DIFFERENCE_EQUATION}  (a0 = 1; a1, a2 as in scipy.signal)`,
    `fs = ${pythonFloat(p.quantized.sampleRateHz)}  # Hz`,
    ...body,
    "",
  ].join("\n");
}
