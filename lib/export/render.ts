import { renderCHeader } from "./c-header";
import { renderJson } from "./json";
import { assertFirmwareSafe } from "./prepare";
import { renderScipy } from "./scipy";
import { FIRMWARE_FORMATS, type ExportFile, type ExportFormat, type PreparedExport } from "./types";

const FILES: Record<ExportFormat, { render: (p: PreparedExport) => string; contentType: string; suffix: string }> = {
  "c-header": { render: renderCHeader, contentType: "text/x-c; charset=utf-8", suffix: ".h" },
  json: { render: renderJson, contentType: "application/json; charset=utf-8", suffix: ".json" },
  scipy: { render: renderScipy, contentType: "text/x-python; charset=utf-8", suffix: "_sos.py" },
};

/** Renders a prepared export as a file; firmware formats refuse unstable coefficients (ExportRefusal). */
export function renderExport(p: PreparedExport, format: ExportFormat): ExportFile {
  if (FIRMWARE_FORMATS.includes(format)) assertFirmwareSafe(p);
  const file = FILES[format];
  return { body: file.render(p), contentType: file.contentType, filename: `${p.name}${file.suffix}` };
}
