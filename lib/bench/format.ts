import { formatHz, signedTrim } from "@/lib/format/units";

/** A number to `digits` significant figures followed by its unit, or "—" when there is none. */
export function withUnit(value: number | null | undefined, unit: string, digits = 3): string {
  if (value === null || value === undefined || Number.isNaN(value)) return "—";
  const text = signedTrim(value, digits);
  return unit ? `${text} ${unit}` : text;
}

/** A frequency in Hz or kHz to `digits` significant figures, or "—". */
export function hz(value: number | null | undefined, digits = 4): string {
  return value === null || value === undefined ? "—" : formatHz(value, digits);
}

/** A level in dB to 0.01 dB with a sign when above 0 (so a level of ±1e-15 dB reads "0 dB"), or "—". */
export function levelDb(value: number | null | undefined): string {
  if (value === null || value === undefined || Number.isNaN(value)) return "—";
  if (!Number.isFinite(value)) return value > 0 ? "+∞ dB" : "−∞ dB";
  const rounded = Math.round(value * 100) / 100;
  return `${rounded > 0 ? "+" : ""}${withUnit(rounded === 0 ? 0 : rounded, "dB", 6)}`;
}
