import { describe, expect, it } from "vitest";
import { MASK_GRACE_MS, replayRules, type AlarmRule, type AlarmTransition } from "@/lib/alarms";
import { DEMO_ALARM_RULES, DEMO_PRODUCTION } from "@/lib/demo/lab";
import { designFilter, filterSignal } from "@/lib/dsp";
import { RECIPES } from "@/server/demo-rig/recipes";
import { createSignalSource } from "@/server/demo-rig/signals";

const PATH = "hydraulic-press/supply-node/supply-pressure";
const FS = 1000;
const SECONDS = 15 * 60;

/** The 12 Hz pump-ripple notch followed by a 25 Hz low-pass: the demo's production filter on this channel. */
const chain = designFilter(DEMO_PRODUCTION.spec);

const seeded = DEMO_ALARM_RULES.find((r) => r.channel === PATH)!;
const rule: AlarmRule = { ...seeded, id: 1, enabled: true };

/** Raise/clear pairs of one rule and kind, as [raisedAt, clearedAt] in ms. */
function episodes(ts: AlarmTransition[], ruleId: number, kind: "limit" | "masked"): Array<[number, number]> {
  const mine = ts.filter((t) => t.ruleId === ruleId && t.kind === kind);
  const out: Array<[number, number]> = [];
  for (let i = 0; i + 1 < mine.length; i += 2) out.push([mine[i].at, mine[i + 1].at]);
  return out;
}

describe("the demo supply pressure and its seeded rule", () => {
  const raw = createSignalSource(RECIPES[PATH], FS, 20261201).next(SECONDS * FS);
  const filtered = filterSignal(chain, raw, { initial: "step" });
  const transitions = replayRules([rule, { ...rule, id: 2, signal: "raw" }], { t0: 0, dtMs: 1000 / FS, raw, filtered });

  it("has occasional excursions that raise on the notch + low-pass filtered signal and clear again", () => {
    const limit = episodes(transitions, 1, "limit");
    // About one every 120 s over 15 min; each lasts seconds (the 3 s hold plus part of the rise and fall).
    expect(limit.length).toBeGreaterThanOrEqual(3);
    expect(limit.length).toBeLessThanOrEqual(15);
    for (const [up, down] of limit) expect(down - up).toBeGreaterThan(2500);
  });

  it("has short spikes that cross the limit on raw only: the chain hides each one, and each is recorded as masked", () => {
    const masked = episodes(transitions, 1, "masked");
    expect(masked.length).toBeGreaterThanOrEqual(10); // about one every 45 s
    for (const [up, down] of masked) {
      expect(down - up).toBeLessThanOrEqual(3); // 3 ms pulses: raised on the first sample, cleared after the last
      const from = Math.max(0, up - 200);
      expect(Math.max(...filtered.subarray(from, up + 200))).toBeLessThan(rule.high!);
    }
  });

  it("accounts for every raw crossing: within an excursion the filtered signal caught, or recorded as masked", () => {
    const limit = episodes(transitions, 1, "limit");
    const masked = new Set(episodes(transitions, 1, "masked").map(([up]) => up));
    const rawRaises = episodes(transitions, 2, "limit").map(([up]) => up);
    // The deadband is wider than the pump ripple's swing, so each excursion crosses once on raw too.
    expect(rawRaises.length).toBe(limit.length + masked.size);
    for (const up of rawRaises) {
      const caught = limit.some(([a, b]) => up >= a - MASK_GRACE_MS && up <= b + MASK_GRACE_MS);
      expect(caught || masked.has(up), `raw crossing at ${up} ms`).toBe(true);
    }
  });
});
