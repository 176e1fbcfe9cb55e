"use client";

import { useState } from "react";
import { defaultTarget as targetFor, EXPORT_FORMATS, FIRMWARE_FORMATS, FORMAT_TARGETS, type ExportFormat, type ExportTarget } from "@/lib/export/types";

const FORMAT_LABEL: Record<ExportFormat, string> = {
  "c-header": "C header",
  json: "JSON",
  scipy: "scipy sos",
  csv: "CSV (spreadsheet)",
  "cmsis-df1": "CMSIS-DSP DF1 header",
  "cmsis-df2t": "CMSIS-DSP DF2T header",
};

interface Props {
  revisionId: number;
  /** The device format the revision was saved for. */
  defaultTarget: ExportTarget;
  /** Why the revision is not deployable in its device format, if it is not. */
  refusal?: string;
  /** Whether the float design is stable; when not, every firmware target is refused. */
  designStable: boolean;
}

/** Format and number-format pickers with a download link to the revision's export route. */
export function ExportControl({ revisionId, defaultTarget, refusal, designStable }: Props) {
  const [format, setFormat] = useState<ExportFormat>("c-header");
  const [chosen, setTarget] = useState<ExportTarget>(defaultTarget);
  const targets = FORMAT_TARGETS[format];
  const target = targets.includes(chosen) ? chosen : targetFor(format, defaultTarget);
  const refused = refusal !== undefined && FIRMWARE_FORMATS.includes(format) && (target === defaultTarget || !designStable);
  const href = `/api/v1/revisions/${revisionId}/export?format=${format}&target=${target}`;
  return (
    <fieldset className="flex flex-wrap items-end gap-2" data-testid={`export-${revisionId}`}>
      <legend className="label">Export</legend>
      <select aria-label="Export format" className="field w-auto" value={format} onChange={(e) => setFormat(e.target.value as ExportFormat)}>
        {EXPORT_FORMATS.map((f) => <option key={f} value={f}>{FORMAT_LABEL[f]}</option>)}
      </select>
      <select aria-label="Number format" className="field w-auto" value={target} onChange={(e) => setTarget(e.target.value as ExportTarget)}>
        {targets.map((t) => <option key={t} value={t}>{t}{t === defaultTarget ? " (device)" : ""}</option>)}
      </select>
      {refused ? (
        <p className="text-xs text-fault">Not exported for firmware: {refusal}</p>
      ) : (
        <a className="btn-quiet" href={href} download>Download</a>
      )}
    </fieldset>
  );
}
