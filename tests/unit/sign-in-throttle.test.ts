import { describe, expect, it } from "vitest";
import { SignInThrottle } from "@/server/broker/sign-in-throttle";

function clockAt(start = 0) {
  const c = { t: start, now: () => c.t };
  return c;
}

describe("broker sign-in throttle", () => {
  it("lets the first failures through, then doubles the delay per failure up to the cap", () => {
    const clock = clockAt();
    const t = new SignInThrottle(clock, { freeFailures: 3, baseDelayMs: 250, maxDelayMs: 2000 });
    const delays: number[] = [];
    for (let i = 0; i < 8; i++) {
      delays.push(t.delayMs("rig/device", "10.0.0.9"));
      t.fail("rig/device", "10.0.0.9");
    }
    // Address and username each add their own doubling delay once past three failures, capped at 2 s.
    expect(delays).toEqual([0, 0, 0, 0, 500, 1000, 2000, 2000]);
  });

  it("does not slow the real device down from a clean address while a stranger hammers its name", () => {
    const clock = clockAt();
    const t = new SignInThrottle(clock, { freeFailures: 1, baseDelayMs: 100 });
    for (let i = 0; i < 20; i++) t.fail("hydraulic-press/env-node", "203.0.113.7");
    expect(t.delayMs("hydraulic-press/env-node", "203.0.113.7")).toBeGreaterThan(0);
    expect(t.delayMs("hydraulic-press/env-node", "10.0.0.5")).toBe(0);
  });

  it("forgets failures after the window and clears an address on success", () => {
    const clock = clockAt();
    const t = new SignInThrottle(clock, { freeFailures: 0, baseDelayMs: 100, windowMs: 60_000 });
    t.fail("a/b", "10.0.0.1");
    expect(t.delayMs("a/b", "10.0.0.1")).toBe(200);
    t.succeed("10.0.0.1");
    expect(t.delayMs("a/b", "10.0.0.1")).toBe(0);
    t.fail("a/b", "10.0.0.2");
    clock.t += 60_001;
    expect(t.delayMs("a/b", "10.0.0.2")).toBe(0);
  });

  it("remembers at most maxKeys keys (a flood of made-up names cannot grow it without bound)", () => {
    const t = new SignInThrottle(clockAt(), { maxKeys: 10 });
    for (let i = 0; i < 1000; i++) t.fail(`made-up-${i}`, "10.0.0.1");
    expect(t.delayMs("made-up-999", "10.0.0.1")).toBeGreaterThan(0);
  });
});
