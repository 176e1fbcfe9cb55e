import type { Clock, Logger } from "./clock";

/**
 * A warning per key at most once per `everyMs`, with the number suppressed since, so a fault that
 * repeats on every sample or batch is logged without flooding the log.
 */
export type ThrottledWarn = (key: string, message: string) => void;

export function throttledWarn(deps: { clock: Clock; logger: Logger; everyMs?: number }): ThrottledWarn {
  const everyMs = deps.everyMs ?? 60_000;
  const last = new Map<string, { at: number; suppressed: number }>();
  return (key, message) => {
    const now = deps.clock.now();
    const seen = last.get(key);
    if (seen && now - seen.at < everyMs) {
      seen.suppressed++;
      return;
    }
    const more = seen?.suppressed ? ` (${seen.suppressed} more since the last report)` : "";
    deps.logger.warn(`${message}${more}`);
    last.set(key, { at: now, suppressed: 0 });
  };
}
