/**
 * Σ values with Neumaier's compensated summation (A. Neumaier, "Rundungsfehleranalyse einiger
 * Verfahren zur Summation endlicher Summen", ZAMM 54 (1974) 39–51): the rounding error of every
 * addition is recovered exactly and added back at the end, so the result is as accurate as if
 * summed in twice the precision and then rounded. Needed where the terms cancel, e.g. Σ a_k of a
 * low-pass denominator, which is orders of magnitude below Σ|a_k|.
 */
export function accurateSum(values: readonly number[]): number {
  let sum = 0;
  let compensation = 0;
  for (const v of values) {
    const t = sum + v;
    compensation += Math.abs(sum) >= Math.abs(v) ? sum - t + v : v - t + sum;
    sum = t;
  }
  return sum + compensation;
}
