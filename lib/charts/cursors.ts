import { formatHz, signedTrim, trim, withMinus } from "@/lib/format/units";

/** The x axis of a chart as the cursors read it: time is in s since the epoch, log and linear are in `unit`. */
export interface CursorAxis {
  kind: "time" | "log" | "linear";
  unit: string;
}

/** Two measurement cursors, each an x value on a data point (null: not placed), and the one the keys move. */
export interface Cursors {
  a: number | null;
  b: number | null;
  active: "a" | "b";
}

export const NO_CURSORS: Cursors = { a: null, b: null, active: "a" };

/** One column of a chart's data: numbers, with null or undefined for gaps. */
export type Column = ArrayLike<number | null | undefined>;

/**
 * Index of the point of ascending `xs` nearest to `x` (by distance in log₁₀ x when `log`), or null when xs is
 * empty or x lies more than one data step beyond either end (a live window that scrolled past the cursor).
 */
export function nearestIndex(xs: Column, x: number, log = false): number | null {
  const n = xs.length;
  if (n === 0 || !Number.isFinite(x)) return null;
  const at = (i: number) => xs[i] ?? NaN;
  const first = at(0);
  const last = at(n - 1);
  const step = n > 1 ? (last - first) / (n - 1) : 0;
  if (x < first - step || x > last + step) return null;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (at(mid) <= x) lo = mid;
    else hi = mid;
  }
  const dist = (v: number) => (log && v > 0 && x > 0 ? Math.abs(Math.log10(v) - Math.log10(x)) : Math.abs(v - x));
  return dist(at(hi)) < dist(at(lo)) ? hi : lo;
}

/** The x of the point `step` points away from the one nearest `x` (stopping at either end), or null when x is off the data. */
export function stepCursor(xs: Column, x: number, step: number, log = false): number | null {
  const i = nearestIndex(xs, x, log);
  if (i === null) return null;
  return xs[Math.min(xs.length - 1, Math.max(0, i + step))] ?? null;
}

export interface CursorPoint {
  /** The x of the data point under the cursor. */
  x: number;
  /** Each series' value there (series in chart order, without x); null for a gap. */
  values: (number | null)[];
}

export interface CursorReadout {
  a: CursorPoint | null;
  b: CursorPoint | null;
  /** y(B) − y(A) of each series, when both have a value. */
  dy: (number | null)[];
}

const finite = (v: number | null | undefined): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);

function pointAt(data: readonly Column[], x: number | null, log: boolean): CursorPoint | null {
  if (x === null || data.length === 0) return null;
  const i = nearestIndex(data[0], x, log);
  if (i === null) return null;
  return { x: data[0][i] ?? x, values: data.slice(1).map((col) => finite(col[i])) };
}

/** What the cursors read on column-per-series data (x first): each cursor's point and the differences y(B) − y(A). */
export function cursorReadout(data: readonly Column[], cursors: Pick<Cursors, "a" | "b">, log = false): CursorReadout {
  const a = pointAt(data, cursors.a, log);
  const b = pointAt(data, cursors.b, log);
  const dy = Math.max(0, data.length - 1);
  return {
    a,
    b,
    dy: Array.from({ length: dy }, (_, s) => {
      const ya = a?.values[s] ?? null;
      const yb = b?.values[s] ?? null;
      return ya === null || yb === null ? null : yb - ya;
    }),
  };
}

/** The name of the x difference: Δt on a time axis, Δf on a frequency axis, Δx otherwise. */
export function deltaName(axis: CursorAxis): "Δt" | "Δf" | "Δx" {
  if (axis.kind === "time" || axis.unit === "s" || axis.unit === "ms") return "Δt";
  return axis.unit === "Hz" ? "Δf" : "Δx";
}

/**
 * An x difference in words with its unit: a time in ms below 1 s and in s above, followed by the frequency of
 * that period (1/Δt, in Hz); a frequency in Hz or kHz; anything else in the axis unit. Four significant figures.
 */
export function formatDelta(axis: CursorAxis, dx: number): string {
  if (deltaName(axis) === "Δt") {
    const seconds = axis.unit === "ms" && axis.kind !== "time" ? dx / 1000 : dx;
    const text = Math.abs(seconds) < 1 ? `${trim(seconds * 1000, 4)} ms` : `${trim(seconds, 4)} s`;
    return seconds === 0 ? withMinus(text) : `${withMinus(text)} (1/Δt ${formatHz(1 / Math.abs(seconds))})`;
  }
  if (axis.unit === "Hz") return withMinus(formatHz(dx));
  return `${signedTrim(dx, 4)} ${axis.unit}`.trim();
}

/** The x of the data point nearest `x`, or null when x is off the data. */
export function snapToData(xs: Column, x: number, log = false): number | null {
  const i = nearestIndex(xs, x, log);
  return i === null ? null : (xs[i] ?? null);
}

/** A click at x (already on a data point): places A, then B; once both are placed it moves the nearer one. */
export function placeCursor(c: Cursors, x: number, log = false): Cursors {
  if (c.a === null) return { ...c, a: x, active: "a" };
  if (c.b === null) return { ...c, b: x, active: "b" };
  const dist = (v: number) => (log && v > 0 && x > 0 ? Math.abs(Math.log10(v) - Math.log10(x)) : Math.abs(v - x));
  return dist(c.b) < dist(c.a) ? { ...c, b: x, active: "b" } : { ...c, a: x, active: "a" };
}

/**
 * The cursors after a key on a focused chart, or null when the key does nothing there: Enter or space places
 * A at the data point nearest `centre`, then B on A, then switches which one the arrows move; the left and
 * right arrows move the active cursor one data point (ten with shift); Escape clears both.
 */
export function cursorsAfterKey(c: Cursors, key: string, shift: boolean, xs: Column, centre: number, log = false): Cursors | null {
  if (key === "Escape") return c.a === null && c.b === null ? null : NO_CURSORS;
  if (key === "Enter" || key === " ") {
    if (c.a === null) {
      const a = snapToData(xs, centre, log);
      return a === null ? null : { a, b: null, active: "a" };
    }
    if (c.b === null) return { ...c, b: c.a, active: "b" };
    return { ...c, active: c.active === "a" ? "b" : "a" };
  }
  if (key !== "ArrowLeft" && key !== "ArrowRight") return null;
  const at = c[c.active];
  if (at === null) return null;
  const moved = stepCursor(xs, at, (key === "ArrowLeft" ? -1 : 1) * (shift ? 10 : 1), log);
  return moved === null ? null : { ...c, [c.active]: moved };
}
