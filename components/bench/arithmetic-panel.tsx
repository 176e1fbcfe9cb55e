"use client";

import { useMemo, useState } from "react";
import { arithmeticCaution, compareArithmetic } from "@/lib/bench/arithmetic";
import { FIXED_ARITHMETICS, type FilterDesign, type FixedArithmetic, type QuantFormat, type QuantizedDesign } from "@/lib/dsp";
import { CautionsList } from "./cautions-list";
import { errorMessage } from "@/lib/errors";

const CHOICES: Record<FixedArithmetic, string> = {
  tapwright: "Tapwright (rounding, the C header export)",
  cmsis: "CMSIS-DSP kernels",
  "cmsis-fast": "CMSIS-DSP fast kernels",
};

/**
 * Which arithmetic the fixed-point view shows for the device's format, chosen by the engineer, and how
 * that arithmetic's bit-true output compares with the float design (a caution when it strays).
 */
export function ArithmeticPanel({ design, quantized, format }: { design: FilterDesign; quantized: QuantizedDesign | null; format: QuantFormat }) {
  const [arithmetic, setArithmetic] = useState<FixedArithmetic>("tapwright");
  const result = useMemo(() => {
    if (!quantized || quantized.format === "f32") return null;
    try {
      return { ok: true as const, comparison: compareArithmetic(design, quantized, arithmetic) };
    } catch (err) {
      return { ok: false as const, message: errorMessage(err) };
    }
  }, [design, quantized, arithmetic]);
  if (format === "f32") {
    return <p className="text-xs text-slate-500" data-testid="fixed-arithmetic">Arithmetic shown: float32 throughout (this device takes f32 coefficients).</p>;
  }
  const caution = result?.ok ? arithmeticCaution(result.comparison) : null;
  return (
    <div className="space-y-2 text-xs" data-testid="fixed-arithmetic">
      <label className="flex flex-wrap items-center gap-2">
        <span className="text-slate-500">Device arithmetic ({format.toUpperCase()})</span>
        <select className="field w-auto py-1" value={arithmetic} onChange={(e) => setArithmetic(FIXED_ARITHMETICS.find((a) => a === e.target.value) ?? "tapwright")}>
          {FIXED_ARITHMETICS.map((a) => (
            <option key={a} value={a}>
              {CHOICES[a]}
            </option>
          ))}
        </select>
      </label>
      {result === null ? null : result.ok ? (
        <>
          <p data-testid="fixed-arithmetic-label">Arithmetic shown: {result.comparison.label}.</p>
          <p className="num">
            Bit-true output vs the float design on half-scale steps and a chirp: worst{" "}
            {result.comparison.worstDbfs === null ? "no difference" : `${result.comparison.worstDbfs.toFixed(1)} dBFS (${result.comparison.worstLsb.toPrecision(3)} LSB)`},{" "}
            {result.comparison.overflows} saturations or wraps.
          </p>
        </>
      ) : (
        <p className="text-fault">Not runnable in this arithmetic: {result.message}</p>
      )}
      {caution && <CautionsList cautions={[caution]} />}
    </div>
  );
}
