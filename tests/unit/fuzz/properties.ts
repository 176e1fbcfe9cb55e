import fc from "fast-check";
import { designFilter, filterSpecSchema, SPEC_LIMITS, type FilterSpec } from "@/lib/dsp";
import { totalSize } from "@/lib/dsp/design-size";
import { activeStages } from "@/lib/dsp/filter-spec";
import { AppError } from "@/lib/errors";
import { readJson } from "@/lib/http/body";
import { safeParseInput, unstorableTextAt } from "@/lib/http/fields";
import { MAX_SAMPLES, parseRecordingCsv, RecordingCsvError } from "@/lib/recordings";
import { createSetSchema, addRevisionSchema, listSetsSchema } from "@/app/api/v1/sets/schema";
import { transitionSchema, promoteSchema } from "@/app/api/v1/revisions/schema";
import { rollbackSchema } from "@/app/api/v1/deployments/schema";
import { uploadFieldsSchema } from "@/app/api/v1/recordings/schema";
import { auditQuerySchema } from "@/app/api/v1/audit/schema";
import { loginSchema } from "@/app/api/auth/login/schema";

/**
 * Fuzz properties for the three kinds of input strangers can send: filter specs, recording CSV and
 * JSON bodies. tests/unit/fuzz/fuzz.test.ts runs them with the corpus of cases found so far
 * (tests/fixtures/fuzz/corpus.json) first; tests/unit/fuzz/explore.ts runs them long to find more.
 */

// ---- Specs ---------------------------------------------------------------------------------------

const fs = fc.constantFrom(100, 1000, 48000, 0.5);
const anyNumber = fc.oneof(fc.double(), fc.integer({ min: -5, max: 5000 }), fc.constantFrom(0, -0, 1e308, -1e-308, 0.5));
const frequency = fc.oneof(anyNumber, fc.tuple(anyNumber, anyNumber));
const coefficients = (max: number) => fc.array(fc.double({ min: -4, max: 4, noNaN: true }), { minLength: 0, maxLength: max });

export const stageArb: fc.Arbitrary<Record<string, unknown>> = fc.oneof(
  fc.record({
    kind: fc.constant("iir"),
    family: fc.constantFrom("butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel", "other"),
    response: fc.constantFrom("lowpass", "highpass", "bandpass", "bandstop"),
    order: fc.integer({ min: -1, max: 14 }),
    cutoffHz: frequency,
    passbandRippleDb: fc.option(anyNumber, { nil: undefined }),
    stopbandAttenuationDb: fc.option(anyNumber, { nil: undefined }),
  }),
  fc.record({ kind: fc.constant("biquad"), shape: fc.constantFrom("lowpass", "notch", "peaking", "highshelf"), centerHz: anyNumber, q: anyNumber, gainDb: fc.option(anyNumber, { nil: undefined }) }),
  fc.record({
    kind: fc.constant("fir"),
    response: fc.constantFrom("lowpass", "highpass", "bandpass", "bandstop"),
    window: fc.constantFrom("rectangular", "hann", "hamming", "blackman", "kaiser"),
    taps: fc.integer({ min: 0, max: 1100 }),
    cutoffHz: frequency,
    kaiserBeta: fc.option(anyNumber, { nil: undefined }),
  }),
  fc.record({ kind: fc.constant("moving-average"), length: fc.integer({ min: 0, max: 2100 }) }),
  fc.record({ kind: fc.constant("ema"), cutoffHz: anyNumber }),
  fc.record({ kind: fc.constant("differentiator") }),
  fc.record({ kind: fc.constant("analog"), num: coefficients(22), den: coefficients(22), method: fc.constantFrom("tustin", "zoh", "matched", "forward-euler", "backward-euler") }),
  fc.record({ kind: fc.constant("coefficients"), b: coefficients(1100), a: fc.option(coefficients(70), { nil: undefined }) }),
  fc.record({ kind: fc.constant("coefficients"), sos: fc.array(fc.tuple(...Array.from({ length: 6 }, () => fc.double({ min: -2, max: 2, noNaN: true }))), { maxLength: 40 }) }),
);

