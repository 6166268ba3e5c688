/**
 * Sample quantiles by linear interpolation between order statistics,
 * definition 7 of Hyndman & Fan (1996), "Sample quantiles in statistical
 * packages", The American Statistician 50(4): with the sorted sample
 * x₍₁₎ ≤ … ≤ x₍ₙ₎ and h = (n − 1)p + 1, Q(p) = x₍⌊h⌋₎ + (h − ⌊h⌋)(x₍⌊h⌋+1₎ − x₍⌊h⌋₎).
 * It is R's default (type 7), so numbers agree with what most readers check against.
 * Edge cases: p = 0 gives the minimum, p = 1 the maximum, n = 1 that one value.
 */
import { assertAtLeast, assertFinite, StatsInputError } from './errors';

/**
 * The p-quantile of a sample (Hyndman & Fan definition 7).
 * @param values - the sample, any unit; at least one finite value (not modified)
 * @param p - the probability, 0 ≤ p ≤ 1 (0.5 for the median)
 * @returns the quantile, in the values' unit
 * @throws {StatsInputError} "bad-argument" when p is outside [0, 1]; "too-few-points" when empty;
 *   "non-finite" for NaN or ±Infinity among the values
 * @example
 * sampleQuantile([1, 2, 3, 4], 0.25) // 1.75
 */
export function sampleQuantile(values: ArrayLike<number>, p: number): number {
  return sortedQuantile(sortedCopy(values, 'sampleQuantile'), p);
}

/**
 * The sample median (the 0.5 quantile; the mean of the two middle values for even n).
 * @param values - the sample, any unit; at least one finite value
 * @returns the median, in the values' unit
 * @throws {StatsInputError} as sampleQuantile
 * @example
 * sampleMedian([7, 1, 4, 10]) // 5.5
 */
export function sampleMedian(values: ArrayLike<number>): number {
  return sortedQuantile(sortedCopy(values, 'sampleMedian'), 0.5);
}

/**
 * Quantile of values already sorted ascending (no checks on the order).
 * @param sorted - finite values in ascending order, at least one
 * @param p - the probability, 0 ≤ p ≤ 1
 * @returns the quantile, in the values' unit
 * @throws {StatsInputError} "bad-argument" when p is outside [0, 1]
 * @example
 * sortedQuantile([1, 2, 3, 4], 0.5) // 2.5
 */
export function sortedQuantile(sorted: ArrayLike<number>, p: number): number {
  if (!(p >= 0 && p <= 1)) {
    throw new StatsInputError(
      'bad-argument',
      `sampleQuantile: p is ${String(p)}; it must lie between 0 and 1.`,
    );
  }
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

function sortedCopy(values: ArrayLike<number>, fn: string): Float64Array {
  assertAtLeast(values.length, 1, `${fn}: values`, 'a quantile needs one value');
  assertFinite(values, `${fn}: values`);
  // Float64Array sorts numerically (a plain array would sort as text).
  return Float64Array.from(values).sort();
}

/**
 * Quantile of a weighted sample whose values are sorted ascending: the inverse of its weighted
 * distribution function, the smallest value whose cumulative weight reaches p of the total
 * (p = 0 gives the smallest value of positive weight). With equal weights it is definition 1
 * of Hyndman & Fan (1996), R's quantile(type = 1). No interpolation: an interpolated weighted
 * quantile can rise when values of unequal weight swap places, and the optimum's interval
 * must never rise as the price ratio rises (each value falls then). Values of zero weight are
 * skipped.
 * @param sorted - finite values in ascending order, at least one with positive weight
 * @param weights - one non-negative weight per value
 * @param p - the probability, 0 ≤ p ≤ 1
 * @returns the quantile, one of the values
 * @throws {StatsInputError} "bad-argument" when p is outside [0, 1] or no weight is positive
 * @example
 * weightedSortedQuantile([2, 3, 5, 7], [1, 1, 1, 1], 0.5) // 3, as R's quantile(type = 1)
 */
export function weightedSortedQuantile(
  sorted: ArrayLike<number>,
  weights: ArrayLike<number>,
  p: number,
): number {
  if (!(p >= 0 && p <= 1)) {
    throw new StatsInputError(
      'bad-argument',
      `weightedSortedQuantile: p is ${String(p)}; it must lie between 0 and 1.`,
    );
  }
  let total = 0;
  let last = -1;
  for (let i = 0; i < sorted.length; i++) {
    if (weights[i] > 0) {
      total += weights[i];
      last = i;
    }
  }
  if (last < 0) {
    throw new StatsInputError('bad-argument', 'weightedSortedQuantile: no weight is positive.');
  }
  // Relative slack for the rounding of the running sum (so p = k/n lands on the k-th value).
  const goal = p * total * (1 - 1e-12);
  let cumulative = 0;
  for (let i = 0; i <= last; i++) {
    if (!(weights[i] > 0)) continue;
    cumulative += weights[i];
    if (cumulative >= goal && (p > 0 || cumulative > 0)) return sorted[i];
  }
  return sorted[last];
}
