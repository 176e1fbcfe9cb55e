import { describe, expect, it } from "vitest";
import { createFilterBank } from "@/lib/dsp/engine/filter-bank";
import { filterSignal } from "@/lib/dsp/engine/filter-signal";

const base = { sampleRateHz: 2000, zeros: [], poles: [], gain: 1 };
const lowpass = { ...base, sos: [[0.02, 0.04, 0.02, 1, -1.56, 0.64]] };
const average = { ...base, taps: [0.25, 0.25, 0.25, 0.25] };
const signal = (n: number, phase: number) => Float64Array.from({ length: n }, (_, i) => Math.sin(i / 5 + phase) + 1);

describe("filter bank", () => {
  it("runs every filter of a channel; channels keep separate state; blocks join seamlessly", () => {
    const bank = createFilterBank();
    bank.add("ch1", "lp", lowpass);
    bank.add("ch1", "avg", average, { initial: "step" });
    bank.add("ch2", "lp", lowpass);
    const [x1, x2] = [signal(120, 0), signal(120, 1)];
    const got = { lp1: new Float64Array(120), avg1: new Float64Array(120), lp2: new Float64Array(120) };
    for (let at = 0; at < 120; at += 40) {
      const out1 = bank.process("ch1", x1.subarray(at, at + 40));
      got.lp1.set(out1.get("lp") ?? [], at);
      got.avg1.set(out1.get("avg") ?? [], at);
      got.lp2.set(bank.process("ch2", x2.subarray(at, at + 40)).get("lp") ?? [], at);
    }
    expect(got.lp1).toEqual(filterSignal(lowpass, x1));
    expect(got.avg1).toEqual(filterSignal(average, x1, { initial: "step" }));
    expect(got.lp2).toEqual(filterSignal(lowpass, x2));
    expect(bank.channelIds()).toEqual(["ch1", "ch2"]);
    expect(bank.filterIds("ch1")).toEqual(["lp", "avg"]);
  });

  it("reuses its output buffers while the block length stays the same", () => {
    const bank = createFilterBank();
    bank.add("c", "lp", lowpass);
    const first = bank.process("c", signal(40, 0)).get("lp");
    const second = bank.process("c", signal(40, 2)).get("lp");
    expect(second).toBe(first);
    expect(bank.process("c", signal(41, 0)).get("lp")?.length).toBe(41);
  });

  it("adds, removes and resets by id; unknown ids throw", () => {
    const bank = createFilterBank();
    bank.add("c", "lp", lowpass);
    expect(() => bank.add("c", "lp", lowpass)).toThrow(/already exists/);
    bank.add("c", "avg", average);
    const x = signal(30, 0);
    bank.process("c", Float64Array.of(5, NaN, 7));
    expect(bank.faults("c", "lp")).toBe(1);
    bank.reset("c", "lp");
    expect(bank.process("c", x).get("lp")).toEqual(filterSignal(lowpass, x));
    bank.reset();
    expect(bank.process("c", x).get("avg")).toEqual(filterSignal(average, x));
    expect(bank.remove("c", "lp")).toBe(true);
    expect(bank.remove("c", "lp")).toBe(false);
    expect([...bank.process("c", x).keys()]).toEqual(["avg"]);
    expect(bank.remove("c", "avg")).toBe(true);
    expect(bank.channelIds()).toEqual([]);
    expect(() => bank.process("c", x)).toThrow(/unknown channel 'c'/);
    bank.add("d", "lp", lowpass);
    expect(() => bank.reset("d", "nope")).toThrow(/unknown filter 'nope'/);
    expect(bank.removeChannel("d")).toBe(true);
    expect(bank.removeChannel("d")).toBe(false);
  });
});
