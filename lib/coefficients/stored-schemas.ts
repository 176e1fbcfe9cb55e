import { z } from "zod";
import type { FilterDesign, QuantizedDesign } from "@/lib/dsp";
import type { AnalysisSummary } from "./analysis";
import type { RevisionContent } from "./revision-content";

/**
 * Schemas of what a revision stores beside its spec (the design, its quantized form, the analysis
 * summary), checked when a row is read back (db/json-columns.ts). Objects are loose: a key this code
 * does not know is kept as stored, so reading a row never changes what it says.
 */

const num = z.number();
const complex = z.tuple([num, num]);
const rows = z.array(z.array(num));

const singleDesign = {
  sampleRateHz: num,
  sos: rows.optional(),
  taps: z.array(num).optional(),
  ba: z.looseObject({ b: z.array(num), a: z.array(num) }).optional(),
  zeros: z.array(complex).optional(),
  poles: z.array(complex),
  gain: num,
};

/** A designed filter as lib/dsp's FilterDesign: one design, or a chain's stages. */
export const filterDesignSchema: z.ZodType<FilterDesign> = z.looseObject({
  ...singleDesign,
  stages: z.array(z.looseObject({ ...singleDesign, stage: z.number().int() })).optional(),
});

const quantizedPart = { sos: rows.optional(), taps: z.array(num).optional(), integers: rows.optional(), shifts: z.array(num) };

/** A design's quantized form as lib/dsp's QuantizedDesign. */
export const quantizedDesignSchema: z.ZodType<QuantizedDesign> = z.looseObject({
  ...quantizedPart,
  format: z.enum(["f32", "q15", "q31"]),
  sampleRateHz: num,
  stages: z.array(z.looseObject({ ...quantizedPart, stage: z.number().int() })).optional(),
  stable: z.boolean(),
  maxPoleRadiusBefore: num,
  maxPoleRadius: num,
  maxDeviationDb: num,
  headroom: z.array(z.looseObject({ part: z.number().int(), sinePeakDb: num, worstCaseDb: num })).optional(),
});

const nullableNum = num.nullable();

const analysisSummarySchema: z.ZodType<AnalysisSummary> = z.looseObject({
  stable: z.boolean(),
  maxPoleRadius: num,
  cutoffsHz: z.array(num),
  peakGainDb: nullableNum,
  groupDelayDcSamples: nullableNum,
  groupDelayDcMs: nullableNum,
  step: z.looseObject({ riseTimeS: nullableNum, overshootPercent: nullableNum, settlingTimeS: nullableNum, finalValue: nullableNum }),
});

/** A revision's stored analysis: the summary and whether it may go to a device. */
export const revisionAnalysisSchema: z.ZodType<RevisionContent["analysis"]> = z.intersection(
  analysisSummarySchema,
  z.looseObject({
    deployable: z.discriminatedUnion("ok", [z.looseObject({ ok: z.literal(true) }), z.looseObject({ ok: z.literal(false), reason: z.string() })]),
  }),
);
