/**
 * A plain sentence for an F-test: what was compared, the statistic with its
 * degrees of freedom and p-value, and what that means at the chosen level.
 */
import type { FTestResult, NoTest } from './extraSumOfSquaresTest';

/** The two readings of a test, written by the caller for its own question. */
export interface TestReadings {
  /** What the test compares, e.g. "site-specific quadratics against one common quadratic". */
  comparison: string;
  /** The reading when p < alpha, e.g. "the sites do not share one response". */
  significant: string;
  /** The reading when p ≥ alpha. */
  notSignificant: string;
}

/** p in words: "p < 0.001", "p = 0.034", "p = 0.41". */
export function formatP(p: number): string {
  if (!Number.isFinite(p)) return 'p not available';
  if (p < 0.001) return 'p < 0.001';
  return `p = ${p < 0.01 ? p.toFixed(3) : p.toPrecision(2)}`;
}

/**
 * One sentence for a test result.
 * @param result - the test or the reason there is none
 * @param readings - what the test compares and how to read either outcome
 * @param alpha - significance level, e.g. 0.05
 * @example
 * describeFTest({ kind: 'f-test', df1: 2, df2: 20, f: 5, p: 0.017, extraSse: 100 },
 *   { comparison: 'A against B', significant: 'B fits better', notSignificant: 'A is enough' }, 0.05)
 * // "A against B: F = 5.00 on 2 and 20 df, p = 0.017; at the 5% level B fits better."
 */
export function describeFTest(
  result: FTestResult | NoTest,
  readings: TestReadings,
  alpha: number,
): string {
  if (result.kind === 'no-test') return `${readings.comparison}: no test (${result.reason}).`;
  const f = Number.isFinite(result.f) ? result.f.toPrecision(3) : '∞';
  const level = `${+(alpha * 100).toPrecision(3)}%`;
  const reading = result.p < alpha ? readings.significant : readings.notSignificant;
  return `${readings.comparison}: F = ${f} on ${result.df1} and ${result.df2} df, ${formatP(result.p)}; at the ${level} level ${reading}.`;
}
