import { createTracker, trackBlock, type AlarmTransition, type SampleBlock } from "./tracker";
import type { AlarmRule } from "./rule";

/** Every transition the rules would have made over a stretch of samples, in time order per rule. */
export function replayRules(rules: readonly AlarmRule[], block: SampleBlock): AlarmTransition[] {
  const out: AlarmTransition[] = [];
  for (const rule of rules) {
    if (!rule.enabled) continue;
    trackBlock(createTracker(rule), block, (t) => out.push(t));
  }
  return out;
}

/** How many alarms of each kind the rules would have raised over a stretch of samples. */
export function countRaised(rules: readonly AlarmRule[], block: SampleBlock): { limit: number; masked: number } {
  const counts = { limit: 0, masked: 0 };
  for (const t of replayRules(rules, block)) if (t.change === "raise") counts[t.kind]++;
  return counts;
}
