import { describe, expect, it } from "vitest";
import { PassCache } from "@/lib/bench/pass-cache";

describe("PassCache", () => {
  it("reuses what the previous pass computed and forgets what a pass did not ask for", () => {
    const cache = new PassCache<string>();
    let computed = 0;
    const make = (k: string) => () => `${k}#${++computed}`;
    expect([cache.get("a", make("a")), cache.get("b", make("b"))]).toEqual(["a#1", "b#2"]);
    cache.endPass();
    expect(cache.get("a", make("a"))).toBe("a#1");
    cache.endPass();
    // "b" was not asked for in the second pass, so the third computes it again.
    expect([cache.get("a", make("a")), cache.get("b", make("b"))]).toEqual(["a#1", "b#3"]);
  });
});
