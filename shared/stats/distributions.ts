/**
 * Distribution functions for the tests and intervals in this folder. They come
 * from the stdlib project's well-tested implementations (never a hand-written
 * incomplete beta); this file names them, fixes argument order, checks the
 * degrees of freedom and probabilities (stdlib answers NaN for a bad one, which
 * would travel silently into a report), and computes tails without cancellation.
 * A NaN statistic still gives a NaN p-value: that is the caller's data, passed through.
 */
import tCdf from '@stdlib/stats-base-dists-t-cdf';
import tQuantile from '@stdlib/stats-base-dists-t-quantile';
import fCdf from '@stdlib/stats-base-dists-f-cdf';
import fQuantile from '@stdlib/stats-base-dists-f-quantile';
import chisqCdf from '@stdlib/stats-base-dists-chisquare-cdf';
import chisqQuantile from '@stdlib/stats-base-dists-chisquare-quantile';
import normalCdf from '@stdlib/stats-base-dists-normal-cdf';
import normalQuantile from '@stdlib/stats-base-dists-normal-quantile';
import { StatsInputError } from './errors';

/**
 * Quantiles remembered by their arguments. A run asks for the same few (t at 0.975 or 0.95 on a
 * site's error df, F at 0.9 on its model's df) thousands of times, and each stdlib call inverts
 * an incomplete beta; a quantile is a pure function, so the remembered value is the same number.
 * Bounded: past QUANTILE_CACHE_SIZE distinct arguments the memory starts again.
 */
const QUANTILE_CACHE_SIZE = 4096;
const quantileCache = new Map<string, number>();

function remembered(key: string, compute: () => number): number {
  const known = quantileCache.get(key);
  if (known !== undefined) return known;
  const value = compute();
  if (quantileCache.size >= QUANTILE_CACHE_SIZE) quantileCache.clear();
  quantileCache.set(key, value);
  return value;
}

function checkDf(df: number, fn: string, name = 'df'): void {
  if (!(df > 0)) {
    throw new StatsInputError(
      'bad-argument',
      `${fn}: ${name} is ${String(df)}; degrees of freedom must be positive.`,
    );
  }
}

function checkProbability(p: number, fn: string): void {
  if (!(p >= 0 && p <= 1)) {
    throw new StatsInputError(
      'bad-argument',
      `${fn}: p is ${String(p)}; a probability lies between 0 and 1.`,
    );
  }
}

/**
 * P(T ≤ t) for Student's t.
 * @param t - the statistic
 * @param df - degrees of freedom, > 0
 * @returns the lower-tail probability
 * @throws {StatsInputError} "bad-argument" for df ≤ 0 or NaN
 * @example
 * studentTCdf(2.228, 10) // ≈ 0.975
 */
export function studentTCdf(t: number, df: number): number {
  checkDf(df, 'studentTCdf');
  return tCdf(t, df);
}

/**
 * The t value with P(T ≤ t) = p.
 * @param p - probability, 0 ≤ p ≤ 1
 * @param df - degrees of freedom, > 0
 * @returns the quantile (±Infinity at p = 0 or 1)
 * @throws {StatsInputError} "bad-argument" for p outside [0, 1] or df ≤ 0
 * @example
 * studentTQuantile(0.975, 10) // ≈ 2.228
 */
export function studentTQuantile(p: number, df: number): number {
  checkProbability(p, 'studentTQuantile');
  checkDf(df, 'studentTQuantile');
  return remembered(`t|${p}|${df}`, () => tQuantile(p, df));
}

/**
 * Two-sided p-value of a t statistic, P(|T| ≥ |t|), from the lower tail at −|t|
 * so that small p-values keep their digits.
 * @param t - the statistic; NaN gives NaN
 * @param df - degrees of freedom, > 0
 * @returns the p-value in [0, 1]
 * @throws {StatsInputError} "bad-argument" for df ≤ 0 or NaN
 * @example
 * studentTTwoSidedP(2.228, 10) // ≈ 0.05
 */
export function studentTTwoSidedP(t: number, df: number): number {
  checkDf(df, 'studentTTwoSidedP');
  if (Number.isNaN(t)) return NaN;
  return 2 * tCdf(-Math.abs(t), df);
}

/**
 * P(F ≤ f) for the F distribution.
 * @param f - the statistic
 * @param df1 - numerator degrees of freedom, > 0
 * @param df2 - denominator degrees of freedom, > 0
 * @returns the lower-tail probability
 * @throws {StatsInputError} "bad-argument" for a degrees of freedom ≤ 0 or NaN
 * @example
 * fisherFCdf(3.708, 3, 10) // ≈ 0.95
 */
export function fisherFCdf(f: number, df1: number, df2: number): number {
  checkDf(df1, 'fisherFCdf', 'df1');
  checkDf(df2, 'fisherFCdf', 'df2');
  return fCdf(f, df1, df2);
}

