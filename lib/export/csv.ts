import type { PreparedExport } from "./types";

const HEADER = ["stage", "spec_stage", "kind", "section", "coefficient", "value", "word", "shift"];
const SECTION_NAMES = ["b0", "b1", "b2", "a1", "a2"];

/**
 * A revision's coefficients for the target as CSV (RFC 4180: a header line, CRLF line ends; no field
 * needs quoting), one row per coefficient for checking numbers in a spreadsheet: its stage (and the
 * stage's index in the spec), kind (sections or fir), section number (empty for FIR taps), name (b0 …
 * a2 in our sign convention, subtracted; h0 … for taps, h0 on the newest input), its real value
 * (word · 2^(shift − F) exactly, or the float32 value), and for Q15/Q31 the word and post-shift.
 */
export function renderCsv(p: PreparedExport): string {
  const bits = p.target === "q15" ? 15 : 31;
  const row = (k: number, kind: string, section: string, name: string, value: number, word: number | null, shift: number) =>
    [k, p.specStages[k], kind, section, name, String(value), word === null ? "" : String(word), shift].join(",");
  const rows = p.content.stages.flatMap((stage, k) => {
    if (stage.kind === "fir") {
      if (Array.isArray(stage.taps)) return stage.taps.map((v, i) => row(k, "fir", "", `h${i}`, v, null, 0));
      const { words, shift } = stage.taps;
      return words.map((w, i) => row(k, "fir", "", `h${i}`, w * 2 ** (shift - bits), w, shift));
    }
    return stage.sections.flatMap((s, j) =>
      Array.isArray(s)
        ? s.map((v, i) => row(k, "sections", String(j), SECTION_NAMES[i], v, null, 0))
        : s.words.map((w, i) => row(k, "sections", String(j), SECTION_NAMES[i], w * 2 ** (s.shift - bits), w, s.shift)),
    );
  });
  return [HEADER.join(","), ...rows].join("\r\n") + "\r\n";
}
