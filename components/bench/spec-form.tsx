"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useRef } from "react";
import { FormProvider, useForm, useWatch } from "react-hook-form";
import { FAMILY_LABELS, METHOD_LABELS } from "@/lib/bench/spec-defaults";
import {
  biquadShapes,
  discretizationMethods,
  firResponses,
  firWindows,
  gainShapes,
  IIR_FAMILIES,
  IIR_RESPONSES,
  stageSpecSchema,
  type StageSpec,
} from "@/lib/dsp";
import { DesignFields } from "./design-fields";
import { ListField, NumberField, SelectField, useReportValidity } from "./form-fields";
import { useLatest } from "@/components/hooks/use-latest";

const opts = (values: readonly string[], labels: Record<string, string> = {}) => values.map((v) => ({ value: v, label: labels[v] ?? v }));
/** Moves a cutoff between one frequency (low/high-pass) and a pair (band designs) when the response changes. */
function cutoffFor(response: string, current: unknown): number | [number, number] {
  const band = response === "bandpass" || response === "bandstop";
  if (band) {
    if (Array.isArray(current)) return current as [number, number];
    const f = typeof current === "number" && current > 0 ? current : 10;
    return [f * 0.8, f * 1.25];
  }
  return Array.isArray(current) ? Math.sqrt(current[0] * current[1]) : (current as number);
}

/**
 * The fields of one stage's design kind, validated with lib/dsp's stageSpecSchema through react-hook-form;
 * every valid edit is handed to onValid at once (the charts re-plot within a frame). Errors sit beside their field.
 * onValidity hears whether the fields hold a usable design (true again once the form closes).
 */
