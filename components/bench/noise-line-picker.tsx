"use client";

import { useState } from "react";
import { readNoiseLine, STRONGEST, type JudgedLine, type NoiseLineChoice } from "@/lib/bench/noise-line";

/**
 * Says which noise line the attenuation figures are judged at, and lets the engineer type another
 * (0 < f < fs/2) or go back to the live spectrum's strongest peak; a peak can also be picked in the
 * live spectrum's peak list.
 */
export function NoiseLinePicker({
  line,
  choice,
  sampleRateHz,
  onChoose,
}: {
  line: JudgedLine;
  choice: NoiseLineChoice;
  sampleRateHz: number;
  onChoose: (choice: NoiseLineChoice) => void;
}) {
  const [text, setText] = useState("");
  const [error, setError] = useState<string | null>(null);
  const submit = () => {
    const read = readNoiseLine(text, sampleRateHz);
    if ("error" in read) return setError(read.error);
    setError(null);
    setText("");
    onChoose({ kind: "chosen", freqHz: read.freqHz, from: "typed" });
  };
  return (
    <div className="flex flex-wrap items-center gap-2 text-sm" data-testid="noise-line">
      <span>
        <span className="text-slate-500">Noise line judged: </span>
        <span className="num font-medium" data-testid="noise-line-judged" data-hz={line.freqHz ?? ""}>
          {line.label}
        </span>
      </span>
      <form
        className="flex items-center gap-1.5"
        onSubmit={(e) => {
          e.preventDefault();
          submit();
        }}
      >
        <label htmlFor="noise-line-hz" className="sr-only">
          Judge at another frequency (Hz)
        </label>
        <input
          id="noise-line-hz"
          inputMode="decimal"
          placeholder="other Hz"
          className="field num w-24 py-1"
          value={text}
          aria-invalid={error !== null}
          aria-describedby={error ? "noise-line-error" : undefined}
          onChange={(e) => setText(e.target.value)}
        />
        <button type="submit" className="btn-quiet py-1">
          Judge here
        </button>
        {choice.kind === "chosen" && (
          <button type="button" className="btn-quiet py-1" onClick={() => onChoose(STRONGEST)}>
            Use the strongest peak
          </button>
        )}
      </form>
      {error && (
        <p id="noise-line-error" role="alert" className="w-full text-xs text-red-700 dark:text-red-300">
          {error}
        </p>
      )}
    </div>
  );
}
