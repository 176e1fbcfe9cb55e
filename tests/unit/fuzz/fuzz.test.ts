import { readFileSync } from "node:fs";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { filterSpecSchema } from "@/lib/dsp";
import { stageSize } from "@/lib/dsp/design-size";
import type { StageSpec } from "@/lib/dsp/spec";
import { safeParseInput } from "@/lib/http/fields";
import { parseRecordingCsv, RecordingCsvError } from "@/lib/recordings";
import { BODY_SCHEMAS, bodyProperty, csvProperty, rawBodyProperty, specProperty, type BodyCase } from "./properties";

/** `{ "ramp": n }` in the corpus stands for n coefficients 1, 0.001, 0.002, …, (n − 1)/1000. */
function expand(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(expand);
  if (value && typeof value === "object") {
    if ("ramp" in value && typeof value.ramp === "number") return Array.from({ length: value.ramp }, (_, i) => (i === 0 ? 1 : 0.001 * i));
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, expand(v)]));
  }
  return value;
}

interface Corpus {
  spec: Array<{ found: string; input: unknown; size?: { order: number; sections: number; taps: number }; refusedAt?: string }>;
  csv: Array<{ found: string; text: string; sampleRateHz: number | null }>;
  body: Array<{ found: string; schema: string; body: unknown; refusedAt: string }>;
}

// Read with JSON.parse: the corpus holds lone surrogates (\ud800), which the bundler's JSON loader refuses.
const corpus = JSON.parse(readFileSync(new URL("../../fixtures/fuzz/corpus.json", import.meta.url), "utf8")) as Corpus;

const specs = corpus.spec.map((c) => ({ ...c, input: expand(c.input) }));
const bodies = corpus.body.map((c): BodyCase & { refusedAt: string } => ({ schema: c.schema as BodyCase["schema"], body: c.body, refusedAt: c.refusedAt }));
const csvs = corpus.csv.map((c): [string, number | undefined] => [c.text, c.sampleRateHz ?? undefined]);

describe("fuzz properties, with the corpus replayed first", () => {
  it("specs: refused by the schema, or designed within the size it counted, or refused by the design with a message", () => {
    fc.assert(specProperty(), { numRuns: 150, examples: specs.map((c) => [c.input]) });
  });

  it("CSV: refused with a RecordingCsvError, or finite samples at a finite rate", () => {
    fc.assert(csvProperty(), { numRuns: 400, examples: csvs });
  });

  it("JSON bodies: nothing that passes a route's schema holds unstorable text or an id past 2³¹ − 1", () => {
    fc.assert(bodyProperty(), { numRuns: 400, examples: bodies.map(({ schema, body }) => [{ schema, body }]) });
  });

  it("raw bodies: any bytes parse as JSON or are refused with 400 or 413", async () => {
    await fc.assert(rawBodyProperty(), { numRuns: 200 });
  });
});

describe("the corpus, case by case", () => {
  it.each(specs.filter((c) => c.size))("spec sized as it designs: %#", (c) => {
    expect(stageSize(c.input as StageSpec)).toEqual(c.size);
  });

  it.each(specs.filter((c) => c.refusedAt))("spec refused before any design: %#", (c) => {
    const parsed = filterSpecSchema.safeParse(c.input);
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.path.join("."))).toContain(c.refusedAt);
  });

  it.each(csvs)("CSV refused like Infinity: %j", (text, rate) => {
    expect(() => parseRecordingCsv(text, { channelRateHz: 1000, sampleRateHz: rate })).toThrow(RecordingCsvError);
    expect(() => parseRecordingCsv(text, { channelRateHz: 1000, sampleRateHz: rate })).toThrow(/is not a finite number/);
  });

  it.each(bodies)("body refused at its field: $schema $refusedAt", ({ schema, body, refusedAt }) => {
    const parsed = safeParseInput(BODY_SCHEMAS[schema].schema, body);
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.path.join("."))).toContain(refusedAt);
  });
});
