/** Formats a frequency with its unit, switching to kHz at 1000 Hz; `digits` significant figures. */
export function formatHz(hz: number, digits = 4): string {
  if (!Number.isFinite(hz)) return "—";
  return Math.abs(hz) >= 1000 ? `${trim(hz / 1000, digits)} kHz` : `${trim(hz, digits)} Hz`;
}

/** A number to `digits` significant figures without trailing zeros or exponent for everyday magnitudes. */
export function trim(value: number, digits = 4): string {
  if (!Number.isFinite(value)) return value > 0 ? "∞" : value < 0 ? "−∞" : "—";
  if (value === 0) return "0";
  return String(Number(value.toPrecision(digits)));
}

/** A number's text with true minus signs (U+2212) for the hyphens of its sign and of its exponent ("−1.2e−15"). */
export function withMinus(text: string): string {
  return text.replaceAll("-", "−");
}

/** trim with true minus signs, for text people read (not for values they paste back). */
export function signedTrim(value: number, digits = 4): string {
  return withMinus(trim(value, digits));
}
