import { formatHz, trim } from "@/lib/format/units";

/** A number to `digits` significant figures followed by its unit, or "—" when there is none. */
export function withUnit(value: number | null | undefined, unit: string, digits = 3): string {
  if (value === null || value === undefined || Number.isNaN(value)) return "—";
  const text = trim(value, digits).replace("-", "−");
  return unit ? `${text} ${unit}` : text;
}

/** A frequency in Hz or kHz to `digits` significant figures, or "—". */
export function hz(value: number | null | undefined, digits = 4): string {
  return value === null || value === undefined ? "—" : formatHz(value, digits);
}
