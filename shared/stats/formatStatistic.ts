/**
 * Short number formats for sentences a reader sees ("t = 3.1, p = 0.006"):
 * two significant digits, the habit of journal tables (common practice), with
 * p-values below 0.001 shown as "< 0.001" because more digits there are noise.
 */

/**
 * A test statistic to two significant digits.
 * @param value - the statistic (t, F, …), unitless
 * @returns the rounded value as text, e.g. "3.1", "-0.54", "1200"
 * @example
 * formatStatistic(3.1416) // "3.1"
 */
export function formatStatistic(value: number): string {
  if (!Number.isFinite(value)) return value > 0 ? '∞' : value < 0 ? '−∞' : 'undefined';
  return String(Number(value.toPrecision(2)));
}

/**
 * A p-value with its relation sign: "= 0.006", "< 0.001". When two digits would
 * round the p-value onto alpha, a third digit is kept so the sentence and the
 * decision cannot disagree.
 * @param p - the p-value, 0 ≤ p ≤ 1
 * @param alpha - the significance level the decision used, e.g. 0.05
 * @returns the text after "p ", e.g. "= 0.049" or "< 0.001"
 * @example
 * formatPValue(0.00612, 0.05) // "= 0.0061"
 */
export function formatPValue(p: number, alpha: number): string {
  if (p < 0.001) return '< 0.001';
  let digits = 2;
  while (digits < 6 && Number(p.toPrecision(digits)) === alpha && p !== alpha) digits++;
  return `= ${String(Number(p.toPrecision(digits)))}`;
}
