/**
 * Spearman's rank correlation: Pearson's r of the average ranks, so ties are
 * handled exactly rather than by the 1 − 6Σd²/(n(n² − 1)) shortcut, which holds
 * only without ties (Conover, Practical Nonparametric Statistics, 3rd ed., §5.4).
 * The test of ρ = 0 uses t = rₛ √((n − 2)/(1 − rₛ²)) on n − 2 df, the large-sample
 * approximation R's cor.test uses when exact = FALSE; with small n and no ties an
 * exact permutation p-value would be slightly different (Conover §5.4 gives tables).
 */
import { averageRanks } from './ranks';
import { checkPairs, correlationOfCentered } from './pearson';
import { studentTTwoSidedP } from './distributions';

export interface SpearmanResult {
  n: number;
  /** Spearman's rₛ, in [−1, 1]. */
  rho: number;
  /** t statistic of the approximation. */
  t: number;
  df: number;
  /** Two-sided p-value from the t approximation. */
  p: number;
  /** True when x or y has tied values (averaged ranks were used). */
  ties: boolean;
}

/**
 * Spearman rank correlation of paired values, with a t-approximation test.
 * @param x - the first variable, any unit
 * @param y - the second variable, same length, any unit
 * @returns rₛ, its test and whether ties were present
 * @throws {StatsInputError} "length-mismatch"; "non-finite"; "too-few-points" for n < 3;
 *   "constant-values" when x or y does not vary
 * @example
 * spearmanCorrelation([0, 40, 80, 120], [5100, 6300, 7000, 6900]).rho // ≈ 0.8
 */
export function spearmanCorrelation(x: ArrayLike<number>, y: ArrayLike<number>): SpearmanResult {
  checkPairs(x, y, 'spearmanCorrelation');
  const rx = averageRanks(x);
  const ry = averageRanks(y);
  const n = x.length;
  const rho = correlationOfCentered(rx, ry);
  const df = n - 2;
  const t = Math.abs(rho) === 1 ? rho * Infinity : rho * Math.sqrt(df / (1 - rho * rho));
  return { n, rho, t, df, p: studentTTwoSidedP(t, df), ties: hasTies(x) || hasTies(y) };
}

function hasTies(values: ArrayLike<number>): boolean {
  // Averaged ranks can still be whole numbers (three tied at 1, 2, 3 share 2), so look at the values.
  const sorted = Float64Array.from(values).sort();
  for (let i = 1; i < sorted.length; i++) if (sorted[i] === sorted[i - 1]) return true;
  return false;
}
