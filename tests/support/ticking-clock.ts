import type { Clock, Timer } from "@/server/clock";

interface Pending {
  at: number;
  every: number | null;
  fn: () => void;
}

/**
 * A clock whose time and timers move only when the test says: advance(ms) runs every interval and
 * timeout that falls due on the way, in time order, at its own time.
 */
export function tickingClock(start = 0): Clock & { advance(ms: number): void } {
  let now = start;
  const timers = new Map<Timer, Pending>();
  /** A real timer handle, cleared at once, so the code under test holds the type it expects. */
  const handle = (): Timer => {
    const t = setTimeout(() => undefined, 0);
    clearTimeout(t);
    return t;
  };
  const add = (fn: () => void, ms: number, repeat: boolean): Timer => {
    const t = handle();
    timers.set(t, { at: now + ms, every: repeat ? Math.max(1, ms) : null, fn });
    return t;
  };
  return {
    now: () => now,
    setInterval: (fn, ms) => add(fn, ms, true),
    setTimeout: (fn, ms) => add(fn, ms, false),
    clearInterval: (t) => void timers.delete(t),
    clearTimeout: (t) => void timers.delete(t),
    advance(ms) {
      const end = now + ms;
      for (;;) {
        let due: [Timer, Pending] | null = null;
        for (const entry of timers) if (entry[1].at <= end && (!due || entry[1].at < due[1].at)) due = entry;
        if (!due) break;
        const [t, p] = due;
        now = p.at;
        if (p.every === null) timers.delete(t);
        else p.at += p.every;
        p.fn();
      }
      now = end;
    },
  };
}
