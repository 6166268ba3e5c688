/**
 * The extra-sum-of-squares F-test between a reduced model and a fuller one that
 * contains it (Draper & Smith, Applied Regression Analysis, 3rd ed., §6.1; section from memory):
 *
 *   F = [(SSE_reduced − SSE_full) / (df_reduced − df_full)] / (SSE_den / df_den)
 *
 * The denominator is normally the fuller model's own residual mean square; in a
 * chain of nested models the largest model's is used for every step, as R's
 * anova() does when it is given more than two models.
 *
 * Edge cases:
 * - df_reduced ≤ df_full: no test (the "reduced" model is not smaller).
 * - SSE_den = 0 (a perfect fit): F = +∞ and p = 0 when the numerator is positive, no test otherwise.
 * - a numerator below zero from rounding is clipped at 0 (F = 0, p = 1).
 */
import { fisherFUpperP } from '../stats/distributions';

/** A fitted model as the test sees it. */
export interface ModelSse {
  /** Residual sum of squares, (kg/ha)². */
  sse: number;
  /** Residual degrees of freedom: observations − estimated parameters. */
  df: number;
}

export interface FTestResult {
  kind: 'f-test';
  df1: number;
  df2: number;
  f: number;
  p: number;
  /** SSE_reduced − SSE_full, (kg/ha)². */
  extraSse: number;
}

export interface NoTest {
  kind: 'no-test';
  reason: string;
}

/**
 * Extra-sum-of-squares F-test.
 * @param reduced - the smaller model's SSE, (kg/ha)², and residual df
 * @param full - the larger model's SSE and residual df
 * @param denominator - whose residual mean square divides (default: `full`)
 * @returns the F statistic with its p-value, or a reason why no test is possible
 * @example
 * extraSumOfSquaresTest({ sse: 300, df: 22 }, { sse: 200, df: 20 }) // F = (100/2)/(200/20) = 5, df 2 and 20
 */
export function extraSumOfSquaresTest(
  reduced: ModelSse,
  full: ModelSse,
  denominator: ModelSse = full,
): FTestResult | NoTest {
  const df1 = reduced.df - full.df;
  const df2 = denominator.df;
  if (!(df1 > 0)) {
    return {
      kind: 'no-test',
      reason: 'the fuller model has no more parameters than the reduced one',
    };
  }
  if (!(df2 > 0)) {
    return { kind: 'no-test', reason: 'the fuller model leaves no residual degrees of freedom' };
  }
  if (![reduced.sse, full.sse, denominator.sse].every(Number.isFinite)) {
    return { kind: 'no-test', reason: 'a model could not be fitted' };
  }
  const extraSse = Math.max(reduced.sse - full.sse, 0);
  const ms = denominator.sse / df2;
  if (ms === 0) {
    if (extraSse === 0) return { kind: 'no-test', reason: 'both models fit the data exactly' };
    return { kind: 'f-test', df1, df2, f: Infinity, p: 0, extraSse };
  }
  const f = extraSse / df1 / ms;
  return { kind: 'f-test', df1, df2, f, p: fisherFUpperP(f, df1, df2), extraSse };
}
