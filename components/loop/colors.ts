import { CANDIDATE_COLORS, RAW_COLOR } from "@/lib/bench/colors";

/** The loop without the filter in the muted grey of raw traces; with it in the first candidate colour. */
export const WITHOUT_COLOR = RAW_COLOR;
export const WITH_COLOR = CANDIDATE_COLORS[0];
export const GUIDE_COLOR = "#64748b";
