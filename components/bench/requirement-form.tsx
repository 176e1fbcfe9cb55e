"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useMemo } from "react";
import { FormProvider, useForm, useWatch } from "react-hook-form";
import { IIR_FAMILIES, IIR_RESPONSES, orderRequirementSchema, type OrderRequirement, type StageSpec } from "@/lib/dsp";
import { defaultRequirement, specFromRequirement } from "@/lib/bench/requirement";
import { FAMILY_LABELS } from "@/lib/bench/spec-defaults";
import { hz } from "@/lib/bench/format";
import { NumberField, SelectField, useReportValidity } from "./form-fields";
import { useLatest } from "@/components/hooks/use-latest";
import { errorMessage } from "@/lib/errors";

function edges(response: string, current: unknown, wider: boolean): number | [number, number] {
  const band = response === "bandpass" || response === "bandstop";
  if (band) {
    if (Array.isArray(current)) return current as [number, number];
    const f = typeof current === "number" ? current : 10;
    return wider ? [f * 0.6, f * 1.6] : [f * 0.8, f * 1.25];
  }
  return Array.isArray(current) ? Math.sqrt(current[0] * current[1]) : (current as number);
}

/** The order estimate shown under the form, with the design it gives, or null while the requirement does not parse. */
function estimateFor(values: OrderRequirement): { text: string; error: boolean; spec: StageSpec | null } | null {
  const parsed = orderRequirementSchema.safeParse(values);
  if (!parsed.success) return null;
  try {
    const spec = specFromRequirement(parsed.data);
    const cut = typeof spec.cutoffHz === "number" ? hz(spec.cutoffHz) : `${hz(spec.cutoffHz[0])}–${hz(spec.cutoffHz[1])}`;
    return { text: `Estimated order ${spec.order}, natural cutoff ${cut}.`, error: false, spec };
  } catch (err) {
    return { text: errorMessage(err), error: true, spec: null };
  }
}

/**
 * An IIR requirement (pass and stop edges, ripple, attenuation) checked by lib/dsp's orderRequirementSchema;
 * each valid requirement is turned into a design at the order estimateOrder finds.
 */
export function RequirementForm({ sampleRateHz, onValid, onValidity }: { sampleRateHz: number; onValid: (spec: StageSpec) => void; onValidity?: (valid: boolean) => void }) {
  const form = useForm<OrderRequirement>({
    resolver: zodResolver(orderRequirementSchema),
    mode: "onChange",
    defaultValues: defaultRequirement(sampleRateHz),
  });
  const values = useWatch({ control: form.control }) as OrderRequirement;
  const estimate = useMemo(() => estimateFor(values), [values]);
  const onValidRef = useLatest(onValid);
  useReportValidity(orderRequirementSchema.safeParse(values).success && estimate?.error !== true, onValidity);
  useEffect(() => {
    if (estimate?.spec) onValidRef.current(estimate.spec);
  }, [estimate, onValidRef]);

  const band = Array.isArray(values.passbandHz);
  const onResponse = (r: string) => {
    form.setValue("passbandHz", edges(r, form.getValues("passbandHz"), r === "bandstop"), { shouldValidate: true });
    form.setValue("stopbandHz", edges(r, form.getValues("stopbandHz"), r === "bandpass"), { shouldValidate: true });
  };

  return (
    <FormProvider {...form}>
      <form className="grid grid-cols-2 gap-3" onSubmit={(e) => e.preventDefault()} aria-label="Filter requirement" noValidate>
        <SelectField name="family" label="Family" options={IIR_FAMILIES.map((f) => ({ value: f, label: FAMILY_LABELS[f] }))} />
        <SelectField name="response" label="Response" options={IIR_RESPONSES.map((r) => ({ value: r, label: r }))} onPicked={onResponse} />
        {band ? (
          <>
            <NumberField name="passbandHz.0" label="Pass edge, low" unit="Hz" />
            <NumberField name="passbandHz.1" label="Pass edge, high" unit="Hz" />
            <NumberField name="stopbandHz.0" label="Stop edge, low" unit="Hz" />
            <NumberField name="stopbandHz.1" label="Stop edge, high" unit="Hz" />
          </>
        ) : (
          <>
            <NumberField name="passbandHz" label="Pass edge" unit="Hz" />
            <NumberField name="stopbandHz" label="Stop edge" unit="Hz" />
          </>
        )}
        <NumberField name="passbandRippleDb" label="Passband ripple" unit="dB" />
        <NumberField name="stopbandAttenuationDb" label="Stopband attenuation" unit="dB" />
        {estimate && (
          <p role={estimate.error ? "alert" : "status"} className={`col-span-2 text-sm ${estimate.error ? "text-red-700 dark:text-red-300" : "text-slate-600 dark:text-slate-300"}`}>
            {estimate.text}
          </p>
        )}
      </form>
    </FormProvider>
  );
}
