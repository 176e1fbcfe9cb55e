import { describeExport, DIFFERENCE_EQUATION } from "./describe";
import { pythonFloat } from "./literals";
import type { PreparedExport } from "./types";

/**
 * Python-pasteable `fs` and `sos` for analysis (scipy.signal sos convention: rows
 * [b0, b1, b2, a0, a1, a2], a0 = 1): the target's quantized coefficients as exact real values.
 */
export function renderScipy(p: PreparedExport): string {
  const rows = (p.quantized.sos ?? []).map((r) => `    [${r.map(pythonFloat).join(", ")}],`);
  return [
    "# Tapwright coefficient export for analysis. Generated; do not edit by hand.",
    "#",
    ...describeExport(p).map((l) => `# ${l}`),
    "#",
    `# Rows [b0, b1, b2, a0, a1, a2], the ${p.target} quantized coefficients as exact real values:`,
    `#   ${DIFFERENCE_EQUATION}  (a0 = 1; a1, a2 as in scipy.signal)`,
    "# Use: scipy.signal.sosfilt(sos, x) or scipy.signal.sosfreqz(sos, fs=fs)",
    `fs = ${pythonFloat(p.quantized.sampleRateHz)}  # Hz`,
    "sos = [",
    ...rows,
    "]",
    "",
  ].join("\n");
}
