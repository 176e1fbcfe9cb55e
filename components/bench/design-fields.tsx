"use client";

import { useState, type ReactNode } from "react";
import { useFormContext } from "react-hook-form";
import { withUnit } from "@/lib/bench/format";
import { combOrder, estimateFirOrder, firOrderRequirementSchema, firWindows, FIR_DESIGN_LIMITS, notchShapes, SPEC_LIMITS, type FilterSpec } from "@/lib/dsp";
import { FieldLabel, ListField, NumberField, SelectField } from "./form-fields";
import { countOf } from "@/lib/format/plural";

const SHAPES = notchShapes.map((s) => ({ value: s, label: s === "notch" ? "Notch (stop)" : "Peak (pass)" }));
const WINDOWS = firWindows.map((w) => ({ value: w, label: w }));

/**
 * The fields of the notch, comb, equiripple and arbitrary-magnitude FIR kinds, and the Kaiser order
 * estimate offered beside the windowed-sinc FIR. Rendered inside SpecForm's form (useFormContext).
 */
export function DesignFields({ values }: { values: FilterSpec }) {
  switch (values.kind) {
    case "fir":
      return <KaiserOrderHelper response={values.response} />;
    case "notch":
      return (
        <ShapeFrequencyQ frequency="centerHz" frequencyLabel="Centre" qLabel="Q = centre / −3 dB width">
          <BandwidthNote centerHz={values.centerHz} q={values.q} sampleRateHz={values.sampleRateHz} />
        </ShapeFrequencyQ>
      );
    case "comb":
      return (
        <ShapeFrequencyQ frequency="fundamentalHz" frequencyLabel="Fundamental" qLabel="Q of each notch or peak">
          <CombNote fundamentalHz={values.fundamentalHz} sampleRateHz={values.sampleRateHz} shape={values.shape} />
        </ShapeFrequencyQ>
      );
    case "fir-equiripple":
      return (
        <>
          <NumberField name="taps" label="Taps" />
          <div />
          <div className="col-span-2">
            <ListField name="bandsHz" label="Band edges (Hz), a pair per band" hint={`From 0 to ${values.sampleRateHz / 2} Hz, e.g. 0, 100, 150, ${values.sampleRateHz / 2}; the gaps are transition bands.`} />
          </div>
          <div className="col-span-2">
            <ListField name="desired" label="Desired gain per band" hint="e.g. 1, 0 for a low-pass" />
          </div>
          <div className="col-span-2">
            <ListField name="weights" label="Weight per band (optional)" hint="A larger weight makes that band's ripple smaller, e.g. 1, 10." />
          </div>
          <p className="col-span-2 text-xs text-slate-500">
            Parks–McClellan: the largest weighted error over the bands is as small as {values.taps} taps allow, with equal ripples
            (as scipy.signal.remez). Up to {FIR_DESIGN_LIMITS.maxEquirippleTaps} taps; very wide transition bands are refused.
          </p>
        </>
      );
    case "fir-arbitrary":
      return (
        <>
          <NumberField name="taps" label="Taps" />
          <SelectField name="window" label="Window" options={WINDOWS} />
          {values.window === "kaiser" ? <NumberField name="kaiserBeta" label="Kaiser β" optional /> : <div />}
          <div />
          <div className="col-span-2">
            <ListField name="freqsHz" label="Frequencies (Hz)" hint={`From 0 to ${values.sampleRateHz / 2} Hz; repeat one for a step, e.g. 0, 100, 100, ${values.sampleRateHz / 2}.`} />
          </div>
          <div className="col-span-2">
            <ListField name="gains" label="Gain at each frequency" hint="Linear in between, e.g. 1, 1, 0, 0." />
          </div>
        </>
      );
    default:
      return null;
  }
}

/** Shape, one frequency and q (the notch and the comb), then a note about them. */
function ShapeFrequencyQ({ frequency, frequencyLabel, qLabel, children }: { frequency: string; frequencyLabel: string; qLabel: string; children: ReactNode }) {
  return (
    <>
      <SelectField name="shape" label="Shape" options={SHAPES} />
      <NumberField name={frequency} label={frequencyLabel} unit="Hz" />
      <NumberField name="q" label={qLabel} />
      <div />
      {children}
    </>
  );
}

