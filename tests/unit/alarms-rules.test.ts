import { describe, expect, it } from "vitest";
import {
  closeTracker,
  countRaised,
  createTracker,
  limitProblems,
  MASK_GRACE_MS,
  replayRules,
  resumeRaised,
  trackBlock,
  type AlarmRule,
  type AlarmTransition,
} from "@/lib/alarms";

const rule = (over: Partial<AlarmRule> = {}): AlarmRule => ({
  id: 1,
  channel: "rig/dev/ch",
  name: "test",
  signal: "raw",
  severity: "warning",
  enabled: true,
  high: 10,
  low: null,
  deadband: 2,
  minDurationMs: 0,
  ...over,
});

/** Runs one rule over raw values (and filtered ones, if given) at 10 ms per sample from t = 0. */
function run(r: AlarmRule, raw: number[], filtered: number[] | null = null): AlarmTransition[] {
  const out: AlarmTransition[] = [];
  trackBlock(createTracker(r), { t0: 0, dtMs: 10, raw, filtered }, (t) => out.push(t));
  return out;
}

const brief = (ts: AlarmTransition[]) => ts.map((t) => `${t.kind} ${t.change} ${t.side} @${t.at} peak ${t.peak}`);

describe("limits and hysteresis", () => {
  it("raises above the high limit and clears only below the limit minus the deadband", () => {
    // high 10, deadband 2: 9 → 11 raises; 9 and 10.5 stay raised (not below 8); 7.9 clears.
    expect(brief(run(rule(), [9, 11, 9, 12, 10.5, 8, 7.9, 9]))).toEqual(["limit raise high @10 peak 11", "limit clear high @60 peak 12"]);
  });

  it("treats a value exactly at the limit as inside, and one exactly at limit − deadband as not yet cleared", () => {
    expect(run(rule(), [10, 10, 10])).toEqual([]);
    expect(brief(run(rule(), [11, 8, 7.99]))).toEqual(["limit raise high @0 peak 11", "limit clear high @20 peak 11"]);
  });

  it("watches both limits, each with its own side and peak", () => {
    const r = rule({ high: 10, low: -10, deadband: 1 });
    expect(brief(run(r, [0, 12, 15, 8.9, 0, -11, -14, -12, -8.9, 0]))).toEqual([
      "limit raise high @10 peak 12",
      "limit clear high @30 peak 15",
      "limit raise low @50 peak -11",
      "limit clear low @80 peak -14",
    ]);
  });

  it("clears one limit and raises the other on the next sample after a swing straight across", () => {
    const r = rule({ high: 10, low: -10, deadband: 1 });
    expect(brief(run(r, [11, -11, -11, 0]))).toEqual([
      "limit raise high @0 peak 11",
      "limit clear high @10 peak 11",
      "limit raise low @20 peak -11",
      "limit clear low @30 peak -11",
    ]);
  });
});

describe("minimum duration", () => {
  it("raises only once the value has been beyond the limit for minDurationMs, and starts over when it comes back", () => {
    const r = rule({ minDurationMs: 30 });
    // 11 at 0..20 ms (20 ms over) then 9: no alarm; from 40 ms over again: raises at 70 ms (40 + 30).
    expect(brief(run(r, [11, 11, 11, 9, 11, 11, 13, 11, 11, 0]))).toEqual(["limit raise high @70 peak 13", "limit clear high @90 peak 13"]);
  });

  it("an excursion shorter than the minimum never raises", () => {
    expect(run(rule({ minDurationMs: 100 }), [11, 50, 11, 0, 0, 0])).toEqual([]);
  });
});

describe("re-arm", () => {
  it("raises once per excursion: bouncing inside the deadband does not raise again, a new excursion after clearing does", () => {
    const values = [11, 9, 11, 9.5, 12, 7, 7, 11, 7];
    expect(brief(run(rule(), values))).toEqual([
      "limit raise high @0 peak 11",
      "limit clear high @50 peak 12",
      "limit raise high @70 peak 11",
      "limit clear high @80 peak 11",
    ]);
  });
});

