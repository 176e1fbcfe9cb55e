/** Longest identifier stem we emit; C99 guarantees 31 significant characters for external names, 63 internal. */
const MAX_STEM = 40;

/**
 * A C identifier stem from free text: ASCII letters and digits kept (lowercased), every other run
 * of characters becomes one underscore, no leading/trailing underscore (those names are reserved
 * in C), a leading digit gets an `f_` prefix, empty text becomes `filter`.
 */
export function identifierStem(text: string): string {
  const stem = text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "_")
    .replace(/^_+|_+$/g, "")
    .slice(0, MAX_STEM)
    .replace(/_+$/, "");
  if (!stem) return "filter";
  return /^[0-9]/.test(stem) ? `f_${stem}` : stem;
}

/** The export name of a revision for a target, e.g. `hum_notch_r3_q15`; `prefix` overrides the set name. */
export function exportName(setName: string, revision: number, target: string, prefix?: string): string {
  return `${identifierStem(prefix ?? setName)}_r${revision}_${target}`;
}

/** Text safe inside a C block comment and a Python comment: ASCII only, non-ASCII as \uXXXX, no comment terminator. */
export function commentSafe(text: string): string {
  return text
    .replace(/[^\x20-\x7e]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, "0")}`)
    .replace(/\*\//g, "* /");
}
