/**
 * Trace colours. Raw is a muted grey and production a warm amber (tailwind `production`); candidates
 * take the Okabe–Ito colour-blind-safe palette (Okabe & Ito, "Color Universal Design", 2008) without
 * its orange, which would read as production on the chart, and without its black, which vanishes on
 * the dark chart canvas. Vermillion comes last so that red-looking lines stay rare.
 */
export const RAW_COLOR = "#94a3b8";
export const PRODUCTION_COLOR = "#f2a93b";
export const CANDIDATE_COLORS = ["#56b4e9", "#009e73", "#cc79a7", "#f0e442", "#3d8fd1", "#d55e00"] as const;
export const MAX_CANDIDATES = CANDIDATE_COLORS.length;

/** The first palette index not in use, or null when all six are taken. */
export function freeColorIndex(used: readonly number[]): number | null {
  for (let i = 0; i < CANDIDATE_COLORS.length; i++) if (!used.includes(i)) return i;
  return null;
}

/**
 * Colours of a chain's stages where one chain is drawn alone (the stage pole-zero map): the eight
 * Okabe–Ito hues with their black, which vanishes on the dark canvas, replaced by a light grey.
 */
export const STAGE_COLORS = ["#56b4e9", "#e69f00", "#009e73", "#f0e442", "#cc79a7", "#3d8fd1", "#d55e00", "#e2e8f0"] as const;
