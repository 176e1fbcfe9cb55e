import { describe, expect, it } from "vitest";
import { NO_CURSORS, type Cursors, cursorReadout, cursorsAfterKey, deltaName, formatDelta, nearestIndex, placeCursor, stepCursor } from "@/lib/charts/cursors";

const xs = [0, 10, 20, 30, 40];

describe("chart cursors", () => {
  it("snap to the nearest data point and refuse an x off the data", () => {
    expect(nearestIndex(xs, 14)).toBe(1);
    expect(nearestIndex(xs, 16)).toBe(2);
    expect(nearestIndex(xs, -5)).toBe(0);
    expect(nearestIndex(xs, 49)).toBe(4);
    expect(nearestIndex(xs, -11)).toBeNull();
    expect(nearestIndex(xs, 51)).toBeNull();
    expect(nearestIndex([], 1)).toBeNull();
    expect(nearestIndex(xs, NaN)).toBeNull();
  });

  it("measure nearness in decades on a log axis", () => {
    // 31 is nearer 10 than 100 on a line, but nearer 100 in log10 (1.49 vs 2).
    expect(nearestIndex([10, 100], 31)).toBe(0);
    expect(nearestIndex([10, 100], 32, true)).toBe(1);
    expect(nearestIndex([10, 100], 31, true)).toBe(0);
  });

  it("step by data points and stop at either end", () => {
    expect(stepCursor(xs, 20, 1)).toBe(30);
    expect(stepCursor(xs, 21, -1)).toBe(10);
    expect(stepCursor(xs, 20, 10)).toBe(40);
    expect(stepCursor(xs, 20, -10)).toBe(0);
    expect(stepCursor(xs, 100, 1)).toBeNull();
  });

  it("read each series under A and B and the differences B − A", () => {
    const data = [xs, [1, 2, 3, 4, 5], [0.5, null, -1, -2, -4]];
    const r = cursorReadout(data, { a: 9, b: 31 });
    expect(r.a).toEqual({ x: 10, values: [2, null] });
    expect(r.b).toEqual({ x: 30, values: [4, -2] });
    expect(r.dy).toEqual([2, null]);
    const one = cursorReadout(data, { a: 40, b: null });
    expect(one.a).toEqual({ x: 40, values: [5, -4] });
    expect(one.b).toBeNull();
    expect(one.dy).toEqual([null, null]);
  });

  it("name and word the x difference by the axis", () => {
    expect(deltaName({ kind: "time", unit: "s" })).toBe("Δt");
    expect(deltaName({ kind: "linear", unit: "ms" })).toBe("Δt");
    expect(deltaName({ kind: "log", unit: "Hz" })).toBe("Δf");
    expect(deltaName({ kind: "linear", unit: "mm" })).toBe("Δx");
    expect(formatDelta({ kind: "time", unit: "s" }, 0.02)).toBe("20 ms (1/Δt 50 Hz)");
    expect(formatDelta({ kind: "time", unit: "s" }, -2.5)).toBe("−2.5 s (1/Δt 0.4 Hz)");
    expect(formatDelta({ kind: "linear", unit: "ms" }, 4)).toBe("4 ms (1/Δt 250 Hz)");
    expect(formatDelta({ kind: "time", unit: "s" }, 0)).toBe("0 ms");
    expect(formatDelta({ kind: "log", unit: "Hz" }, 120)).toBe("120 Hz");
    expect(formatDelta({ kind: "log", unit: "Hz" }, -1500)).toBe("−1.5 kHz");
    expect(formatDelta({ kind: "linear", unit: "mm" }, 0.123456)).toBe("0.1235 mm");
    // Tiny differences keep their exponent, and its sign is a true minus too.
    expect(formatDelta({ kind: "linear", unit: "V" }, -1.23456e-15)).toBe("−1.235e−15 V");
  });

  it("are placed by clicks: A, then B, then the nearer one moves", () => {
    const one = placeCursor(NO_CURSORS, 10);
    expect(one).toEqual({ a: 10, b: null, active: "a" });
    const two = placeCursor(one, 30);
    expect(two).toEqual({ a: 10, b: 30, active: "b" });
    expect(placeCursor(two, 12)).toEqual({ a: 12, b: 30, active: "a" });
    expect(placeCursor(two, 25)).toEqual({ a: 10, b: 25, active: "b" });
    // On a log axis 300 is nearer 1000 than 10.
    expect(placeCursor({ a: 10, b: 1000, active: "a" }, 300, true)).toEqual({ a: 10, b: 300, active: "b" });
  });

  it("follow the keys: Enter places A at the centre, then B on A; arrows move the active one; Escape clears", () => {
    const key = (c: Cursors, k: string, shift = false): Cursors => {
      const next = cursorsAfterKey(c, k, shift, xs, 19);
      if (!next) throw new Error(`${k} did nothing`);
      return next;
    };
    const a = key(NO_CURSORS, "Enter");
    expect(a).toEqual({ a: 20, b: null, active: "a" });
    const right = key(a, "ArrowRight");
    expect(right).toEqual({ a: 30, b: null, active: "a" });
    const b = key(right, " ");
    expect(b).toEqual({ a: 30, b: 30, active: "b" });
    expect(key(b, "ArrowLeft", true)).toEqual({ a: 30, b: 0, active: "b" });
    expect(key(b, "Enter")).toEqual({ a: 30, b: 30, active: "a" });
    expect(key(b, "Escape")).toEqual(NO_CURSORS);
    expect(cursorsAfterKey(NO_CURSORS, "Escape", false, xs, 19)).toBeNull();
    expect(cursorsAfterKey(NO_CURSORS, "ArrowLeft", false, xs, 19)).toBeNull();
    expect(cursorsAfterKey(NO_CURSORS, "Enter", false, [], 19)).toBeNull();
    expect(cursorsAfterKey(b, "Tab", false, xs, 19)).toBeNull();
  });
});
