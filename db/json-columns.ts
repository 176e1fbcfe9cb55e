import { z } from "zod";
import {
  filterDesignSchema,
  quantizedDesignSchema,
  revisionAnalysisSchema,
  storedChannelConfigSchema,
  type RevisionContent,
  type StoredChannelConfig,
} from "@/lib/coefficients";
import { filterSpecSchema, type FilterDesign, type FilterSpec } from "@/lib/dsp";
import type { StoredJson } from "./types";

/** The row a stored value was read from, named in the error when it no longer parses. */
export interface StoredRow {
  table: "revisions" | "deployments" | "bench_candidates";
  id: number;
}

/**
 * The one way to open a JSON column (see StoredJson in db/types.ts): the stored value checked with
 * the column's zod schema. A value that no longer parses is logged and thrown as an Error naming the
 * table, the row and the column; it never reaches a caller under a type it does not have.
 */
function columnReader<T>(column: string, schema: z.ZodType<T>) {
  return (value: StoredJson<T>, row: StoredRow): T => {
    const parsed = schema.safeParse(value);
    if (parsed.success) return parsed.data;
    const message = `${row.table} row ${row.id}: the stored ${column} no longer parses: ${z.prettifyError(parsed.error)}`;
    console.error(`[db] ${message}`);
    throw new Error(message);
  };
}

/** A filter spec (revisions.spec, bench_candidates.spec). */
export const readSpec = columnReader<FilterSpec>("spec", filterSpecSchema);
/** A revision's float design (revisions.design). */
export const readDesign = columnReader<FilterDesign>("design", filterDesignSchema);
/** A revision's quantized form, null when it could not be quantized (revisions.quantized). */
export const readQuantized = columnReader<RevisionContent["quantized"]>("quantized", quantizedDesignSchema.nullable());
/** A revision's analysis summary and deployability (revisions.analysis). */
export const readAnalysis = columnReader<RevisionContent["analysis"]>("analysis", revisionAnalysisSchema);
/** A deployment's channel entry, current or pre-chain form (deployments.config). */
export const readChannelConfig = columnReader<StoredChannelConfig>("config", storedChannelConfigSchema);
