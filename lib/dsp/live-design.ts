import { peakGainDb } from "./analysis";
import { designFilter } from "./design";
import type { FilterSpec } from "./filter-spec";
import type { FilterDesign } from "./types";

/** A design as the live pipeline runs it, with the passband reference its live metrics judge attenuation against. */
export interface LiveDesign {
  design: FilterDesign;
  /** peakGainDb of the design: found once, where the design is made (a design thread), never on the stream's event loop. */
  passbandDb: number;
}

/** Designs a candidate for the live pipeline. */
export function liveDesign(spec: FilterSpec): LiveDesign {
  const design = designFilter(spec);
  return { design, passbandDb: peakGainDb(design) };
}