/** How the bandwidth Q differs from the cookbook biquad's Q, with both −3 dB widths for the values typed. */
function BandwidthNote({ centerHz, q, sampleRateHz }: { centerHz: number; q: number; sampleRateHz: number }) {
  const valid = centerHz > 0 && centerHz < sampleRateHz / 2 && q > 0;
  const width = valid ? centerHz / q : null;
  // The cookbook notch is this design with β = α = sin ω0/(2Q), so its −3 dB width is 2·atan(α) rad/sample.
  const cookbook = valid ? (sampleRateHz / Math.PI) * Math.atan(Math.sin((2 * Math.PI * centerHz) / sampleRateHz) / (2 * q)) : null;
  return (
    <p className="col-span-2 text-xs text-slate-500" data-testid="bandwidth-q-note">
      Q here is the centre over the −3 dB width (as scipy.signal.iirnotch / iirpeak): the notch is {withUnit(width, "Hz", 3)} wide.
      The cookbook biquad&apos;s Q is not the same number: it sets α = sin ω0/(2Q), so the same Q there gives a {withUnit(cookbook, "Hz", 3)}{" "}
      wide notch, close at low frequencies and narrower towards Nyquist.
    </p>
  );
}

/** Whether the comb's fundamental divides fs, and what the comb does at DC. */
function CombNote({ fundamentalHz, sampleRateHz, shape }: { fundamentalHz: number; sampleRateHz: number; shape: string }) {
  const n = fundamentalHz > 0 ? combOrder(fundamentalHz, sampleRateHz) : null;
  return (
    <p className="col-span-2 text-xs text-slate-500" data-testid="comb-note">
      {n === null
        ? `The comb delays by fs/f0 samples, so ${sampleRateHz} Hz / f0 must be a whole number.`
        : `A ${n}-sample comb: it acts at ${withUnit(fundamentalHz, "Hz", 4)} and every multiple up to ${withUnit(sampleRateHz / 2, "Hz", 4)}, and at 0 Hz too.`}{" "}
      {shape === "notch" ? "The notch comb removes DC: the signal's steady level is lost." : "The peak comb passes DC and the harmonics only."}
    </p>
  );
}

/**
 * Kaiser's order estimate (as scipy.signal.kaiserord): taps and β for a ripple and a transition width,
 * applied to the windowed-sinc form as a Kaiser window with that attenuation.
 */
function KaiserOrderHelper({ response }: { response: string }) {
  const form = useFormContext();
  const [rippleDb, setRippleDb] = useState("60");
  const [widthHz, setWidthHz] = useState("");
  const sampleRateHz = Number(form.getValues("sampleRateHz"));
  const request = firOrderRequirementSchema.safeParse({ rippleDb: Number(rippleDb), widthHz: Number(widthHz), sampleRateHz });
  const estimate = request.success ? estimateFirOrder(request.data) : null;
  // Kaiser's count may be even; a high-pass or band-stop needs an odd one (zero gain at Nyquist otherwise).
  const taps = estimate && (response === "highpass" || response === "bandstop") && estimate.taps % 2 === 0 ? estimate.taps + 1 : estimate?.taps;
  const tooMany = taps !== undefined && taps > SPEC_LIMITS.maxFirTaps;
  return (
    <fieldset className="col-span-2 rounded-md border border-slate-200 p-2 dark:border-slate-700">
      <legend className="px-1 text-xs text-slate-500">Estimate the taps (Kaiser)</legend>
      <div className="grid grid-cols-2 gap-3">
        <div>
          <FieldLabel id="kaiser-ripple" label="Ripple / attenuation" unit="dB" />
          <input id="kaiser-ripple" className="field num" type="number" step="any" value={rippleDb} onChange={(e) => setRippleDb(e.target.value)} />
        </div>
        <div>
          <FieldLabel id="kaiser-width" label="Transition width" unit="Hz" />
          <input id="kaiser-width" className="field num" type="number" step="any" value={widthHz} onChange={(e) => setWidthHz(e.target.value)} />
        </div>
      </div>
      <div className="mt-2 flex items-center gap-3 text-xs">
        <span className="text-slate-600 dark:text-slate-300" data-testid="kaiser-estimate">
          {estimate ? `${countOf(estimate.taps, "tap")}, β = ${withUnit(estimate.beta, "", 4)}` : (request.error?.issues[0]?.message ?? "")}
        </span>
        {estimate && !tooMany && (
          <button
            type="button"
            className="rounded-md border border-slate-300 px-2 py-1 dark:border-slate-600"
            onClick={() => {
              form.setValue("window", "kaiser");
              form.setValue("kaiserBeta", undefined);
              form.setValue("stopbandAttenuationDb", Number(rippleDb));
              form.setValue("taps", taps, { shouldValidate: true });
            }}
          >
            Use {taps} taps, Kaiser window
          </button>
        )}
        {tooMany && <span className="text-amber-700 dark:text-amber-300">more than {SPEC_LIMITS.maxFirTaps} taps: widen the transition or ease the ripple</span>}
      </div>
    </fieldset>
  );
}
