import { KIND_LABELS, SPEC_KINDS, type SpecKind } from "@/lib/bench/spec-defaults";
import type { StageSpec } from "@/lib/dsp";

/** A labelled select of the stage kinds the forms can edit. */
export function KindSelect({ id, label, value, onChange }: { id: string; label: string; value: StageSpec["kind"]; onChange: (kind: SpecKind) => void }) {
  return (
    <div>
      <label htmlFor={id} className="label">
        {label}
      </label>
      <select id={id} className="field" value={value} onChange={(e) => onChange(e.target.value as SpecKind)}>
        {SPEC_KINDS.map((k) => (
          <option key={k} value={k}>
            {KIND_LABELS[k]}
          </option>
        ))}
      </select>
    </div>
  );
}
