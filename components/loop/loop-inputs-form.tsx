"use client";

import { FieldLabel, FieldMessage } from "@/components/bench/form-fields";
import { Segmented } from "@/components/ui/segmented";
import { METHOD_LABELS } from "@/lib/bench/spec-defaults";
import { discretizationMethods } from "@/lib/dsp";
import type { LoopInputs } from "./defaults";

function Field({ id, label, unit, value, onChange, hint, error }: { id: string; label: string; unit?: string; value: string; onChange: (v: string) => void; hint?: string; error?: string }) {
  return (
    <div>
      <FieldLabel id={id} label={label} unit={unit} />
      <input id={id} className="field num" value={value} onChange={(e) => onChange(e.target.value)} inputMode="decimal" aria-invalid={error ? true : undefined} spellCheck={false} />
      {hint && !error && <p className="mt-1 text-xs text-slate-500">{hint}</p>}
      <FieldMessage message={error} />
    </div>
  );
}

/** Plant P(s), controller (PID or C(s)), discretisation and computation delay; every edit re-plots at once. */
export function LoopInputsForm({ inputs, onChange, errors }: { inputs: LoopInputs; onChange: (next: LoopInputs) => void; errors: { path: string; message: string }[] }) {
  const set = (key: keyof LoopInputs) => (v: string) => onChange({ ...inputs, [key]: v });
  const err = (...paths: string[]) => errors.filter((e) => paths.some((p) => e.path === p || e.path.startsWith(`${p}.`))).map((e) => e.message).join("; ") || undefined;
  const loose = errors.filter((e) => !/^(plant|controller\.(kp|ki|kd|n|num|den|prewarpHz)|delaySamples)/.test(e.path));
  return (
    <section className="card space-y-3 p-4" aria-label="Plant and controller">
      <h2 className="font-medium">Plant and controller</h2>
      <div className="grid grid-cols-2 gap-3">
        <Field id="loop-plant-num" label="Plant num P(s)" value={inputs.plantNum} onChange={set("plantNum")} hint="highest power of s first" error={err("plant.num")} />
        <Field id="loop-plant-den" label="Plant den" value={inputs.plantDen} onChange={set("plantDen")} hint="e.g. τ, 1, 0 for K/(s(τs+1))" error={err("plant.den", "plant")} />
      </div>
      <Segmented
        label="Controller"
        value={inputs.mode}
        onChange={(mode) => onChange({ ...inputs, mode })}
        options={[
          { value: "pid", label: "PID" },
          { value: "tf", label: "C(s)" },
        ]}
      />
      {inputs.mode === "pid" ? (
        <div className="grid grid-cols-2 gap-3">
          <Field id="loop-kp" label="Kp" value={inputs.kp} onChange={set("kp")} error={err("controller.kp")} />
          <Field id="loop-ki" label="Ki" unit="1/s" value={inputs.ki} onChange={set("ki")} error={err("controller.ki")} />
          <Field id="loop-kd" label="Kd" unit="s" value={inputs.kd} onChange={set("kd")} error={err("controller.kd")} />
          <Field id="loop-n" label="Derivative filter N" value={inputs.n} onChange={set("n")} hint="Tf = Kd/(Kp·N)" error={err("controller.n")} />
        </div>
      ) : (
        <div className="grid grid-cols-2 gap-3">
          <Field id="loop-ctrl-num" label="C(s) num" value={inputs.ctrlNum} onChange={set("ctrlNum")} error={err("controller.num")} />
          <Field id="loop-ctrl-den" label="C(s) den" value={inputs.ctrlDen} onChange={set("ctrlDen")} error={err("controller.den")} />
        </div>
      )}
      <div className="grid grid-cols-2 gap-3">
        <div>
          <label htmlFor="loop-method" className="label">
            Controller discretisation
          </label>
          <select id="loop-method" className="field" value={inputs.method} onChange={(e) => onChange({ ...inputs, method: e.target.value as LoopInputs["method"] })}>
            {discretizationMethods.map((m) => (
              <option key={m} value={m}>
                {METHOD_LABELS[m]}
              </option>
            ))}
          </select>
        </div>
        {inputs.method === "tustin-prewarp" ? (
          <Field id="loop-prewarp" label="Prewarp at" unit="Hz" value={inputs.prewarpHz} onChange={set("prewarpHz")} error={err("controller.prewarpHz")} />
        ) : (
          <div />
        )}
        <Field id="loop-delay" label="Computation delay" unit="samples" value={inputs.delaySamples} onChange={set("delaySamples")} error={err("delaySamples")} />
      </div>
      <p className="text-xs text-slate-500">The plant is discretised by zero-order hold (driven through a DAC). PID: Kp + Ki/s + Kd·s/(1 + s·Tf).</p>
      {loose.map((e) => (
        <p key={e.path + e.message} role="alert" className="text-xs text-red-700 dark:text-red-300">
          {e.message}
        </p>
      ))}
    </section>
  );
}
