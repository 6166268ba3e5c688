/**
 * Distribution functions used by the tests in this folder. They come from the
 * stdlib project's well-tested implementations (never a hand-written incomplete
 * beta); this file only names them and fixes argument order.
 */
import tCdf from '@stdlib/stats-base-dists-t-cdf';
import tQuantile from '@stdlib/stats-base-dists-t-quantile';
import fCdf from '@stdlib/stats-base-dists-f-cdf';
import fQuantile from '@stdlib/stats-base-dists-f-quantile';
import chisqCdf from '@stdlib/stats-base-dists-chisquare-cdf';
import chisqQuantile from '@stdlib/stats-base-dists-chisquare-quantile';
import normalCdf from '@stdlib/stats-base-dists-normal-cdf';
import normalQuantile from '@stdlib/stats-base-dists-normal-quantile';

/** P(T ≤ t) for Student's t with `df` degrees of freedom. */
export function studentTCdf(t: number, df: number): number {
  return tCdf(t, df);
}

/** The t value with P(T ≤ t) = p, e.g. studentTQuantile(0.975, 10) ≈ 2.228. */
export function studentTQuantile(p: number, df: number): number {
  return tQuantile(p, df);
}

/** Two-sided p-value of a t statistic: P(|T| ≥ |t|). */
export function studentTTwoSidedP(t: number, df: number): number {
  if (Number.isNaN(t)) return NaN;
  return 2 * tCdf(-Math.abs(t), df);
}

/** P(F ≤ f) for the F distribution with (df1, df2) degrees of freedom. */
export function fisherFCdf(f: number, df1: number, df2: number): number {
  return fCdf(f, df1, df2);
}

/**
 * Upper-tail p-value P(F ≥ f). Computed as the lower tail of the reciprocal,
 * P(F(df1, df2) ≥ f) = P(F(df2, df1) ≤ 1/f), an exact identity (if X ~ F(a, b)
 * then 1/X ~ F(b, a); Johnson, Kotz & Balakrishnan, Continuous Univariate
 * Distributions vol. 2, ch. 27), because 1 − cdf(f) cancels to a few digits
 * when the p-value is small (p = 4e−9 keeps only 7 of 16).
 */
export function fisherFUpperP(f: number, df1: number, df2: number): number {
  if (Number.isNaN(f)) return NaN;
  if (f === Infinity) return 0;
  if (f <= 0) return 1;
  return fCdf(1 / f, df2, df1);
}

/** The F value with P(F ≤ f) = p, e.g. fisherFQuantile(0.95, 3, 10) ≈ 3.708. */
export function fisherFQuantile(p: number, df1: number, df2: number): number {
  return fQuantile(p, df1, df2);
}

/** P(X ≤ x) for chi-square with `df` degrees of freedom. */
export function chiSquareCdf(x: number, df: number): number {
  return chisqCdf(x, df);
}

/** The chi-square value with P(X ≤ x) = p. */
export function chiSquareQuantile(p: number, df: number): number {
  return chisqQuantile(p, df);
}

/** Standard normal P(Z ≤ z). */
export function standardNormalCdf(z: number): number {
  return normalCdf(z, 0, 1);
}

/** Standard normal quantile, e.g. standardNormalQuantile(0.975) ≈ 1.95996. */
export function standardNormalQuantile(p: number): number {
  return normalQuantile(p, 0, 1);
}