export function SpecForm({ initial, onValid, onValidity }: { initial: StageSpec; onValid: (spec: StageSpec) => void; onValidity?: (valid: boolean) => void }) {
  const form = useForm<StageSpec>({
    resolver: zodResolver(stageSpecSchema),
    mode: "onChange",
    defaultValues: initial,
  });
  const values = useWatch({ control: form.control }) as StageSpec;
  const lastSent = useRef(JSON.stringify(initial));
  const onValidRef = useLatest(onValid);

  useEffect(() => {
    void form.trigger();
  }, [form]);

  const valid = stageSpecSchema.safeParse(values).success;
  useReportValidity(valid, onValidity);

  useEffect(() => {
    const parsed = stageSpecSchema.safeParse(values);
    if (!parsed.success) return;
    const text = JSON.stringify(parsed.data);
    if (text === lastSent.current) return;
    lastSent.current = text;
    onValidRef.current(parsed.data);
  }, [values, onValidRef]);

  const setCutoffs = (response: string) => form.setValue("cutoffHz", cutoffFor(response, form.getValues("cutoffHz")), { shouldValidate: true });
  const band = (values.kind === "iir" || values.kind === "fir") && Array.isArray(values.cutoffHz);

  return (
    <FormProvider {...form}>
      <form className="grid grid-cols-2 gap-3" onSubmit={(e) => e.preventDefault()} aria-label="Stage design" noValidate>
        {values.kind === "iir" && (
          <>
            <SelectField name="family" label="Family" options={opts(IIR_FAMILIES, FAMILY_LABELS)} />
            <SelectField name="response" label="Response" options={opts(IIR_RESPONSES)} onPicked={setCutoffs} />
            <NumberField name="order" label="Order" />
            <div />
            {band ? (
              <>
                <NumberField name="cutoffHz.0" label="Low edge" unit="Hz" />
                <NumberField name="cutoffHz.1" label="High edge" unit="Hz" />
              </>
            ) : (
              <NumberField name="cutoffHz" label="Cutoff" unit="Hz" />
            )}
            {(values.family === "chebyshev1" || values.family === "elliptic") && <NumberField name="passbandRippleDb" label="Passband ripple" unit="dB" optional />}
            {(values.family === "chebyshev2" || values.family === "elliptic") && <NumberField name="stopbandAttenuationDb" label="Stopband attenuation" unit="dB" optional />}
          </>
        )}
        {values.kind === "biquad" && (
          <>
            <SelectField name="shape" label="Shape" options={opts(biquadShapes)} onPicked={(s) => form.setValue("gainDb", gainShapes.includes(s as never) ? 6 : undefined, { shouldValidate: true })} />
            <NumberField name="centerHz" label="Centre / corner" unit="Hz" />
            <NumberField name="q" label="Q" />
            {gainShapes.includes(values.shape) && <NumberField name="gainDb" label="Gain" unit="dB" optional />}
          </>
        )}
        {values.kind === "fir" && (
          <>
            <SelectField name="response" label="Response" options={opts(firResponses)} onPicked={setCutoffs} />
            <SelectField
              name="window"
              label="Window"
              options={opts(firWindows)}
              onPicked={(w) => form.setValue("stopbandAttenuationDb", w === "kaiser" ? 60 : undefined, { shouldValidate: true })}
            />
            <NumberField name="taps" label="Taps" />
            {values.window === "kaiser" ? <NumberField name="stopbandAttenuationDb" label="Stopband attenuation" unit="dB" optional /> : <div />}
            {band ? (
              <>
                <NumberField name="cutoffHz.0" label="Low edge" unit="Hz" />
                <NumberField name="cutoffHz.1" label="High edge" unit="Hz" />
              </>
            ) : (
              <NumberField name="cutoffHz" label="Cutoff" unit="Hz" />
            )}
          </>
        )}
        {values.kind === "moving-average" && <NumberField name="length" label="Length" unit="samples" />}
        {values.kind === "differentiator" && (
          <p className="col-span-2 text-sm text-slate-500">First difference scaled by fs: y[n] = fs·(x[n] − x[n−1]). Nothing to set.</p>
        )}
        {values.kind === "ema" && <NumberField name="cutoffHz" label="Cutoff" unit="Hz" />}
        {values.kind === "analog" && (
          <>
            <div className="col-span-2">
              <ListField name="num" label="Numerator b(s), highest power first" hint="s in rad/s, e.g. 15791" />
            </div>
            <div className="col-span-2">
              <ListField name="den" label="Denominator a(s), highest power first" hint="e.g. 1, 177.7, 15791" />
            </div>
            <SelectField
              name="method"
              label="Discretisation"
              options={opts(discretizationMethods, METHOD_LABELS)}
              onPicked={(m) => form.setValue("prewarpHz", m === "tustin-prewarp" ? Math.round(values.sampleRateHz / 20) : undefined, { shouldValidate: true })}
            />
            {values.method === "tustin-prewarp" && <NumberField name="prewarpHz" label="Prewarp at" unit="Hz" optional />}
          </>
        )}
        <DesignFields values={values} />
        {values.kind === "coefficients" && <CoefficientFields hasSos={values.sos !== undefined} onMode={(sos) => {
          if (sos) {
            form.setValue("b", undefined);
            form.setValue("a", undefined);
            form.setValue("sos", [[1, 0, 0, 1, 0, 0]], { shouldValidate: true });
          } else {
            form.setValue("sos", undefined);
            form.setValue("b", [1], { shouldValidate: true });
          }
        }} />}
      </form>
    </FormProvider>
  );
}

function CoefficientFields({ hasSos, onMode }: { hasSos: boolean; onMode: (sos: boolean) => void }) {
  return (
    <>
      <div className="col-span-2 flex gap-4 text-sm">
        <label className="flex items-center gap-1.5">
          <input type="radio" name="coefficient-layout" checked={!hasSos} onChange={() => onMode(false)} /> b and a
        </label>
        <label className="flex items-center gap-1.5">
          <input type="radio" name="coefficient-layout" checked={hasSos} onChange={() => onMode(true)} /> Second-order sections
        </label>
      </div>
      {hasSos ? (
        <div className="col-span-2">
          <ListField key="sos" name="sos" label="SOS rows [b0, b1, b2, a0, a1, a2]" rows lines={4} hint="Paste from numpy or C, or one row per line." />
        </div>
      ) : (
        <>
          <div className="col-span-2">
            <ListField key="b" name="b" label="b (numerator)" lines={3} hint="Paste from numpy or C, or separate with commas or spaces." />
          </div>
          <div className="col-span-2">
            <ListField key="a" name="a" label="a (denominator, empty for FIR)" />
          </div>
        </>
      )}
    </>
  );
}