/** Specs as a stranger may send them: single stages and chains, often invalid. */
export const specArb: fc.Arbitrary<unknown> = fc.oneof(
  fc.tuple(stageArb, fs).map(([s, rate]) => ({ ...s, sampleRateHz: rate })),
  fc.tuple(fc.array(fc.tuple(stageArb, fc.boolean()), { minLength: 0, maxLength: 10 }), fs).map(([stages, rate]) => ({
    kind: "chain",
    sampleRateHz: rate,
    stages: stages.map(([s, bypassed]) => ({ ...s, sampleRateHz: rate, ...(bypassed ? { bypassed } : {}) })),
  })),
  fc.jsonValue(),
);

/**
 * A spec is either refused by the schema with issues, or designs within the size the schema counted
 * (so the limits bound the work), or its design throws an Error with a message: nothing else escapes.
 */
export const specProperty = () =>
  fc.property(specArb, (input) => {
    const parsed = filterSpecSchema.safeParse(input);
    if (!parsed.success) return parsed.error.issues.length > 0;
    const spec: FilterSpec = parsed.data;
    const size = totalSize(activeStages(spec).map((s) => s.spec));
    if (size.sections > SPEC_LIMITS.maxTotalSections || size.taps > SPEC_LIMITS.maxTotalTaps || size.order > SPEC_LIMITS.maxTotalOrder) return false;
    let design;
    try {
      design = designFilter(spec);
    } catch (err) {
      return err instanceof Error && err.message.length > 0 && !(err instanceof TypeError);
    }
    const stages = design.stages ?? [design];
    const sections = stages.reduce((n, s) => n + (s.sos?.length ?? 0), 0);
    const taps = stages.reduce((n, s) => n + (s.taps?.length ?? 0), 0);
    return sections <= size.sections && taps <= size.taps && design.poles.length <= size.order && (design.zeros?.length ?? 0) <= size.order;
  });

// ---- CSV -----------------------------------------------------------------------------------------

const cell = fc.oneof(
  fc.double().map(String),
  fc.integer().map(String),
  fc.constantFrom("", "NaN", "nan", "Infinity", "-Infinity", "1e999", "-1e400", "1e-400", "0x10", "1,5", '"1.5"', "1_000", " 2 ", "+.5", "5.", "٣", "\u0000", "\uD800"),
  fc.string({ maxLength: 8 }),
);
const row = fc.array(cell, { minLength: 1, maxLength: 3 }).map((cells) => cells.join(","));
const eol = fc.constantFrom("\n", "\r\n", "\r");
export const csvArb: fc.Arbitrary<string> = fc.oneof(
  // Any rows under any header: mostly refused for their shape.
  fc.tuple(fc.constantFrom("t_s,x[V]", "x", "time,x", "t_s", "t_s,a,b", ""), fc.array(row, { maxLength: 30 }), eol).map(([header, rows, end]) => [header, ...rows].join(end)),
  // Well-formed files whose values are anything: these reach the value checks.
  fc.tuple(fc.array(cell, { minLength: 2, maxLength: 30 }), eol).map(([cells, end]) => ["x[V]", ...cells].join(end)),
  fc.tuple(fc.array(cell, { minLength: 2, maxLength: 30 }), eol).map(([cells, end]) => ["t_s,x[V]", ...cells.map((c, i) => `${(i / 1000).toFixed(3)},${c}`)].join(end)),
);

/** Parsing CSV either refuses with a RecordingCsvError or gives finite samples (NaN for gaps) at a finite rate. */
export const csvProperty = () =>
  fc.property(fc.oneof(csvArb, fc.string({ maxLength: 200 })), fc.constantFrom(undefined, 1000, 1000, 1e-9, 1e308), (text, rate) => {
    try {
      const r = parseRecordingCsv(text, { channelRateHz: 1000, sampleRateHz: rate });
      return r.samples.length <= MAX_SAMPLES && r.samples.every((v) => Number.isNaN(v) || Number.isFinite(v)) && Number.isFinite(r.sampleRateHz) && r.sampleRateHz > 0;
    } catch (err) {
      return err instanceof RecordingCsvError;
    }
  });