/**
 * Upper-tail p-value P(F ≥ f). Computed as the lower tail of the reciprocal,
 * P(F(df1, df2) ≥ f) = P(F(df2, df1) ≤ 1/f), an exact identity (if X ~ F(a, b)
 * then 1/X ~ F(b, a); Johnson, Kotz & Balakrishnan, Continuous Univariate
 * Distributions vol. 2, ch. 27), because 1 − cdf(f) cancels to a few digits
 * when the p-value is small (p = 4e−9 keeps only 7 of 16).
 * @param f - the statistic; NaN gives NaN, Infinity gives 0, f ≤ 0 gives 1
 * @param df1 - numerator degrees of freedom, > 0
 * @param df2 - denominator degrees of freedom, > 0
 * @returns the p-value in [0, 1]
 * @throws {StatsInputError} "bad-argument" for a degrees of freedom ≤ 0 or NaN
 * @example
 * fisherFUpperP(3.708, 3, 10) // ≈ 0.05
 */
export function fisherFUpperP(f: number, df1: number, df2: number): number {
  checkDf(df1, 'fisherFUpperP', 'df1');
  checkDf(df2, 'fisherFUpperP', 'df2');
  if (Number.isNaN(f)) return NaN;
  if (f === Infinity) return 0;
  if (f <= 0) return 1;
  return fCdf(1 / f, df2, df1);
}

/**
 * The F value with P(F ≤ f) = p.
 * @param p - probability, 0 ≤ p ≤ 1
 * @param df1 - numerator degrees of freedom, > 0
 * @param df2 - denominator degrees of freedom, > 0
 * @returns the quantile
 * @throws {StatsInputError} "bad-argument" for p outside [0, 1] or a degrees of freedom ≤ 0
 * @example
 * fisherFQuantile(0.95, 3, 10) // ≈ 3.708
 */
export function fisherFQuantile(p: number, df1: number, df2: number): number {
  checkProbability(p, 'fisherFQuantile');
  checkDf(df1, 'fisherFQuantile', 'df1');
  checkDf(df2, 'fisherFQuantile', 'df2');
  return remembered(`F|${p}|${df1}|${df2}`, () => fQuantile(p, df1, df2));
}

/**
 * P(X ≤ x) for chi-square.
 * @param x - the statistic
 * @param df - degrees of freedom, > 0
 * @returns the lower-tail probability
 * @throws {StatsInputError} "bad-argument" for df ≤ 0 or NaN
 * @example
 * chiSquareCdf(3.841, 1) // ≈ 0.95
 */
export function chiSquareCdf(x: number, df: number): number {
  checkDf(df, 'chiSquareCdf');
  return chisqCdf(x, df);
}

/**
 * Upper-tail p-value P(X ≥ x) for chi-square, as 1 − cdf: accurate to about 1e−16 absolute, so a
 * p-value below 1e−12 keeps few digits (reports print such a p as "< 0.001").
 * @param x - the statistic; NaN gives NaN, x ≤ 0 gives 1
 * @param df - degrees of freedom, > 0
 * @returns the p-value in [0, 1]
 * @throws {StatsInputError} "bad-argument" for df ≤ 0 or NaN
 * @example
 * chiSquareUpperP(5.991, 2) // ≈ 0.05
 */
export function chiSquareUpperP(x: number, df: number): number {
  checkDf(df, 'chiSquareUpperP');
  if (Number.isNaN(x)) return NaN;
  if (x <= 0) return 1;
  return Math.max(0, 1 - chisqCdf(x, df));
}

/**
 * The chi-square value with P(X ≤ x) = p.
 * @param p - probability, 0 ≤ p ≤ 1
 * @param df - degrees of freedom, > 0
 * @returns the quantile
 * @throws {StatsInputError} "bad-argument" for p outside [0, 1] or df ≤ 0
 * @example
 * chiSquareQuantile(0.95, 1) // ≈ 3.841
 */
export function chiSquareQuantile(p: number, df: number): number {
  checkProbability(p, 'chiSquareQuantile');
  checkDf(df, 'chiSquareQuantile');
  return chisqQuantile(p, df);
}

/**
 * Standard normal P(Z ≤ z).
 * @param z - the standard score
 * @returns the lower-tail probability
 * @example
 * standardNormalCdf(1.96) // ≈ 0.975
 */
export function standardNormalCdf(z: number): number {
  return normalCdf(z, 0, 1);
}

/**
 * Standard normal quantile.
 * @param p - probability, 0 ≤ p ≤ 1
 * @returns z with P(Z ≤ z) = p
 * @throws {StatsInputError} "bad-argument" for p outside [0, 1]
 * @example
 * standardNormalQuantile(0.975) // ≈ 1.95996
 */
export function standardNormalQuantile(p: number): number {
  checkProbability(p, 'standardNormalQuantile');
  return normalQuantile(p, 0, 1);
}
