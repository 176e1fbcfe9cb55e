// Exploration runner (not a test): runs the fuzz properties with many runs and prints counterexamples.
// Run: node --import tsx tests/unit/fuzz/explore.ts [runs] [seed]; add what it finds to tests/fixtures/fuzz/corpus.json.
import fc from "fast-check";
import { bodyProperty, csvProperty, specProperty } from "./properties";

const params = { numRuns: Number(process.argv[2] ?? 2000), seed: Number(process.argv[3] ?? Date.now() % 100000) };
const report = (name: string, out: { failed: boolean; counterexample: unknown; errorInstance?: unknown }) =>
  console.log(name, params.seed, out.failed ? `FAILED: ${JSON.stringify(out.counterexample)} ${String(out.errorInstance).slice(0, 300)}` : "ok");
report("spec", fc.check(specProperty(), params));
report("csv", fc.check(csvProperty(), params));
report("body", fc.check(bodyProperty(), params));