// ---- JSON bodies ---------------------------------------------------------------------------------

const nasty = fc.constantFrom("\u0000", "\uD800", "\uDFFF", "a\u0000b", "\uD83D", "🎛", "%00", "\\u0000", "2147483648", "1e999", "-0", "9".repeat(400));
const jsonish: fc.Arbitrary<unknown> = fc.letrec((tie) => ({
  value: fc.oneof(
    { depthSize: "small" },
    fc.string({ unit: "binary", maxLength: 12 }),
    nasty,
    fc.double(),
    fc.integer({ min: -(2 ** 53), max: 2 ** 53 }),
    fc.boolean(),
    fc.constant(null),
    fc.array(tie("value"), { maxLength: 4 }),
    fc.dictionary(fc.oneof(fc.string({ maxLength: 6 }), nasty), tie("value"), { maxKeys: 5 }),
  ),
})).value;

/** Bodies shaped like a route's, with any field replaced by anything. */
const shaped = (base: Record<string, unknown>) =>
  fc.tuple(fc.constantFrom(...Object.keys(base)), jsonish).map(([key, value]) => ({ ...base, [key]: value }));

const SPEC = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 100, sampleRateHz: 1000 };
export const BODY_SCHEMAS = {
  createSet: { schema: createSetSchema, base: { channel: "a/b/c", name: "n", notes: "x", spec: SPEC } },
  addRevision: { schema: addRevisionSchema, base: { spec: SPEC, notes: "x", expectedLatestRevision: 1 } },
  listSets: { schema: listSetsSchema, base: { channel: "a/b/c", q: "x", author: "y", page: "1", pageSize: "20" } },
  transition: { schema: transitionSchema, base: { action: "submit", expectedVersion: 1, comment: "c" } },
  promote: { schema: promoteSchema, base: { channels: ["a/b/c"] } },
  rollback: { schema: rollbackSchema, base: { channel: "a/b/c", expectedActiveId: 1 } },
  upload: { schema: uploadFieldsSchema, base: { channel: "a/b/c", name: "n", notes: "x", sampleRateHz: "1000" } },
  audit: { schema: auditQuerySchema, base: { actor: "a", entity: "set", action: "x", from: "2026-01-01", to: "2026-01-02", page: "1" } },
  login: { schema: loginSchema, base: { email: "a@b.test", password: "p" } },
} as const;

/** What passes a body schema holds no unstorable text, and no integer beyond what a column takes. */
export type BodyCase = { schema: keyof typeof BODY_SCHEMAS; body: unknown };

export const bodyProperty = () =>
  fc.property(
    fc.constantFrom(...(Object.keys(BODY_SCHEMAS) as Array<keyof typeof BODY_SCHEMAS>)).chain((name) =>
      fc.oneof(shaped(BODY_SCHEMAS[name].base), jsonish).map((body): BodyCase => ({ schema: name, body })),
    ),
    ({ schema, body }) => {
      const parsed = safeParseInput(BODY_SCHEMAS[schema].schema, body);
      if (!parsed.success) return parsed.error.issues.length > 0;
      const ints = JSON.stringify(parsed.data, (_k, v) => (typeof v === "number" && Number.isInteger(v) && Math.abs(v) > 2 ** 31 - 1 && _k !== "sampleRateHz" ? "TOO_BIG" : v));
      return unstorableTextAt(parsed.data) === null && !ints.includes("TOO_BIG");
    },
  );

/** Reading any bytes as a JSON body either parses or refuses with an AppError (400 or 413). */
export const rawBodyProperty = () =>
  fc.asyncProperty(fc.uint8Array({ maxLength: 300 }), fc.integer({ min: 16, max: 400 }), async (bytes, limit) => {
    try {
      await readJson(new Request("http://x.test", { method: "POST", body: bytes }), limit);
      return bytes.length <= limit;
    } catch (err) {
      return err instanceof AppError && (err.code === "bad_request" || err.code === "too_large");
    }
  });
