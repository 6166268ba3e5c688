/**
 * Linear contrasts of the rate means of the rate + block model (shared/stats/rateBlockModel),
 * tested with that model's residual mean square and degrees of freedom, as a contrast of
 * treatment means is tested inside an ANOVA (Steel, Torrie & Dickey, Principles and Procedures
 * of Statistics, 3rd ed., §8.3 on single-degree-of-freedom comparisons; section from memory).
 *
 * A contrast gives every rate a coefficient c_j with Σ c_j = 0, so it is a combination of the
 * differences d_j = m_j − m_0 from the lowest rate (c_0 drops out):
 *   L = Σ_{j>0} c_j d_j,  Var(L) = MSE · cᵀ U c  (U = Cov(d) / σ², from the model)
 *   t = L / SE(L) on the error df, two-sided p.
 * Several contrasts at once (rows of K) are tested together by the Wald F, which for a linear
 * model equals the extra-sum-of-squares F of the model restricted by K·d = 0:
 *   F = (K d)ᵀ (K U Kᵀ)⁻¹ (K d) / (q · MSE)  on (q, error df).
 *
 * Edge cases:
 * - a coefficient vector whose length is not the number of rates, or whose sum is not 0: a
 *   caller's mistake (StatsInputError "bad-argument");
 * - MSE = 0 (every plot on its rate + block prediction): t and F are ±Infinity when the
 *   contrast is not 0 (p = 0), and NaN with p = 1 when it is.
 */
import { fisherFUpperP, studentTQuantile, studentTTwoSidedP } from './distributions';
import { StatsInputError } from './errors';
import type { RateBlockModel } from './rateBlockModel';

/** One contrast, tested. Estimate and SE in the unit of the contrast (kg/ha for weights summing to 1). */
export interface ContrastTest {
  estimate: number;
  stdError: number;
  t: number;
  /** The rate + block model's error degrees of freedom. */
  df: number;
  /** Two-sided p-value. */
  p: number;
  /** estimate ± t(1 − (1 − level)/2, df) · SE at the level asked for. */
  ci: [number, number];
}

/** Several contrasts tested together. */
export interface ContrastFTest {
  F: number;
  df1: number;
  df2: number;
  p: number;
}

/** Rate model fields a contrast reads. */
export type ContrastModel = Pick<RateBlockModel, 'rateMeans' | 'differences' | 'residual'>;

/**
 * Tests one contrast of the rate means.
 * @param model - the site's rate + block model
 * @param coefficients - one per rate, by increasing rate, summing to 0
 * @param level - level of the interval, default 0.95
 * @returns estimate, SE, t on the error df, two-sided p and the interval
 * @throws {StatsInputError} "bad-argument" for a wrong length or coefficients that do not sum to 0
 * @example
 * rateContrast(model, [-1, 0.5, 0.5]) // the mean of the two higher rates against the lowest
 */
export function rateContrast(
  model: ContrastModel,
  coefficients: readonly number[],
  level = 0.95,
): ContrastTest {
  const c = differenceWeights(model, coefficients, 'rateContrast');
  const { kgHa, u } = contrastMoments(model, [c]);
  const ms = model.residual.ms;
  const df = model.residual.df;
  const estimate = kgHa[0];
  const stdError = Math.sqrt(ms * u[0][0]);
  const t =
    stdError > 0 ? estimate / stdError : estimate === 0 ? NaN : Math.sign(estimate) * Infinity;
  const p = Number.isNaN(t) ? 1 : Number.isFinite(t) ? studentTTwoSidedP(t, df) : 0;
  const half = studentTQuantile(1 - (1 - level) / 2, df) * stdError;
  return { estimate, stdError, t, df, p, ci: [estimate - half, estimate + half] };
}

