/** Whether every value is a finite number (x − x is 0 for every finite x, NaN for NaN and ±∞). */
export function allFinite(values: ArrayLike<number>): boolean {
  for (let i = 0; i < values.length; i++) if (values[i] - values[i] !== 0) return false;
  return true;
}
