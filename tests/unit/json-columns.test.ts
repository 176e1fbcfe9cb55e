import { afterEach, describe, expect, it, vi } from "vitest";
import { readAnalysis, readChannelConfig, readDesign, readQuantized, readSpec } from "@/db/json-columns";
import type { StoredJson } from "@/db/types";
import { buildRevisionContent } from "@/lib/coefficients";
import type { FilterSpec } from "@/lib/dsp";
import { firLowpass255, humChain } from "./coefficients-support";
import { unchecked } from "../support/unchecked";

/** What PostgreSQL gives back for a jsonb column written with JSON.stringify(value). */
function stored<T>(value: T): StoredJson<T> {
  return unchecked<StoredJson<T>>(JSON.parse(JSON.stringify(value)));
}

const at = { table: "revisions", id: 42 } as const;

afterEach(() => vi.restoreAllMocks());

describe("reading JSON columns back", () => {
  it.each<[string, FilterSpec]>([
    ["a chain of notches and a low-pass", humChain],
    ["a 255-tap FIR low-pass", firLowpass255],
  ])("returns %s exactly as it was written: spec, design, quantized form and analysis", (_name, spec) => {
    const content = buildRevisionContent(spec, "q15");
    expect(readSpec(stored(spec), at)).toEqual(JSON.parse(JSON.stringify(spec)));
    expect(readDesign(stored(content.design), at)).toEqual(JSON.parse(JSON.stringify(content.design)));
    expect(readQuantized(stored(content.quantized), at)).toEqual(JSON.parse(JSON.stringify(content.quantized)));
    expect(readAnalysis(stored(content.analysis), at)).toEqual(JSON.parse(JSON.stringify(content.analysis)));
  });

  it("reads a channel entry in the current form and in the form stored before chains", () => {
    const current = { revisionId: "7", sampleRateHz: 1000, format: "f32" as const, stages: [{ kind: "sections" as const, sections: [[1, 0, 0, 1, 0, 0]] }] };
    const legacy = { revisionId: "7", sampleRateHz: 1000, format: "f32" as const, sections: [[1, 0, 0, 1, 0, 0]] };
    expect(readChannelConfig(stored(current), { table: "deployments", id: 3 })).toEqual(current);
    expect(readChannelConfig(stored(legacy), { table: "deployments", id: 3 })).toEqual(legacy);
  });

  it("refuses a stored value that no longer parses with an error naming the table, the row and the column, and logs it", () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const broken = stored(unchecked<FilterSpec>({ kind: "iir", family: "butterworth" }));
    expect(() => readSpec(broken, at)).toThrow(/^revisions row 42: the stored spec no longer parses/);
    const noPoles = stored({ ...buildRevisionContent(humChain, "f32").design, poles: "none" });
    expect(() => readDesign(unchecked(noPoles), at)).toThrow(/^revisions row 42: the stored design no longer parses/);
    expect(() => readChannelConfig(stored(unchecked({ format: "q7" })), { table: "deployments", id: 9 })).toThrow(/^deployments row 9: the stored config/);
    expect(log).toHaveBeenCalledTimes(3);
    expect(String(log.mock.calls[0][0])).toContain("revisions row 42");
  });
});