describe("the filter hides a fault (raw against filtered)", () => {
  const filteredRule = rule({ signal: "filtered" });
  const samples = (n: number, value: number) => Array<number>(n).fill(value);

  it("records a masked alarm with the raw peak when raw crosses a limit the filtered signal never reaches", () => {
    const n = MASK_GRACE_MS / 10 + 20;
    const raw = samples(n, 5);
    raw[3] = 40; // a 10 ms spike
    const filtered = samples(n, 5);
    filtered[4] = 9; // smoothed: stays under 10
    expect(brief(run(filteredRule, raw, filtered))).toEqual(["masked raise high @30 peak 40", `masked clear high @40 peak 40`]);
  });

  it("records nothing masked when the filtered signal follows the excursion within the grace time", () => {
    const n = MASK_GRACE_MS / 10 + 40;
    const raw = samples(n, 5);
    raw[3] = 40;
    const filtered = samples(n, 5);
    filtered[10] = 12; // 70 ms later, the filter's delay
    expect(brief(run(filteredRule, raw, filtered))).toEqual(["limit raise high @100 peak 12", "limit clear high @110 peak 12"]);
  });

  it("raises a masked alarm after the grace time for a sustained excursion the filter removes, and clears it when raw comes back", () => {
    const n = MASK_GRACE_MS / 10 + 60;
    const raw = samples(n, 20);
    raw[0] = 5;
    raw[n - 2] = 5;
    raw[n - 1] = 5;
    const filtered = samples(n, 5);
    const out = run(filteredRule, raw, filtered);
    expect(brief(out)).toEqual(["masked raise high @10 peak 20", `masked clear high @${(n - 2) * 10} peak 20`]);
  });

  it("checks only filtered rules, and only on channels that have a production filter", () => {
    const raw = samples(200, 5);
    raw[3] = 40;
    const filtered = samples(200, 5);
    expect(run(rule({ signal: "raw" }), raw, filtered).map((t) => t.kind)).toEqual(["limit", "limit"]);
    expect(run(filteredRule, raw, null).map((t) => t.kind)).toEqual(["limit", "limit"]);
  });

  it("counts masked and limit alarms over a stretch, skipping disabled rules", () => {
    const raw = samples(600, 5);
    const filtered = samples(600, 5);
    raw[10] = 30;
    raw[300] = 30;
    raw[450] = 30;
    filtered[452] = 11;
    const block = { t0: 0, dtMs: 10, raw, filtered };
    expect(countRaised([filteredRule], block)).toEqual({ limit: 1, masked: 2 });
    expect(countRaised([{ ...filteredRule, enabled: false }], block)).toEqual({ limit: 0, masked: 0 });
    expect(replayRules([filteredRule, { ...filteredRule, id: 2, signal: "raw" }], block).filter((t) => t.ruleId === 2 && t.change === "raise")).toHaveLength(3);
  });

  it("treats raw crossings inside the grace time as one excursion, reported once from the first raise to the last clear", () => {
    const raw = samples(MASK_GRACE_MS / 10 + 20, 5);
    raw[2] = 30;
    raw[6] = 35;
    const out = run(rule({ signal: "filtered", deadband: 0 }), raw, samples(raw.length, 5));
    expect(brief(out)).toEqual(["masked raise high @20 peak 35", "masked clear high @70 peak 35"]);
  });

  it("is not fooled by raw flapping on the way up while the slower filtered signal follows", () => {
    // Raw crosses, dips back, crosses again; the filtered signal raises 150 ms after the first crossing.
    const raw = [5, 12, 5, 12, 12, 12, 12, 12, 12, 12, 12, 12, 12, 12, 12, 12, 12, ...samples(110, 5)];
    const filtered = [...samples(16, 5), 11, 11, ...samples(110, 5)];
    expect(run(filteredRule, raw, filtered).map((t) => t.kind)).toEqual(["limit", "limit"]);
  });
});

describe("rule changes and restarts", () => {
  it("closeTracker clears what is raised at the given time and leaves the tracker armed", () => {
    const tr = createTracker(rule());
    const out: AlarmTransition[] = [];
    trackBlock(tr, { t0: 0, dtMs: 10, raw: [11, 12], filtered: null }, (t) => out.push(t));
    closeTracker(tr, 500, (t) => out.push(t));
    trackBlock(tr, { t0: 1000, dtMs: 10, raw: [11], filtered: null }, (t) => out.push(t));
    expect(brief(out)).toEqual(["limit raise high @0 peak 11", "limit clear high @500 peak 12", "limit raise high @1000 peak 11"]);
  });

  it("resumeRaised continues an alarm raised before a restart instead of raising it again", () => {
    const tr = createTracker(rule());
    resumeRaised(tr, { kind: "limit", side: "high", limit: 10, since: 0, peak: 14 });
    const out: AlarmTransition[] = [];
    trackBlock(tr, { t0: 100, dtMs: 10, raw: [11, 12, 7], filtered: null }, (t) => out.push(t));
    expect(brief(out)).toEqual(["limit clear high @120 peak 14"]);
  });
});

describe("limitProblems", () => {
  const base = { high: 10, low: null, deadband: 1, minDurationMs: 0 };
  it("accepts one limit or two ordered ones", () => {
    expect(limitProblems(base)).toEqual([]);
    expect(limitProblems({ ...base, high: null, low: 3 })).toEqual([]);
    expect(limitProblems({ ...base, low: -10 })).toEqual([]);
  });
  it("names each problem's field", () => {
    expect(limitProblems({ ...base, high: null }).map((p) => p.path)).toEqual(["high"]);
    expect(limitProblems({ ...base, low: 10 }).map((p) => p.path)).toEqual(["low", "deadband"]);
    expect(limitProblems({ ...base, low: 9.5 }).map((p) => p.path)).toEqual(["deadband"]);
    expect(limitProblems({ ...base, deadband: -1 }).map((p) => p.path)).toEqual(["deadband"]);
    expect(limitProblems({ ...base, minDurationMs: 1.5 }).map((p) => p.path)).toEqual(["minDurationMs"]);
    expect(limitProblems({ ...base, high: Number.NaN }).map((p) => p.path)).toEqual(["high"]);
    expect(limitProblems({ ...base, deadband: Number.POSITIVE_INFINITY }).map((p) => p.path)).toEqual(["deadband"]);
  });
});

describe("one excursion, two traces", () => {
  it("does not call a raw re-crossing masked while the filtered signal has just been raised on the same side", () => {
    const r = rule({ signal: "filtered", deadband: 1 });
    // Filtered raised 0–200 ms and cleared; raw crosses again on noise 300 ms later: the same excursion's tail.
    const raw = [...Array<number>(21).fill(12), 5, 5, 5, 5, 5, 5, 5, 5, 5, 11, 5, ...Array<number>(150).fill(5)];
    const filtered = [...Array<number>(21).fill(11), ...Array<number>(160).fill(5)];
    const kinds = run(r, raw, filtered).map((t) => `${t.kind} ${t.change}`);
    expect(kinds).toEqual(["limit raise", "limit clear"]);
  });
});
