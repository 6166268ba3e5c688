/**
 * The usual one-look summary of a sample: count, mean, spread, range, quartiles
 * and the coefficient of variation. CV% = 100 · SD / mean, the figure trial
 * reviewers compare across sites (common practice); it is left null when the
 * mean is zero, where the ratio has no meaning.
 */
import { assertAtLeast } from './errors';
import { sampleMean, sampleVariance } from './variance';
import { sortedQuantile } from './quantile';

export interface SampleSummary {
  n: number;
  mean: number;
  /** Divisor n − 1, corrected two-pass algorithm. */
  variance: number;
  sd: number;
  /** Standard error of the mean, SD / √n. */
  se: number;
  min: number;
  max: number;
  /** Quartiles and median by Hyndman & Fan definition 7 (R's default). */
  q1: number;
  median: number;
  q3: number;
  /** 100 · SD / mean, in percent; null when the mean is 0. */
  cvPercent: number | null;
}

/**
 * Summarizes a sample.
 * @param values - the sample, any unit (e.g. yield in kg/ha); at least two finite values
 * @param what - how to name the values in an error message, default "values"
 * @returns the summary; every field but n and cvPercent is in the values' unit (variance in its square)
 * @throws {StatsInputError} "too-few-points" for fewer than 2 values; "non-finite" for NaN or ±Infinity
 * @example
 * describeSample([6100, 6400, 6250]).cvPercent // 2.4
 */
export function describeSample(values: ArrayLike<number>, what = 'values'): SampleSummary {
  assertAtLeast(values.length, 2, `describeSample: ${what}`, 'a spread needs n − 1 ≥ 1');
  const n = values.length;
  const mean = sampleMean(values, what);
  const variance = sampleVariance(values, what);
  const sd = Math.sqrt(variance);
  const sorted = Float64Array.from(values).sort();
  return {
    n,
    mean,
    variance,
    sd,
    se: sd / Math.sqrt(n),
    min: sorted[0],
    max: sorted[n - 1],
    q1: sortedQuantile(sorted, 0.25),
    median: sortedQuantile(sorted, 0.5),
    q3: sortedQuantile(sorted, 0.75),
    cvPercent: mean === 0 ? null : (100 * sd) / mean,
  };
}
