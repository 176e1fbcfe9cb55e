/**
 * Trace colours. Raw is a muted grey and production a warm amber (tailwind `production`). The six
 * candidate colours come from Paul Tol's colour-blind-safe schemes (Tol, "Colour Schemes", SRON
 * technical note, 2021: bright, vibrant and light): the six of them chosen so that every pair, and
 * each against raw and production, stays far apart in CIEDE2000 for normal vision and under
 * simulated protanopia, deuteranopia and tritanopia, and each stands out on the dark chart canvas
 * (tests/unit/candidate-colors.test.ts checks the distances). No orange (production's) and the rose
 * last, so red-looking lines stay rare.
 */
export const RAW_COLOR = "#94a3b8";
export const PRODUCTION_COLOR = "#f2a93b";
export const CANDIDATE_COLORS = ["#99ddff", "#44bb99", "#aa3377", "#0077bb", "#117733", "#ee6677"] as const;
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
