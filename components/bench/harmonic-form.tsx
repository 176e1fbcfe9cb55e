"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { FormProvider, useForm, useWatch } from "react-hook-form";
import { harmonicFormSchema, seriesOf, SEED_NOTCH_Q, type HarmonicForm, type HarmonicSeries } from "@/lib/bench/chain-edit";
import { NumberField } from "./form-fields";

/** Mains frequency when the channel can show it, else a tenth of Nyquist (starting values, meant to be edited). */
const startingFundamental = (fs: number) => (fs > 120 ? 50 : Math.max(1, Math.round(fs / 20)));

/**
 * The harmonic series action: fundamental, a count or every harmonic up to Nyquist, and one Q; on
 * "Add notches" the valid series goes to onAdd (the chain adds what fits and says what it left out).
 */
export function HarmonicSeriesForm({ sampleRateHz, disabled, onAdd }: { sampleRateHz: number; disabled: boolean; onAdd: (series: HarmonicSeries) => void }) {
  const form = useForm<HarmonicForm>({
    resolver: zodResolver(harmonicFormSchema),
    mode: "onChange",
    defaultValues: { fundamentalHz: startingFundamental(sampleRateHz), upToNyquist: false, count: 3, notchQ: SEED_NOTCH_Q, sampleRateHz },
  });
  const upToNyquist = useWatch({ control: form.control, name: "upToNyquist" });
  return (
    <FormProvider {...form}>
      <form className="grid grid-cols-3 items-start gap-3" aria-label="Harmonic series" noValidate onSubmit={form.handleSubmit((v) => onAdd(seriesOf(v)))}>
        <NumberField name="fundamentalHz" label="Fundamental" unit="Hz" />
        {upToNyquist ? <p className="self-end pb-2 text-xs text-slate-500">Every harmonic below {sampleRateHz / 2} Hz</p> : <NumberField name="count" label="Count" optional />}
        <NumberField name="notchQ" label="Q" />
        <label className="col-span-2 flex items-center gap-1.5 text-sm">
          <input type="checkbox" {...form.register("upToNyquist")} /> Up to Nyquist
        </label>
        <button type="submit" className="btn-quiet py-1 text-sm" disabled={disabled}>
          Add notches
        </button>
      </form>
    </FormProvider>
  );
}
