/**
 * Pearson's product-moment correlation with its t-test and a Fisher-z interval.
 *
 * r = Sxy / √(Sxx Syy) from sums of centered products (two-pass, so values with
 * many shared leading digits keep their precision); t = r √((n − 2)/(1 − r²))
 * on n − 2 df tests ρ = 0 (Snedecor & Cochran, Statistical Methods, 8th ed.,
 * §10.5). The interval maps z = atanh r, whose standard error is 1/√(n − 3),
 * back through tanh (Fisher 1921; Snedecor & Cochran §10.6).
 * Edge cases:
 * - |r| = 1 (a perfect line): t = ±Infinity, p = 0, the interval collapses on r.
 * - n = 3: the test exists (1 df) but the Fisher interval needs n ≥ 4, so it is null.
 * - rounding can push |r| a hair past 1; it is clamped to [−1, 1].
 */
import {
  assertAtLeast,
  assertFinite,
  assertNotConstant,
  assertLevel,
  assertSameLength,
} from './errors';
import { standardNormalQuantile, studentTTwoSidedP } from './distributions';
import { sampleMean } from './variance';

export interface CorrelationInterval {
  /** Confidence level, e.g. 0.95. */
  level: number;
  low: number;
  high: number;
}

export interface PearsonResult {
  n: number;
  r: number;
  /** t statistic for ρ = 0. */
  t: number;
  df: number;
  /** Two-sided p-value. */
  p: number;
  /** Fisher-z interval for ρ; null when n < 4. */
  interval: CorrelationInterval | null;
}

/**
 * Pearson correlation of paired values.
 * @param x - the first variable, e.g. rate in kg N/ha
 * @param y - the second variable, same length, e.g. yield in kg/ha
 * @param confidence - level of the Fisher-z interval, between 0 and 1, default 0.95
 * @returns r, its t-test (df n − 2) and the interval
 * @throws {StatsInputError} "length-mismatch"; "non-finite"; "too-few-points" for n < 3;
 *   "constant-values" when x or y does not vary; "bad-argument" for a confidence outside (0, 1)
 * @example
 * pearsonCorrelation([0, 40, 80, 120], [5100, 6300, 7000, 7200]).r // ≈ 0.953
 */
export function pearsonCorrelation(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  confidence = 0.95,
): PearsonResult {
  checkPairs(x, y, 'pearsonCorrelation');
  assertLevel(confidence, 'pearsonCorrelation: confidence');
  const n = x.length;
  const r = correlationOfCentered(x, y);
  const df = n - 2;
  const t = Math.abs(r) === 1 ? r * Infinity : r * Math.sqrt(df / (1 - r * r));
  let interval: CorrelationInterval | null = null;
  if (n >= 4) {
    const z = Math.atanh(r);
    const half = standardNormalQuantile(1 - (1 - confidence) / 2) / Math.sqrt(n - 3);
    interval = { level: confidence, low: Math.tanh(z - half), high: Math.tanh(z + half) };
  }
  return { n, r, t, df, p: studentTTwoSidedP(t, df), interval };
}

/**
 * The input checks every paired correlation shares: same length, finite, n ≥ 3, both varying.
 * @param x - first variable
 * @param y - second variable
 * @param fn - the calling function's name, for the message
 * @throws {StatsInputError} as pearsonCorrelation
 * @example
 * checkPairs([1, 2, 3], [2, 4, 5], 'spearmanCorrelation') // passes silently
 */
export function checkPairs(x: ArrayLike<number>, y: ArrayLike<number>, fn: string): void {
  assertSameLength(x, y, [`${fn}: x`, 'y']);
  assertFinite(x, `${fn}: x`);
  assertFinite(y, `${fn}: y`);
  assertAtLeast(x.length, 3, `${fn}: x and y`, 'the test on n − 2 degrees of freedom needs n ≥ 3');
  assertNotConstant(x, `${fn}: x`, 'a correlation needs x to vary');
  assertNotConstant(y, `${fn}: y`, 'a correlation needs y to vary');
}

/**
 * r from centered sums, clamped to [−1, 1]; inputs already checked.
 * @param x - first variable, finite, varying
 * @param y - second variable, finite, varying, same length
 * @returns Pearson's r
 * @example
 * correlationOfCentered([1, 2, 3], [3, 2, 1]) // -1
 */
export function correlationOfCentered(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const mx = sampleMean(x);
  const my = sampleMean(y);
  // Deviations are divided by their largest size so the squares can neither
  // underflow (values near 1e−150) nor overflow (near 1e+160): r is scale-free.
  let scaleX = 0;
  let scaleY = 0;
  for (let i = 0; i < x.length; i++) {
    scaleX = Math.max(scaleX, Math.abs(x[i] - mx));
    scaleY = Math.max(scaleY, Math.abs(y[i] - my));
  }
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (let i = 0; i < x.length; i++) {
    const dx = (x[i] - mx) / scaleX;
    const dy = (y[i] - my) / scaleY;
    sxx += dx * dx;
    syy += dy * dy;
    sxy += dx * dy;
  }
  const r = sxy / (Math.sqrt(sxx) * Math.sqrt(syy));
  return Math.min(1, Math.max(-1, r));
}
