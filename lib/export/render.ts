import { renderCHeader } from "./c-header";
import { renderCmsisHeader } from "./cmsis-header";
import { renderCsv } from "./csv";
import { renderJson } from "./json";
import { assertFirmwareSafe } from "./prepare";
import { renderScipy } from "./scipy";
import { FIRMWARE_FORMATS, type ExportFile, type ExportFormat, type PreparedExport } from "./types";

const FILES: Record<ExportFormat, { render: (p: PreparedExport) => string; contentType: string; suffix: string }> = {
  "c-header": { render: renderCHeader, contentType: "text/x-c; charset=utf-8", suffix: ".h" },
  json: { render: renderJson, contentType: "application/json; charset=utf-8", suffix: ".json" },
  scipy: { render: renderScipy, contentType: "text/x-python; charset=utf-8", suffix: "_sos.py" },
  csv: { render: renderCsv, contentType: "text/csv; charset=utf-8; header=present", suffix: ".csv" },
  "cmsis-df1": { render: (p) => renderCmsisHeader(p, "df1"), contentType: "text/x-c; charset=utf-8", suffix: "_cmsis_df1.h" },
  "cmsis-df2t": { render: (p) => renderCmsisHeader(p, "df2t"), contentType: "text/x-c; charset=utf-8", suffix: "_cmsis_df2t.h" },
};

/** Renders a prepared export as a file; firmware formats refuse unstable coefficients (ExportRefusal). */
export function renderExport(p: PreparedExport, format: ExportFormat): ExportFile {
  if (FIRMWARE_FORMATS.includes(format)) assertFirmwareSafe(p);
  const file = FILES[format];
  return { body: file.render(p), contentType: file.contentType, filename: `${p.name}${file.suffix}` };
}