/**
 * Tests several contrasts of the rate means together (Wald F, the extra-sum-of-squares F of the
 * model that sets them all to 0).
 * @param model - the site's rate + block model
 * @param rows - the contrasts, each one coefficient per rate by increasing rate, summing to 0;
 *   linearly independent
 * @returns F on (rows, error df) and its upper-tail p
 * @throws {StatsInputError} "bad-argument" for a wrong length, a sum other than 0, no rows, or
 *   rows that are not independent
 * @example
 * rateContrastsF(model, [[1, -2, 1, 0], [0, 1, -2, 1]]) // do the means bend?
 */
export function rateContrastsF(
  model: ContrastModel,
  rows: readonly (readonly number[])[],
): ContrastFTest {
  if (rows.length === 0) {
    throw new StatsInputError('bad-argument', 'rateContrastsF: rows: give at least one contrast.');
  }
  const k = rows.map((r) => differenceWeights(model, r, 'rateContrastsF'));
  const { kgHa, u } = contrastMoments(model, k);
  const q = k.length;
  // Solve (K U Kᵀ) z = K d by Cholesky; F = (K d)ᵀ z / (q · MSE).
  const l = cholesky(u);
  if (!l) {
    throw new StatsInputError(
      'bad-argument',
      'rateContrastsF: rows: the contrasts are not linearly independent.',
    );
  }
  const z = Float64Array.from(kgHa);
  for (let i = 0; i < q; i++) {
    for (let j = 0; j < i; j++) z[i] -= l[i][j] * z[j];
    z[i] /= l[i][i];
  }
  let quadratic = 0;
  for (let i = 0; i < q; i++) quadratic += z[i] * z[i];
  const ms = model.residual.ms;
  const df2 = model.residual.df;
  const F = ms > 0 ? quadratic / (q * ms) : quadratic > 0 ? Infinity : NaN;
  const p = Number.isNaN(F) ? 1 : Number.isFinite(F) ? fisherFUpperP(F, q, df2) : 0;
  return { F, df1: q, df2, p };
}

/** The weights of the differences d_j (j > 0) for one contrast, after checking it. */
function differenceWeights(
  model: ContrastModel,
  coefficients: readonly number[],
  caller: string,
): number[] {
  const t = model.rateMeans.length;
  if (coefficients.length !== t) {
    throw new StatsInputError(
      'bad-argument',
      `${caller}: coefficients: ${coefficients.length} given for ${t} rates; give one per rate.`,
    );
  }
  const sum = coefficients.reduce((s, v) => s + v, 0);
  const size = coefficients.reduce((s, v) => s + Math.abs(v), 0);
  if (!(Math.abs(sum) <= 1e-12 * Math.max(size, 1))) {
    throw new StatsInputError(
      'bad-argument',
      `${caller}: coefficients sum to ${sum}; a contrast's coefficients sum to 0.`,
    );
  }
  return coefficients.slice(1);
}

/** K d (kg/ha) and K U Kᵀ for the rows K of difference weights. */
function contrastMoments(
  model: ContrastModel,
  k: readonly number[][],
): { kgHa: number[]; u: number[][] } {
  const { differenceKgHa: d, unscaledCovariance: cov } = model.differences;
  const kgHa = k.map((w) => w.reduce((s, v, j) => s + v * d[j], 0));
  const u = k.map((a) =>
    k.map((b) => {
      let s = 0;
      for (let i = 0; i < a.length; i++) {
        for (let j = 0; j < b.length; j++) s += a[i] * cov[i][j] * b[j];
      }
      return s;
    }),
  );
  return { kgHa, u };
}

/** Lower Cholesky factor of a small symmetric matrix, or null when it is not positive definite. */
function cholesky(a: readonly number[][]): number[][] | null {
  const n = a.length;
  const l = a.map(() => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i][j];
      for (let k = 0; k < j; k++) s -= l[i][k] * l[j][k];
      if (i === j) {
        if (!(s > 1e-12 * Math.abs(a[i][i]))) return null;
        l[i][i] = Math.sqrt(s);
      } else {
        l[i][j] = s / l[j][j];
      }
    }
  }
  return l;
}
