import { MAX_STEP_JITTER } from "./limits";

/** Why a time column cannot give a sample rate, with the 1-based file line of the offending row. */
export interface StepProblem {
  line: number;
  message: string;
}

function median(values: Float64Array): number {
  const sorted = Float64Array.from(values).sort();
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

const ms = (s: number) => `${Number((s * 1000).toPrecision(4))} ms`;

/**
 * Sample rate in Hz from sample times in s: 1 / median step (common practice; robust to a few odd
 * steps), rounded to 6 significant figures so that decimal times such as 0.001, 0.002… give 1000 Hz
 * rather than 999.99999999989 Hz. Returns the first problem instead when a step is not positive or
 * differs from the median by more than MAX_STEP_JITTER (1 %); `lines[i]` is the file line of times[i].
 */
export function inferSampleRate(times: Float64Array, lines: readonly number[]): { sampleRateHz: number } | { problem: StepProblem } {
  if (times.length < 2) return { problem: { line: lines[0] ?? 1, message: "At least two samples are needed to read a sample rate from the time column." } };
  const steps = new Float64Array(times.length - 1);
  for (let i = 1; i < times.length; i++) {
    const step = times[i] - times[i - 1];
    if (!(step > 0)) {
      return { problem: { line: lines[i], message: `Line ${lines[i]}: the time does not increase (step ${ms(step)} from line ${lines[i - 1]}). Sort the rows by time and remove repeated rows.` } };
    }
    steps[i - 1] = step;
  }
  const typical = median(steps);
  for (let i = 0; i < steps.length; i++) {
    const off = Math.abs(steps[i] - typical) / typical;
    if (off > MAX_STEP_JITTER) {
      const line = lines[i + 1];
      return {
        problem: {
          line,
          message:
            `Line ${line}: the time step is ${ms(steps[i])}, ${Number((off * 100).toPrecision(3))} % off the median step ${ms(typical)} (at most ${MAX_STEP_JITTER * 100} % is accepted). ` +
            "Samples may be missing or the clock may jitter: write missing samples as empty cells at their own times, or resample the capture first.",
        },
      };
    }
  }
  return { sampleRateHz: Number((1 / typical).toPrecision(6)) };
}
