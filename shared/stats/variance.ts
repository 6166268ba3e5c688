/**
 * Sample mean, variance and standard deviation by the corrected two-pass
 * algorithm: first the mean, then Σ(x − m)² − (Σ(x − m))² / n. The correction
 * term removes most of the rounding left in the mean, so the result stays
 * accurate when the values share many leading digits (yields near 10 000 kg/ha
 * differing in the units place), where the one-pass Σx² − (Σx)²/n loses every
 * digit. Chan, Golub & LeVeque (1983), "Algorithms for computing the sample
 * variance: analysis and recommendations", The American Statistician 37(3),
 * eq. 1.7.
 */
import { assertAtLeast, assertFinite } from './errors';

/**
 * Arithmetic mean, computed as m₀ + mean(x − m₀) with m₀ the first value so
 * that the sum runs over small deviations rather than large raw values.
 * @param values - the sample, any unit; at least one finite value
 * @param what - how to name the values in an error message, default "values"
 * @returns the mean, in the unit of the values
 * @throws {StatsInputError} "too-few-points" for an empty sample; "non-finite" for NaN or ±Infinity
 * @example
 * sampleMean([6100, 6400, 6250]) // 6250
 */
export function sampleMean(values: ArrayLike<number>, what = 'values'): number {
  assertAtLeast(values.length, 1, `sampleMean: ${what}`, 'a mean needs one value');
  assertFinite(values, `sampleMean: ${what}`);
  const shift = values[0];
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i] - shift;
  return shift + sum / values.length;
}

/**
 * Sample variance with divisor n − 1 (corrected two-pass algorithm).
 * @param values - the sample, any unit; at least two finite values
 * @param what - how to name the values in an error message, default "values"
 * @returns the variance, in the square of the values' unit
 * @throws {StatsInputError} "too-few-points" for fewer than 2 values; "non-finite" for NaN or ±Infinity
 * @example
 * sampleVariance([6100, 6400, 6250]) // 22500
 */
export function sampleVariance(values: ArrayLike<number>, what = 'values'): number {
  assertAtLeast(values.length, 2, `sampleVariance: ${what}`, 'a variance needs n − 1 ≥ 1');
  const n = values.length;
  const mean = sampleMean(values, what);
  let sumSq = 0;
  let sumDev = 0;
  for (let i = 0; i < n; i++) {
    const d = values[i] - mean;
    sumSq += d * d;
    sumDev += d;
  }
  return Math.max((sumSq - (sumDev * sumDev) / n) / (n - 1), 0);
}

/**
 * Sample standard deviation √(sampleVariance).
 * @param values - the sample, any unit; at least two finite values
 * @param what - how to name the values in an error message, default "values"
 * @returns the standard deviation, in the values' unit
 * @throws {StatsInputError} as sampleVariance
 * @example
 * sampleStandardDeviation([6100, 6400, 6250]) // 150
 */
export function sampleStandardDeviation(values: ArrayLike<number>, what = 'values'): number {
  return Math.sqrt(sampleVariance(values, what));
}
